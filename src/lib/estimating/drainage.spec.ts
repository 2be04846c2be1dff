import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	analyseDrainage,
	bottomWidthForM,
	inPerHourToMs,
	manningFlowM3s,
	normalDepthM,
	rationalPeakCfs,
	rationalPeakM3s
} from './drainage';
import { settingsSchema, featureSchema, type DrainageFeature } from './schema';
import { starterDrainage } from './starter-yard';
import { fromSI, toSI } from './units';

const settings = settingsSchema.parse({});
const ACRE_M2 = toSI(43560, 'area', 'ft2');
const FT3 = toSI(1, 'volume', 'ft3');
const cfs = (m3s: number) => m3s / FT3;
const ft = (m: number) => m / 0.3048;
const drainage = (over: Partial<DrainageFeature> = {}) =>
	({ ...featureSchema.parse(starterDrainage([])), ...over }) as DrainageFeature;

describe('Rational method, Q = C·i·A', () => {
	it('gives 4.125 cfs for 30 acres at C = 0.11 and 1.25 in/h', () => {
		// Worked example: engineeringprep.com, problem 079 "Flow Rate" (1.008 taken as 1).
		expect(rationalPeakCfs(0.11, 1.25, 30)).toBeCloseTo(4.125, 6);
		// The SI form keeps the 1.008: 1 acre·in/h = 43,560/12/3600 = 1.00833 ft³/s.
		const si = rationalPeakM3s(0.11, inPerHourToMs(1.25), 30 * ACRE_M2);
		expect(cfs(si)).toBeCloseTo(4.125 * (43560 / 12 / 3600), 6);
	});

	it('gives 10.11 m³/s for 45.48 mm/h of effective rain over 80 ha', () => {
		// Worked example: V. M. Ponce, San Diego State University, CIVE 445 midterm 2, problem 1
		// (effective intensity, so C = 1).
		expect(rationalPeakM3s(1, 45.48 / 1000 / 3600, 80 * 10_000)).toBeCloseTo(10.11, 2);
	});
});

describe("Manning's equation", () => {
	it('carries 32.91 m³/s in a 6 m rectangular channel 1.6 m deep, n = 0.015, S = 0.0025', () => {
		// Worked example: V. M. Ponce, San Diego State University, CIVE 530 midterm 1, problem 4
		// (v = 3.428 m/s, Q = 32.91 m³/s).
		const q = manningFlowM3s({ bottomM: 6, depthM: 1.6, sideSlope: 0 }, 0.015, 0.0025);
		expect(q).toBeCloseTo(32.91, 1);
		expect(q / (6 * 1.6)).toBeCloseTo(3.428, 2);
	});

	it('finds a normal depth of about 3.36 ft for 400 cfs in a 20 ft trapezoid, z = 2', () => {
		// Worked example: V. T. Chow, Open-Channel Hydraulics (1959), Example 6-2: b = 20 ft, z = 2,
		// S = 0.0016, n = 0.025, Q = 400 cfs, yn = 3.36 ft (from memory; Chow uses 1.49 for 1.486).
		const q = 400 * FT3;
		const y = normalDepthM(q, toSI(20, 'length', 'ft'), 2, 0.025, 0.0016);
		expect(ft(y)).toBeCloseTo(3.36, 2);
	});

	it('sizes a bottom width that carries the flow at the depth given, and no wider', () => {
		const q = 0.05;
		const b = bottomWidthForM(q, 0.15, 2, 0.04, 0.02);
		expect(manningFlowM3s({ bottomM: b, depthM: 0.15, sideSlope: 2 }, 0.04, 0.02)).toBeCloseTo(
			q,
			6
		);
		expect(
			manningFlowM3s({ bottomM: b * 0.99, depthM: 0.15, sideSlope: 2 }, 0.04, 0.02)
		).toBeLessThan(q);
	});
});

describe('a dry creek into a soak-away', () => {
	it('holds one storm’s runoff in the gravel’s voids', () => {
		// Hand calculation: 600 ft² of roof, C = 0.9, 2 in/h for 60 min: 0.9 × 2/12 × 600 = 90 ft³;
		// gravel at 35% voids: 90 / 0.35 = 257.1 ft³.
		const r = analyseDrainage(drainage(), settings);
		expect(fromSI(r.soakaway!.stormRunoffM3, 'volume', 'ft3')).toBeCloseTo(90, 6);
		expect(fromSI(r.soakaway!.gravelVolumeM3, 'volume', 'ft3')).toBeCloseTo(90 / 0.35, 6);
		// 3 ft deep: a square of √(257.1 / 3) = 9.26 ft a side.
		expect(ft(r.soakaway!.sideM)).toBeCloseTo(Math.sqrt(90 / 0.35 / 3), 6);
	});

	it('takes the firm’s design rain unless the feature gives its own', () => {
		// 2,000 ft² of paving and roof, a creek 2 in deep: both storms need a flat bottom.
		const base = drainage();
		const wide = {
			catchment: {
				areas: [{ shape: 'rectangle' as const, lengthFt: 50, widthFt: 40 }],
				runoffC: 0.9
			},
			creek: { ...base.creek!, flowDepthIn: 2 }
		};
		const own = analyseDrainage(drainage({ ...wide, rainInPerHr: 4 }), settings);
		const firm = analyseDrainage(drainage(wide), settings);
		expect(firm.creek!.bottomM).toBeGreaterThan(0);
		expect(firm.rainInPerHr).toBe(settings.drainage.designRainInPerHr);
		expect(own.peakFlowM3s).toBeCloseTo(firm.peakFlowM3s * 2, 12);
		expect(own.creek!.bottomM).toBeGreaterThan(firm.creek!.bottomM);
	});

	it('lines the bottom and both banks with cobble and fabric, and counts boulders on both banks', () => {
		const r = analyseDrainage(drainage(), settings);
		const c = r.creek!;
		// Lined width: b + 2 × (6 + 3 in) × √(1 + 2²); fabric 1 ft more each side (geometry).
		const lined = c.bottomM + 2 * 0.2286 * Math.sqrt(5);
		expect(c.linedWidthM).toBeCloseTo(lined, 9);
		expect(c.fabricAreaM2).toBeCloseTo((lined + 2 * 0.3048) * c.lengthM, 9);
		expect(c.cobbleVolumeM3).toBeCloseTo(lined * c.lengthM * 0.1016, 9);
		expect(c.boulderCount).toBe(10); // 30 ft at 6 ft spacing, both banks
	});

	it('warns when the ground by the house falls less than IRC R401.3 asks (6 in in 10 ft)', () => {
		const low = analyseDrainage(drainage({ houseFallIn: 4 }), settings);
		expect(low.houseFall.enough).toBe(false);
		expect(low.warnings.join(' ')).toMatch(/IRC R401\.3/);
		const ok = analyseDrainage(drainage({ houseFallIn: 6 }), settings);
		expect(ok.houseFall.enough).toBe(true);
		expect(ok.warnings.join(' ')).not.toMatch(/R401/);
	});
});

describe('drainage properties', () => {
	const side = fc.double({ min: 1, max: 400, noNaN: true });
	it('is finite and never negative; more roof never gives a narrower creek or a smaller soak-away', () => {
		fc.assert(
			fc.property(
				side,
				side,
				fc.double({ min: 0.05, max: 1, noNaN: true }),
				fc.double({ min: 0.1, max: 20, noNaN: true }),
				fc.double({ min: 1, max: 3, noNaN: true }),
				(l, w, c, slope, grow) => {
					const make = (length: number) =>
						analyseDrainage(
							drainage({
								catchment: {
									areas: [{ shape: 'rectangle', lengthFt: length, widthFt: w }],
									runoffC: c
								},
								creek: { ...drainage().creek!, slopePercent: slope }
							}),
							settings
						);
					const a = make(l);
					const b = make(l * grow);
					for (const r of [a, b]) {
						for (const v of [
							r.peakFlowM3s,
							r.creek!.bottomM,
							r.creek!.topWidthM,
							r.creek!.velocityMs,
							r.creek!.cobbleVolumeM3,
							r.soakaway!.gravelVolumeM3
						]) {
							expect(Number.isFinite(v)).toBe(true);
							expect(v).toBeGreaterThanOrEqual(0);
						}
					}
					expect(b.peakFlowM3s).toBeGreaterThanOrEqual(a.peakFlowM3s);
					expect(b.creek!.bottomM).toBeGreaterThanOrEqual(a.creek!.bottomM - 1e-9);
					expect(b.soakaway!.gravelVolumeM3).toBeGreaterThanOrEqual(a.soakaway!.gravelVolumeM3);
				}
			),
			{ numRuns: 150 }
		);
	});

	it('a deeper normal depth for more flow', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0.001, max: 50, noNaN: true }),
				fc.double({ min: 1.01, max: 10, noNaN: true }),
				(q, k) => {
					const a = normalDepthM(q, 1, 2, 0.04, 0.01);
					const b = normalDepthM(q * k, 1, 2, 0.04, 0.01);
					expect(b).toBeGreaterThan(a);
				}
			)
		);
	});
});
