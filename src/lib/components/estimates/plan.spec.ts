import { describe, expect, it } from 'vitest';
import { fountainIn } from '../../../../tests/support/fountain';
import { designSchema, estimate } from '$lib/estimating';
import { demoDesign } from '../../../../scripts/seed/demo-catalog';
import { includedBuckets } from '$lib/estimating/pricing';
import { yardDesign } from '../../../../scripts/bench/designs';
import { boxOf } from './geometry';
import { inclusionFor, planOf, planSizes } from './plan';

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
		// Without the engine's figures, the sizes at the default settings (worked below).
		expect(creek.detail).toBe(
			'creek 30 ft long, 3 ft across the top into a soak-away 9.3 ft square, 3 ft deep'
		);
	});

	it('draws the creek as wide and the soak-away as large as the engine sizes them', async () => {
		const { starterDrainage } = await import('$lib/estimating/starter-yard');
		const design = designSchema.parse({ name: 'Yard', features: [starterDrainage([])] });
		const drawn = (lengthFt: number, widthFt: number) => {
			const d = structuredClone(design);
			const f = d.features[0];
			if (f.kind === 'drainage') f.catchment.areas = [{ shape: 'rectangle', lengthFt, widthFt }];
			const r = estimate(d, { items: [] });
			if (!r.ok) throw new Error('estimates');
			const plan = planOf(d, inclusionFor(d, includedBuckets(d)), planSizes(r.features));
			const [channel, pit] = plan.features[0].shapes.map(boxOf);
			return {
				creekWidthFt: channel.maxY - channel.minY,
				creekLengthFt: channel.maxX - channel.minX,
				soakFt: [pit.maxX - pit.minX, pit.maxY - pit.minY],
				result: r.features[0].drainage!
			};
		};
		// Worked by hand at the default 2 in/h. Runoff of one 60 min storm from 600 ft² of roof at C = 0.9:
		// 0.9 × 2/12 ft × 600 ft² = 90 ft³; in gravel with 35% voids 90 / 0.35 = 257.1 ft³; 3 ft deep,
		// a pit of √(257.1 / 3) = 9.26 ft square (soak-away sizing from the runoff volume and the voids).
		// Peak flow Q = C·i·A = 0.025 ft³/s, far below what a V of 2:1 banks 6 in deep carries at 2%
		// (Manning, n = 0.04: 0.97 ft³/s), so the bottom is 0 wide and the top, freeboard included,
		// 2 × 2 × (6 + 3) in = 3 ft.
		const storm = drawn(30, 20);
		expect(storm.creekLengthFt).toBeCloseTo(30, 9);
		expect(storm.creekWidthFt).toBeCloseTo(3, 6);
		expect(storm.soakFt[0]).toBeCloseTo(9.258, 3);
		expect(storm.soakFt[1]).toBeCloseTo(9.258, 3);
		// The drawing follows the engine's own figures, whatever they are.
		expect(storm.creekWidthFt * 0.3048).toBeCloseTo(storm.result.creek!.topWidthM, 9);
		expect(storm.soakFt[0] * 0.3048).toBeCloseTo(storm.result.soakaway!.sideM, 9);
		// A 200 × 150 ft yard sends 1.25 ft³/s, more than the V carries: the creek gets a flat bottom
		// and is drawn wider, the soak-away larger.
		const heavy = drawn(200, 150);
		expect(heavy.result.creek!.bottomM).toBeGreaterThan(0);
		expect(heavy.creekWidthFt).toBeGreaterThan(storm.creekWidthFt);
		expect(heavy.soakFt[0]).toBeGreaterThan(storm.soakFt[0]);
	});
});
