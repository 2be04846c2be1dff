// A first estimate starts from the firm's own price list: with SKUs of its own it prices, and
// with an empty list it is still made and the lead's timeline says what is missing.
import { eq, sql } from 'drizzle-orm';
import { beforeEach, describe, expect, it } from 'vitest';
import { db } from '$lib/server/platform/db';
import { fountainIn } from '$lib/estimating/testing';
import { activities, priceListItems } from '$lib/server/platform/db/schema';
import { createEstimate } from '$lib/server/estimates/versions';
import { getEstimate } from '$lib/server/estimates/records';
import { resetDatabase } from '../support/database';
import { makeUser, seedFirm } from './fixtures';
import { makeLead, seedCatalog } from './estimates-fixtures';

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
	await seedCatalog();
});

describe('the first estimate of a lead', () => {
	it('uses the firm’s own SKUs and prices when none of the demo SKUs is in the list', async () => {
		await db.execute(sql`update price_list_items set sku = 'OWN-' || md5(sku)`);
		const owner = await makeUser('owner');
		const lead = await makeLead(owner.id);
		const id = await createEstimate(lead.id, owner as never);
		const estimate = (await getEstimate(id!))!;
		expect(estimate.result).not.toBeNull();
		expect(estimate.totalCents).toBeGreaterThan(0);
		const design = estimate.design as {
			features: { kind: string; basin?: { sku?: string } }[];
			stones: { sku: string }[];
		};
		expect(fountainIn(design).basin?.sku).toMatch(/^OWN-/);
		expect(design.stones.every((s) => s.sku.startsWith('OWN-'))).toBe(true);
		const notes = await db.select().from(activities).where(eq(activities.kind, 'note'));
		expect(notes).toHaveLength(0);
	});

	it('is still made from an empty price list, and a timeline note (not the scope) says to fill the list', async () => {
		await db.delete(priceListItems);
		const owner = await makeUser('owner');
		const lead = await makeLead(owner.id);
		const id = await createEstimate(lead.id, owner as never);
		const estimate = (await getEstimate(id!))!;
		expect(estimate.result).not.toBeNull();
		expect(estimate.scope).not.toMatch(/price list/);
		const [note] = await db.select().from(activities).where(eq(activities.kind, 'note'));
		expect(note.leadId).toBe(lead.id);
		expect(note.body).toMatch(/price list has no items yet/);
	});
});
