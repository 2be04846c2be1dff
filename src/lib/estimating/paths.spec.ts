import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { BASE_COMPACTION_FACTOR, BEDDING_COMPACTION_FACTOR, compactionFactor } from './earthwork';
import { SOILS } from './labor-rates';
import { analysePath, jointLengthPerArea, pathTasks } from './paths';
import { demoCatalog } from '../../../scripts/seed/demo-catalog';
import { catalogSchema, featureSchema, settingsSchema, type PathFeature } from './schema';
import { starterPath } from './starter-yard';
import { fromSI } from './units';

const settings = settingsSchema.parse({});
const path = (over: Record<string, unknown> = {}) =>
	featureSchema.parse({
		...starterPath(catalogSchema.parse(demoCatalog()).items),
		...over
	}) as PathFeature;
const ft3 = (m3: number) => fromSI(m3, 'volume', 'ft3');
const ft = (m: number) => fromSI(m, 'length', 'ft');

describe('compaction factors', () => {
	it('follow the published soil conversion table', () => {
		// US Army FM 5-434, Earthmoving Operations, table 1-2: sand (or gravel) in place 1.00, loose
		// 1.11, compacted 0.95; common earth 1.25 and 0.90; clay 1.43 and 0.90.
		expect(SOILS.sand).toMatchObject({ swell: 1.11, compaction: 0.95 });
		expect(SOILS.loam).toMatchObject({ swell: 1.25, compaction: 0.9 });
		expect(SOILS.clay).toMatchObject({ swell: 1.43, compaction: 0.9 });
		// Loose per compacted: 1.11 / 0.95 = 1.168 (hand calculation).
		expect(compactionFactor('sand')).toBeCloseTo(1.11 / 0.95, 12);
		expect(BASE_COMPACTION_FACTOR).toBe(1.168);
		expect(BEDDING_COMPACTION_FACTOR).toBe(1.168);
		expect(settings.hardscape.baseCompactionFactor).toBe(BASE_COMPACTION_FACTOR);
	});
});

describe('a flagstone path', () => {
	const r = analysePath(path(), settings);

	it('weighs the flagstone from area, thickness and the rock’s density', () => {
		// Hand calculation: 20 × 4 ft, 10% joints, 1.5 in thick, 10% waste: 80 × 0.9 × 0.125 × 1.1
		// = 9.9 ft³ of sandstone at 2.5 g/cm³ (midpoint of 2.2–2.8, Alden's rock densities), 156.07
		// lb/ft³: 1,545 lb.
		expect(ft3(r.stoneVolumeM3)).toBeCloseTo(9.9, 9);
		expect(fromSI(r.stoneMassKg, 'mass', 'lb')).toBeCloseTo(
			(9.9 * 2500 * 0.0283168466) / 0.45359237,
			3
		);
	});

	it('orders the base and bedding loose, with their compaction factors', () => {
		// 80 ft² × 4 in = 26.67 ft³ compacted; × 1.168 loose. Bedding 80 ft² × 1 in × 1.168.
		expect(ft3(r.baseCompactedM3)).toBeCloseTo(80 / 3, 9);
		expect(ft3(r.baseLooseM3)).toBeCloseTo((80 / 3) * BASE_COMPACTION_FACTOR, 9);
		expect(ft3(r.beddingLooseM3)).toBeCloseTo((80 / 12) * BEDDING_COMPACTION_FACTOR, 9);
		// Dug out: the surface and both layers, 80 × (1.5 + 4 + 1)/12 ft³.
		expect(ft3(r.excavationM3)).toBeCloseTo((80 * 6.5) / 12, 9);
	});

	it('restrains the edge that is not against something else, and fills 10% of joints', () => {
		expect(ft(r.edgeM)).toBeCloseTo(48, 9);
		expect(ft(analysePath(path({ edgeExcludedFt: 4 }), settings).edgeM)).toBeCloseTo(44, 9);
		expect(ft3(r.jointFillM3)).toBeCloseTo(80 * 0.1 * 0.125, 9);
	});

	it('gives each task its people and hours: crew-hours are people × hours', () => {
		const tasks = pathTasks(path(), r, settings, 'base');
		const lay = tasks.find((t) => t.task.startsWith('Lay flagstone'))!;
		// 80 ft² at the firm's flagstone rate in person-hours a ft², shared by the base crew.
		const people = settings.labor.baseCrewSize;
		expect(lay.people).toBe(people);
		expect(lay.hours).toBeCloseTo(80 * settings.labor.rates.flagstone, 9);
		expect(lay.hoursEach * lay.people).toBeCloseTo(lay.hours, 12);
		const steps = tasks.find((t) => t.task.startsWith('Build steps'))!;
		expect(steps.hours).toBeCloseTo(2 * settings.labor.rates.step, 9);
		// The layers by their loose volume: (26.67 + 6.67) ft³ × 1.168 ÷ 27 yd³.
		const layers = tasks.find((t) => t.key === 'path-layers')!;
		expect(layers.hours).toBeCloseTo(
			((100 / 3) * 1.168 * settings.labor.rates['path-layers']) / 27,
			9
		);
		// Digging is not a path task: the design digs it with the rest (by hand or machine).
		expect(tasks.some((t) => t.key.startsWith('dig'))).toBe(false);
	});
});

describe('pavers', () => {
	it('own half their perimeter of joint: 4.5 ft of joint per ft² of 8 × 4 in pavers', () => {
		// Geometry: 144/32 = 4.5 pavers per ft², each owning (8 + 4) in of joint = 54 in.
		expect(jointLengthPerArea(8, 4) * 144).toBeCloseTo(54, 9);
		const r = analysePath(path({ surface: 'pavers', thicknessIn: 2.375 }), settings);
		expect(r.stoneMassKg).toBe(0);
		expect(r.paverCount).toBe(Math.ceil(80 * 1.1 * 4.5));
		// Joint sand: 80 ft² × 4.5 ft/ft² × 1/8 in wide × 2.375 in deep.
		expect(ft3(r.jointFillM3)).toBeCloseTo((80 * 4.5 * (0.125 / 12) * 2.375) / 12, 9);
	});
});

describe('steps', () => {
	it('warn when the rise or tread is outside the residential code', () => {
		const steep = analysePath(
			path({ steps: { count: 3, riseIn: 8, treadIn: 9, widthFt: 4 } }),
			settings
		);
		const text = steep.warnings.join(' ');
		expect(text).toMatch(/R311\.7\.5\.1/);
		expect(text).toMatch(/R311\.7\.5\.2/);
		expect(ft(steep.steps!.totalRiseM)).toBeCloseTo(2, 9);
		const easy = analysePath(path(), settings);
		expect(easy.warnings).toEqual([]);
	});
});

describe('path properties', () => {
	it('finite, never negative, and a larger path never needs less stone, base or work', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 1, max: 200, noNaN: true }),
				fc.double({ min: 1, max: 50, noNaN: true }),
				fc.double({ min: 1, max: 3, noNaN: true }),
				fc.constantFrom('flagstone' as const, 'pavers' as const),
				fc.double({ min: 0.5, max: 4, noNaN: true }),
				(l, w, grow, surface, thick) => {
					const make = (length: number) => {
						const f = path({
							surface,
							thicknessIn: thick,
							areas: [{ shape: 'rectangle', lengthFt: length, widthFt: w }]
						});
						const r = analysePath(f, settings);
						return {
							r,
							hours: pathTasks(f, r, settings, 'base').reduce((s, t) => s + t.hours, 0)
						};
					};
					const a = make(l);
					const b = make(l * grow);
					for (const { r, hours } of [a, b]) {
						for (const v of [
							r.stoneMassKg,
							r.paverCount,
							r.baseLooseM3,
							r.edgeM,
							r.excavationM3,
							hours
						]) {
							expect(Number.isFinite(v)).toBe(true);
							expect(v).toBeGreaterThanOrEqual(0);
						}
					}
					expect(b.r.stoneMassKg).toBeGreaterThanOrEqual(a.r.stoneMassKg);
					expect(b.r.paverCount).toBeGreaterThanOrEqual(a.r.paverCount);
					expect(b.r.baseLooseM3).toBeGreaterThanOrEqual(a.r.baseLooseM3);
					expect(b.hours).toBeGreaterThanOrEqual(a.hours - 1e-9);
				}
			),
			{ numRuns: 150 }
		);
	});
});
