import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { SystemCoefficients } from './hydraulics';
import {
	firstNonMonotoneIndex,
	headAt,
	matchPump,
	monotoneSlopes,
	operatingPoint,
	pumpCurve,
	runningCost
} from './pumps';
import { settingsSchema, type PumpModel } from './schema';
import { feet, gph, toFeet, toGph } from './units';

const settings = settingsSchema.parse({});

const model = (id: string, watts: number, curve: [number, number][]): PumpModel => ({
	id,
	name: id,
	watts,
	priceCents: watts * 300,
	curve: curve.map(([flowGph, headFt]) => ({ flowGph, headFt }))
});

const system = (staticFt: number, dynamicFt: number, designGph: number): SystemCoefficients => ({
	staticM: feet(staticFt),
	frictionM: 0,
	minorM: feet(dynamicFt),
	weirM: 0,
	designFlowM3s: gph(designGph)
});

describe('monotone interpolation (Fritsch–Carlson, SIAM J. Numer. Anal. 17(2), 1980)', () => {
	it('passes through every curve point', () => {
		const curve = pumpCurve(
			model('p', 100, [
				[0, 12],
				[300, 10.2],
				[600, 7.4],
				[900, 3.6],
				[1050, 0]
			])
		);
		for (const p of curve.points) expect(headAt(curve, p.flowM3s)).toBeCloseTo(p.headM, 12);
	});

	it('reproduces straight-line data exactly', () => {
		const slopes = monotoneSlopes([0, 1, 2, 4], [10, 8, 6, 2]);
		for (const s of slopes) expect(s).toBeCloseTo(-2, 12);
	});

	it('property: never rises and never leaves the data range between points (fast-check)', () => {
		const curveArb = fc
			.array(
				fc.tuple(
					fc.double({ min: 1, max: 500, noNaN: true }),
					fc.double({ min: 0, max: 5, noNaN: true })
				),
				{ minLength: 2, maxLength: 8 }
			)
			.map((steps) => {
				let flow = 0;
				let head = steps.reduce((s, [, dh]) => s + dh, 0.5);
				return steps.map(([dq, dh]) => {
					const point: [number, number] = [flow, head];
					flow += dq;
					head = Math.max(0, head - dh);
					return point;
				});
			});
		fc.assert(
			fc.property(
				curveArb,
				fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 2, maxLength: 20 }),
				(points, ts) => {
					const curve = pumpCurve(model('p', 100, points));
					const qMax = curve.points.at(-1)!.flowM3s;
					const flows = ts.map((t) => t * qMax).sort((a, b) => a - b);
					const heads = flows.map((q) => headAt(curve, q));
					for (let i = 1; i < heads.length; i++) {
						expect(heads[i]).toBeLessThanOrEqual(heads[i - 1] + 1e-12);
					}
					for (const h of heads) {
						expect(h).toBeLessThanOrEqual(curve.points[0].headM + 1e-12);
						expect(h).toBeGreaterThanOrEqual(0);
					}
				}
			)
		);
	});
});

describe('curve validation', () => {
	it('finds the first point where flow falls or head rises', () => {
		expect(
			firstNonMonotoneIndex([
				{ flowGph: 0, headFt: 10 },
				{ flowGph: 100, headFt: 8 }
			])
		).toBe(-1);
		expect(
			firstNonMonotoneIndex([
				{ flowGph: 0, headFt: 10 },
				{ flowGph: 100, headFt: 11 }
			])
		).toBe(1);
		expect(
			firstNonMonotoneIndex([
				{ flowGph: 0, headFt: 10 },
				{ flowGph: 100, headFt: 8 },
				{ flowGph: 100, headFt: 6 }
			])
		).toBe(2);
	});
});

describe('operating point', () => {
	it('matches the closed-form crossing of a straight pump line and a quadratic system', () => {
		// Pump: H = 20 − 0.01 Q (ft, gph). System: H = 5 + 10 (Q/1000)². Root of 0.00001Q² + 0.01Q − 15 = 0.
		const curve = pumpCurve(
			model('p', 100, [
				[0, 20],
				[1000, 10],
				[2000, 0]
			])
		);
		const op = operatingPoint(curve, system(5, 10, 1000));
		const exact = (-0.01 + Math.sqrt(0.01 ** 2 + 4 * 0.00001 * 15)) / (2 * 0.00001);
		expect(op.status).toBe('ok');
		expect(toGph(op.flowM3s)).toBeCloseTo(exact, 4);
		expect(toFeet(op.headM)).toBeCloseTo(20 - 0.01 * exact, 4);
	});

	it('reports no flow when the static lift is above shut-off head', () => {
		const curve = pumpCurve(
			model('p', 100, [
				[0, 8],
				[500, 4],
				[800, 0]
			])
		);
		expect(operatingPoint(curve, system(9, 1, 500))).toMatchObject({
			flowM3s: 0,
			status: 'no-flow'
		});
	});

	it('reports the end of the curve when the system is easier than the curve reaches', () => {
		const curve = pumpCurve(
			model('p', 100, [
				[0, 10],
				[500, 6],
				[800, 4]
			])
		);
		const op = operatingPoint(curve, system(1, 0.1, 500));
		expect(op.status).toBe('end-of-curve');
		expect(toGph(op.flowM3s)).toBeCloseTo(800, 6);
	});

	it('property: always finite, within the curve, and pump head ≈ system head when ok (fast-check)', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0, max: 30, noNaN: true }),
				fc.double({ min: 0, max: 50, noNaN: true }),
				fc.double({ min: 1, max: 5000, noNaN: true }),
				fc.double({ min: 1, max: 40, noNaN: true }),
				(staticFt, dynamicFt, designGph, shutoff) => {
					const curve = pumpCurve(
						model('p', 100, [
							[0, shutoff],
							[1000, shutoff * 0.7],
							[2000, 0]
						])
					);
					const sys = system(staticFt, dynamicFt, designGph);
					const op = operatingPoint(curve, sys);
					expect(Number.isFinite(op.flowM3s) && Number.isFinite(op.headM)).toBe(true);
					expect(op.flowM3s).toBeGreaterThanOrEqual(0);
					expect(toGph(op.flowM3s)).toBeLessThanOrEqual(2000 + 1e-6);
					if (op.status === 'ok') {
						expect(Math.abs(headAt(curve, op.flowM3s) - op.headM)).toBeLessThan(1e-6);
					}
				}
			)
		);
	});
});

describe('pump choice', () => {
	const small = model('small', 80, [
		[0, 10],
		[1000, 6],
		[1300, 0]
	]);
	const medium = model('medium', 150, [
		[0, 16],
		[1500, 9],
		[2000, 0]
	]);
	const large = model('large', 300, [
		[0, 24],
		[2500, 14],
		[3500, 0]
	]);

	it('picks the smallest pump that gives the flow plus the 15% margin (common practice, no source) at the required head', () => {
		// Needs 1000 gph at 7 ft: small gives under 6 ft at 1150 gph (no); medium gives over 10 ft there.
		const match = matchPump(
			[large, small, medium],
			system(4, 3, 1000),
			gph(1000),
			feet(7),
			settings
		);
		expect(match.chosenId).toBe('medium');
		expect(toGph(match.marginFlowM3s)).toBeCloseTo(1150, 6);
		expect(match.evaluations.map((e) => e.id)).toEqual(['small', 'medium', 'large']);
	});

	it('the margin matters: a pump good for 1.10 × Q fails at 1.15 × Q and passes at 5%', () => {
		// Straight curve 10 ft at 0 down to 0 at 2200 gph: at 1100 gph it gives 5.0 ft, at 1150 gph 4.77 ft.
		const edge = model('edge', 90, [
			[0, 10],
			[2200, 0]
		]);
		const required = feet(5);
		expect(
			matchPump([edge], system(3, 2, 1000), gph(1000), required, settings).chosenId
		).toBeUndefined();
		const loose = { ...settings, pumpMarginPercent: 5 };
		expect(matchPump([edge], system(3, 2, 1000), gph(1000), required, loose).chosenId).toBe('edge');
	});

	it('compares the pump and the system at the same flow: the system’s head grows with the margin too', () => {
		// System: 3 ft static + 2 ft that grows with Q² (5 ft at 1000 gph). At 1150 gph it needs
		// 3 + 2 × 1.15² = 5.645 ft. A straight curve from 10 ft at 0 to 0 at 2450 gph gives
		// 10 × (1 − 1150/2450) = 5.306 ft there: above the 5 ft needed at 1000 gph, below the 5.645 ft
		// needed at 1150 gph, so it does not serve with the 15% margin (common practice, no source).
		const close = model('close', 90, [
			[0, 10],
			[2450, 0]
		]);
		const match = matchPump([close], system(3, 2, 1000), gph(1000), feet(5), settings);
		expect(match.requiredHeadAtMarginM).toBeCloseTo(feet(3 + 2 * 1.15 ** 2), 9);
		expect(match.evaluations[0].headAtMarginFlowM).toBeCloseTo(feet(10 * (1 - 1150 / 2450)), 6);
		expect(match.chosenId).toBeUndefined();
	});

	it('warns when nothing fits, and returns curves to plot', () => {
		const match = matchPump([small], system(12, 3, 1000), gph(1000), feet(15), settings);
		expect(match.chosenId).toBeUndefined();
		expect(match.warnings[0]).toMatch(/No pump/);
		expect(match.systemCurve).toHaveLength(25);
		expect(match.evaluations[0].curve[0]).toEqual({ flowM3s: 0, headM: feet(10) });
	});
});

describe('running cost', () => {
	it('100 W for 10 h a day at 15¢/kWh over a mean Gregorian month (30.436875 d) is 30.44 kWh, $4.57', () => {
		const cost = runningCost(100, {
			...settings,
			dailyRunHours: 10,
			electricityCentsPerKwh: 15,
			seasonMonths: 7
		});
		expect(cost.kwhPerMonth).toBeCloseTo(30.436875, 9);
		expect(cost.centsPerMonth).toBe(457);
		expect(cost.centsPerSeason).toBe(3196);
	});
});
