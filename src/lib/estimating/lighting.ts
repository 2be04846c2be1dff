/** Low-voltage lighting: transformer load, voltage drop along each run, tap and gauge advice. */
import type { Lighting, Settings } from './schema';
import { feet, toFeet } from './units';

import { GAUGES, type Gauge } from './choices';
export { GAUGES, type Gauge };

// NEC (NFPA 70) Chapter 9, Table 8, DC resistance at 75 °C, uncoated stranded copper,
// ohms per 1000 ft. 12 AWG stranded uncoated 1.98 Ω/kft (NEC (NFPA 70) Chapter 9 Table 8); the
// others from memory (the table's solid
// column, 3.07 / 1.93 / 1.21 / 0.764 for 14 / 12 / 10 / 8 AWG, is reprinted at voltdropcalc.com).
export const COPPER_OHMS_PER_KFT: Record<Gauge, number> = {
	'16': 4.99,
	'14': 3.14,
	'12': 1.98,
	'10': 1.24,
	'8': 0.778
};

const OHMS_PER_M = (gauge: Gauge) => COPPER_OHMS_PER_KFT[gauge] / feet(1000);

/** Drop over a two-conductor run: current × resistance of the out-and-back length. */
export function voltageDrop(amps: number, lengthM: number, gauge: Gauge): number {
	return amps * 2 * lengthM * OHMS_PER_M(gauge);
}

export interface FixtureOnRun {
	fixtureId: string;
	name: string;
	distanceM: number;
	va: number;
	volts: number;
}

export interface RunResult {
	id: string;
	transformerId: string;
	layout: RunLayout;
	gauge: Gauge;
	tapV: number;
	/** The fixtures' own rating. */
	fixtureVA: number;
	/** Heat in the cable at the settled currents, W. */
	cableLossW: number;
	/** Current from the transformer, A. */
	amps: number;
	/** False when the cable cannot carry the load at this tap (no steady voltage). */
	settled: boolean;
	/** What the transformer supplies to the run: the fixtures plus the cable's loss. */
	loadVA: number;
	cableLengthM: number;
	/** Trench dug for the run's cable (shared stretches counted once). */
	trenchLengthM: number;
	fixtures: FixtureOnRun[];
	lastFixtureVolts: number;
	lowestVolts: number;
	highestVolts: number;
	withinWindow: boolean;
	advice?: string;
}

export interface TransformerResult {
	id: string;
	name: string;
	ratingVA: number;
	loadVA: number;
	loadRatio: number;
	warnings: string[];
}

export interface LightingResult {
	transformers: TransformerResult[];
	runs: RunResult[];
	totalLoadVA: number;
	fixtureCount: number;
	warnings: string[];
}

interface Placed {
	fixtureId: string;
	name: string;
	/** Along its own stretch: from the transformer (a chain), the T (an arm) or the hub (a spoke). */
	distanceM: number;
	va: number;
	/** Which arm of a T the fixture is on. */
	arm?: 'a' | 'b';
}

export type RunLayout = 'chain' | 't' | 'hub';

export interface RunShape {
	layout: RunLayout;
	/** Cable from the transformer to the T or the hub (0 for a chain). */
	leadM: number;
}

const CHAIN: RunShape = { layout: 'chain', leadM: 0 };

/** The stretches a run's fixtures hang on, each fed from the end of the lead. */
function branchesOf(placed: readonly Placed[], shape: RunShape): Placed[][] {
	const byDistance = (list: readonly Placed[]) =>
		[...list].sort((a, b) => a.distanceM - b.distanceM);
	if (shape.layout === 'hub') return placed.map((p) => [p]);
	if (shape.layout === 't') {
		return [
			byDistance(placed.filter((p) => p.arm !== 'b')),
			byDistance(placed.filter((p) => p.arm === 'b'))
		].filter((arm) => arm.length > 0);
	}
	return [byDistance(placed)];
}

export interface RunSolution {
	fixtures: FixtureOnRun[];
	/** Current leaving the transformer, A. */
	amps: number;
	/** Power lost as heat in the cable, W. */
	cableLossW: number;
	/** False when no steady voltage exists: the cable cannot carry the load at this tap. */
	settled: boolean;
	iterations: number;
}

// The iteration stops when no fixture's voltage moves by more than this; below the floor the run
// has no steady state (the drivers would draw ever more current).
const SETTLE_V = 1e-9;
const FLOOR_V = 1;
const MAX_ITERATIONS = 200;

/**
 * Voltages, current and cable loss of a run of LED fixtures. An LED driver draws about its rated
 * power whatever the voltage (I = VA / V at the fixture, common practice, no source), so it draws
 * more current as the voltage sags, which sags the voltage further: start every fixture at the tap
 * voltage, work out the currents, the drops along each stretch (each stretch carries the fixtures
 * beyond it; a T's lead carries both arms, a hub's lead every spoke), and repeat until the
 * voltages settle. A run that never settles is reported at the nominal-current figures, unsettled.
 */
export function solveRun(
	placed: readonly Placed[],
	tapV: number,
	gauge: Gauge,
	shape: RunShape = CHAIN,
	nominalV = 12
): RunSolution {
	// Fixtures by position in `placed`; two entries of one fixture at one distance share a voltage
	// (a slot). Plain arrays keep the repeated passes free of string keys and maps.
	const n = placed.length;
	const index = new Map(placed.map((p, i) => [p, i]));
	const slotOf = new Map<string, number>();
	const slot = placed.map((p) => {
		const key = p.fixtureId + '\u0000' + p.distanceM;
		const known = slotOf.get(key);
		if (known !== undefined) return known;
		slotOf.set(key, slotOf.size);
		return slotOf.size - 1;
	});
	const slots = slotOf.size;
	const branches = branchesOf(placed, shape).map((b) => b.map((p) => index.get(p)!));
	const ohms = OHMS_PER_M(gauge);
	const amps = new Float64Array(n);
	const pass = (currentOf: (i: number) => number) => {
		for (let i = 0; i < n; i++) amps[i] = currentOf(i);
		const next = new Float64Array(slots);
		let total = 0;
		for (let i = 0; i < n; i++) total += amps[i];
		let loss = total ** 2 * 2 * shape.leadM * ohms;
		const junctionV = tapV - voltageDrop(total, shape.leadM, gauge);
		for (const branch of branches) {
			let remaining = 0;
			for (const i of branch) remaining += amps[i];
			let v = junctionV;
			let position = 0;
			for (const i of branch) {
				const length = placed[i].distanceM - position;
				v -= voltageDrop(remaining, length, gauge);
				loss += remaining ** 2 * 2 * length * ohms;
				next[slot[i]] = v;
				position = placed[i].distanceM;
				remaining -= amps[i];
			}
		}
		return { next, total, loss };
	};
	let volts = new Float64Array(slots).fill(tapV);
	let settled = false;
	let iterations = 0;
	let last = pass((i) => placed[i].va / tapV);
	for (; iterations < MAX_ITERATIONS; iterations++) {
		const current = volts;
		last = pass((i) => placed[i].va / current[slot[i]]);
		let lowest = Infinity;
		for (let k = 0; k < slots; k++) lowest = Math.min(lowest, last.next[k]);
		if (!(lowest >= FLOOR_V)) break;
		let moved = -Infinity;
		for (let i = 0; i < n; i++) {
			moved = Math.max(moved, Math.abs(last.next[slot[i]] - current[slot[i]]));
		}
		volts = last.next;
		if (moved < SETTLE_V) {
			settled = true;
			break;
		}
	}
	if (!settled) {
		// No steady state: show the drop at nominal current, floored at 0 V, and say so.
		last = pass((i) => placed[i].va / nominalV);
		volts = last.next.map((v) => Math.max(0, v));
	}
	const fixtures = branches.flat().map((i) => {
		const p = placed[i];
		return {
			fixtureId: p.fixtureId,
			name: p.name,
			distanceM: shape.leadM + p.distanceM,
			va: p.va,
			volts: volts[slot[i]]
		};
	});
	return { fixtures, amps: last.total, cableLossW: last.loss, settled, iterations };
}

/** Voltage at each fixture of a daisy-chained run (see solveRun). */
export function fixtureVoltages(
	placed: readonly Placed[],
	tapV: number,
	gauge: Gauge,
	nominalV = 12
): FixtureOnRun[] {
	return solveRun(placed, tapV, gauge, CHAIN, nominalV).fixtures;
}

function window(fixtures: readonly FixtureOnRun[], settings: Settings['lighting']) {
	const volts = fixtures.map((f) => f.volts);
	const lowest = Math.min(...volts);
	const highest = Math.max(...volts);
	return {
		lowest,
		highest,
		ok: lowest >= settings.fixtureMinVolts && highest <= settings.fixtureMaxVolts
	};
}

function runAdvice(
	placed: readonly Placed[],
	shape: RunShape,
	taps: readonly number[],
	gauge: Gauge,
	settings: Settings['lighting']
): string {
	const fits = (g: Gauge, tap: number) => {
		const solution = solveRun(placed, tap, g, shape, settings.nominalVolts);
		return solution.settled && window(solution.fixtures, settings).ok;
	};
	const sortedTaps = [...taps].sort((a, b) => a - b);
	const tap = sortedTaps.find((t) => fits(gauge, t));
	if (tap !== undefined) return `Move this run to the ${tap} V tap`;
	const heavier = GAUGES.slice(GAUGES.indexOf(gauge) + 1);
	for (const g of heavier) {
		const t = sortedTaps.find((candidate) => fits(g, candidate));
		if (t !== undefined) return `Use ${g} AWG cable on the ${t} V tap`;
	}
	return shape.layout === 'chain'
		? 'No tap or gauge keeps every fixture in range: split the run or feed it from the middle (a T or hub)'
		: 'No tap or gauge keeps every fixture in range: split the run onto another tap or transformer';
}

function runResult(
	run: Lighting['runs'][number],
	lighting: Lighting,
	settings: Settings['lighting']
): RunResult {
	const byId = new Map(lighting.fixtures.map((f) => [f.id, f]));
	const placed: Placed[] = run.fixtures.map((p) => {
		const fixture = byId.get(p.fixtureId)!;
		return {
			fixtureId: p.fixtureId,
			name: fixture.name,
			distanceM: feet(p.distanceFt),
			va: fixture.va,
			...(p.arm ? { arm: p.arm } : {})
		};
	});
	const shape: RunShape = {
		layout: run.layout,
		leadM: run.layout === 'chain' ? 0 : feet(run.leadFt)
	};
	const solution = solveRun(placed, run.tapV, run.gauge, shape, settings.nominalVolts);
	const fixtures = solution.fixtures;
	const range = window(fixtures, settings);
	const transformer = lighting.transformers.find((t) => t.id === run.transformerId)!;
	const branches = branchesOf(placed, shape);
	// Cable and trench: the lead once, then each stretch out to its farthest fixture.
	const laidM =
		shape.leadM + branches.reduce((sum, b) => sum + Math.max(0, ...b.map((p) => p.distanceM)), 0);
	const fixtureVA = placed.reduce((sum, p) => sum + p.va, 0);
	const ok = range.ok && solution.settled;
	return {
		id: run.id,
		transformerId: run.transformerId,
		layout: run.layout,
		gauge: run.gauge,
		tapV: run.tapV,
		fixtureVA,
		cableLossW: solution.cableLossW,
		amps: solution.amps,
		settled: solution.settled,
		loadVA: fixtureVA + solution.cableLossW,
		cableLengthM: laidM * (1 + settings.cableSlackPercent / 100),
		trenchLengthM: laidM,
		fixtures,
		lastFixtureVolts: fixtures[fixtures.length - 1].volts,
		lowestVolts: range.lowest,
		highestVolts: range.highest,
		withinWindow: ok,
		advice: ok ? undefined : runAdvice(placed, shape, transformer.tapsV, run.gauge, settings)
	};
}

// Keep a transformer's load at or under 80% of its rating (common practice, no source; the
// ratio itself comes from the settings).
function transformerResult(
	transformer: Lighting['transformers'][number],
	runs: readonly RunResult[],
	settings: Settings['lighting']
): TransformerResult {
	const loadVA = runs
		.filter((r) => r.transformerId === transformer.id)
		.reduce((sum, r) => sum + r.loadVA, 0);
	const loadRatio = loadVA / transformer.ratingVA;
	const warnings: string[] = [];
	const percent = (x: number) => `${Math.round(x * 100)}%`;
	if (loadRatio > 1) {
		warnings.push(`${transformer.name} is overloaded at ${percent(loadRatio)} of its rating`);
	} else if (loadRatio > settings.loadWarnRatio) {
		warnings.push(
			`${transformer.name} is loaded to ${percent(loadRatio)}, above the ${percent(settings.loadWarnRatio)} usually kept as headroom`
		);
	}
	return {
		id: transformer.id,
		name: transformer.name,
		ratingVA: transformer.ratingVA,
		loadVA,
		loadRatio,
		warnings
	};
}

export function analyseLighting(lighting: Lighting, settings: Settings): LightingResult {
	const runs = lighting.runs.map((run) => runResult(run, lighting, settings.lighting));
	const transformers = lighting.transformers.map((t) =>
		transformerResult(t, runs, settings.lighting)
	);
	const runWarnings = runs
		.filter((r) => r.advice)
		.map(
			(r) =>
				`Run ${r.id}: fixtures see ${r.lowestVolts.toFixed(1)}–${r.highestVolts.toFixed(1)} V. ${r.advice}`
		);
	return {
		transformers,
		runs,
		totalLoadVA: transformers.reduce((sum, t) => sum + t.loadVA, 0),
		fixtureCount: runs.reduce((sum, r) => sum + r.fixtures.length, 0),
		warnings: [...transformers.flatMap((t) => t.warnings), ...runWarnings]
	};
}

export const cableLengthFt = (run: RunResult) => toFeet(run.cableLengthM);
