import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { crewTask } from './labor';
import {
	bucketTotals,
	percentOf,
	priceLine,
	priceSummary,
	purchaseQuantity,
	quantityInUnit,
	roundCents,
	type PricedLine
} from './pricing';
import { designSchema, settingsSchema, type CatalogItem } from './schema';
import { toSI } from './units';

const settings = settingsSchema.parse({ markupPercent: 10, taxRatePercent: 8, depositPercent: 30 });
const rate = { costPerHourCents: 4000, pricePerHourCents: 8000 };

const item = (overrides: Partial<CatalogItem>): CatalogItem => ({
	sku: 'X',
	name: 'Item',
	category: 'other',
	unit: 'each',
	unitCost: 500,
	unitPrice: 1000,
	taxable: true,
	...overrides
});

const line = (bucket: string, extendedCents: number, taxable = true): PricedLine => ({
	bucket,
	sku: 'X',
	name: 'X',
	description: '',
	unit: 'each',
	quantity: 1,
	unitPriceCents: extendedCents,
	extendedCents,
	costCents: Math.floor(extendedCents / 2),
	taxable
});

describe('the rounding rule: each amount to the nearest cent, halves up', () => {
	it('rounds halves up, including binary fractions such as 1.005 × 100', () => {
		expect(roundCents(2.5)).toBe(3);
		expect(roundCents(2.4999)).toBe(2);
		expect(roundCents(1.005 * 100)).toBe(101);
		expect(percentOf(1999, 7.25)).toBe(145); // 144.9275
		expect(percentOf(1000, 0.05)).toBe(1); // 0.5, half up
	});
});

describe('quantities in the item’s unit', () => {
	it('converts volume to yd³, tons by bulk density, bags and loads', () => {
		const volume = toSI(27, 'volume', 'ft3');
		expect(quantityInUnit({ volumeM3: volume }, item({ unit: 'yd3' }))).toBeCloseTo(1, 12);
		expect(
			quantityInUnit({ volumeM3: volume }, item({ unit: 'ton', bulkDensityLbFt3: 100 }))
		).toBeCloseTo(1.35, 12);
		expect(
			quantityInUnit({ volumeM3: volume }, item({ unit: 'bag', bagVolumeFt3: 0.5 }))
		).toBeCloseTo(54, 9);
		expect(
			quantityInUnit({ volumeM3: volume }, item({ unit: 'load', loadVolumeYd3: 10 }))
		).toBeCloseTo(0.1, 12);
		expect(quantityInUnit({ volumeM3: volume }, item({ unit: 'ton' }))).toBeUndefined();
		expect(quantityInUnit({ count: 3 }, item({ unit: 'ft' }))).toBeUndefined();
	});

	it('rounds up to the purchase increment: whole bags, tenths of a ton', () => {
		expect(purchaseQuantity(53.2, item({ unit: 'bag' }))).toBe(54);
		expect(purchaseQuantity(1.31, item({ unit: 'ton' }))).toBe(1.4);
		expect(purchaseQuantity(1.3, item({ unit: 'ton' }))).toBe(1.3);
		expect(purchaseQuantity(7, item({ unit: 'ft', increment: 10 }))).toBe(10);
	});

	it('prices a line at the price-list price', () => {
		const priced = priceLine(
			{ bucket: 'base', sku: 'X', description: 'd', measure: { count: 3 } },
			item({ unitPrice: 1333 }),
			2.2
		);
		expect(priced.quantity).toBe(3);
		expect(priced.extendedCents).toBe(3999);
		expect(priced.costCents).toBe(1500);
	});
});

const task = (hours: number) =>
	crewTask({ bucket: 'base', key: 'extra', task: 't', people: 1, hours, basis: '' });

describe('bucket totals, worked by hand', () => {
	it('$100.00 taxable + $50.00 untaxed + 2 h at $80: markup 10%, tax 8% on taxable materials with markup', () => {
		const t = bucketTotals(
			[line('base', 10000), line('base', 5000, false)],
			[task(2)],
			rate,
			settings
		);
		expect(t.materialsCents).toBe(15000);
		expect(t.laborCents).toBe(16000);
		expect(t.subtotalCents).toBe(31000);
		expect(t.markupCents).toBe(3100);
		expect(t.taxCents).toBe(880); // 10000 × 1.10 × 0.08
		expect(t.totalCents).toBe(34980);
		expect(t.costCents).toBe(5000 + 2500 + 8000);
	});

	it('tax on everything when the settings say so', () => {
		const t = bucketTotals([line('base', 10000)], [task(1)], rate, {
			...settings,
			taxAppliesTo: 'all'
		});
		// 10000 materials + 1 h at 8000 = 18000; × 1.10 markup = 19800; × 8% tax = 1584.
		expect(t.taxCents).toBe(1584);
	});
});

describe('options, alternates, deposit', () => {
	const design = designSchema.parse({
		options: [
			{ id: 'lights', name: 'Lights', selected: true },
			{ id: 'wall', name: 'Wall', selected: false }
		],
		alternates: [
			{
				id: 'top',
				name: 'Topping',
				choices: [
					{ id: 'pebble', name: 'Pebble' },
					{ id: 'slate', name: 'Slate' }
				],
				selectedChoiceId: 'slate'
			}
		]
	});
	const lines = [
		line('base', 10000),
		line('lights', 2000),
		line('wall', 50000),
		line('pebble', 1000),
		line('slate', 3000)
	];
	const summary = priceSummary(design, lines, [], rate, {
		...settings,
		markupPercent: 0,
		taxRatePercent: 0
	});

	it('the total takes the base, selected options and the chosen alternate only', () => {
		expect(summary.totalCents).toBe(10000 + 2000 + 3000);
		expect(summary.options.find((o) => o.id === 'wall')!.totals.totalCents).toBe(50000);
	});

	it('each alternate choice shows its difference from the chosen one', () => {
		const choices = summary.alternates[0].choices;
		expect(choices.find((c) => c.id === 'pebble')!.deltaCents).toBe(-2000);
		expect(choices.find((c) => c.id === 'slate')!.deltaCents).toBe(0);
	});

	it('deposit is 30% of the total, and deposit + balance = total', () => {
		expect(summary.depositCents).toBe(4500);
		expect(summary.depositCents + summary.balanceCents).toBe(summary.totalCents);
	});

	it('property: totals are integers and the bucket parts always add up (fast-check)', () => {
		fc.assert(
			fc.property(
				fc.array(fc.tuple(fc.integer({ min: 0, max: 10_000_000 }), fc.boolean()), {
					maxLength: 12
				}),
				fc.double({ min: 0, max: 200, noNaN: true }),
				fc.double({ min: 0, max: 40, noNaN: true }),
				fc.double({ min: 0, max: 50, noNaN: true }),
				(amounts, hours, markupPercent, taxRatePercent) => {
					const t = bucketTotals(
						amounts.map(([a, taxable]) => line('base', a, taxable)),
						[task(hours)],
						rate,
						{ ...settings, markupPercent, taxRatePercent }
					);
					for (const v of Object.values(t)) {
						if (v !== t.laborHours) expect(Number.isInteger(v)).toBe(true);
					}
					expect(t.totalCents).toBe(t.materialsCents + t.laborCents + t.markupCents + t.taxCents);
				}
			)
		);
	});
});
