/**
 * Dry creeks and drainage: the peak runoff of a roof or yard area (the Rational method), the cobble
 * channel that carries it (Manning's equation for a trapezoid), the cobble, fabric and bank boulders
 * it takes, a gravel soak-away that holds one design storm's runoff in the gravel's voids, and the
 * fall of the ground away from the house. Pure; SI inside and out.
 */
import { areaM2 } from './aggregate';
import { rateTask, type LaborTask } from './labor';
import type { DrainageFeature, Settings, Stone } from './schema';
import { feet, inches, toFeet, toInches } from './units';

/**
 * Rational method, Q = C·i·A. In SI with i in m/s and A in m² it gives m³/s directly; the textbook
 * US form takes i in in/h and A in acres and gives cfs to within 1.008 (1 acre·in/h = 1.0083 ft³/s).
 */
export function rationalPeakM3s(c: number, intensityMs: number, areaM2: number): number {
	return c * intensityMs * areaM2;
}

/** The textbook US form: cfs from C, in/h and acres (the 1.008 factor taken as 1). */
export const rationalPeakCfs = (c: number, inPerHour: number, acres: number) =>
	c * inPerHour * acres;

export const inPerHourToMs = (inPerHour: number) => inches(inPerHour) / 3600;

export interface Trapezoid {
	bottomM: number;
	depthM: number;
	/** Horizontal run per unit of rise on each bank (z in z:1). */
	sideSlope: number;
}

export const flowArea = ({ bottomM, depthM, sideSlope }: Trapezoid) =>
	(bottomM + sideSlope * depthM) * depthM;

export const wettedPerimeter = ({ bottomM, depthM, sideSlope }: Trapezoid) =>
	bottomM + 2 * depthM * Math.sqrt(1 + sideSlope * sideSlope);

export const topWidth = ({ bottomM, depthM, sideSlope }: Trapezoid) =>
	bottomM + 2 * sideSlope * depthM;

/** Manning's equation in SI: Q = (1/n) A R^(2/3) S^(1/2), R = A/P. */
export function manningFlowM3s(section: Trapezoid, n: number, slope: number): number {
	const a = flowArea(section);
	const p = wettedPerimeter(section);
	if (a <= 0 || p <= 0) return 0;
	return (1 / n) * a * Math.pow(a / p, 2 / 3) * Math.sqrt(slope);
}

/** The smallest x in [0, ∞) with f(x) ≥ target, for f rising with x (bisection). */
function solveRising(f: (x: number) => number, target: number, start: number): number {
	if (f(0) >= target) return 0;
	let high = start;
	for (let i = 0; i < 200 && f(high) < target; i++) high *= 2;
	let low = 0;
	for (let i = 0; i < 200 && high - low > 1e-9 * Math.max(1, high); i++) {
		const mid = (low + high) / 2;
		if (f(mid) >= target) high = mid;
		else low = mid;
	}
	return high;
}

/** The normal depth of flow Q in a trapezoid of bottom width b. */
export function normalDepthM(
	q: number,
	bottomM: number,
	sideSlope: number,
	n: number,
	slope: number
): number {
	if (q <= 0) return 0;
	return solveRising((y) => manningFlowM3s({ bottomM, depthM: y, sideSlope }, n, slope), q, 0.1);
}

/** The bottom width a trapezoid needs to carry Q at a given depth (0 when a V carries it). */
export function bottomWidthForM(
	q: number,
	depthM: number,
	sideSlope: number,
	n: number,
	slope: number
): number {
	if (q <= 0) return 0;
	return solveRising((b) => manningFlowM3s({ bottomM: b, depthM, sideSlope }, n, slope), q, 0.1);
}

export interface CreekResult {
	lengthM: number;
	slope: number;
	manningN: number;
	bottomM: number;
	flowDepthM: number;
	/** Across the top of the finished channel, freeboard included. */
	topWidthM: number;
	velocityMs: number;
	/** The lined surface across the channel (bottom and both banks to the freeboard). */
	linedWidthM: number;
	cobbleVolumeM3: number;
	fabricAreaM2: number;
	excavationM3: number;
	boulderCount: number;
}

export interface SoakawayResult {
	/** Runoff of one design storm that the soak-away holds. */
	stormRunoffM3: number;
	gravelVolumeM3: number;
	depthM: number;
	/** A square pit of this side holds the gravel at the depth given. */
	sideM: number;
	fabricAreaM2: number;
}

export interface DrainageResult {
	catchmentM2: number;
	runoffC: number;
	rainInPerHr: number;
	peakFlowM3s: number;
	creek?: CreekResult;
	soakaway?: SoakawayResult;
	/** The fall the code asks for next to the house, and the fall given (if any). */
	houseFall: { requiredM: number; overM: number; givenM?: number; enough?: boolean };
	warnings: string[];
}

/** One storm's runoff: C × rain depth (intensity × duration) × area. */
export function stormRunoffM3(c: number, inPerHour: number, minutes: number, areaM2: number) {
	return c * inches(inPerHour) * (minutes / 60) * areaM2;
}

export function analyseDrainage(f: DrainageFeature, settings: Settings): DrainageResult {
	const d = settings.drainage;
	const catchment = f.catchment.areas.reduce((sum, a) => sum + areaM2(a), 0);
	const rain = f.rainInPerHr ?? d.designRainInPerHr;
	const q = rationalPeakM3s(f.catchment.runoffC, inPerHourToMs(rain), catchment);
	const warnings: string[] = [];
	let creek: CreekResult | undefined;
	if (f.creek) {
		const c = f.creek;
		const slope = c.slopePercent / 100;
		const y = inches(c.flowDepthIn);
		const z = c.sideSlope;
		const b = bottomWidthForM(q, y, z, d.cobbleManningN, slope);
		const flow = { bottomM: b, depthM: y, sideSlope: z };
		const full = { bottomM: b, depthM: y + inches(c.freeboardIn), sideSlope: z };
		const lined = wettedPerimeter(full);
		const length = feet(c.lengthFt);
		const layer = inches(c.cobbleDepthIn);
		const area = flowArea(flow);
		const velocity = area > 0 ? q / area : 0;
		creek = {
			lengthM: length,
			slope,
			manningN: d.cobbleManningN,
			bottomM: b,
			flowDepthM: y,
			topWidthM: topWidth(full),
			velocityMs: velocity,
			linedWidthM: lined,
			cobbleVolumeM3: lined * length * layer,
			fabricAreaM2: (lined + 2 * feet(c.fabricOverlapFt)) * length,
			excavationM3: (flowArea(full) + lined * layer) * length,
			boulderCount: f.boulder ? 2 * Math.ceil(c.lengthFt / f.boulder.spacingFt - 1e-9) : 0
		};
		// Above about 5 ft/s water starts to move the smaller cobbles of a dry creek (common
		// practice, no source).
		if (toFeet(velocity) > 5) {
			warnings.push(
				`${f.name}: water runs at ${toFeet(velocity).toFixed(1)} ft/s in the creek; use larger stone, a wider bed or a gentler slope`
			);
		}
	}
	let soakaway: SoakawayResult | undefined;
	if (f.soakaway) {
		const s = f.soakaway;
		const runoff = stormRunoffM3(f.catchment.runoffC, rain, d.stormMinutes, catchment);
		const gravel = runoff / s.voidFraction;
		const depth = feet(s.depthFt);
		const side = Math.sqrt(gravel / depth);
		soakaway = {
			stormRunoffM3: runoff,
			gravelVolumeM3: gravel,
			depthM: depth,
			sideM: side,
			fabricAreaM2: 2 * side * side + 4 * side * depth
		};
	}
	const requiredM = inches(d.houseFallIn);
	const overM = feet(d.houseFallOverFt);
	const givenM = f.houseFallIn === undefined ? undefined : inches(f.houseFallIn);
	const enough = givenM === undefined ? undefined : givenM >= requiredM - 1e-12;
	if (enough === false) {
		warnings.push(
			`${f.name}: the ground falls ${toInches(givenM!).toFixed(1)} in over the first ${d.houseFallOverFt} ft from the house; the code asks for ${d.houseFallIn} in (IRC R401.3): regrade before building`
		);
	}
	return {
		catchmentM2: catchment,
		runoffC: f.catchment.runoffC,
		rainInPerHr: rain,
		peakFlowM3s: q,
		creek,
		soakaway,
		houseFall: { requiredM, overM, givenM, enough },
		warnings
	};
}

/** The creek's bank boulders as stones, so they are weighed and set like the design's own. */
export function creekBoulders(f: DrainageFeature, count: number): Stone | undefined {
	const b = f.boulder;
	if (!b || count <= 0) return undefined;
	return {
		id: `${f.id}-boulders`,
		name: `${f.name}: bank boulders`,
		size: { shape: 'boulder', lengthIn: b.lengthIn, widthIn: b.widthIn, heightIn: b.heightIn },
		rock: b.rock,
		count,
		wetted: false,
		sku: f.boulderSku,
		optionId: f.optionId
	};
}

const FT2 = feet(1) ** 2;
const KG_PER_TON = 907.18474;

/**
 * The crew's tasks: lay fabric, place cobble and gravel (by weight, from the items' densities). The
 * creek's and soak-away's digging are digs of the design; bank boulders are set as stones.
 */
export function drainageTasks(
	f: DrainageFeature,
	r: DrainageResult,
	settings: Settings,
	bucket: string,
	massKg: { cobble: number; gravel: number }
): LaborTask[] {
	const people = settings.labor.baseCrewSize;
	const fabric = (r.creek?.fabricAreaM2 ?? 0) + (r.soakaway?.fabricAreaM2 ?? 0);
	return [
		rateTask(settings, 'fabric', {
			bucket,
			task: `Lay fabric: ${f.name}`,
			quantity: fabric / FT2,
			people
		}),
		rateTask(settings, 'creek-stone', {
			bucket,
			task: `Place cobble and gravel: ${f.name}`,
			quantity: (massKg.cobble + massKg.gravel) / KG_PER_TON,
			people
		})
	].filter((t) => t.hours > 0);
}
