import { describe, expect, it } from 'vitest';
import { demoCatalog } from '../../../scripts/seed/demo-catalog';
import { estimate, type EstimateSuccess } from './index';
import { catalogSchema, featureSchema, settingsSchema, type Stream } from './schema';
import { streamErrors, streamFlowM3s, streamLinerFt } from './stream';

const settings = settingsSchema.parse({});
const GAL = 0.003785411784; // m³ in a US gallon: 231 in³ × 0.0254³ (NIST Handbook 44, Appendix C)
const GPH = GAL / 3600;

const stream = (extra: Record<string, unknown> = {}) =>
	featureSchema.parse({
		id: 's',
		kind: 'stream',
		name: 'Stream',
		riseFt: 3,
		segments: [1, 2, 3].map((n) => ({
			id: `seg-${n}`,
			lengthFt: 8,
			widthFt: 2,
			waterDepthIn: 2,
			fallHeightIn: 10,
			weirWidthIn: 12
		})),
		flow: { method: 'per-inch' },
		supply: { pipe: { material: 'flex-pvc', size: '1-1/2' }, lengthFt: 30, fittings: [] },
		reservoir: { kind: 'gravel', lengthFt: 6, widthFt: 4, depthFt: 3, voidFraction: 0.35 },
		gravelDepthIn: 2,
		...extra
	}) as Stream;

function run(s: Stream): EstimateSuccess {
	const result = estimate({ name: 'Stream', features: [s] }, demoCatalog());
	if (!result.ok) throw new Error(JSON.stringify(result.errors));
	return result;
}

describe('flow over the widest fall', () => {
	it('Francis weir: 12 in at a medium sheet (0.75 in over the lip)', () => {
		// Q = 3.33 L H^1.5 = 3.33 × 1 × (0.0625)^1.5 = 3.33 × 0.015625 = 0.052031 ft³/s (Francis,
		// Lowell Hydraulic Experiments, 1855); × 7.48052 gal × 3600 s = 1401.2 gph (by hand).
		const q = streamFlowM3s(stream({ flow: { method: 'weir', sheet: 'medium' } }), settings);
		expect(q / GPH).toBeCloseTo(1401.2, 1);
	});

	it('or the firm’s 100 gph per inch of weir (common practice, no source): 12 in → 1200 gph', () => {
		expect(streamFlowM3s(stream(), settings) / GPH).toBeCloseTo(1200, 6);
		const wider = stream();
		wider.segments[1].weirWidthIn = 18;
		expect(streamFlowM3s(wider, settings) / GPH).toBeCloseTo(1800, 6);
	});
});

describe('head: the rise plus the supply line’s friction', () => {
	it('3 ft rise + 30 ft of 1-1/2 in flexible PVC at 1200 gph', () => {
		// Hazen-Williams in US units: p = 4.52 L Q^1.852 / (C^1.852 d^4.87) psi, Q in gpm, d in in
		// (Engineering ToolBox, "Hazen-Williams equation"): Q = 20 gpm, C = 140, d = 1.610 in,
		// L = 30 ft → 0.3630 psi; × 2.3067 ft of water per psi (NIST SP 811: 6894.757 Pa per psi,
		// 2988.98 Pa per ft of water) = 0.837 ft (by hand). Head = 3 + 0.837 = 3.837 ft.
		const system = run(stream()).systems[0];
		expect(system.kind).toBe('stream');
		expect(system.requiredHeadM / 0.3048).toBeCloseTo(3.837, 2);
		expect(system.pump.chosenId).toBeDefined();
	});
});

describe('liner, drain-back and reservoir (common practice, no source: laps and reserve)', () => {
	it('liner: the segments, the falls and a lap under each, the overlap at both ends', () => {
		// Length 24 + 30/12 + 3 × 1 + 2 × 1 = 31.5 ft; width 2 + 2 × (2 + 2)/12 + 2 × 1 = 4.667 ft.
		const liner = streamLinerFt(stream(), settings);
		expect(liner.lengthFt).toBeCloseTo(31.5, 10);
		expect(liner.widthFt).toBeCloseTo(4.6667, 4);
	});

	it('drain-back is the running water plus the supply pipe, and the reservoir holds 1.5 × that', () => {
		// Bed 3 × 8 × 2 = 48 ft² × 2/12 ft = 8 ft³ = 59.84 gal; pipe 30 ft × π/4 × (1.610/12)² ft² =
		// 0.4241 ft³ = 3.17 gal; together 63.01 gal; × 1.5 = 94.52 gal (by hand).
		const s = run(stream()).features[0].stream!;
		expect(s.drainBackM3 / GAL).toBeCloseTo(63.01, 1);
		expect(s.requiredReserveM3 / GAL).toBeCloseTo(94.52, 1);
		// Reservoir 6 × 4 × 3 ft in gravel at 0.35 voids, above a 6 in pump level:
		// 24 × 2.5 × 0.35 = 21 ft³ = 157.1 gal, enough.
		expect(s.reservoir!.roomM3 / GAL).toBeCloseTo(157.09, 1);
		expect(s.warnings).toEqual([]);
	});

	it('warns when the reservoir cannot hold the drain-back', () => {
		const small = run(
			stream({ reservoir: { kind: 'gravel', lengthFt: 2, widthFt: 2, depthFt: 1 } })
		);
		expect(small.warnings.join(' ')).toMatch(/the reservoir holds 5 gal above the pump, less than/);
	});

	it('bank boulders join the stone-handling plan and the price', () => {
		const r = run(
			stream({
				boulderSku: 'STONE-BANK-BOULDER',
				boulder: { lengthIn: 16, widthIn: 12, heightIn: 10, rock: 'granite', spacingFt: 3 }
			})
		);
		// 24 ft / 3 ft = 8 a bank, both banks: 16.
		const boulders = r.stones.stones.find((s) => /bank boulders/.test(s.name))!;
		expect(boulders.count).toBe(16);
		expect(boulders.handling.people).toBeGreaterThanOrEqual(1);
		expect(r.pricing.lines.find((l) => l.sku === 'STONE-BANK-BOULDER')?.quantity).toBe(16);
	});
});

describe('bad streams give field errors, never NaN', () => {
	it('falls that add up to more than the rise', () => {
		const steep = stream({ riseFt: 1 });
		expect(streamErrors(steep).map((e) => e.path.join('.'))).toEqual([
			'segments.1.fallHeightIn',
			'segments.2.fallHeightIn'
		]);
		const result = estimate({ name: 'x', features: [steep] }, demoCatalog());
		expect(result.ok ? [] : result.errors).toContainEqual({
			path: 'design.features.0.segments.1.fallHeightIn',
			message: 'The falls reach 1.67 ft, more than the stream’s 1 ft rise'
		});
	});

	it('a stream into a pond that is not in the design', () => {
		const result = estimate(
			{ name: 'x', features: [stream({ feedsPondId: 'nowhere', reservoir: undefined })] },
			catalogSchema.parse(demoCatalog())
		);
		expect(result.ok ? [] : result.errors.map((e) => e.path)).toContain(
			'design.features.0.feedsPondId'
		);
	});
});
