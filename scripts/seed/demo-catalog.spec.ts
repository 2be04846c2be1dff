import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { fountainIn } from '../../tests/support/fountain';
import { catalogSchema, designSchema } from '../../src/lib/estimating/schema';
import { STANDARD_ITEM_UNITS, standardDesign } from '../../src/lib/estimating/standard-feature';
import { demoCatalog, demoDesign } from './demo-catalog';

const SRC = join(import.meta.dirname, '..', '..', 'src');
function shipped(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
		const path = join(dir, e.name);
		if (e.isDirectory()) return shipped(path);
		return /\.(ts|svelte)$/.test(e.name) && !/\.(spec|test)\.ts$/.test(e.name) ? [path] : [];
	});
}

describe('demo data', () => {
	it('parses with the design and catalog schemas', () => {
		expect(designSchema.safeParse(demoDesign()).success).toBe(true);
		expect(catalogSchema.safeParse(demoCatalog()).success).toBe(true);
	});

	it('has a three-column bubbling feature, a gravel basin, lights, a topping alternate and an optional wall', () => {
		const d = designSchema.parse(demoDesign());
		expect(fountainIn(d).outlets.filter((o) => o.kind === 'bubbler')).toHaveLength(3);
		expect(fountainIn(d).basin?.fill.kind).toBe('gravel');
		expect(d.lighting!.fixtures.length).toBeGreaterThanOrEqual(2);
		expect(d.lighting!.fixtures.length).toBeLessThanOrEqual(3);
		expect(d.alternates[0].choices.map((c) => c.id)).toEqual(['topping-pebble', 'topping-slate']);
		expect(d.walls[0].optionId).toBe('low-wall');
		expect(d.options.find((o) => o.id === 'low-wall')!.selected).toBe(false);
	});

	it('returns fresh objects each time, so the builder may edit them', () => {
		const a = demoDesign();
		fountainIn(a).outlets!.pop();
		expect(fountainIn(demoDesign()).outlets).toHaveLength(3);
	});

	it('prices in whole cents, with price at or above cost', () => {
		const c = catalogSchema.parse(demoCatalog());
		expect(c.items.length).toBeGreaterThan(0);
		for (const item of c.items) {
			expect(Number.isInteger(item.unitPrice), item.sku).toBe(true);
			expect(Number.isInteger(item.unitCost), item.sku).toBe(true);
			expect(item.unitPrice).toBeGreaterThanOrEqual(item.unitCost);
		}
		for (const pump of c.pumps) expect(Number.isInteger(pump.priceCents)).toBe(true);
		for (const rate of c.laborRates) {
			expect(Number.isInteger(rate.pricePerHourCents)).toBe(true);
			expect(Number.isInteger(rate.costPerHourCents)).toBe(true);
		}
	});
});

describe('the demo data stays out of what ships', () => {
	it('no module under src but the tests imports the demo catalog or anything from scripts', () => {
		const importsDemo = /(?:from\s+|import\s*\(\s*)['"][^'"]*(?:scripts\/|demo-catalog)[^'"]*['"]/;
		const offenders = shipped(SRC)
			.filter((f) => importsDemo.test(readFileSync(f, 'utf8')))
			.map((f) => relative(SRC, f));
		expect(offenders).toEqual([]);
	});

	it('the standard feature says how each item it names is sold, as the demo price list sells it', () => {
		const units = new Map((demoCatalog().items ?? []).map((i) => [i.sku, i.unit]));
		const named = JSON.stringify(standardDesign()).match(/"[a-zA-Z]*[sS]ku":"[^"]+"/g) ?? [];
		const skus = new Set(named.map((m) => m.split(':')[1].replaceAll('"', '')));
		expect(new Set(Object.keys(STANDARD_ITEM_UNITS))).toEqual(skus);
		for (const [sku, unit] of Object.entries(STANDARD_ITEM_UNITS)) {
			expect(units.get(sku), sku).toBe(unit);
		}
	});
});
