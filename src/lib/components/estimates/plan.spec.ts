import { describe, expect, it } from 'vitest';
import { fountainIn } from '../../../../tests/support/fountain';
import { designSchema } from '$lib/estimating';
import { demoDesign } from '$lib/estimating/demo';
import { includedBuckets } from '$lib/estimating/pricing';
import { yardDesign } from '../../../../scripts/bench/designs';
import { boxOf } from './geometry';
import { inclusionFor, planOf } from './plan';

const demo = () => designSchema.parse(demoDesign());

describe('plan drawing layout', () => {
	it('draws the demo with its basin, three outlets on the columns, one topping and the lights', () => {
		const design = demo();
		const plan = planOf(design, inclusionFor(design, includedBuckets(design)));
		expect(plan.basin?.label).toBe('Basin 6 × 4 ft');
		expect(plan.outlets.map((o) => o.n)).toEqual([1, 2, 3]);
		// The alternate's other topping (slate) is not drawn; the pebble one is, at 8 × 6 ft.
		expect(plan.toppings.map((t) => t.name)).toEqual(['River pebble topping']);
		expect(plan.toppings[0].areaFt2).toBeCloseTo(48, 9);
		// The wall is an option not taken: drawn, marked optional, behind everything else.
		expect(plan.walls).toHaveLength(1);
		expect(plan.walls[0].optional).toBe(true);
		const wallBottom = Math.max(...plan.walls[0].points.map((p) => p[1]));
		const toppingTop = Math.min(...plan.areas.flatMap((a) => a.points.map((p) => p[1])));
		expect(wallBottom).toBeLessThan(toppingTop);
		expect(plan.runs).toHaveLength(1);
		expect(plan.runs[0].fixtures.map((f) => f.distanceFt)).toEqual([30, 36, 55]);
		// Every outlet sits inside the basin's outline.
		for (const o of plan.outlets) {
			expect(Math.abs(o.at[0])).toBeLessThan(3);
			expect(Math.abs(o.at[1])).toBeLessThan(2);
		}
	});

	it('follows the choices: the other topping, the wall taken, lights left out with their alternate', () => {
		const design = demo();
		design.lighting!.optionId = 'topping-slate';
		const chosen = new Set(['low-wall', 'topping-slate']);
		const plan = planOf(design, inclusionFor(design, chosen));
		expect(plan.toppings.map((t) => t.name)).toEqual(['Slate chip topping']);
		expect(plan.walls[0].optional).toBe(false);
		expect(plan.runs).toHaveLength(1);
		const other = planOf(design, inclusionFor(design, new Set(['topping-pebble'])));
		expect(other.runs).toHaveLength(0);
	});

	it('spreads the outlets along the basin when they outnumber the wetted stones', () => {
		const design = demo();
		fountainIn(design).outlets.push({
			id: 'col-4',
			name: 'Fourth',
			kind: 'bubbler',
			bubbleHeightIn: 3,
			boreIn: 0.8
		});
		const plan = planOf(design, inclusionFor(design, includedBuckets(design)));
		const xs = plan.outlets.map((o) => o.at[0]);
		// Four outlets over a 6 ft basin: every 1.2 ft from -1.8 to 1.8, none on top of another.
		expect(xs.map((x) => Math.round(x * 10) / 10)).toEqual([-1.8, -0.6, 0.6, 1.8]);
	});

	it('places a second topping area beside the first and keeps it in the bounds', () => {
		const design = demo();
		design.aggregates[0].areas.push({
			shape: 'polygon',
			pointsFt: [
				[0, 0],
				[6, 0],
				[3, 5]
			]
		});
		const plan = planOf(design, inclusionFor(design, includedBuckets(design)));
		const [first, second] = plan.areas;
		const firstRight = Math.max(...first.points.map((p) => p[0]));
		const secondLeft = Math.min(...second.points.map((p) => p[0]));
		expect(secondLeft).toBeGreaterThan(firstRight);
		expect(plan.box.maxX).toBeGreaterThanOrEqual(Math.max(...second.points.map((p) => p[0])));
		expect(plan.toppings[0].areaFt2).toBeCloseTo(48 + 15, 9);
	});
});

describe('every feature is drawn', () => {
	it('a pond, a three-fall stream with its reservoir, and the fountain, each to scale', () => {
		const yard = designSchema.parse(yardDesign());
		const plan = planOf(yard, inclusionFor(yard, new Set()));
		expect(plan.basin?.label).toBe('Basin 6 × 4 ft');
		expect(plan.features.map((f) => f.kind)).toEqual(['pond', 'stream']);
		const [pond, stream] = plan.features;
		expect(pond.detail).toBe('oval 12 × 8 ft, 30 in at the deepest, 3 depth zones');
		// Three 8 ft segments and a 6 ft reservoir: four outlines, a bar at each of the three falls.
		expect(stream.shapes).toHaveLength(4);
		expect(stream.falls).toHaveLength(3);
		const box = boxOf(stream.shapes[0]);
		expect(box.maxX - box.minX).toBeCloseTo(8, 10);
		// Nothing overlaps: each feature starts right of the one before.
		expect(boxOf(stream.shapes.flat()).minX).toBeGreaterThan(boxOf(pond.shapes[0]).maxX);
	});

	it('a whole feature that is an option not taken is drawn dotted; one left out is not drawn', () => {
		const yard = designSchema.parse({
			...yardDesign(),
			options: [{ id: 'pond-option', name: 'Pond', selected: false }]
		});
		yard.features[0].optionId = 'pond-option';
		const plan = planOf(yard, inclusionFor(yard, new Set()));
		expect(plan.features.find((f) => f.kind === 'pond')?.optional).toBe(true);
		const chosen = planOf(yard, inclusionFor(yard, new Set(['pond-option'])));
		expect(chosen.features.find((f) => f.kind === 'pond')?.optional).toBe(false);
	});
});

describe('plan drawing of the yard features', () => {
	it('draws a path’s and a bed’s areas to scale, and a dry creek with its soak-away', async () => {
		const { starterDrainage, starterPath, starterPlanting } =
			await import('$lib/estimating/starter-yard');
		const design = designSchema.parse({
			name: 'Yard',
			features: [starterPath([]), starterPlanting([]), starterDrainage([])]
		});
		const plan = planOf(design, inclusionFor(design, includedBuckets(design)));
		expect(plan.basin).toBeUndefined();
		expect(plan.features.map((f) => f.kind)).toEqual(['path', 'planting', 'drainage']);
		const [path, beds, creek] = plan.features;
		const box = boxOf(path.shapes.flat());
		expect(box.maxX - box.minX).toBeCloseTo(20, 9);
		expect(box.maxY - box.minY).toBeCloseTo(4, 9);
		expect(path.detail).toBe('flagstone over 80 ft², 2 steps');
		expect(beds.detail).toBe('beds of 96 ft², 3 plant groups');
		expect(creek.shapes).toHaveLength(2);
		expect(creek.detail).toBe('creek 30 ft long into a soak-away');
	});
});
