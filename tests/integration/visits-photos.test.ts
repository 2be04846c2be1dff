// Photos taken at a site visit: the intake pipeline, both sizes in the bucket, the row tied to
// the visit and its lead with context 'visit'; a file that is not a photo stores nothing; a delete
// removes the row and both objects, for staff only, and only the visit's own photo.
import sharp from 'sharp';
import { eq } from 'drizzle-orm';
import { beforeEach, describe, expect, it } from 'vitest';
import { db } from '$lib/server/platform/db';
import { photos } from '$lib/server/platform/db/schema';
import { PhotoError } from '$lib/server/platform/images';
import { getObject } from '$lib/server/platform/storage';
import { agendaThumbs, storeVisitPhoto, visitPhotoLinks } from '$lib/server/photos/visit-photos';
import { bookVisit } from '$lib/server/visits/booking';
import { saveNotes } from '$lib/server/visits/notes';
import { zonedInstant } from '$lib/scheduling/zone';
import { actions } from '../../src/routes/office/visits/[id]/+page.server';
import { load as leadLoad } from '../../src/routes/office/leads/[id]/+page.server';
import { resetDatabase } from '../support/database';
import { makeUser, makeVisitLead, seedFirm, setHours } from './fixtures';

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
});

async function bookedVisit() {
	const sales = await makeUser('sales', 'rhea@test.example', 'Rhea Test');
	await setHours(sales.id);
	const lead = await makeVisitLead();
	const visit = await bookVisit({
		leadId: lead.id,
		salespersonId: sales.id,
		startsAt: zonedInstant('2027-04-12', 10 * 60, 'America/Denver'),
		noteForHomeowner: '',
		actorId: sales.id
	});
	return { sales, lead, visit };
}

describe('visit photos', () => {
	it('stores both sizes and a row with the visit, its lead and context visit', async () => {
		const { sales, lead, visit } = await bookedVisit();
		const jpeg = await sharp({
			create: { width: 3000, height: 2000, channels: 3, background: '#3a7d8c' }
		})
			.jpeg()
			.toBuffer();
		const row = await storeVisitPhoto(visit.id, 'pond-spot.jpg', new Uint8Array(jpeg), sales.id);
		expect(row).not.toBeNull();
		const [stored] = await db.select().from(photos).where(eq(photos.id, row!.id));
		expect(stored).toMatchObject({
			visitId: visit.id,
			leadId: lead.id,
			context: 'visit',
			jobId: null,
			width: 2048,
			height: 1365,
			originalName: 'pond-spot.jpg',
			uploadedBy: sales.id
		});
		const display = await sharp(await getObject(stored.displayKey)).metadata();
		const thumb = await sharp(await getObject(stored.thumbKey)).metadata();
		expect([display.format, display.width]).toEqual(['webp', 2048]);
		expect([thumb.format, thumb.width]).toEqual(['webp', 480]);
		const links = await visitPhotoLinks(visit.id);
		expect(links.map((l) => l.id)).toEqual([row!.id]);
		expect((await fetch(links[0].thumbUrl)).status).toBe(200);
	});

	it('refuses a file that is not a photo with a PhotoError and stores nothing', async () => {
		const { sales, visit } = await bookedVisit();
		const svg = new TextEncoder().encode('<svg xmlns="http://www.w3.org/2000/svg"></svg>');
		await expect(storeVisitPhoto(visit.id, 'plan.svg', svg, sales.id)).rejects.toThrow(PhotoError);
		expect(await db.select().from(photos)).toHaveLength(0);
		expect(await storeVisitPhoto('no-such-visit', 'x.jpg', svg, sales.id)).toBeNull();
	});

	it('the page action takes a plain multipart post and answers a bad file beside the field', async () => {
		const { sales, visit } = await bookedVisit();
		const post = (file: Blob, name: string) => {
			const body = new FormData();
			body.append('photo', file, name);
			const url = `http://127.0.0.1/office/visits/${visit.id}?/photo`;
			return actions.photo({
				params: { id: visit.id },
				locals: { user: { ...sales } },
				url: new URL(url),
				request: new Request(url, { method: 'POST', body })
			} as never);
		};
		const png = await sharp({
			create: { width: 640, height: 480, channels: 3, background: '#7a8f5c' }
		})
			.png()
			.toBuffer();
		expect(await post(new Blob([new Uint8Array(png)]), 'edge.png')).toEqual({
			form: 'photo',
			saved: true
		});
		const bad = (await post(new Blob(['not a photo at all']), 'notes.txt')) as {
			status: number;
			data: { form: string; message: string };
		};
		expect(bad.status).toBe(400);
		expect(bad.data.message).toContain('“notes.txt” is not a JPEG, PNG or WebP photo');
		const rows = await db.select().from(photos).where(eq(photos.visitId, visit.id));
		expect(rows.map((r) => [r.context, r.originalName])).toEqual([['visit', 'edge.png']]);
	});
});

describe('deleting a visit photo', () => {
	const jpeg = () =>
		sharp({ create: { width: 800, height: 600, channels: 3, background: '#5c6f7a' } })
			.jpeg()
			.toBuffer()
			.then((b) => new Uint8Array(b));

	const del = (
		visitId: string,
		photoId: string,
		user: { id: string; email: string; name: string; role: string }
	) => {
		const body = new FormData();
		body.append('photoId', photoId);
		const url = `http://127.0.0.1/office/visits/${visitId}?/deletePhoto`;
		return actions.deletePhoto({
			params: { id: visitId },
			locals: { user },
			url: new URL(url),
			request: new Request(url, { method: 'POST', body })
		} as never);
	};

	const gone = (key: string) =>
		getObject(key).then(
			() => false,
			(e: { name?: string }) => e.name === 'NoSuchKey'
		);

	it('removes the row and both objects; the other photo stays', async () => {
		const { sales, visit } = await bookedVisit();
		const keep = (await storeVisitPhoto(visit.id, 'keep.jpg', await jpeg(), sales.id))!;
		const drop = (await storeVisitPhoto(visit.id, 'drop.jpg', await jpeg(), sales.id))!;
		expect(await del(visit.id, drop.id, sales)).toEqual({ form: 'deletePhoto', deleted: true });
		expect((await visitPhotoLinks(visit.id)).map((p) => p.originalName)).toEqual(['keep.jpg']);
		expect(await gone(drop.displayKey)).toBe(true);
		expect(await gone(drop.thumbKey)).toBe(true);
		expect(await gone(keep.thumbKey)).toBe(false);
		// Deleting it again says it is gone.
		const again = (await del(visit.id, drop.id, sales)) as { status: number; data: object };
		expect(again.status).toBe(404);
		expect(again.data).toEqual({ form: 'deletePhoto', message: 'That photo is already gone.' });
	});

	it('keeps the photo when the bucket is out of reach, and says so', async () => {
		const { sales, visit } = await bookedVisit();
		const photo = (await storeVisitPhoto(visit.id, 'spot.jpg', await jpeg(), sales.id))!;
		const endpoint = process.env.S3_ENDPOINT;
		process.env.S3_ENDPOINT = 'http://127.0.0.1:9'; // nothing listens there
		let result: { status: number; data: { message: string } };
		try {
			result = (await del(visit.id, photo.id, sales)) as typeof result;
		} finally {
			process.env.S3_ENDPOINT = endpoint;
		}
		expect(result.status).toBe(503);
		expect(result.data.message).toContain('the photo is still here');
		expect((await visitPhotoLinks(visit.id)).map((p) => p.id)).toEqual([photo.id]);
		expect(await gone(photo.displayKey)).toBe(false);
	});

	it('refuses a crew lead, and a photo of another visit through this one', async () => {
		const { sales, visit } = await bookedVisit();
		const photo = (await storeVisitPhoto(visit.id, 'spot.jpg', await jpeg(), sales.id))!;
		const crew = await makeUser('crew', 'rosa@test.example', 'Rosa Test');
		await expect(del(visit.id, photo.id, crew)).rejects.toMatchObject({ status: 403 });
		// A colleague in sales can open the booked visit but not remove its photos.
		const colleague = await makeUser('sales', 'colleague@test.example', 'Colleague Test');
		const refused = (await del(visit.id, photo.id, colleague)) as { status: number };
		expect(refused.status).toBe(403);
		expect((await visitPhotoLinks(visit.id)).map((p) => p.id)).toEqual([photo.id]);
		const other = await makeVisitLead();
		const otherVisit = await bookVisit({
			leadId: other.id,
			salespersonId: sales.id,
			startsAt: zonedInstant('2027-04-13', 10 * 60, 'America/Denver'),
			noteForHomeowner: '',
			actorId: sales.id
		});
		const wrong = (await del(otherVisit.id, photo.id, sales)) as { status: number };
		expect(wrong.status).toBe(404);
		await expect(del('no-such-visit', photo.id, sales)).rejects.toMatchObject({ status: 404 });
		expect(await db.select().from(photos).where(eq(photos.id, photo.id))).toHaveLength(1);
		expect(await gone(photo.thumbKey)).toBe(false);
	});
});

describe('agenda thumbnails', () => {
	it("gives each visit its lead's intake photos and its own visit photos, with links that open", async () => {
		const { sales, lead, visit } = await bookedVisit();
		const other = await makeVisitLead();
		const otherVisit = await bookVisit({
			leadId: other.id,
			salespersonId: sales.id,
			startsAt: zonedInstant('2027-04-13', 10 * 60, 'America/Denver'),
			noteForHomeowner: '',
			actorId: sales.id
		});
		const bytes = new Uint8Array(
			await sharp({ create: { width: 640, height: 480, channels: 3, background: '#8c6a3a' } })
				.jpeg()
				.toBuffer()
		);
		const atVisit = (await storeVisitPhoto(visit.id, 'at-visit.jpg', bytes, sales.id))!;
		// An intake photo of the first lead: the same pipeline's row, context 'intake'.
		await db.insert(photos).values({
			...atVisit,
			id: 'intake-1',
			visitId: null,
			context: 'intake',
			originalName: 'from-inquiry.jpg',
			createdAt: new Date(Date.now() - 60_000)
		});
		const thumbs = await agendaThumbs([
			{ id: visit.id, leadId: lead.id },
			{ id: otherVisit.id, leadId: other.id }
		]);
		expect(thumbs.get(visit.id)?.map((t) => [t.kind, t.name])).toEqual([
			['intake', 'from-inquiry.jpg'],
			['visit', 'at-visit.jpg']
		]);
		expect(thumbs.has(otherVisit.id)).toBe(false);
		const res = await fetch(thumbs.get(visit.id)![1].thumbUrl);
		expect([res.status, res.headers.get('content-type')]).toEqual([200, 'image/webp']);
	});
});

describe('the lead page', () => {
	it("shows the visit's notes and photos read-only, and keeps visit photos out of the inquiry's", async () => {
		const { sales, lead, visit } = await bookedVisit();
		const bytes = new Uint8Array(
			await sharp({ create: { width: 640, height: 480, channels: 3, background: '#4f6a8c' } })
				.jpeg()
				.toBuffer()
		);
		await storeVisitPhoto(visit.id, 'north-corner.jpg', bytes, sales.id);
		await saveNotes(
			visit.id,
			{
				spotLengthFt: 14,
				slope: 'gentle',
				locateRequested: 'no',
				powerLocation: 'Garage',
				notes: 'Roots'
			},
			sales.id
		);
		const data = (await leadLoad({
			params: { id: lead.id },
			locals: { user: { ...sales } },
			url: new URL(`http://127.0.0.1/office/leads/${lead.id}`)
		} as never)) as {
			photos: unknown[];
			visitNotes: {
				id: string;
				notes: Record<string, unknown>;
				photos: { originalName: string; thumbUrl: string }[];
			}[];
		};
		expect(data.photos).toEqual([]);
		expect(data.visitNotes).toHaveLength(1);
		const [shown] = data.visitNotes;
		expect(shown.id).toBe(visit.id);
		expect(shown.notes).toMatchObject({ spotLengthFt: 14, slope: 'gentle', locateRequested: 'no' });
		expect(shown.photos.map((p) => p.originalName)).toEqual(['north-corner.jpg']);
		expect((await fetch(shown.photos[0].thumbUrl)).status).toBe(200);
	});
});
