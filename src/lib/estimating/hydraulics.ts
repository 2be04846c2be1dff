/** Branches in parallel from a manifold: velocity, friction, fittings, valve throttling, advice. */
import { outletDemand, type OutletDemand } from './outlets';
import {
	HAZEN_WILLIAMS_C,
	hazenWilliamsLoss,
	insideDiameterM,
	lossPer100,
	nextLargerSizes,
	pipeVolume,
	totalK,
	velocity,
	velocityHead,
	type FittingCount,
	type NominalSize,
	type PipeMaterial
} from './pipes';
import type { Branch, Outlet, Settings, Supply } from './schema';
import { feet, formatQuantity, type UnitSystem } from './units';

// Hazen-Williams flow exponent (friction ∝ Q^1.852).
const HW_EXPONENT = 1.852;
// Francis weir: Q ∝ H^1.5, so the head over a spillway lip goes with Q^(2/3).
const WEIR_EXPONENT = 2 / 3;

export interface PipeRun {
	material: PipeMaterial;
	size: NominalSize;
	insideDiameterM: number;
	lengthM: number;
	flowM3s: number;
	velocityMs: number;
	frictionLossM: number;
	lossPer100: number;
	fittingsK: number;
	fittingsLossM: number;
	volumeM3: number;
}

export interface BranchResult extends PipeRun {
	branchId: string;
	outletId: string;
	outletName: string;
	staticLiftM: number;
	valveLossM: number;
	outletHeadM: number;
	/** Head this branch needs from the manifold with its valve wide open. */
	headM: number;
	/** Head its valve must burn so that it takes its share when the hardest branch is open. */
	throttleHeadM: number;
	/** The valve's extra loss coefficient for that throttling (Δh = K v²/2g). */
	throttleK: number;
	hardest: boolean;
	tooSmall: boolean;
	advice?: string;
	suggestedSize?: NominalSize;
}

export interface SystemCoefficients {
	staticM: number;
	frictionM: number;
	minorM: number;
	weirM: number;
	designFlowM3s: number;
}

export interface HydraulicsResult {
	outlets: OutletDemand[];
	branches: BranchResult[];
	supply?: PipeRun;
	totalFlowM3s: number;
	/** Head the pump must deliver at the total flow: supply losses plus the hardest branch. */
	requiredHeadM: number;
	hardestBranchId?: string;
	drainBackM3: number;
	system: SystemCoefficients;
	warnings: string[];
}

export function pipeRun(
	spec: { material: PipeMaterial; size: NominalSize },
	lengthM: number,
	flowM3s: number,
	fittings: readonly FittingCount[]
): PipeRun {
	const diameter = insideDiameterM(spec.material, spec.size);
	const c = HAZEN_WILLIAMS_C[spec.material];
	const v = velocity(flowM3s, diameter);
	const k = totalK(fittings, spec.size);
	return {
		material: spec.material,
		size: spec.size,
		insideDiameterM: diameter,
		lengthM,
		flowM3s,
		velocityMs: v,
		frictionLossM: hazenWilliamsLoss(flowM3s, diameter, c, lengthM),
		lossPer100: lossPer100(flowM3s, diameter, c),
		fittingsK: k,
		fittingsLossM: k * velocityHead(v),
		volumeM3: pipeVolume(diameter, lengthM)
	};
}

export interface SizeLimits {
	velocityLimitMs: number;
	lossPer100Limit: number;
}

export function limitsFrom(settings: Settings): SizeLimits {
	return {
		velocityLimitMs: feet(settings.velocityLimitFtS),
		lossPer100Limit: settings.lossPer100Limit
	};
}

export function exceeds(run: Pick<PipeRun, 'velocityMs' | 'lossPer100'>, limits: SizeLimits) {
	return run.velocityMs > limits.velocityLimitMs || run.lossPer100 > limits.lossPer100Limit;
}

/** The smallest larger size of the same material that keeps within both limits, if any. */
export function suggestSize(
	material: PipeMaterial,
	size: NominalSize,
	flowM3s: number,
	limits: SizeLimits
): NominalSize | undefined {
	return nextLargerSizes(material, size).find((candidate) => {
		const d = insideDiameterM(material, candidate);
		const run = {
			velocityMs: velocity(flowM3s, d),
			lossPer100: lossPer100(flowM3s, d, HAZEN_WILLIAMS_C[material])
		};
		return !exceeds(run, limits);
	});
}

// Trade rule: keep water in plastic pipe at or under about 5 ft/s to limit noise and surge
// (common practice, no source); the limit itself comes from the settings.
export function sizeAdvice(
	run: PipeRun,
	limits: SizeLimits,
	units: UnitSystem,
	subject = 'this outlet'
): { advice: string; suggested?: NominalSize } {
	const speed = (ms: number) => formatQuantity(ms, 'velocity', units).text;
	const carries = `${run.size} in carries ${subject} at ${speed(run.velocityMs)}`;
	const per100 = units === 'us' ? 'ft per 100 ft' : 'm per 100 m';
	const lossNote =
		run.lossPer100 > limits.lossPer100Limit
			? ` and loses ${run.lossPer100.toFixed(1)} ${per100}`
			: '';
	const suggested = suggestSize(run.material, run.size, run.flowM3s, limits);
	if (!suggested) {
		return { advice: `${carries}${lossNote}; no larger ${run.material} size fits, split the flow` };
	}
	const d = insideDiameterM(run.material, suggested);
	const better = speed(velocity(run.flowM3s, d));
	return { advice: `${carries}${lossNote}; ${suggested} in brings it to ${better}`, suggested };
}

const VALVE_FITTING = {
	'ball-valve': 'ball-valve',
	'gate-valve': 'gate-valve',
	'globe-valve': 'globe-valve'
} as const;

function branchResult(
	branch: Branch,
	demand: OutletDemand,
	limits: SizeLimits,
	units: UnitSystem
): BranchResult {
	const run = pipeRun(branch.pipe, feet(branch.lengthFt), demand.flowM3s, branch.fittings);
	const valveK =
		branch.valve === 'none'
			? 0
			: totalK([{ kind: VALVE_FITTING[branch.valve], count: 1 }], run.size);
	const hv = velocityHead(run.velocityMs);
	const exitLoss = demand.losesPipeVelocityHead ? hv : 0;
	const staticLiftM = feet(branch.staticLiftFt);
	const valveLossM = valveK * hv;
	const outletHeadM = demand.outletHeadM + exitLoss;
	const tooSmall = exceeds(run, limits);
	const advice = tooSmall ? sizeAdvice(run, limits, units) : undefined;
	return Object.assign(run, {
		branchId: branch.id,
		outletId: demand.id,
		outletName: demand.name,
		staticLiftM,
		valveLossM,
		outletHeadM,
		headM: staticLiftM + run.frictionLossM + run.fittingsLossM + valveLossM + outletHeadM,
		throttleHeadM: 0,
		throttleK: 0,
		hardest: false,
		tooSmall,
		advice: advice?.advice,
		suggestedSize: advice?.suggested
	});
}

function withThrottling(branches: BranchResult[]): BranchResult[] {
	const hardest = branches.reduce<BranchResult | undefined>(
		(worst, b) => (!worst || b.headM > worst.headM ? b : worst),
		undefined
	);
	for (const b of branches) {
		const hv = velocityHead(b.velocityMs);
		b.hardest = b === hardest;
		b.throttleHeadM = hardest ? hardest.headM - b.headM : 0;
		b.throttleK = hv > 0 ? b.throttleHeadM / hv : 0;
	}
	return branches;
}

function systemCoefficients(
	hardest: BranchResult | undefined,
	demand: OutletDemand | undefined,
	supply: PipeRun | undefined,
	totalFlowM3s: number
): SystemCoefficients {
	const supplyFriction = supply?.frictionLossM ?? 0;
	const supplyMinor = supply?.fittingsLossM ?? 0;
	if (!hardest || !demand) {
		return { staticM: 0, frictionM: 0, minorM: 0, weirM: 0, designFlowM3s: totalFlowM3s };
	}
	const weir = demand.kind === 'spillway' ? demand.outletHeadM : 0;
	return {
		staticM: hardest.staticLiftM,
		frictionM: hardest.frictionLossM + supplyFriction,
		minorM: hardest.fittingsLossM + hardest.valveLossM + (hardest.outletHeadM - weir) + supplyMinor,
		weirM: weir,
		designFlowM3s: totalFlowM3s
	};
}

/**
 * The system curve: head the pump must give at a total flow Q, with every valve held at its
 * design setting so all branch flows scale together by s = Q / Q_design.
 */
export function systemHead(system: SystemCoefficients, flowM3s: number): number {
	if (system.designFlowM3s <= 0) return system.staticM;
	const s = Math.max(0, flowM3s) / system.designFlowM3s;
	return (
		system.staticM +
		system.frictionM * s ** HW_EXPONENT +
		system.minorM * s ** 2 +
		system.weirM * s ** WEIR_EXPONENT
	);
}

export function analyseHydraulics(
	outlets: readonly Outlet[],
	branches: readonly Branch[],
	supplyInput: Supply | undefined,
	settings: Settings,
	units: UnitSystem
): HydraulicsResult {
	const limits = limitsFrom(settings);
	const demands = outlets.map(outletDemand);
	const demandById = new Map(demands.map((d) => [d.id, d]));
	const results = withThrottling(
		branches.map((b) => branchResult(b, demandById.get(b.outletId)!, limits, units))
	);
	const totalFlowM3s = results.reduce((sum, b) => sum + b.flowM3s, 0);
	const supply = supplyInput
		? pipeRun(supplyInput.pipe, feet(supplyInput.lengthFt), totalFlowM3s, supplyInput.fittings)
		: undefined;
	const hardest = results.find((b) => b.hardest);
	const warnings = results.filter((b) => b.advice).map((b) => `${b.outletName}: ${b.advice}`);
	if (supply && exceeds(supply, limits)) {
		warnings.push(
			`Supply to the manifold: ${sizeAdvice(supply, limits, units, 'the total flow').advice}`
		);
	}
	const supplyHead = supply ? supply.frictionLossM + supply.fittingsLossM : 0;
	return {
		outlets: demands,
		branches: results,
		supply,
		totalFlowM3s,
		requiredHeadM: (hardest?.headM ?? 0) + supplyHead,
		hardestBranchId: hardest?.branchId,
		drainBackM3: results.reduce((sum, b) => sum + b.volumeM3, 0) + (supply?.volumeM3 ?? 0),
		system: systemCoefficients(
			hardest,
			hardest && demandById.get(hardest.outletId),
			supply,
			totalFlowM3s
		),
		warnings
	};
}
