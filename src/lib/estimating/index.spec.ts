import fc from 'fast-check';
import { fountainIn } from '../../../tests/support/fountain';
import { describe, expect, it } from 'vitest';
import { demoCatalog, demoDesign } from '../../../scripts/seed/demo-catalog';
import { estimate, prepareCatalog, type Design, type EstimateSuccess } from './index';
import { twelveOutletDesign, yardDesign } from '../../../scripts/bench/designs';
import { sizesFor, PIPE_MATERIALS } from './pipes';
import { ROCK_TYPES } from './stones';

/** Signed by nature: an alternate's difference from the chosen one, and margin over cost. */
const SIGNED_KEYS = new Set(['deltaCents', 'marginCents']);

function badNumbers(value: unknown, path = 'result'): string[] {
	if (typeof value === 'number') {
		const key = path.split('.').at(-1)!;
		return !Number.isFinite(value) || (value < 0 && !SIGNED_KEYS.has(key)) ? [path] : [];
	}
	if (Array.isArray(value)) return value.flatMap((v, i) => badNumbers(v, `${path}.${i}`));
	if (value && typeof value === 'object') {
		return Object.entries(value).flatMap(([k, v]) => badNumbers(v, `${path}.${k}`));
	}
	return [];
}

const ok = (design: unknown = demoDesign(), catalog: unknown = demoCatalog()): EstimateSuccess => {
	const result = estimate(design, catalog);
	if (!result.ok) throw new Error(JSON.stringify(result.errors));
	return result;
};

const errorsOf = (design: unknown, catalog: unknown = demoCatalog()) => {
	const result = estimate(design, catalog);
	expect(result.ok).toBe(false);
	return result.ok ? [] : result.errors;
};

describe('the demo estimate', () => {
	const result = ok();

	it('is a three-column feature on a manifold with a ball valve per column', () => {
		const design = demoDesign();
		expect(fountainIn(design).outlets).toHaveLength(3);
		expect(fountainIn(design).branches!.every((b) => b.valve === 'ball-valve')).toBe(true);
		expect(result.water!.branches.filter((b) => b.hardest)).toHaveLength(1);
		expect(result.water!.branches.filter((b) => b.throttleHeadM > 0)).toHaveLength(2);
	});

	it('chooses a pump that is suitable, and prices it', () => {
		const chosen = result.water!.pump.evaluations.find(
			(e) => e.id === result.water!.pump.chosenId
		)!;
		expect(chosen.suitable).toBe(true);
		expect(result.pricing.lines[0].sku).toBe(`pump:${chosen.id}`);
	});

	it('has finite, non-negative numbers everywhere, and lines that add up to the totals', () => {
		expect(badNumbers(result)).toEqual([]);
		const base = result.pricing.lines.filter((l) => l.bucket === 'base');
		expect(base.reduce((s, l) => s + l.extendedCents, 0)).toBe(result.pricing.base.materialsCents);
		const selected = result.pricing.alternates[0].choices.find((c) => c.selected)!;
		expect(result.pricing.totalCents).toBe(
			result.pricing.base.totalCents + selected.totals.totalCents
		);
	});

	it('carries the cautions a water feature needs, ending with local codes', () => {
		const ids = result.cautions.map((c) => c.id);
		expect(ids).toEqual(
			expect.arrayContaining([
				'locate-utilities',
				'ground-fault-protection',
				'licensed-electrician',
				'heavy-lifting'
			])
		);
		expect(ids.at(-1)).toBe('local-codes');
	});

	it('selecting the optional wall adds its price to the total', () => {
		const design = demoDesign();
		design.options = [{ id: 'low-wall', name: 'Wall', selected: true }];
		const withWall = ok(design);
		const wall = result.pricing.options[0].totals.totalCents;
		expect(withWall.pricing.totalCents).toBe(result.pricing.totalCents + wall);
	});

	it('is JSON-serialisable input: a JSON round trip gives the same estimate', () => {
		const again = ok(
			JSON.parse(JSON.stringify(demoDesign())),
			JSON.parse(JSON.stringify(demoCatalog()))
		);
		expect(again.pricing.totalCents).toBe(result.pricing.totalCents);
	});

	it('shows metric on request', () => {
		const metric = estimate(demoDesign(), demoCatalog(), { units: 'metric' });
		expect(metric.ok && metric.quantities.find((q) => q.id === 'total-flow')!.display).toMatch(
			/L\/min$/
		);
		expect(result.quantities.find((q) => q.id === 'total-flow')!.display).toMatch(/gph$/);
	});

	it('uses no brand names in the demo: every name is made of plain trade words', () => {
		const text = JSON.stringify([demoDesign(), demoCatalog()]);
		expect(text).not.toMatch(/®|™/);
		// A brand name would need a word outside this generic vocabulary; adding one here is a
		// deliberate, reviewed act. Model letters and sizes (S-900, 16 in) are not words.
		const generic = new Set(
			(
				'a accent and bag ball basalt base basin behind boulder boulders brass burial cable cap ' +
				'chip chips clean column columns compactable core crushed direct drainage drilled drilling ' +
				'elbow feature ft granite gravel in installer kit led light liner low manifold middle multi ' +
				'over path pebble pipe port pump pvc retaining river road round s schedule segmental slate ' +
				'stone submersible tall tap the three through topping transformer underlayment unit ' +
				'uplight va valve voltage wall washed ' +
				'epdm mil pond ponds skimmer rated gph biological filter to gal waterfall weir box flexible ' +
				'reservoir vault stream mixed bank flagstone edging by square foot ' +
				'sandstone concrete paver step slab edge restraint lengths sand for bedding polymeric ' +
				'joint cobble woven landscape fabric creek perennial ornamental grass flowering shrub ' +
				'shredded bark mulch compost soil amendment ' +
				'perforated sock compact track loader mini excavator day machine delivery of or load ' +
				'pick up haul away dump spoil yd loose drain with aggregate'
			).split(' ')
		);
		const names: string[] = [];
		const collect = (value: unknown, key = ''): void => {
			if (typeof value === 'string' && key === 'name') names.push(value);
			else if (Array.isArray(value)) value.forEach((v) => collect(v));
			else if (value && typeof value === 'object') {
				for (const [k, v] of Object.entries(value)) collect(v, k);
			}
		};
		collect([demoDesign(), demoCatalog()]);
		expect(names.length).toBeGreaterThan(40);
		const words = names.flatMap((n) => n.toLowerCase().match(/[a-z]+/g) ?? []);
		expect(words.filter((w) => !generic.has(w))).toEqual([]);
	});
});

describe('bad designs give field-level errors, never NaN, Infinity or an exception', () => {
	it('a negative length', () => {
		const design = demoDesign();
		fountainIn(design).branches![0].lengthFt = -5;
		expect(errorsOf(design)).toContainEqual({
			path: 'design.features.0.branches.0.lengthFt',
			message: 'Must be greater than zero'
		});
	});

	it('a pipe size that does not exist, or not in that material', () => {
		const design = demoDesign();
		(fountainIn(design).branches![0].pipe as { size: string }).size = '5/8';
		expect(errorsOf(design)[0].path).toBe('design.features.0.branches.0.pipe.size');
		const flex = demoDesign();
		fountainIn(flex).branches![1].pipe = { material: 'flex-pvc', size: '3' };
		expect(errorsOf(flex)).toContainEqual({
			path: 'design.features.0.branches.1.pipe.size',
			message: 'flex-pvc has no 3 in size'
		});
	});

	it('an outlet with no branch, and a branch to no outlet', () => {
		const design = demoDesign();
		fountainIn(design).branches = fountainIn(design).branches!.slice(1);
		expect(errorsOf(design)).toContainEqual({
			path: 'design.features.0.outlets.0',
			message: 'This outlet has no branch to feed it'
		});
		const stray = demoDesign();
		fountainIn(stray).branches![0].outletId = 'nowhere';
		expect(errorsOf(stray).map((e) => e.path)).toContain('design.features.0.branches.0.outletId');
	});

	it('a pump curve that is not monotone', () => {
		const catalog = demoCatalog();
		catalog.pumps![1].curve[2].headFt = 20;
		expect(errorsOf(demoDesign(), catalog)).toContainEqual({
			path: 'catalog.pumps.1.curve.2',
			message: 'Flow must rise and head must not rise from one curve point to the next'
		});
	});

	it('NaN, Infinity, strings and missing objects are refused field by field', () => {
		const design = demoDesign() as Record<string, unknown>;
		(fountainIn(design).branches as { lengthFt: number }[])[0].lengthFt = NaN;
		(fountainIn(design).branches as { staticLiftFt: number }[])[1].staticLiftFt = Infinity;
		(fountainIn(design).outlets as { bubbleHeightIn: unknown }[])[0].bubbleHeightIn = '3';
		const paths = errorsOf(design).map((e) => e.path);
		expect(paths).toEqual(
			expect.arrayContaining([
				'design.features.0.branches.0.lengthFt',
				'design.features.0.branches.1.staticLiftFt',
				'design.features.0.outlets.0.bubbleHeightIn'
			])
		);
		const nothing = estimate(null, undefined);
		expect(nothing.ok ? [] : nothing.errors.map((e) => e.path)).toEqual(['design', 'catalog']);
	});

	it('absurdly large numbers are refused before they can overflow', () => {
		const design = demoDesign();
		fountainIn(design).branches![0].lengthFt = 1e300;
		expect(errorsOf(design)).toContainEqual({
			path: 'design.features.0.branches.0.lengthFt',
			message: 'Must be at most 1,000,000'
		});
	});

	it('unknown SKUs, taps, fixtures, options and labor rates', () => {
		const design = demoDesign();
		design.stones![0].sku = 'NOPE';
		design.lighting!.runs[0].tapV = 11;
		design.lighting!.runs[0].fixtures[0].fixtureId = 'ghost';
		design.walls![0].optionId = 'missing';
		const catalog = demoCatalog();
		catalog.settings!.labor = { rateId: 'foreman' };
		const paths = errorsOf(design, catalog).map((e) => e.path);
		expect(paths).toEqual(
			expect.arrayContaining([
				'design.stones.0.sku',
				'design.lighting.runs.0.tapV',
				'design.lighting.runs.0.fixtures.0.fixtureId',
				'design.walls.0.optionId',
				'catalog.settings.labor.rateId'
			])
		);
	});

	it('an item whose unit cannot price its part', () => {
		const catalog = demoCatalog();
		const pebble = catalog.items!.find((i) => i.sku === 'AGG-PEBBLE-RIVER')!;
		delete pebble.bulkDensityLbFt3;
		expect(errorsOf(demoDesign(), catalog)[0].path).toBe('design.aggregates.0.sku');
	});
});

const pipeArb = fc
	.constantFrom(...PIPE_MATERIALS)
	.chain((material) =>
		fc.record({ material: fc.constant(material), size: fc.constantFrom(...sizesFor(material)) })
	);

const outletArb = fc.oneof(
	fc.record({
		kind: fc.constant('bubbler' as const),
		bubbleHeightIn: fc.double({ min: 0.1, max: 24, noNaN: true }),
		boreIn: fc.double({ min: 0.2, max: 3, noNaN: true })
	}),
	fc.record({
		kind: fc.constant('spillway' as const),
		widthIn: fc.double({ min: 1, max: 96, noNaN: true }),
		sheet: fc.constantFrom('light' as const, 'medium' as const, 'heavy' as const)
	}),
	fc.record({
		kind: fc.constant('spout' as const),
		flowGph: fc.double({ min: 1, max: 5000, noNaN: true }),
		nozzleIn: fc.double({ min: 0.1, max: 3, noNaN: true })
	})
);

const designArb: fc.Arbitrary<Design> = fc
	.record({
		outlets: fc.array(
			fc.tuple(
				outletArb,
				pipeArb,
				fc.double({ min: 0.5, max: 200, noNaN: true }),
				fc.double({ min: 0, max: 20, noNaN: true })
			),
			{ maxLength: 6 }
		),
		depthFt: fc.double({ min: 0.5, max: 6, noNaN: true }),
		voids: fc.option(fc.double({ min: 0.05, max: 1, noNaN: true })),
		stones: fc.array(
			fc.tuple(
				fc.constantFrom(...ROCK_TYPES),
				fc.double({ min: 1, max: 96, noNaN: true }),
				fc.double({ min: 1, max: 96, noNaN: true })
			),
			{ maxLength: 4 }
		),
		wallHeightIn: fc.option(fc.double({ min: 1, max: 120, noNaN: true })),
		lights: fc.array(
			fc.tuple(
				fc.double({ min: 1, max: 80, noNaN: true }),
				fc.double({ min: 0, max: 300, noNaN: true })
			),
			{ maxLength: 5 }
		)
	})
	.map(({ outlets, depthFt, voids, stones, wallHeightIn, lights }) => ({
		outlets: outlets.map(([o], i) => ({ ...o, id: `o${i}`, name: `Outlet ${i}` })),
		branches: outlets.map(([, pipe, lengthFt, staticLiftFt], i) => ({
			id: `b${i}`,
			outletId: `o${i}`,
			pipe,
			lengthFt,
			staticLiftFt
		})),
		basin: {
			size: { shape: 'rectangle' as const, lengthFt: 5, widthFt: 4, depthFt },
			fill:
				voids === null
					? { kind: 'open' as const }
					: { kind: 'gravel' as const, voidFraction: voids }
		},
		stones: stones.map(([rock, a, b], i) => ({
			id: `s${i}`,
			name: `Stone ${i}`,
			rock,
			size: { shape: 'boulder' as const, lengthIn: a, widthIn: b, heightIn: (a + b) / 2 }
		})),
		walls:
			wallHeightIn === null
				? []
				: [
						{
							id: 'w',
							name: 'Wall',
							purpose: 'retaining' as const,
							lengthFt: 12,
							exposedHeightIn: wallHeightIn,
							unit: { lengthIn: 16, heightIn: 6, depthIn: 12 },
							unitSku: 'WALL-UNIT-16'
						}
					],
		lighting: lights.length
			? {
					fixtures: lights.map(([va], i) => ({ id: `f${i}`, name: `Light ${i}`, va })),
					transformers: [{ id: 't', name: 'Transformer', ratingVA: 300, tapsV: [12, 13, 14, 15] }],
					runs: [
						{
							id: 'r',
							transformerId: 't',
							tapV: 12,
							gauge: '12' as const,
							fixtures: lights.map(([, distanceFt], i) => ({ fixtureId: `f${i}`, distanceFt }))
						}
					]
				}
			: undefined
	}));

describe('property: any valid design gives finite, non-negative numbers (fast-check)', () => {
	it('holds across random outlets, pipes, basins, stones, walls and lights', () => {
		fc.assert(
			fc.property(designArb, (design) => {
				const result = estimate(design, demoCatalog());
				expect(result.ok).toBe(true);
				expect(badNumbers(result)).toEqual([]);
			}),
			{ numRuns: 150 }
		);
	});
});

describe('a price list prepared once (the builder validates its catalog once per page)', () => {
	it('prices every bench design exactly as the catalog validated on each call does', () => {
		const prepared = prepareCatalog(demoCatalog());
		for (const design of [demoDesign(), twelveOutletDesign(), yardDesign()]) {
			const fresh = estimate(design, demoCatalog());
			expect(fresh.ok).toBe(true);
			expect(estimate(design, prepared)).toEqual(fresh);
			// Twice: nothing the first estimate did changed the prepared catalog.
			expect(estimate(design, prepared)).toEqual(fresh);
		}
		expect(Object.isFrozen(prepared.items[0])).toBe(true);
	});

	it('is a frozen copy: the caller’s own object may change without reaching it', () => {
		const raw = demoCatalog();
		const prepared = prepareCatalog(raw);
		raw.items![0].unitPrice = 1;
		expect(prepared.items[0].unitPrice).not.toBe(1);
		expect(() => prepareCatalog({ items: [{ sku: '' }] })).toThrow();
	});
});
