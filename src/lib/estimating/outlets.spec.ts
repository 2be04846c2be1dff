import { describe, expect, it } from 'vitest';
import {
	SPILLWAY_GPH_PER_INCH,
	SPILLWAY_HEAD_IN,
	bubblerFlowM3s,
	francisWeirFlowCfs,
	francisWeirFlowM3s,
	outletDemand
} from './outlets';
import { feet, inches, toGph, toSI } from './units';

describe('Francis weir formula Q = 3.33 L H^1.5 (ft³/s; Francis, Lowell Hydraulic Experiments)', () => {
	it('a 1 ft weir under 1 ft of head passes 3.33 ft³/s', () => {
		expect(francisWeirFlowCfs(1, 1)).toBeCloseTo(3.33, 10);
	});

	it('a 3 ft weir under 0.5 ft passes 3.33 × 3 × 0.3536 = 3.532 ft³/s', () => {
		expect(francisWeirFlowCfs(3, 0.5)).toBeCloseTo(3.532, 3);
	});

	it('the SI wrapper agrees with the ft³/s form', () => {
		const si = francisWeirFlowM3s(feet(2), feet(0.25));
		expect(si).toBeCloseTo(toSI(francisWeirFlowCfs(2, 0.25), 'volume', 'ft3'), 12);
	});
});

describe('spillway rule of thumb (common practice, no source) cross-checked with Francis', () => {
	it.each(['light', 'medium', 'heavy'] as const)(
		'%s sheet: gph per inch of width within 25% of Francis at its nominal head over the lip',
		(sheet) => {
			const francisGph = toGph(francisWeirFlowM3s(inches(1), inches(SPILLWAY_HEAD_IN[sheet])));
			const rule = SPILLWAY_GPH_PER_INCH[sheet];
			expect(Math.abs(rule - francisGph) / francisGph).toBeLessThan(0.25);
		}
	);

	it('a 12 in spillway with a medium sheet wants 1200 gph, and reports the Francis figure', () => {
		const demand = outletDemand({
			id: 's',
			name: 'Spillway',
			kind: 'spillway',
			widthIn: 12,
			sheet: 'medium'
		});
		expect(toGph(demand.flowM3s)).toBeCloseTo(1200, 6);
		expect(toGph(demand.francisFlowM3s!)).toBeCloseTo(1401, -1);
		expect(demand.outletHeadM).toBeCloseTo(inches(0.75), 12);
		expect(demand.losesPipeVelocityHead).toBe(true);
	});
});

describe('bubblers: a free jet rises to v²/2g (Bernoulli / Torricelli)', () => {
	it('a 1 m rise needs 4.429 m/s at the bore (√(2 × 9.80665 × 1))', () => {
		const bore = 0.02;
		const area = (Math.PI / 4) * bore ** 2;
		expect(bubblerFlowM3s(1, bore) / area).toBeCloseTo(4.4287, 3);
	});

	it('a 3 in bubble through a 3/4 in Schedule 40 bore (0.824 in) takes about 400 gph', () => {
		const demand = outletDemand({
			id: 'c',
			name: 'Column',
			kind: 'bubbler',
			bubbleHeightIn: 3,
			boreIn: 0.824
		});
		expect(toGph(demand.flowM3s)).toBeGreaterThan(390);
		expect(toGph(demand.flowM3s)).toBeLessThan(410);
		expect(demand.outletHeadM).toBeCloseTo(inches(3), 12);
	});

	it('flow goes with the square root of the bubble height', () => {
		const low = bubblerFlowM3s(inches(2), inches(1));
		const high = bubblerFlowM3s(inches(8), inches(1));
		expect(high / low).toBeCloseTo(2, 10);
	});
});

describe('spouts', () => {
	it('need the velocity head of their jet: 600 gph through a 1/2 in nozzle ≈ 16.3 ft/s, 4.15 ft', () => {
		const demand = outletDemand({
			id: 'p',
			name: 'Spout',
			kind: 'spout',
			flowGph: 600,
			nozzleIn: 0.5
		});
		const v = demand.flowM3s / ((Math.PI / 4) * inches(0.5) ** 2);
		expect(v / feet(1)).toBeCloseTo(16.34, 1);
		expect(demand.outletHeadM / feet(1)).toBeCloseTo(16.34 ** 2 / (2 * 32.174), 1);
	});
});
