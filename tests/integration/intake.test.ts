// The inquiry records and the bad-input corpus, through the same functions the form action and
// the upload API call (receiveInquiry, uploadDraft), against the real PostgreSQL and s3rver.
import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import { count, eq } from 'drizzle-orm';
import sharp from 'sharp';
import { beforeEach, describe, expect, it } from 'vitest';
import { db } from '$lib/server/platform/db';
import {
	activities,
	contacts,
	leads,
	outbox,
	photos,
	properties,
	settings
} from '$lib/server/platform/db/schema';
import { createUser } from '$lib/server/auth/team';
import { formStamp, thanksPath, verifyThanks } from '$lib/server/leads/intake/stamp';
import { receiveInquiry } from '$lib/server/leads/intake/form';
import { sweepDrafts, uploadDraft, deleteDraft } from '$lib/server/leads/intake/drafts';
import { deliverOutboxMessage } from '$lib/server/platform/outbox';
import { getObject } from '$lib/server/platform/storage';
import { resetDatabase } from '../support/database';
import { clearMail, waitForMail } from '../support/mailbox';
import {
	heic,
	oversized,
	pngBomb,
	sidewaysGpsJpeg,
	svgWithScript,
	textNamedJpg,
	truncatedJpeg,
	yardJpeg
} from '../fixtures/images/make';

const s3 = new S3Client({
	endpoint: process.env.S3_ENDPOINT,
	region: 'us-east-1',
	credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
	forcePathStyle: true
});
async function objectCount(): Promise<number> {
	const res = await s3.send(
		new ListObjectsV2Command({
			Bucket: process.env.S3_BUCKET ?? 'rillstone-private',
			Prefix: 'intake/'
		})
	);
	return res.KeyCount ?? 0;
}
const rows = async (table: typeof leads | typeof photos | typeof contacts | typeof outbox) =>
	(await db.select({ n: count() }).from(table))[0].n;

const MB = 1024 * 1024;
const titles: Record<string, string> = { 'slate-spillway': 'Slate spillway' };
const options = { projectTitle: (slug: string) => titles[slug] };

function form(
	fields: Record<string, string | string[]> = {},
	files: [string, Buffer, string?][] = []
) {
	const data = new FormData();
	const base: Record<string, string | string[]> = {
		name: 'Juniper Okafor',
		email: 'Juniper@Example.test',
		phone: '(555) 010-7788',
		street: '4 Fernbrake Row',
		town: 'Alder Flats',
		postalCode: '80998',
		services: ['water-feature', 'lighting'],
		budget: '5k-15k',
		timeframe: 'this-season',
		heardFrom: 'neighbour',
		message: 'A bubbling stone we can see from the kitchen window.',
		consent: 'yes',
		startedAt: formStamp(Date.now() - 20_000),
		...fields
	};
	for (const [k, v] of Object.entries(base)) {
		for (const one of Array.isArray(v) ? v : [v]) data.append(k, one);
	}
	for (const [name, bytes, type] of files) {
		data.append('photos', new File([new Uint8Array(bytes)], name, { type: type ?? 'image/jpeg' }));
	}
	return data;
}

// The firm and an owner (kept here rather than in fixtures.ts, which others edit at the moment).
async function seedFirm() {
	await db.insert(settings).values({
		id: 1,
		firmName: 'Test Firm',
		email: 'office@test.example',
		phone: '(555) 010-0000'
	});
}
async function makeUser(role: 'owner', email: string, name: string) {
	await createUser({ email, name, role, password: 'correct horse battery' });
}

let objectsBefore = 0;
beforeEach(async () => {
	await resetDatabase();
	await clearMail();
	await seedFirm();
	await makeUser('owner', 'owner@test.example', 'Olive Owner');
	objectsBefore = await objectCount();
});

async function expectNothingStored() {
	expect(await rows(leads)).toBe(0);
	expect(await rows(photos)).toBe(0);
	expect(await rows(contacts)).toBe(0);
	expect(await rows(outbox)).toBe(0);
	expect(await objectCount()).toBe(objectsBefore);
}

describe('a complete inquiry', () => {
	it('writes contact, property, lead, photos, timeline and both e-mails, with the photos in S3', async () => {
		const result = await receiveInquiry(
			form({ ref: 'slate-spillway' }, [
				['wide.jpg', await yardJpeg(3000, 2000)],
				['IMG_0002.jpg', await sidewaysGpsJpeg()]
			]),
			options
		);
		expect(result.ok).toBe(true);
		if (!result.ok) return;
		expect(result.number).toBe(1001);

		const [lead] = await db.select().from(leads).where(eq(leads.id, result.leadId));
		expect(lead).toMatchObject({
			stage: 'new',
			source: 'website',
			referenceProject: 'slate-spillway',
			services: ['water-feature', 'lighting'],
			budget: '5k-15k',
			timeframe: 'this-season'
		});
		expect(lead.consentAt).toBeInstanceOf(Date);
		const [contact] = await db.select().from(contacts);
		expect(contact).toMatchObject({ email: 'juniper@example.test', phoneDigits: '5550107788' });
		const [property] = await db.select().from(properties);
		expect(property).toMatchObject({ street: '4 Fernbrake Row', town: 'Alder Flats' });
		const timeline = await db.select().from(activities).where(eq(activities.leadId, lead.id));
		expect(timeline.map((a) => a.kind)).toEqual(['inquiry']);
		expect(timeline[0].data).toMatchObject({ photos: 2, ref: 'slate-spillway' });

		const stored = await db.select().from(photos).where(eq(photos.leadId, lead.id));
		expect(stored.map((p) => p.originalName).sort()).toEqual(['IMG_0002.jpg', 'wide.jpg']);
		expect(stored.every((p) => p.draftToken === null)).toBe(true);
		expect(await objectCount()).toBe(objectsBefore + 4);
		const upright = stored.find((p) => p.originalName === 'IMG_0002.jpg')!;
		expect(upright.displayKey).not.toContain('IMG');
		const meta = await sharp(await getObject(upright.displayKey)).metadata();
		expect([meta.width, meta.height, meta.exif, meta.orientation]).toEqual([
			400,
			600,
			undefined,
			undefined
		]);

		const mails = await db.select().from(outbox).where(eq(outbox.leadId, lead.id));
		expect(mails.map((m) => m.to).sort()).toEqual(['juniper@example.test', 'owner@test.example']);
		for (const m of mails) expect(await deliverOutboxMessage(m.id)).toBe('sent');
		const ack = await waitForMail('juniper@example.test', /R-1001/);
		expect(ack.text).toContain('Test Firm');
		expect(ack.text).toContain('(555) 010-0000');
		expect(ack.text).toContain('Inspired by: Slate spillway');
		expect(ack.text).toContain('Photos: 2');
		expect(ack.text).toContain('811');
		expect(ack.html).not.toMatch(/<img|src=["']?https?:/i);
		const alert = await waitForMail('owner@test.example', /New lead R-1001/);
		expect(alert.text).toContain('Juniper Okafor');
		expect(alert.text).toMatch(/\/office\/leads\//);
	});

	it('finds the same contact again by e-mail only; the same phone with another e-mail is a new contact', async () => {
		expect((await receiveInquiry(form(), options)).ok).toBe(true);
		expect(
			(await receiveInquiry(form({ email: 'JUNIPER@example.test', phone: '' }), options)).ok
		).toBe(true);
		expect(
			(await receiveInquiry(form({ email: 'other@example.test', phone: '555.010.7788' }), options))
				.ok
		).toBe(true);
		expect(await rows(contacts)).toBe(2);
		expect(await rows(leads)).toBe(3);
		expect((await db.select().from(leads)).map((l) => l.number).sort()).toEqual([1001, 1002, 1003]);
	});

	it('claims photos uploaded earlier as drafts, and refuses an unknown or expired draft', async () => {
		const up = await uploadDraft(new File([new Uint8Array(await yardJpeg())], 'spot.jpg'));
		expect(up.ok).toBe(true);
		if (!up.ok) return;
		const [draft] = await db.select().from(photos);
		expect(draft.leadId).toBeNull();
		const result = await receiveInquiry(form({ photoToken: up.draft.token }), options);
		expect(result.ok).toBe(true);
		const [claimed] = await db.select().from(photos);
		expect(claimed.leadId).toBe(result.ok ? result.leadId : '');
		expect(claimed.draftToken).toBeNull();

		const again = await receiveInquiry(form({ photoToken: up.draft.token }), options);
		expect(again.ok).toBe(false);
		if (!again.ok) expect(again.errors.photos).toMatch(/expired/);
		expect(await rows(leads)).toBe(1);
	});

	it('keeps the photos of a post with a field error as drafts, so they need not be picked again', async () => {
		const result = await receiveInquiry(
			form({ email: 'not-an-address' }, [['spot.jpg', await yardJpeg()]]),
			options
		);
		expect(result.ok).toBe(false);
		if (result.ok) return;
		expect(result.status).toBe(400);
		expect(result.errors.email).toMatch(/valid e-mail/);
		expect(result.values).toMatchObject({
			name: 'Juniper Okafor',
			email: 'not-an-address',
			town: 'Alder Flats'
		});
		expect(result.values.services).toEqual(['water-feature', 'lighting']);
		expect(result.drafts.map((d) => d.name)).toEqual(['spot.jpg']);
		expect(await rows(leads)).toBe(0);
		const fixed = await receiveInquiry(form({ photoToken: result.drafts[0].token }), options);
		expect(fixed.ok).toBe(true);
		expect((await db.select().from(photos))[0].leadId).toBe(fixed.ok ? fixed.leadId : '');
	});

	it('signs the thank-you link', () => {
		const path = new URL(thanksPath(1042), 'http://x');
		expect(verifyThanks(path.searchParams.get('n'), path.searchParams.get('s'))).toBe(1042);
		expect(verifyThanks('1043', path.searchParams.get('s'))).toBeNull();
	});
});

describe('the bad-input corpus: a 4xx, a clear message, every value kept, nothing stored', () => {
	const photoCases: [string, () => Promise<[string, Buffer, string?][]>, number, RegExp][] = [
		[
			'a zero-byte file',
			async () => [['empty.jpg', Buffer.alloc(0)]],
			422,
			/“empty\.jpg” is empty/
		],
		[
			'a truncated JPEG',
			async () => [['half.jpg', await truncatedJpeg()]],
			422,
			/“half\.jpg” is damaged/
		],
		[
			'a text file named .jpg',
			async () => [['notes.jpg', textNamedJpg]],
			415,
			/“notes\.jpg” is not a JPEG/
		],
		[
			'an SVG with a script',
			async () => [['logo.svg', svgWithScript, 'image/svg+xml']],
			415,
			/SVG drawing/
		],
		[
			'a 20,000 × 20,000 PNG',
			async () => [['bomb.png', pngBomb(), 'image/png']],
			413,
			/40 megapixels/
		],
		[
			'a HEIC photo',
			async () => [['IMG_7.HEIC', heic(), 'image/heic']],
			415,
			/Phones can send JPEG/
		],
		[
			'a 16 MB photo',
			async () => [['big.jpg', oversized(16 * MB)]],
			413,
			/“big\.jpg” is 16 MB; .*at most 15 MB/
		],
		[
			'a ninth photo',
			async () => {
				const one = await yardJpeg(200, 150);
				return Array.from({ length: 9 }, (_, i) => [`p${i}.jpg`, one] as [string, Buffer]);
			},
			413,
			/at most 8 photos; this has 9/
		],
		[
			'more than 60 MB in all',
			async () =>
				Array.from(
					{ length: 5 },
					(_, i) => [`p${i}.jpg`, oversized(12.5 * MB)] as [string, Buffer]
				),
			413,
			/63 MB; send at most 60 MB/
		],
		[
			'odd file names on bad content',
			async () => [
				['../../etc/pass\u202Ewd.jpg', textNamedJpg],
				['…/ünï¢ødé.jpg', Buffer.alloc(0)]
			],
			415,
			/“passwd\.jpg” is not a JPEG.*“ünï¢ødé\.jpg” is empty/
		],
		[
			'one bad photo among good ones',
			async () => [
				['good.jpg', await yardJpeg()],
				['half.jpg', await truncatedJpeg()]
			],
			422,
			/“half\.jpg” is damaged/
		]
	];
	for (const [label, files, status, message] of photoCases) {
		it(label, async () => {
			const result = await receiveInquiry(form({}, await files()), options);
			expect(result.ok).toBe(false);
			if (result.ok) return;
			expect(result.status).toBe(status);
			expect(result.errors.photos).toMatch(message);
			expect(result.values).toMatchObject({ name: 'Juniper Okafor', street: '4 Fernbrake Row' });
			await expectNothingStored();
		});
	}

	const fieldCases: [string, Record<string, string | string[]>, string, RegExp][] = [
		['a malformed e-mail', { email: 'juniper@@example' }, 'email', /valid e-mail/],
		['a 10,000-character message', { message: 'x'.repeat(10_000) }, 'message', /under 4,000/],
		['a missing name', { name: '  ' }, 'name', /your name/],
		['a missing street', { street: '' }, 'street', /street address/],
		['a missing town', { town: '' }, 'town', /town/],
		['no service picked', { services: [] }, 'services', /at least one/],
		['a budget not on the list', { budget: 'a million' }, 'budget', /budget range/],
		['no consent', { consent: '' }, 'consent', /Tick the box/],
		['a project not in the portfolio', { ref: 'no-such-project' }, 'ref', /not in our portfolio/]
	];
	for (const [label, fields, field, message] of fieldCases) {
		it(label, async () => {
			const result = await receiveInquiry(form(fields), options);
			expect(result.ok).toBe(false);
			if (result.ok) return;
			expect(result.status).toBe(400);
			expect(result.errors[field]).toMatch(message);
			expect(result.values.name).toBe(
				typeof fields.name === 'string' ? fields.name : 'Juniper Okafor'
			);
			if (typeof fields.message === 'string') expect(result.values.message).toHaveLength(10_000);
			await expectNothingStored();
		});
	}

	it('accepts a good photo with an odd name, keeping the name only as text', async () => {
		const result = await receiveInquiry(
			form({}, [['../..\\yard/\u202E.. Süd 🌿.jpg', await yardJpeg()]]),
			options
		);
		expect(result.ok).toBe(true);
		const [p] = await db.select().from(photos);
		expect(p.originalName).toBe('.. Süd 🌿.jpg'.replace(/^\.+/, '').trim());
		expect(p.displayKey).toMatch(/^intake\/[0-9a-f]{32}\/display\.webp$/);
	});

	it('refuses the honeypot, a missing or forged stamp and a form sent too fast', async () => {
		const cases: [Record<string, string>, RegExp][] = [
			[{ website: 'http://spam.example' }, /could not be sent/],
			[{ startedAt: '' }, /expired/],
			[{ startedAt: `${Date.now() - 60_000}.forged` }, /expired/],
			[{ startedAt: formStamp(Date.now() - 500) }, /very quick/]
		];
		for (const [fields, message] of cases) {
			const result = await receiveInquiry(form(fields), options);
			expect(result.ok).toBe(false);
			if (!result.ok) {
				expect(result.status).toBe(400);
				expect(result.message).toMatch(message);
				expect(result.values.email).toBe('Juniper@Example.test');
			}
		}
		await expectNothingStored();
	});
});

describe('the upload API pipeline', () => {
	it('answers bad uploads with a 4xx naming the file and stores nothing', async () => {
		const cases: [File | null, number, RegExp][] = [
			[null, 400, /field “file”/],
			[new File([], 'empty.jpg'), 422, /“empty\.jpg” is empty/],
			[new File([new Uint8Array(heic())], 'IMG.HEIC'), 415, /Phones can send JPEG/],
			[new File([new Uint8Array(oversized(16 * MB))], 'big.jpg'), 413, /at most 15 MB/],
			[new File([new Uint8Array(pngBomb())], 'bomb.png'), 413, /40 megapixels/]
		];
		for (const [file, status, message] of cases) {
			const res = await uploadDraft(file);
			expect(res.ok).toBe(false);
			if (!res.ok) {
				expect(res.status).toBe(status);
				expect(res.message).toMatch(message);
			}
		}
		await expectNothingStored();
	});

	it('removes a draft and its objects when the sender removes the photo', async () => {
		const up = await uploadDraft(new File([new Uint8Array(await yardJpeg())], 'spot.jpg'));
		expect(up.ok && (await objectCount()) === objectsBefore + 2).toBe(true);
		if (!up.ok) return;
		expect(await deleteDraft(up.draft.token)).toBe(true);
		expect(await deleteDraft(up.draft.token)).toBe(false);
		await expectNothingStored();
	});
});

describe('the sweep of unclaimed drafts', () => {
	it('deletes drafts older than a day from S3 and the table, and keeps fresh ones and claimed photos', async () => {
		const old = await uploadDraft(new File([new Uint8Array(await yardJpeg())], 'old.jpg'));
		const fresh = await uploadDraft(new File([new Uint8Array(await yardJpeg())], 'fresh.jpg'));
		const claimed = await receiveInquiry(form({}, [['kept.jpg', await yardJpeg()]]), options);
		expect(old.ok && fresh.ok && claimed.ok).toBe(true);
		if (!old.ok) return;
		await db
			.update(photos)
			.set({ createdAt: new Date(Date.now() - 25 * 60 * 60 * 1000) })
			.where(eq(photos.draftToken, old.draft.token));
		const [oldRow] = await db.select().from(photos).where(eq(photos.draftToken, old.draft.token));

		expect(await sweepDrafts()).toBe(1);
		expect(await sweepDrafts()).toBe(0); // idempotent
		expect((await db.select().from(photos)).map((p) => p.originalName).sort()).toEqual([
			'fresh.jpg',
			'kept.jpg'
		]);
		expect(await objectCount()).toBe(objectsBefore + 4);
		await expect(getObject(oldRow.displayKey)).rejects.toThrow();
	});
});
