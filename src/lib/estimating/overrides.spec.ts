import { describe, expect, it } from 'vitest';
import { demoCatalog, demoDesign } from '../../../scripts/seed/demo-catalog';
import { estimate, prepareCatalog, type EstimateSuccess } from './index';
import {
	cleanChoices,
	defaultChoices,
	lineKey,
	priceWithOverrides,
	staleOverrides,
	totalsForChoices,
	type LineOverride
} from './overrides';

const ok = () => {
	const r = estimate(demoDesign(), demoCatalog());
	if (!r.ok) throw new Error('demo failed');
	return r as EstimateSuccess;
};

describe('priceWithOverrides', () => {
	it('with no overrides gives exactly the engine totals', () => {
		const r = ok();
		const p = priceWithOverrides(r, demoDesign(), demoCatalog(), []);
		expect(p.pricing.totalCents).toBe(r.pricing.totalCents);
		expect(p.pricing.depositCents).toBe(r.pricing.depositCents);
		expect(p.depositPercent).toBe(30);
	});

	it('an override changes the line and the totals, and keeps the computed value', () => {
		const r = ok();
		const line = r.pricing.lines.find((l) => l.bucket === 'base' && l.unit === 'each')!;
		const o: LineOverride = {
			key: lineKey(line),
			kind: 'override',
			bucket: line.bucket,
			description: line.description,
			unit: line.unit,
			quantity: line.quantity + 1,
			unitPriceCents: line.unitPriceCents,
			unitCostCents: 0,
			taxable: line.taxable,
			computed: { quantity: line.quantity, unitPriceCents: line.unitPriceCents },
			reason: 'One spare'
		};
		const p = priceWithOverrides(r, demoDesign(), demoCatalog(), [o]);
		const shown = p.lines.find((l) => l.key === o.key)!;
		expect(shown.quantity).toBe(line.quantity + 1);
		expect(shown.override?.computed?.quantity).toBe(line.quantity);
		expect(p.pricing.base.materialsCents - r.pricing.base.materialsCents).toBe(line.unitPriceCents);
		expect(p.pricing.totalCents).toBeGreaterThan(r.pricing.totalCents);
	});

	it('an added line is priced into its bucket with the rounding rule', () => {
		const r = ok();
		const added: LineOverride = {
			key: 'x1',
			kind: 'added',
			bucket: 'base',
			description: 'Haul-away of spoil',
			unit: 'load',
			quantity: 1.5,
			unitPriceCents: 3333,
			unitCostCents: 1000,
			taxable: false,
			reason: 'Tight access'
		};
		const p = priceWithOverrides(r, demoDesign(), demoCatalog(), [added]);
		// 1.5 × 3333 = 4999.5, rounded half up to 5000.
		expect(p.pricing.base.materialsCents - r.pricing.base.materialsCents).toBe(5000);
		expect(p.pricing.base.taxCents).toBe(r.pricing.base.taxCents);
	});

	it('reports overrides whose line has gone', () => {
		const r = ok();
		const gone = { key: 'base|NOPE|x', kind: 'override' } as LineOverride;
		expect(staleOverrides(r.pricing.lines, [gone])).toEqual([gone]);
	});
});

describe('totalsForChoices', () => {
	it('matches the engine when the same choices are made in the design', () => {
		const r = ok();
		const design = demoDesign();
		design.options = [{ id: 'low-wall', name: 'Wall', selected: true }];
		design.alternates![0].selectedChoiceId = 'topping-slate';
		const chosen = estimate(design, demoCatalog());
		if (!chosen.ok) throw new Error('failed');
		const t = totalsForChoices(
			r.pricing,
			{ options: ['low-wall'], alternates: { topping: 'topping-slate' } },
			30
		);
		expect(t.totalCents).toBe(chosen.pricing.totalCents);
		expect(t.depositCents).toBe(chosen.pricing.depositCents);
		expect(t.totalCents - t.depositCents).toBe(t.balanceCents);
	});

	it('ignores unknown ids and keeps one choice per alternate', () => {
		const r = ok();
		const c = cleanChoices(r.pricing, {
			options: ['nope', 'low-wall'],
			alternates: { topping: 'x' }
		});
		expect(c).toEqual({ options: ['low-wall'], alternates: { topping: 'topping-pebble' } });
		expect(defaultChoices(r.pricing)).toEqual({
			options: [],
			alternates: { topping: 'topping-pebble' }
		});
	});
});

describe('overrides priced against a prepared price list', () => {
	it('give the same lines and totals as the catalog validated on each call', () => {
		const prepared = prepareCatalog(demoCatalog());
		const result = estimate(demoDesign(), prepared);
		if (!result.ok) throw new Error('prices');
		const line = result.pricing.lines.find((l) => l.bucket === 'base' && l.unit === 'each')!;
		const o: LineOverride = {
			key: lineKey(line),
			kind: 'override',
			bucket: line.bucket,
			description: line.description,
			unit: line.unit,
			quantity: line.quantity + 1,
			unitPriceCents: line.unitPriceCents,
			unitCostCents: 0,
			taxable: line.taxable,
			computed: { quantity: line.quantity, unitPriceCents: line.unitPriceCents },
			reason: 'One spare'
		};
		const once = priceWithOverrides(result, demoDesign(), prepared, [o]);
		expect(once).toEqual(priceWithOverrides(result, demoDesign(), demoCatalog(), [o]));
		expect(once.lines.find((l) => l.key === o.key)?.quantity).toBe(line.quantity + 1);
	});
});
