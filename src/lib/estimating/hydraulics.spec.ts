import { describe, expect, it } from 'vitest';
import { analyseHydraulics, limitsFrom, sizeAdvice, suggestSize, systemHead } from './hydraulics';
import { velocity, velocityHead, insideDiameterM } from './pipes';
import { settingsSchema, type Branch, type Outlet, type Settings } from './schema';
import { feet, toFeet, toGph } from './units';

const defaults = settingsSchema.parse({});
const settings = (overrides: Partial<Settings> = {}): Settings => ({ ...defaults, ...overrides });

const column = (id: string, bubbleHeightIn: number): Outlet => ({
	id,
	name: `Column ${id}`,
	kind: 'bubbler',
	bubbleHeightIn,
	boreIn: 0.824
});

const branch = (
	id: string,
	outletId: string,
	lengthFt: number,
	liftFt: number,
	size: '3/4' | '1' = '3/4'
): Branch => ({
	id,
	outletId,
	pipe: { material: 'pvc-sch40', size },
	lengthFt,
	staticLiftFt: liftFt,
	fittings: [{ kind: 'elbow-90', count: 2 }],
	valve: 'ball-valve'
});

describe('pipe-size advice', () => {
	// 6.0 ft/s in a 3/4 in Schedule 40 bore (0.824 in) is 9.97 gpm; in 1 in (1.049 in) that is 3.7 ft/s.
	const flow = feet(6) * (Math.PI / 4) * (0.824 * 0.0254) ** 2;

	it('says "3/4 in carries this outlet at 6.0 ft/s; 1 in brings it to 3.7 ft/s"', () => {
		const limits = { velocityLimitMs: feet(5), lossPer100Limit: 100 };
		const outlets: Outlet[] = [
			{ id: 's', name: 'Spout', kind: 'spout', flowGph: toGph(flow), nozzleIn: 0.824 }
		];
		const result = analyseHydraulics(
			outlets,
			[branch('b', 's', 10, 1)],
			undefined,
			settings({ lossPer100Limit: 100 }),
			'us'
		);
		expect(result.branches[0].tooSmall).toBe(true);
		expect(result.branches[0].advice).toBe(
			'3/4 in carries this outlet at 6.0 ft/s; 1 in brings it to 3.7 ft/s'
		);
		expect(suggestSize('pvc-sch40', '3/4', flow, limits)).toBe('1');
	});

	it('speaks metric on request', () => {
		const limits = { velocityLimitMs: feet(5), lossPer100Limit: 100 };
		const d = insideDiameterM('pvc-sch40', '3/4');
		const run = {
			material: 'pvc-sch40' as const,
			size: '3/4' as const,
			insideDiameterM: d,
			lengthM: 3,
			flowM3s: flow,
			velocityMs: velocity(flow, d),
			frictionLossM: 0,
			lossPer100: 1,
			fittingsK: 0,
			fittingsLossM: 0,
			volumeM3: 0
		};
		expect(sizeAdvice(run, limits, 'metric').advice).toBe(
			'3/4 in carries this outlet at 1.8 m/s; 1 in brings it to 1.1 m/s'
		);
	});

	it('mentions the loss per 100 ft when that is the limit passed', () => {
		const result = analyseHydraulics(
			[column('a', 4)],
			[branch('b', 'a', 12, 4)],
			undefined,
			settings({ lossPer100Limit: 10 }),
			'us'
		);
		expect(result.branches[0].advice).toMatch(
			/^3\/4 in carries this outlet at 4\.6 ft\/s and loses 11\.0 ft per 100 ft; 1 in brings it to 2\.9 ft\/s$/
		);
	});
});

describe('trade rules for column feeds (common practice, no source)', () => {
	it('3/4 in feeds a single column at a modest bubble without advice', () => {
		const result = analyseHydraulics(
			[column('a', 2)],
			[branch('b', 'a', 15, 3)],
			undefined,
			settings(),
			'us'
		);
		expect(result.branches[0].tooSmall).toBe(false);
		expect(toFeet(result.branches[0].velocityMs)).toBeLessThan(5);
	});

	it('a tall bubble outgrows 3/4 in and 1 in is the step up', () => {
		const result = analyseHydraulics(
			[column('a', 6)],
			[branch('b', 'a', 15, 3)],
			undefined,
			settings(),
			'us'
		);
		expect(result.branches[0].tooSmall).toBe(true);
		expect(result.branches[0].suggestedSize).toBe('1');
	});

	it('three columns on one manifold with a valve each: the hardest runs open, the others throttle', () => {
		const outlets = [column('a', 3), column('b', 3), column('c', 4)];
		const branches = [branch('ba', 'a', 8, 2), branch('bb', 'b', 10, 3), branch('bc', 'c', 12, 4)];
		const supply = {
			pipe: { material: 'pvc-sch40' as const, size: '1-1/2' as const },
			lengthFt: 6,
			fittings: []
		};
		const r = analyseHydraulics(outlets, branches, supply, settings(), 'us');
		const hardest = r.branches.find((b) => b.hardest)!;
		expect(hardest.branchId).toBe('bc');
		expect(hardest.throttleHeadM).toBe(0);
		for (const b of r.branches.filter((x) => !x.hardest)) {
			expect(b.headM + b.throttleHeadM).toBeCloseTo(hardest.headM, 10);
			expect(b.throttleK * velocityHead(b.velocityMs)).toBeCloseTo(b.throttleHeadM, 10);
			expect(b.throttleHeadM).toBeGreaterThan(0);
		}
		expect(r.totalFlowM3s).toBeCloseTo(
			r.branches.reduce((s, b) => s + b.flowM3s, 0),
			15
		);
		const supplyLoss = r.supply!.frictionLossM + r.supply!.fittingsLossM;
		expect(r.requiredHeadM).toBeCloseTo(hardest.headM + supplyLoss, 12);
	});
});

describe('branch head adds up', () => {
	it('static lift + Hazen-Williams + fittings + valve + the outlet head', () => {
		const r = analyseHydraulics(
			[column('a', 3)],
			[branch('b', 'a', 20, 2)],
			undefined,
			settings(),
			'us'
		);
		const b = r.branches[0];
		const hv = velocityHead(b.velocityMs);
		// Crane TP-410 K for 3/4 in: two elbows 2 × 0.75, ball valve 0.075.
		expect(b.fittingsLossM).toBeCloseTo(1.5 * hv, 12);
		expect(b.valveLossM).toBeCloseTo(0.075 * hv, 12);
		expect(b.headM).toBeCloseTo(
			feet(2) + b.frictionLossM + b.fittingsLossM + b.valveLossM + feet(3 / 12),
			12
		);
	});

	it('a spillway loses the pipe velocity head on discharge into its reservoir (0.5 in light sheet: common practice, no source)', () => {
		const outlet: Outlet = {
			id: 's',
			name: 'Spillway',
			kind: 'spillway',
			widthIn: 6,
			sheet: 'light'
		};
		const r = analyseHydraulics(
			[outlet],
			[branch('b', 's', 10, 2, '1')],
			undefined,
			settings(),
			'us'
		);
		const b = r.branches[0];
		expect(b.outletHeadM).toBeCloseTo(feet(0.5 / 12) + velocityHead(b.velocityMs), 12);
	});
});

describe('one branch worked by hand in US units', () => {
	// 10 gpm (600 gph) through 20 ft of 3/4 in Schedule 40 PVC (ID 0.824 in, ASTM D1785), C = 150,
	// two 90° elbows and a ball valve, 2 ft of lift, ending in a spout with a 0.824 in nozzle.
	// Worked independently of pipes.ts (which uses the SI form, 10.67), in US units:
	// - Hazen-Williams as NFPA 13 writes it: p = 4.52 Q^1.85 / (C^1.85 d^4.87) psi per ft, Q in gpm,
	//   d in in: 4.52 × 70.79 / (10 622 × 0.3891) = 0.0774 psi/ft; at 2.307 ft of water per psi
	//   (6894.757 Pa / 2988.98 Pa) that is 17.86 ft per 100 ft, 3.57 ft over 20 ft.
	//   Cross-check, Engineering ToolBox's US form, 0.2083 (100/C)^1.852 q^1.852 / d^4.8655 = 17.93 ft
	//   per 100 ft. The published forms round their constants differently and agree within 1%.
	// - Velocity v = Q / A = (10 × 231 / 1728 / 60 ft³/s) / (π/4 × (0.824/12)² ft²) = 6.02 ft/s
	//   (231 in³ to the US gallon, NIST Handbook 44); velocity head v²/2g with g = 32.174 ft/s²
	//   = 0.5625 ft.
	// - Minor losses, Crane TP-410 (from memory): K = fT × L/D with fT = 0.025 for 3/4 in:
	//   elbow 30 → 0.75 each, ball valve 3 → 0.075; (2 × 0.75 + 0.075) × 0.5625 = 0.886 ft.
	// - The free jet at the nozzle needs its own velocity head: 0.5625 ft (Bernoulli).
	// Total from the manifold: 2 + 3.57 + 0.886 + 0.5625 = 7.02 ft.
	const gpm = 10;
	const dIn = 0.824;
	const c = 150;
	const lengthFt = 20;
	const nfpaPsiPerFt = (4.52 * gpm ** 1.85) / (c ** 1.85 * dIn ** 4.87);
	const nfpaPer100Ft = nfpaPsiPerFt * 100 * 2.307;
	const toolboxPer100Ft = (0.2083 * (100 / c) ** 1.852 * gpm ** 1.852) / dIn ** 4.8655;
	const cfs = (gpm * 231) / 1728 / 60;
	const vFtS = cfs / ((Math.PI / 4) * (dIn / 12) ** 2);
	const hvFt = vFtS ** 2 / (2 * 32.174);
	const within = (actual: number, expected: number, share: number) =>
		expect(Math.abs(actual - expected) / expected).toBeLessThan(share);

	const r = analyseHydraulics(
		[{ id: 's', name: 'Spout', kind: 'spout', flowGph: gpm * 60, nozzleIn: dIn }],
		[branch('b', 's', lengthFt, 2)],
		undefined,
		settings(),
		'us'
	);
	const b = r.branches[0];

	it('the hand figures are the ones in the comment', () => {
		expect(nfpaPsiPerFt).toBeCloseTo(0.0774, 4);
		expect(nfpaPer100Ft).toBeCloseTo(17.86, 1);
		expect(toolboxPer100Ft).toBeCloseTo(17.93, 1);
		expect(vFtS).toBeCloseTo(6.02, 2);
		expect(hvFt).toBeCloseTo(0.5625, 3);
	});

	it('velocity 6.02 ft/s and velocity head 0.5625 ft', () => {
		expect(toFeet(b.velocityMs)).toBeCloseTo(vFtS, 6);
		expect(toFeet(velocityHead(b.velocityMs))).toBeCloseTo(hvFt, 4);
	});

	it('friction about 17.9 ft per 100 ft and 3.57 ft over 20 ft, within 1% of both US forms', () => {
		within(b.lossPer100, nfpaPer100Ft, 0.01);
		within(b.lossPer100, toolboxPer100Ft, 0.01);
		within(toFeet(b.frictionLossM), 3.57, 0.01);
	});

	it('fittings and valve 0.886 ft, the nozzle 0.5625 ft, and 7.02 ft in all from the manifold', () => {
		expect(toFeet(b.fittingsLossM + b.valveLossM)).toBeCloseTo(0.886, 3);
		expect(toFeet(b.outletHeadM)).toBeCloseTo(0.5625, 3);
		within(toFeet(b.headM), 7.02, 0.01);
		expect(toFeet(r.requiredHeadM)).toBeCloseTo(toFeet(b.headM), 9);
	});
});

describe('system curve', () => {
	it('passes through the design point and rises with flow', () => {
		const outlets = [
			column('a', 3),
			{ id: 's', name: 'Spillway', kind: 'spillway', widthIn: 10, sheet: 'medium' } as Outlet
		];
		const r = analyseHydraulics(
			outlets,
			[branch('ba', 'a', 10, 2), branch('bs', 's', 10, 3, '1')],
			undefined,
			settings(),
			'us'
		);
		expect(systemHead(r.system, r.totalFlowM3s)).toBeCloseTo(r.requiredHeadM, 10);
		expect(systemHead(r.system, 0)).toBeCloseTo(r.branches.find((b) => b.hardest)!.staticLiftM, 12);
		expect(systemHead(r.system, r.totalFlowM3s * 1.5)).toBeGreaterThan(r.requiredHeadM);
	});

	it('limits come from the settings', () => {
		expect(limitsFrom(settings({ velocityLimitFtS: 4 })).velocityLimitMs).toBeCloseTo(feet(4), 12);
	});
});
