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
	gauge: Gauge;
	tapV: number;
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
	distanceM: number;
	va: number;
}

/**
 * Voltage at each fixture of a daisy-chained run: each stretch of cable carries the current of
 * every fixture beyond it, at the nominal voltage (I = VA / V, common practice).
 */
export function fixtureVoltages(
	placed: readonly Placed[],
	tapV: number,
	gauge: Gauge,
	nominalV: number
): FixtureOnRun[] {
	const sorted = [...placed].sort((a, b) => a.distanceM - b.distanceM);
	let remainingVA = sorted.reduce((sum, f) => sum + f.va, 0);
	let volts = tapV;
	let position = 0;
	return sorted.map((fixture) => {
		// The linear model would go below zero on a hopelessly overloaded run; stop at 0 V.
		volts = Math.max(
			0,
			volts - voltageDrop(remainingVA / nominalV, fixture.distanceM - position, gauge)
		);
		position = fixture.distanceM;
		remainingVA -= fixture.va;
		return {
			fixtureId: fixture.fixtureId,
			name: fixture.name,
			distanceM: fixture.distanceM,
			va: fixture.va,
			volts
		};
	});
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
	taps: readonly number[],
	gauge: Gauge,
	settings: Settings['lighting']
): string {
	const fits = (g: Gauge, tap: number) =>
		window(fixtureVoltages(placed, tap, g, settings.nominalVolts), settings).ok;
	const sortedTaps = [...taps].sort((a, b) => a - b);
	const tap = sortedTaps.find((t) => fits(gauge, t));
	if (tap !== undefined) return `Move this run to the ${tap} V tap`;
	const heavier = GAUGES.slice(GAUGES.indexOf(gauge) + 1);
	for (const g of heavier) {
		const t = sortedTaps.find((candidate) => fits(g, candidate));
		if (t !== undefined) return `Use ${g} AWG cable on the ${t} V tap`;
	}
	return 'No tap or gauge keeps every fixture in range: split the run or feed it from the middle (a T or hub)';
}

function runResult(
	run: Lighting['runs'][number],
	lighting: Lighting,
	settings: Settings['lighting']
): RunResult {
	const byId = new Map(lighting.fixtures.map((f) => [f.id, f]));
	const placed = run.fixtures.map((p) => {
		const fixture = byId.get(p.fixtureId)!;
		return {
			fixtureId: p.fixtureId,
			name: fixture.name,
			distanceM: feet(p.distanceFt),
			va: fixture.va
		};
	});
	const fixtures = fixtureVoltages(placed, run.tapV, run.gauge, settings.nominalVolts);
	const range = window(fixtures, settings);
	const transformer = lighting.transformers.find((t) => t.id === run.transformerId)!;
	const farthest = Math.max(...placed.map((p) => p.distanceM));
	return {
		id: run.id,
		transformerId: run.transformerId,
		gauge: run.gauge,
		tapV: run.tapV,
		loadVA: placed.reduce((sum, p) => sum + p.va, 0),
		cableLengthM: farthest * (1 + settings.cableSlackPercent / 100),
		trenchLengthM: farthest,
		fixtures,
		lastFixtureVolts: fixtures[fixtures.length - 1].volts,
		lowestVolts: range.lowest,
		highestVolts: range.highest,
		withinWindow: range.ok,
		advice: range.ok ? undefined : runAdvice(placed, transformer.tapsV, run.gauge, settings)
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
