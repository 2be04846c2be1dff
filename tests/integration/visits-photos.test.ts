// Photos taken at a site visit: the intake pipeline, both sizes in the bucket, the row tied to
// the visit and its lead with context 'visit'; a file that is not a photo stores nothing.
import sharp from 'sharp';
import { eq } from 'drizzle-orm';
import { beforeEach, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { photos } from '$lib/server/db/schema';
import { PhotoError } from '$lib/server/images';
import { getObject } from '$lib/server/storage';
import { storeVisitPhoto, visitPhotoLinks } from '$lib/server/visit-photos';
import { bookVisit } from '$lib/server/visits';
import { zonedInstant } from '$lib/scheduling/zone';
import { actions } from '../../src/routes/office/visits/[id]/+page.server';
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
