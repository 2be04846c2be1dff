import { describe, expect, it } from 'vitest';
import { fountainIn } from '../../../tests/support/fountain';
import { demoCatalog, demoDesign } from './demo';
import { catalogSchema, designSchema } from './schema';

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
