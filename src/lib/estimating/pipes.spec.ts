import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	NOMINAL_SIZES,
	equivalentLengthM,
	fittingK,
	hazenWilliamsLoss,
	insideDiameterM,
	lossPer100,
	pipeExists,
	sizesFor,
	velocity,
	velocityHead
} from './pipes';
import { feet, inches, toFeet, toSI } from './units';

const gpm = (value: number) => toSI(value, 'flow', 'gpm');
const sch40 = (size: (typeof NOMINAL_SIZES)[number]) => insideDiameterM('pvc-sch40', size);
const within = (actual: number, expected: number, fraction: number) =>
	expect(Math.abs(actual - expected) / expected).toBeLessThanOrEqual(fraction);

describe('inside diameters (ASTM D1785 PVC Schedule 40 and 80)', () => {
	it('Schedule 40: 3/4 in 0.824, 1 in 1.049, 1-1/4 in 1.380, 2 in 2.067 in', () => {
		expect(sch40('3/4') / inches(1)).toBeCloseTo(0.824, 6);
		expect(sch40('1') / inches(1)).toBeCloseTo(1.049, 6);
		expect(sch40('1-1/4') / inches(1)).toBeCloseTo(1.38, 6);
		expect(sch40('2') / inches(1)).toBeCloseTo(2.067, 6);
	});

	it('Schedule 80 walls are thicker: 1 in is 0.957 in inside', () => {
		expect(insideDiameterM('pvc-sch80', '1') / inches(1)).toBeCloseTo(0.957, 6);
		expect(insideDiameterM('pvc-sch80', '1')).toBeLessThan(sch40('1'));
	});

	it('knows which sizes each material comes in', () => {
		expect(pipeExists('pvc-sch40', '3')).toBe(true);
		expect(pipeExists('flex-pvc', '3')).toBe(false);
		expect(sizesFor('poly-sidr15')).not.toContain('3');
		expect(() => insideDiameterM('flex-pvc', '3')).toThrow(RangeError);
	});
});

describe('Hazen-Williams friction loss', () => {
	// Illinois Administrative Code Title 77, Part 906, Appendix A, Exhibit I,
	// "Friction Loss in Schedule 40 Plastic Pipe, C=150" (ft of head per 100 ft).
	it.each([
		['1', 5, 1.52],
		['1', 10, 5.5],
		['1-1/4', 10, 1.46]
	] as const)(
		'Illinois 77 IAC 906 Exhibit I: %s in at %d gpm ≈ %f ft/100 ft (within 2%)',
		(size, flow, table) => {
			within(lossPer100(gpm(flow), sch40(size), 150), table, 0.02);
		}
	);

	it('Engineering ToolBox worked example: 200 gpm in 3.048 in pipe at C=140 ≈ 9 ft per 100 ft', () => {
		within(lossPer100(gpm(200), inches(3.048), 140), 9.0, 0.03);
	});

	it('is linear in length and zero without flow', () => {
		const d = sch40('1');
		const q = gpm(8);
		expect(hazenWilliamsLoss(q, d, 150, feet(200))).toBeCloseTo(
			2 * hazenWilliamsLoss(q, d, 150, feet(100)),
			12
		);
		expect(hazenWilliamsLoss(0, d, 150, feet(100))).toBe(0);
	});

	it('property: loss grows with flow and shrinks with diameter (fast-check)', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 1e-6, max: 0.01, noNaN: true }),
				fc.double({ min: 1.01, max: 3, noNaN: true }),
				fc.double({ min: 0.01, max: 0.1, noNaN: true }),
				fc.double({ min: 1.01, max: 3, noNaN: true }),
				(flow, flowFactor, diameter, diameterFactor) => {
					const base = hazenWilliamsLoss(flow, diameter, 150, 10);
					expect(hazenWilliamsLoss(flow * flowFactor, diameter, 150, 10)).toBeGreaterThan(base);
					expect(hazenWilliamsLoss(flow, diameter * diameterFactor, 150, 10)).toBeLessThan(base);
				}
			)
		);
	});
});

describe('velocity', () => {
	it('10 gpm in 1 in Schedule 40 runs at 3.71 ft/s (Q/A, A from the 1.049 in bore)', () => {
		expect(toFeet(velocity(gpm(10), sch40('1')))).toBeCloseTo(3.712, 2);
	});

	it('velocity head of 8.02 ft/s is 1 ft (v²/2g with g = 32.174 ft/s²)', () => {
		expect(toFeet(velocityHead(feet(8.0214)))).toBeCloseTo(1, 3);
	});
});

describe('fitting losses (Crane Technical Paper 410, K = fT·L/D; values from memory)', () => {
	it('standard 90° elbow: K 0.75 at 3/4 in, 0.69 at 1 in, 0.57 at 2 in (Crane TP-410 A-27)', () => {
		expect(fittingK('elbow-90', '3/4')).toBeCloseTo(0.75, 6);
		expect(fittingK('elbow-90', '1')).toBeCloseTo(0.69, 6);
		expect(fittingK('elbow-90', '2')).toBeCloseTo(0.57, 6);
	});

	it('1 in: tee through branch K 1.38, ball valve 0.069, globe valve 7.82 (Crane TP-410)', () => {
		expect(fittingK('tee-branch', '1')).toBeCloseTo(1.38, 6);
		expect(fittingK('ball-valve', '1')).toBeCloseTo(0.069, 6);
		expect(fittingK('globe-valve', '1')).toBeCloseTo(7.82, 6);
	});

	it('equivalent length of a 1 in standard elbow is about 2.6 ft, as in common equivalent-length tables (from memory)', () => {
		expect(toFeet(equivalentLengthM('elbow-90', '1', sch40('1')))).toBeCloseTo(2.62, 1);
	});

	it('pipe exit K = 1 and entrance K = 0.5 (Crane TP-410 A-29)', () => {
		expect(fittingK('exit', '1')).toBe(1);
		expect(fittingK('entrance', '2')).toBe(0.5);
	});
});
