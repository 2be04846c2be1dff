import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { crewHours } from './crew';
import {
	BASE_COMPACTION_FACTOR,
	BEDDING_COMPACTION_FACTOR,
	COMPACTED_PER_BANK,
	SWELL_PERCENT,
	compactionFactor
} from './earthwork';
import { analysePath, jointLengthPerArea, pathTasks } from './paths';
import { demoCatalog } from './demo';
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
	it('follow the published swell and compaction tables', () => {
		// Swell, bank to loose: projectengineer.net "Swell factors for various soils" (the Caterpillar
		// Performance Handbook's table): gravel, dry 12%; sand, dry 12%.
		expect(SWELL_PERCENT).toEqual({ gravel: 12, sand: 12 });
		// Compacted per bank volume: infralens.in "Earthwork bulking and shrinkage", compaction
		// factors: gravel-sand 0.88–0.93, sand 0.88–0.92.
		expect(COMPACTED_PER_BANK.gravel).toEqual([0.88, 0.93]);
		expect(COMPACTED_PER_BANK.sand).toEqual([0.88, 0.92]);
		// Loose per compacted = 1.12 / 0.905 and 1.12 / 0.90 (hand calculation).
		expect(compactionFactor('gravel')).toBeCloseTo(1.12 / 0.905, 12);
		expect(compactionFactor('sand')).toBeCloseTo(1.12 / 0.9, 12);
		expect(settings.hardscape.baseCompactionFactor).toBe(BASE_COMPACTION_FACTOR);
		expect(BASE_COMPACTION_FACTOR).toBeCloseTo(1.238, 3);
		expect(BEDDING_COMPACTION_FACTOR).toBeCloseTo(1.244, 3);
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
		// 80 ft² × 4 in = 26.67 ft³ compacted; × 1.238 loose. Bedding 80 ft² × 1 in × 1.244.
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
		const tasks = pathTasks(path(), r, settings);
		const dig = tasks.find((t) => t.task.startsWith('Dig'))!;
		// 43.33 ft³ at 8 ft³ per person-hour, two people: 2.71 h on the clock, 5.42 crew-hours.
		expect(dig.people).toBe(2);
		expect(dig.hours).toBeCloseTo((80 * 6.5) / 12 / 8 / 2, 9);
		expect(crewHours(dig)).toBeCloseTo((80 * 6.5) / 12 / 8, 9);
		const steps = tasks.find((t) => t.task.startsWith('Build steps'))!;
		expect(crewHours(steps)).toBeCloseTo(2 * settings.hardscape.stepPersonHours, 9);
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
						return { r, hours: pathTasks(f, r, settings).reduce((s, t) => s + crewHours(t), 0) };
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
