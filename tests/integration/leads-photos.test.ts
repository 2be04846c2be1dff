// The lead page's photos: only short-lived signed links to the private bucket, which expire.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { db } from '$lib/server/platform/db';
import { photos } from '$lib/server/platform/db/schema';
import { newId } from '$lib/server/platform/crypto';
import { bucket, putObject, randomKey, signedUrl } from '$lib/server/platform/storage';
import { env } from '$lib/server/platform/env';
import { load } from '../../src/routes/office/leads/[id]/+page.server';
import { resetDatabase } from '../support/database';
import { makeLead, makeUser, seedFirm } from './fixtures';

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
});
afterEach(() => {
	vi.useRealTimers();
});

const JPEG = Buffer.from('ffd8ffe000104a46494600', 'hex');

describe('photo links', () => {
	it('the lead page gives signed links that work, never the bare object address', async () => {
		const owner = await makeUser('owner');
		const lead = await makeLead({ name: 'Gallery Person' });
		const displayKey = randomKey('intake', 'display.jpg');
		const thumbKey = randomKey('intake', 'thumb.jpg');
		await putObject(displayKey, JPEG, 'image/jpeg');
		await putObject(thumbKey, JPEG, 'image/jpeg');
		await db.insert(photos).values({
			id: newId(),
			leadId: lead.id,
			displayKey,
			thumbKey,
			width: 2048,
			height: 1536,
			bytes: JPEG.length,
			originalName: 'spot.jpg'
		});
		const data = (await load({
			params: { id: lead.id },
			locals: { user: { ...owner } },
			url: new URL(`http://127.0.0.1/office/leads/${lead.id}`)
		} as never)) as { photos: { fullUrl: string; thumbUrl: string }[] };
		expect(data.photos).toHaveLength(1);
		const full = new URL(data.photos[0].fullUrl);
		expect(full.searchParams.get('X-Amz-Signature')).toMatch(/^[0-9a-f]{64}$/);
		expect(full.searchParams.get('X-Amz-Expires')).toBe('300');
		expect(full.pathname).toBe(`/${bucket()}/${displayKey}`);
		const res = await fetch(full);
		expect(res.status).toBe(200);
		expect(Buffer.from(await res.arrayBuffer())).toEqual(JPEG);
		expect((await fetch(data.photos[0].thumbUrl)).status).toBe(200);
	});

	it('a link stops working once its lifetime has passed', async () => {
		const key = randomKey('intake', 'display.jpg');
		await putObject(key, JPEG, 'image/jpeg');
		// Signed ten minutes ago with a five-minute lifetime: expired now.
		vi.useFakeTimers({ toFake: ['Date'], now: Date.now() - 10 * 60_000 });
		const stale = await signedUrl(key, 300);
		vi.useRealTimers();
		const res = await fetch(stale);
		expect(res.status).toBe(403);
		expect(await res.text()).toContain('expired');
		expect((await fetch(await signedUrl(key, 300))).status).toBe(200);
		expect(env.S3_ENDPOINT).toBeTruthy();
	});
});
