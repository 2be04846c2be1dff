/** Pipe sizes, Hazen-Williams friction and fitting losses. SI inside, inches only in the tables. */
import { METERS_PER_INCH, STANDARD_GRAVITY } from './units';

export const PIPE_MATERIALS = ['pvc-sch40', 'pvc-sch80', 'flex-pvc', 'poly-sidr15'] as const;
export type PipeMaterial = (typeof PIPE_MATERIALS)[number];

export const NOMINAL_SIZES = ['1/2', '3/4', '1', '1-1/4', '1-1/2', '2', '3'] as const;
export type NominalSize = (typeof NOMINAL_SIZES)[number];

// Inside diameters in inches, outside diameter minus twice the minimum wall.
// ASTM D1785 (PVC Schedule 40 and 80, iron-pipe-size outside diameters).
const SCH40_ID_IN: Record<NominalSize, number> = {
	'1/2': 0.622,
	'3/4': 0.824,
	'1': 1.049,
	'1-1/4': 1.38,
	'1-1/2': 1.61,
	'2': 2.067,
	'3': 3.068
};
const SCH80_ID_IN: Record<NominalSize, number> = {
	'1/2': 0.546,
	'3/4': 0.742,
	'1': 0.957,
	'1-1/4': 1.278,
	'1-1/2': 1.5,
	'2': 1.939,
	'3': 2.9
};

// Flexible PVC hose is made to Schedule 40 outside diameters with a similar bore (from memory);
// polyethylene SIDR-15 pipe (ASTM D2239) is inside-diameter controlled to the Schedule 40 bores
// (from memory). Both are offered up to 2 in in the trade.
const FLEX_AND_POLY_SIZES: NominalSize[] = ['1/2', '3/4', '1', '1-1/4', '1-1/2', '2'];

function pick(table: Record<NominalSize, number>, sizes: readonly NominalSize[]) {
	return Object.fromEntries(sizes.map((size) => [size, table[size]])) as Partial<
		Record<NominalSize, number>
	>;
}

export const INSIDE_DIAMETER_IN: Record<PipeMaterial, Partial<Record<NominalSize, number>>> = {
	'pvc-sch40': SCH40_ID_IN,
	'pvc-sch80': SCH80_ID_IN,
	'flex-pvc': pick(SCH40_ID_IN, FLEX_AND_POLY_SIZES),
	'poly-sidr15': pick(SCH40_ID_IN, FLEX_AND_POLY_SIZES)
};

// Hazen-Williams roughness coefficient C. PVC 150 (the value behind the Illinois Administrative
// Code Title 77 Part 906 Appendix A Exhibit I table); polyethylene 140 (Engineering ToolBox
// "Hazen-Williams coefficients"); flexible PVC 140 (from memory).
export const HAZEN_WILLIAMS_C: Record<PipeMaterial, number> = {
	'pvc-sch40': 150,
	'pvc-sch80': 150,
	'flex-pvc': 140,
	'poly-sidr15': 140
};

export function sizesFor(material: PipeMaterial): NominalSize[] {
	return NOMINAL_SIZES.filter((size) => INSIDE_DIAMETER_IN[material][size] !== undefined);
}

export function pipeExists(material: PipeMaterial, size: string): size is NominalSize {
	return (sizesFor(material) as string[]).includes(size);
}

export function insideDiameterM(material: PipeMaterial, size: NominalSize): number {
	const inches = INSIDE_DIAMETER_IN[material][size];
	if (inches === undefined) throw new RangeError(`No ${size} in ${material}`);
	return inches * METERS_PER_INCH;
}

export function nextLargerSizes(material: PipeMaterial, size: NominalSize): NominalSize[] {
	const sizes = sizesFor(material);
	return sizes.slice(sizes.indexOf(size) + 1);
}

export const boreArea = (diameterM: number) => (Math.PI / 4) * diameterM ** 2;

export function velocity(flowM3s: number, diameterM: number): number {
	return flowM3s / boreArea(diameterM);
}

export const velocityHead = (velocityMs: number) => velocityMs ** 2 / (2 * STANDARD_GRAVITY);

/**
 * Head loss in metres of water over a length of pipe.
 * Hazen-Williams, SI form: h = 10.67 L Q^1.852 / (C^1.852 d^4.8704)
 * (Engineering ToolBox, "Hazen-Williams Equation - calculating Head Loss in Water Pipes").
 */
export function hazenWilliamsLoss(flowM3s: number, diameterM: number, c: number, lengthM: number) {
	if (flowM3s <= 0 || lengthM <= 0) return 0;
	return (10.67 * lengthM * flowM3s ** 1.852) / (c ** 1.852 * diameterM ** 4.8704);
}

export const FITTING_KINDS = [
	'elbow-90',
	'elbow-45',
	'tee-run',
	'tee-branch',
	'ball-valve',
	'gate-valve',
	'globe-valve',
	'swing-check',
	'entrance',
	'exit'
] as const;
export type FittingKind = (typeof FITTING_KINDS)[number];

// Crane Technical Paper 410, "Flow of Fluids", page: K = fT × (L/D) with these
// equivalent-length ratios (values quoted from memory): standard 90° elbow 30, 45° elbow 16,
// tee flow through run 20, through branch 60, ball valve (full port) 3, gate valve 8,
// globe valve 340, swing check valve 100.
const LENGTH_RATIO: Partial<Record<FittingKind, number>> = {
	'elbow-90': 30,
	'elbow-45': 16,
	'tee-run': 20,
	'tee-branch': 60,
	'ball-valve': 3,
	'gate-valve': 8,
	'globe-valve': 340,
	'swing-check': 100
};
// Crane TP-410 page A-29 (from memory): pipe entrance, flush, K = 0.5; pipe exit K = 1.0.
const FIXED_K: Partial<Record<FittingKind, number>> = { entrance: 0.5, exit: 1 };

// Crane TP-410 page A-26 (from memory): friction factor in the zone of complete turbulence
// for clean commercial steel pipe, by nominal size.
export const CRANE_FRICTION_FACTOR: Record<NominalSize, number> = {
	'1/2': 0.027,
	'3/4': 0.025,
	'1': 0.023,
	'1-1/4': 0.022,
	'1-1/2': 0.021,
	'2': 0.019,
	'3': 0.018
};

export function fittingK(kind: FittingKind, size: NominalSize): number {
	const fixed = FIXED_K[kind];
	if (fixed !== undefined) return fixed;
	return CRANE_FRICTION_FACTOR[size] * (LENGTH_RATIO[kind] ?? 0);
}

/** Equivalent length of straight pipe for a fitting (Crane TP-410: L = (L/D) × D). */
export function equivalentLengthM(kind: FittingKind, size: NominalSize, diameterM: number) {
	const ratio = LENGTH_RATIO[kind];
	if (ratio !== undefined) return ratio * diameterM;
	return (fittingK(kind, size) / CRANE_FRICTION_FACTOR[size]) * diameterM;
}

export interface FittingCount {
	kind: FittingKind;
	count: number;
}

export function totalK(fittings: readonly FittingCount[], size: NominalSize): number {
	return fittings.reduce((sum, f) => sum + f.count * fittingK(f.kind, size), 0);
}

/** Loss per 100 length units (ft per 100 ft = m per 100 m). */
export function lossPer100(flowM3s: number, diameterM: number, c: number): number {
	return hazenWilliamsLoss(flowM3s, diameterM, c, 100);
}

/** Water held inside a pipe, m³. */
export const pipeVolume = (diameterM: number, lengthM: number) => boreArea(diameterM) * lengthM;
