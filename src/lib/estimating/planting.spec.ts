import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analysePlanting, cellAreaM2, plantingTasks, plantsFor } from './planting';
import { featureSchema, settingsSchema, type PlantingFeature } from './schema';
import { starterPlanting } from './starter-yard';
import { demoCatalog } from '../../../scripts/seed/demo-catalog';
import { catalogSchema } from './schema';
import { fromSI } from './units';

const settings = settingsSchema.parse({});
const planting = (over: Record<string, unknown> = {}) =>
	featureSchema.parse({
		...starterPlanting(catalogSchema.parse(demoCatalog()).items),
		...over
	}) as PlantingFeature;

/** Points of a triangular lattice of spacing s inside [0, side)²: rows s·√3/2 apart, every other shifted s/2. */
function latticePoints(side: number, s: number): number {
	const rowGap = (s * Math.sqrt(3)) / 2;
	let n = 0;
	for (let row = 0; row * rowGap < side; row++) {
		for (let x = row % 2 ? s / 2 : 0; x < side; x += s) n++;
	}
	return n;
}

describe('plants by spacing', () => {
	it('counts a triangular layout as its lattice does', () => {
		// Geometry: a triangular grid of spacing s puts one plant on each s²·√3/2 of ground. Count
		// the lattice's points in a square 100 spacings a side and compare.
		const s = 1;
		const side = 100;
		const counted = latticePoints(side, s);
		const formula = plantsFor(side * side, s, 'triangular');
		expect(Math.abs(formula - counted) / counted).toBeLessThan(0.01);
		// A square grid: exactly one plant per s², 100 × 100.
		expect(plantsFor(side * side, s, 'square')).toBe(10_000);
	});

	it('fits 2/√3 as many plants on a triangular grid as on a square one', () => {
		expect(cellAreaM2(1, 'square') / cellAreaM2(1, 'triangular')).toBeCloseTo(2 / Math.sqrt(3), 12);
	});
});

describe('a planting bed', () => {
	const f = planting();
	const r = analysePlanting(f, settings);

	it('counts each group over its share of the beds, and specimens by number', () => {
		// 16 × 6 ft = 96 ft²; perennials on 60% at 18 in triangular: 57.6 / (1.5² × √3/2) = 29.56 → 30.
		const [perennials, grasses, shrubs] = r.groups;
		expect(perennials.count).toBe(Math.ceil(57.6 / (2.25 * (Math.sqrt(3) / 2))));
		expect(perennials.count).toBe(30);
		expect(grasses.count).toBe(Math.ceil(38.4 / (4 * (Math.sqrt(3) / 2)))); // 12
		expect(shrubs.count).toBe(3);
		expect(r.plantCount).toBe(45);
	});

	it('orders mulch and amendment by depth, with waste', () => {
		// 96 ft² × 3 in × 1.1 = 26.4 ft³ of mulch; × 2 in × 1.1 = 17.6 ft³ of compost.
		expect(fromSI(r.mulchM3, 'volume', 'ft3')).toBeCloseTo(26.4, 9);
		expect(fromSI(r.amendM3, 'volume', 'ft3')).toBeCloseTo(17.6, 9);
	});

	it('plants by the container: people × hours from the firm’s person-hours', () => {
		const tasks = plantingTasks(f, r, settings, 'base');
		const rates = settings.labor.rates;
		const plant = (name: string) => tasks.find((t) => t.task.startsWith(`Plant ${name}`))!;
		expect(plant('Perennials').hours).toBeCloseTo(30 * rates['plant-1-gal'], 9);
		expect(plant('Flowering shrubs').hours).toBeCloseTo(3 * rates['plant-5-gal'], 9);
		expect(plant('Perennials').people).toBe(settings.labor.baseCrewSize);
		for (const t of tasks) expect(t.people * t.hoursEach).toBeCloseTo(t.hours, 12);
		const mulch = tasks.find((t) => t.task.startsWith('Spread mulch'))!;
		expect(mulch.hours).toBeCloseTo((26.4 / 27) * rates.mulch, 9);
	});

	it('warns when the groups cover more than the whole bed', () => {
		const over = planting({
			groups: [
				{ id: 'a', name: 'A', spacingIn: 12, coverPercent: 70 },
				{ id: 'b', name: 'B', spacingIn: 12, coverPercent: 40 }
			]
		});
		expect(analysePlanting(over, settings).warnings.join(' ')).toMatch(/110%/);
	});
});

describe('planting properties', () => {
	it('more area never fewer plants; wider spacing never more; triangular never fewer than square', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0.01, max: 5000, noNaN: true }),
				fc.double({ min: 1, max: 4, noNaN: true }),
				fc.double({ min: 0.05, max: 5, noNaN: true }),
				fc.constantFrom('square' as const, 'triangular' as const),
				(area, k, s, layout) => {
					const n = plantsFor(area, s, layout);
					expect(Number.isFinite(n)).toBe(true);
					expect(n).toBeGreaterThanOrEqual(1);
					expect(plantsFor(area * k, s, layout)).toBeGreaterThanOrEqual(n);
					expect(plantsFor(area, s * k, layout)).toBeLessThanOrEqual(n);
					expect(plantsFor(area, s, 'triangular')).toBeGreaterThanOrEqual(
						plantsFor(area, s, 'square')
					);
				}
			),
			{ numRuns: 300 }
		);
	});
});
