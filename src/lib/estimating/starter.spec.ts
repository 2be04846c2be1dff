import { describe, expect, it } from 'vitest';
import { fountainIn } from '../../../tests/support/fountain';
import { estimate } from './index';
import { demoCatalog, demoDesign } from '../../../scripts/seed/demo-catalog';
import { starterDesign } from './prefill';
import { starterFromCatalog, starterGapsNote } from './starter';
import { catalogSchema, type Catalog } from './schema';

/** The demo price list with every SKU renamed, as a firm's own list would number its items. */
function renamedCatalog(): Catalog {
	const catalog = demoCatalog();
	const renamed = new Map((catalog.items ?? []).map((item, n) => [item.sku, `FIRM-${1000 + n}`]));
	// The firm's settings name its own items for machines, deliveries and spoil.
	const equipment = Object.fromEntries(
		Object.entries(catalogSchema.parse(catalog).settings.equipment).map(([k, v]) => [
			k,
			typeof v === 'string' ? (renamed.get(v) ?? v) : v
		])
	);
	return {
		...catalog,
		items: (catalog.items ?? []).map((item) => ({ ...item, sku: renamed.get(item.sku)! })),
		settings: { ...catalog.settings, equipment }
	};
}

function skusOf(design: ReturnType<typeof demoDesign>): string[] {
	return [
		fountainIn(design).basin?.sku,
		...(() => {
			const fill = fountainIn(design).basin?.fill;
			return fill?.kind === 'gravel' ? [fill.sku] : [];
		})(),
		...(design.stones ?? []).map((s) => s.sku),
		...(design.aggregates ?? []).map((a) => a.sku),
		...(design.walls ?? []).flatMap((w) => [
			w.unitSku,
			w.capSku,
			w.padSku,
			w.drainSku,
			w.drainPipeSku
		]),
		...(design.lighting?.fixtures ?? []).map((f) => f.sku),
		...(design.lighting?.transformers ?? []).map((t) => t.sku),
		...(design.lighting?.runs ?? []).map((r) => r.cableSku),
		...(design.extraLines ?? []).map((l) => l.sku)
	].filter((s): s is string => Boolean(s));
}

describe('the starting design comes from the firm’s price list', () => {
	it('is today’s standard feature, to the cent, with the demo price list', () => {
		const starter = starterFromCatalog(demoCatalog());
		expect(starter.design).toEqual(demoDesign());
		expect(starter.notes).toEqual([]);
		const a = estimate(starter.design, demoCatalog());
		const b = estimate(demoDesign(), demoCatalog());
		expect(a.ok && b.ok && a.pricing.totalCents).toBe(b.ok && b.pricing.totalCents);
	});

	it('uses the firm’s own SKUs when they differ, and the estimate prices', () => {
		const catalog = renamedCatalog();
		const firmSkus = new Set(catalog.items!.map((i) => i.sku));
		const { design, notes } = starterFromCatalog(catalog);
		expect(notes).toEqual([]);
		const used = skusOf(design);
		expect(used.length).toBe(skusOf(demoDesign()).length);
		expect(used.every((sku) => firmSkus.has(sku))).toBe(true);
		// Same items under other numbers: the same total as the demo.
		const result = estimate(design, catalog);
		const demo = estimate(demoDesign(), demoCatalog());
		expect(result.ok).toBe(true);
		expect(result.ok && result.pricing.totalCents).toBe(demo.ok && demo.pricing.totalCents);
		// The demo design itself would not price against this list (the failure the starter avoids).
		expect(estimate(demoDesign(), catalog).ok).toBe(false);
	});

	it('picks items of the same category that can price the part, whatever their unit', () => {
		const catalog: Catalog = {
			...demoCatalog(),
			items: [
				{
					sku: 'S1',
					name: 'Sandstone pillar',
					category: 'stone',
					unit: 'each',
					unitCost: 20000,
					unitPrice: 45000
				},
				// Sold by the ton without a bulk density: cannot price a topping, so not picked.
				{
					sku: 'A0',
					name: 'Crushed granite',
					category: 'aggregate',
					unit: 'ton',
					unitCost: 3000,
					unitPrice: 6000
				},
				{
					sku: 'A1',
					name: 'Pea gravel',
					category: 'aggregate',
					unit: 'yd3',
					unitCost: 4000,
					unitPrice: 9000
				},
				{
					sku: 'L1',
					name: 'Well light',
					category: 'lighting',
					unit: 'each',
					unitCost: 4000,
					unitPrice: 9000
				},
				{
					sku: 'L2',
					name: 'Transformer 300 VA',
					category: 'lighting',
					unit: 'each',
					unitCost: 15000,
					unitPrice: 30000
				},
				{
					sku: 'C1',
					name: 'Low-voltage wire 12/2',
					category: 'electrical',
					unit: 'ft',
					unitCost: 50,
					unitPrice: 110
				}
			]
		};
		const { design, notes } = starterFromCatalog(catalog);
		expect(design.stones!.map((s) => s.sku)).toEqual(['S1', 'S1', 'S1', 'S1']);
		expect(fountainIn(design).basin!.fill).toMatchObject({ kind: 'gravel', sku: 'A1' });
		expect(design.lighting!.fixtures.map((f) => f.sku)).toEqual(['L1', 'L1', 'L1']);
		expect(design.lighting!.transformers[0].sku).toBe('L2');
		expect(design.lighting!.runs[0].cableSku).toBe('C1');
		// One topping item only: no alternate left to choose, the topping is in the base.
		expect(design.aggregates).toHaveLength(1);
		expect(design.aggregates![0]).toMatchObject({ sku: 'A1', name: 'Pea gravel' });
		expect(design.aggregates![0].optionId).toBeUndefined();
		expect(design.alternates).toEqual([]);
		// No wall units and no core drilling: left out, and said so.
		expect(design.walls).toEqual([]);
		expect(design.options).toEqual([]);
		expect(design.extraLines).toEqual([]);
		expect(notes).toContain('Low retaining wall: no wall unit in the price list; left out.');
		expect(notes).toContain(
			'Core drilling through the columns: no such item in the price list; left out.'
		);
		expect(notes).toContain(
			'Basin: no basin item in the price list can price it, so it is not priced.'
		);
		const result = estimate(design, catalog);
		if (!result.ok) throw new Error(JSON.stringify(result.errors));
		expect(result.pricing.totalCents).toBeGreaterThan(0);
		expect(result.pricing.lines.some((l) => l.sku === 'S1')).toBe(true);
	});

	it('does not crash on an empty price list and says what to do', () => {
		const { design, notes } = starterFromCatalog({ items: [] });
		expect(notes).toHaveLength(1);
		expect(notes[0]).toMatch(/price list has no items yet/);
		expect(skusOf(design)).toEqual([]);
		const result = estimate(design, { items: [] });
		expect(result.ok).toBe(true);
		expect(starterGapsNote(notes)).toMatch(/^Starting design: the price list could not supply\n- /);
		expect(starterFromCatalog('not a catalog').notes[0]).toMatch(/could not be read/);
	});

	it('the visit-notes prefill builds on the firm’s items when it is given the price list', () => {
		const design = starterDesign(
			'Ada — water feature',
			{ spotLengthFt: 9 },
			undefined,
			renamedCatalog()
		);
		expect(design.name).toBe('Ada — water feature');
		expect(fountainIn(design).basin!.sku).toMatch(/^FIRM-/);
		expect(estimate(design, renamedCatalog()).ok).toBe(true);
	});
});
