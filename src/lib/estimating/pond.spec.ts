import { describe, expect, it } from 'vitest';
import { demoCatalog } from '../../../scripts/seed/demo-catalog';
import { estimate } from './index';
import { analysePond, linerSizeFt, pondErrors, pondGallons, pondPlan } from './pond';
import { catalogSchema, featureSchema, settingsSchema, type Pond } from './schema';
import { fitSheets } from './sheets';

const settings = settingsSchema.parse({});
const catalog = catalogSchema.parse(demoCatalog());
const pond = (extra: Record<string, unknown> = {}) =>
	featureSchema.parse({
		id: 'p',
		kind: 'pond',
		name: 'Pond',
		outline: { shape: 'rectangle', lengthFt: 10, widthFt: 8 },
		zones: [
			{ depthIn: 8, percent: 30 },
			{ depthIn: 18, percent: 40 },
			{ depthIn: 30, percent: 30 }
		],
		use: 'fish',
		...extra
	}) as Pond;

describe('pond volume (NIST: 1 US gallon = 231 in³)', () => {
	it('one cubic foot is 1728 / 231 = 7.4805 gallons', () => {
		// NIST Handbook 44, Appendix C: 1 gal = 231 in³; 1 ft³ = 1728 in³, so 7.48052 gal.
		expect(pondGallons(1, [{ depthIn: 12, percent: 100 }])).toBeCloseTo(7.4805, 4);
	});

	it('sums the zones: 10 × 8 ft with 30% at 8 in, 40% at 18 in, 30% at 30 in', () => {
		// By hand: 80 ft² × (0.3 × 8/12 + 0.4 × 18/12 + 0.3 × 30/12) ft = 80 × 1.55 = 124 ft³;
		// 124 × 1728 / 231 = 927.58 gal.
		const r = analysePond(pond(), catalog.items, settings);
		expect(r.gallons).toBeCloseTo(927.58, 2);
		expect(r.maxDepthM).toBeCloseTo(0.762, 6); // 30 in × 0.0254 m
	});
});

describe('outline', () => {
	it('an oval is π·a·b with Ramanujan’s perimeter, against a numerical integral', () => {
		// a = 6, b = 4: area π × 24 = 75.398 ft². The perimeter by midpoint integration of
		// √(a² sin²t + b² cos²t) over a quarter (100 000 steps, by hand in Python) is 31.73088 ft.
		const p = pondPlan({ shape: 'oval', lengthFt: 12, widthFt: 8 });
		expect(p.areaFt2).toBeCloseTo(75.398, 3);
		expect(p.perimeterFt).toBeCloseTo(31.73088, 4);
	});

	it('a polygon by its corners: an L of 10 × 4 plus 4 × 4 is 56 ft² and 36 ft round', () => {
		const p = pondPlan({
			shape: 'polygon',
			pointsFt: [
				[0, 0],
				[10, 0],
				[10, 4],
				[4, 4],
				[4, 8],
				[0, 8]
			]
		});
		expect(p.areaFt2).toBe(56);
		expect(p.perimeterFt).toBe(36);
		expect([p.lengthFt, p.widthFt]).toEqual([10, 8]);
	});

	it('crossing edges and zones that do not make 100% are field errors, not NaN', () => {
		const bowtie = pond({
			outline: {
				shape: 'polygon',
				pointsFt: [
					[0, 0],
					[4, 4],
					[4, 0],
					[0, 4]
				]
			}
		});
		expect(pondErrors(bowtie)[0]).toMatchObject({ path: ['outline', 'pointsFt'] });
		const result = estimate({ name: 'x', features: [bowtie] }, demoCatalog());
		expect(result.ok).toBe(false);
		expect(result.ok ? [] : result.errors.map((e) => e.path)).toContain(
			'design.features.0.outline.pointsFt'
		);
		const short = estimate(
			{ name: 'x', features: [pond({ zones: [{ depthIn: 12, percent: 60 }] })] },
			demoCatalog()
		);
		expect(short.ok ? [] : short.errors).toContainEqual({
			path: 'design.features.0.zones',
			message: 'The depth zones cover 60% of the surface: they must add up to 100%'
		});
	});
});

describe('liner (common practice, no source: 1 ft of overlap at each edge)', () => {
	it('is length and width plus twice the deepest zone plus twice the overlap', () => {
		// 10 + 2 × 2.5 + 2 × 1 = 17 ft; 8 + 2 × 2.5 + 2 × 1 = 15 ft.
		expect(linerSizeFt(10, 8, 2.5, 1)).toEqual({ lengthFt: 17, widthFt: 15 });
		expect(analysePond(pond(), catalog.items, settings).liner).toEqual({
			lengthFt: 17,
			widthFt: 15
		});
	});

	it('takes the smallest stocked sheet that covers, or seams sheets with a note', () => {
		const sheet = catalog.items.find((i) => i.sku === 'LINER-EPDM-10X15')!;
		// 17 × 15 ft: 10 × 15 is too small, 15 × 20 covers (20 ≥ 17, 15 ≥ 15).
		expect(fitSheets({ lengthFt: 17, widthFt: 15 }, sheet, catalog.items, 'Liner')).toMatchObject({
			sku: 'LINER-EPDM-15X20',
			count: 1,
			seams: 0
		});
		// 40 × 40 ft: nothing covers. 25 × 30 sheets lapped 6 in: along 40 with 30 → 1 + ⌈10/29.5⌉ = 2,
		// across 40 with 25 → 1 + ⌈15/24.5⌉ = 2: four sheets (by hand), the fewest of any size.
		const big = fitSheets({ lengthFt: 40, widthFt: 40 }, sheet, catalog.items, 'Liner');
		expect(big.count).toBe(4);
		expect(big.seams).toBe(3);
		expect(big.note).toMatch(/no stocked sheet covers 40\.0 × 40\.0 ft/);
	});
});

describe('pump, skimmer, filter and fish (common practice, no source)', () => {
	it('turns a fish pond over hourly and a plant pond every two hours', () => {
		// 927.58 gal an hour, and half that for plants.
		const fish = analysePond(pond(), catalog.items, settings);
		const plants = analysePond(pond({ use: 'plants' }), catalog.items, settings);
		expect(fish.turnoverFlowM3s / plants.turnoverFlowM3s).toBeCloseTo(2, 10);
		// NIST: 1 gal = 231 in³ = 0.003785411784 m³.
		expect((fish.turnoverFlowM3s * 3600) / 0.003785411784).toBeCloseTo(927.58, 1);
	});

	it('chooses the smallest skimmer by rated flow and filter by rated volume', () => {
		const r = analysePond(pond(), catalog.items, settings);
		expect(r.skimmerSku).toBe('SKIM-2000');
		expect(r.filterSku).toBe('BIOFILTER-1500');
		// 30 × 20 ft at 30 in: 1500 ft³ = 11 221 gal, over any filter in the list.
		const large = analysePond(
			pond({
				outline: { shape: 'rectangle', lengthFt: 30, widthFt: 20 },
				zones: [{ depthIn: 30, percent: 100 }]
			}),
			catalog.items,
			settings
		);
		expect(large.filterSku).toBeUndefined();
		expect(large.warnings.join(' ')).toMatch(/no biological filter .* rated for 11221 gal/);
	});

	it('warns past 1 in of fish per 10 gal (common practice, no source)', () => {
		// 927.58 gal / 10 = 92.8 in of fish.
		const r = analysePond(pond({ fishInches: 120 }), catalog.items, settings);
		expect(r.fishCapacityIn).toBeCloseTo(92.76, 2);
		expect(r.warnings.join(' ')).toMatch(/120 in of fish is over the guideline of 93 in/);
	});

	it('evaporation and top-ups: 0.25 in a day against a 2 in drop is 8 days', () => {
		// Both figures are the schema's defaults (common practice, no source).
		const r = analysePond(pond(), catalog.items, settings);
		expect(r.daysBetweenTopUps).toBe(8);
		// 80 ft² × 0.25/12 ft = 1.6667 ft³ = 12.47 gal a day.
		expect(r.evaporationM3PerDay / 0.003785411784).toBeCloseTo(12.47, 2);
	});
});

describe('a pond in an estimate', () => {
	it('prices liner, underlayment, skimmer, filter, gravel and edge, and cautions about open water', () => {
		const result = estimate(
			{
				name: 'Pond',
				features: [
					pond({
						linerSku: 'LINER-EPDM-10X15',
						underlaymentSku: 'UNDERLAY-FT2',
						gravelSku: 'AGG-PEBBLE-RIVER',
						edgeStoneSku: 'STONE-EDGE-FLAG'
					})
				]
			},
			demoCatalog()
		);
		expect(result.ok).toBe(true);
		if (!result.ok) return;
		const qty = (sku: string) => result.pricing.lines.find((l) => l.sku === sku)?.quantity;
		expect(qty('LINER-EPDM-15X20')).toBe(1);
		expect(qty('UNDERLAY-FT2')).toBe(255); // by the square foot, cut to 17 × 15 ft
		expect(qty('SKIM-2000')).toBe(1);
		// Edge: 36 ft of rim × 1 ft wide = 36 ft².
		expect(qty('STONE-EDGE-FLAG')).toBe(36);
		const open = result.cautions.find((c) => c.id === 'open-water')!;
		expect(open.reason).toMatch(/Pond holds about 30 in of open water/);
		expect(open.reason).toMatch(/barrier/);
	});
});
