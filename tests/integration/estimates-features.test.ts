// Designs with features: stored single-fountain designs are moved into one fountain feature by the
// migration and still price to the cent as they did when accepted; new estimates start from the
// features the homeowner asked for.
import { readdirSync, readFileSync } from 'node:fs';
import { sql } from 'drizzle-orm';
import postgres from 'postgres';
import { beforeEach, describe, expect, it } from 'vitest';
import fixture from '../fixtures/accepted-v1.json';
import { upgradeDesign } from '$lib/estimating';
import { db } from '$lib/server/platform/db';
import { contacts, estimates, leads } from '$lib/server/platform/db/schema';
import { newId } from '$lib/server/platform/crypto';
import { compute, createEstimate } from '$lib/server/estimates/versions';
import { getEstimate } from '$lib/server/estimates/records';
import { resetDatabase } from '../support/database';
import { makeUser, seedFirm } from './fixtures';
import { makeLead, seedCatalog } from './estimates-fixtures';

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
	await seedCatalog();
});

/** The migration that moves fountains into features, found by what it does (not by its number). */
function featuresMigration(): string[] {
	const dir = new URL('../../drizzle/', import.meta.url);
	const file = readdirSync(dir).find(
		(f) => f.endsWith('.sql') && readFileSync(new URL(f, dir), 'utf8').includes('upgrade_design')
	);
	if (!file) throw new Error('no migration moves designs into features');
	return readFileSync(new URL(file, dir), 'utf8').split('--> statement-breakpoint');
}

async function runMigrationAgain() {
	const client = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
	try {
		await client.begin(async (tx) => {
			for (const statement of featuresMigration()) await tx.unsafe(statement);
		});
	} finally {
		await client.end();
	}
}

const oldLineFields = (lines: readonly Record<string, unknown>[]) =>
	lines.map(({ feature: _feature, ...rest }) => {
		void _feature;
		return rest;
	});

describe('the features migration and the accepted demo estimate', () => {
	it('moves a stored single-fountain design into one fountain feature that keeps its accepted totals', async () => {
		const sales = await makeUser('sales');
		const lead = await makeLead(sales.id);
		const id = newId();
		await db.insert(estimates).values({
			id,
			leadId: lead.id,
			number: 1,
			status: 'accepted',
			design: fixture.design,
			catalog: fixture.catalog,
			result: {},
			scope: 'Three basalt columns',
			totalCents: fixture.priced.totalCents,
			taxCents: fixture.totals.taxCents,
			depositCents: fixture.priced.depositCents
		});
		await runMigrationAgain();
		const row = (await getEstimate(id))!;
		expect(row.design).toEqual(upgradeDesign(fixture.design));
		expect(row.design).not.toHaveProperty('outlets');
		expect((row.design.features as { kind: string }[]).map((f) => f.kind)).toEqual(['fountain']);

		// The accepted estimate keeps the totals it was accepted at.
		expect(row.totalCents).toBe(fixture.priced.totalCents);
		expect(row.depositCents).toBe(fixture.priced.depositCents);

		// A recomputation prices every material line as accepted but the wall pad (now bought
		// loose, to compact); only the labor, now in crew-hours, and that pad change.
		const again = compute(row.design, row.catalog, []);
		expect(again.ok).toBe(true);
		if (!again.ok) return;
		const priced = again.stored.priced;
		const notPad = (lines: readonly { sku: string }[]) =>
			lines.filter((l) => l.sku !== 'AGG-BASE-ROAD');
		expect(notPad(oldLineFields(priced.lines as never) as never)).toEqual(
			notPad(fixture.priced.lines)
		);
		expect(priced.pricing.base.materialsCents).toBe(fixture.priced.base.materialsCents);
		expect(priced.pricing.base.laborHours).toBeGreaterThan(fixture.priced.base.laborHours);

		// Running it a second time changes nothing.
		await runMigrationAgain();
		expect((await getEstimate(id))!.design).toEqual(row.design);
	});

	it('upgrades the design inside a job’s frozen copy too', async () => {
		const client = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
		try {
			await client.begin(async (tx) => {
				const [create] = featuresMigration();
				await tx.unsafe(create);
				const [row] = await tx.unsafe(
					`select pg_temp.upgrade_design($1::jsonb) as d, pg_temp.upgrade_design($2::jsonb) as same`,
					[tx.json(fixture.design as never), tx.json(upgradeDesign(fixture.design) as never)]
				);
				// The SQL and the TypeScript agree, and an upgraded design is left alone.
				expect(row.d).toEqual(upgradeDesign(fixture.design));
				expect(row.same).toEqual(upgradeDesign(fixture.design));
			});
		} finally {
			await client.end();
		}
	});
});

async function leadAsking(services: string[], n = 1) {
	const sales = await makeUser('sales', `sales${n}@test.example`);
	const contactId = newId();
	await db
		.insert(contacts)
		.values({ id: contactId, name: `Wren Halloway ${n}`, email: `w${n}@test.example` });
	const [lead] = await db
		.insert(leads)
		.values({ id: newId(), contactId, stage: 'contacted', message: 'Please', services })
		.returning();
	return { sales, lead };
}

describe('the starting design follows the inquiry', () => {
	it('a pond lead starts from a priced pond with liner, skimmer and filter from the price list', async () => {
		const { sales, lead } = await leadAsking(['pond']);
		const row = (await getEstimate((await createEstimate(lead.id, sales))!))!;
		const features = row.design.features as { kind: string; linerSku?: string }[];
		expect(features.map((f) => f.kind)).toEqual(['pond']);
		expect(features[0].linerSku).toMatch(/^LINER-/);
		const lines = (row.result as { priced: { lines: { sku: string }[] } }).priced.lines;
		const skus = lines.map((l) => l.sku);
		expect(skus).toEqual(expect.arrayContaining(['SKIM-2000', 'BIOFILTER-1500', 'UNDERLAY-FT2']));
		expect(skus.some((s) => s.startsWith('pump:'))).toBe(true);
		// No drilled columns in a pond-only design.
		expect(skus).not.toContain('STONE-BASALT-COL');
		expect(row.totalCents).toBeGreaterThan(0);
	});

	it('a stream lead starts from a pondless stream with a reservoir; pond and stream fall together', async () => {
		const { sales, lead } = await leadAsking(['stream']);
		const row = (await getEstimate((await createEstimate(lead.id, sales))!))!;
		const [stream] = row.design.features as { kind: string; reservoir?: unknown }[];
		expect(stream.kind).toBe('stream');
		expect(stream.reservoir).toBeDefined();

		const both = await leadAsking(['pond', 'stream', 'water-feature'], 2);
		const id = await createEstimate(both.lead.id, both.sales);
		const design = (await getEstimate(id!))!.design as {
			features: { kind: string; id: string; feedsPondId?: string }[];
		};
		expect(design.features.map((f) => f.kind)).toEqual(['pond', 'stream', 'fountain']);
		expect(design.features[1].feedsPondId).toBe(design.features[0].id);
		const [{ n }] = await db.execute<{ n: number }>(sql`select count(*)::int as n from estimates`);
		expect(n).toBe(2);
	});
});
