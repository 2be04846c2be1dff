/**
 * Paths, patios and terraces: flagstone or pavers over one or more areas, on a compacted gravel base
 * and a sand bedding layer, with edge restraint, joint fill and steps. Pure; SI results.
 */
import { areaM2 } from './aggregate';
import { rateTask, type LaborTask } from './labor';
import { perimeter } from './polygon';
import type { Area, PathFeature, Settings } from './schema';
import { rockDensityKgM3 } from './stones';
import { feet, inches, toFeet } from './units';

/** The edge of one area, m. */
export function areaPerimeterM(area: Area): number {
	if (area.shape === 'rectangle') return 2 * (feet(area.lengthFt) + feet(area.widthFt));
	if (area.shape === 'circle') return Math.PI * feet(area.diameterFt);
	return feet(perimeter(area.pointsFt));
}

/**
 * Joint length per unit area of a running or stack bond of L × W units: each unit owns half of its
 * perimeter, (L + W) per L·W of surface (geometry).
 */
export const jointLengthPerArea = (lengthM: number, widthM: number) =>
	(lengthM + widthM) / (lengthM * widthM);

// IRC R311.7.5.1 (riser at most 7 3/4 in) and R311.7.5.2 (tread at least 10 in), for stairs that
// serve a dwelling (from memory); a garden step is comfortable when twice the rise plus the tread
// is about 26 in (common practice, no source).
export const MAX_RISER_IN = 7.75;
export const MIN_TREAD_IN = 10;
export const COMFORT_STEP_IN = [24, 28] as const;

export interface StepsResult {
	count: number;
	riseM: number;
	treadM: number;
	totalRiseM: number;
	runM: number;
	/** Step stones or treads: their total length across the path. */
	lengthM: number;
}

export interface PathResult {
	areaM2: number;
	perimeterM: number;
	/** Flagstone: the stone's solid volume and weight to order, with waste. */
	stoneVolumeM3: number;
	stoneMassKg: number;
	/** Pavers: area and units to order, with waste. */
	paverAreaM2: number;
	paverCount: number;
	/** Compacted in place, and the loose volume to order (compaction factor applied). */
	baseCompactedM3: number;
	baseLooseM3: number;
	beddingCompactedM3: number;
	beddingLooseM3: number;
	jointFillM3: number;
	edgeM: number;
	/** What comes out of the ground (bank volume) for the layers and the surface. */
	excavationM3: number;
	steps?: StepsResult;
	wastePercent: number;
	warnings: string[];
}

export function analysePath(f: PathFeature, settings: Settings): PathResult {
	const hard = settings.hardscape;
	const area = f.areas.reduce((sum, a) => sum + areaM2(a), 0);
	const edges = f.areas.reduce((sum, a) => sum + areaPerimeterM(a), 0);
	const waste = 1 + (f.wastePercent ?? settings.aggregateWastePercent) / 100;
	const thick = inches(f.thicknessIn);
	const flag = f.surface === 'flagstone';
	const jointShare = flag ? f.jointPercent / 100 : 0;
	const stoneVolume = flag ? area * (1 - jointShare) * thick * waste : 0;
	const [pl, pw] = [inches(f.paver.lengthIn), inches(f.paver.widthIn)];
	const paverArea = flag ? 0 : area * waste;
	const jointFill = flag
		? area * jointShare * thick
		: area * jointLengthPerArea(pl, pw) * inches(f.jointWidthIn) * thick;
	const baseCompacted = area * inches(f.baseDepthIn);
	const beddingCompacted = area * inches(f.beddingDepthIn);
	const warnings: string[] = [];
	let steps: StepsResult | undefined;
	if (f.steps) {
		const s = f.steps;
		steps = {
			count: s.count,
			riseM: inches(s.riseIn),
			treadM: inches(s.treadIn),
			totalRiseM: s.count * inches(s.riseIn),
			runM: s.count * inches(s.treadIn),
			lengthM: s.count * feet(s.widthFt)
		};
		if (s.riseIn > MAX_RISER_IN) {
			warnings.push(
				`${f.name}: a ${s.riseIn} in rise is more than the ${MAX_RISER_IN} in the residential code allows for a riser (IRC R311.7.5.1); check the local code`
			);
		}
		if (s.treadIn < MIN_TREAD_IN) {
			warnings.push(
				`${f.name}: a ${s.treadIn} in tread is less than the ${MIN_TREAD_IN} in the residential code asks for (IRC R311.7.5.2); check the local code`
			);
		}
		const stride = 2 * s.riseIn + s.treadIn;
		if (stride < COMFORT_STEP_IN[0] || stride > COMFORT_STEP_IN[1]) {
			warnings.push(
				`${f.name}: twice the rise plus the tread is ${stride.toFixed(1)} in; garden steps feel easy at about 26 in`
			);
		}
	}
	if (f.edgeExcludedFt > toFeet(edges) + 1e-9) {
		warnings.push(`${f.name}: more edge left without restraint than the areas have`);
	}
	return {
		areaM2: area,
		perimeterM: edges,
		stoneVolumeM3: stoneVolume,
		stoneMassKg: stoneVolume * rockDensityKgM3(f.rock),
		paverAreaM2: paverArea,
		paverCount: flag ? 0 : Math.ceil(paverArea / (pl * pw) - 1e-9),
		baseCompactedM3: baseCompacted,
		baseLooseM3: baseCompacted * settings.hardscape.baseCompactionFactor,
		beddingCompactedM3: beddingCompacted,
		beddingLooseM3: beddingCompacted * hard.beddingCompactionFactor,
		jointFillM3: jointFill,
		edgeM: f.edgeSku ? Math.max(0, edges - feet(f.edgeExcludedFt)) : 0,
		excavationM3: area * (thick + inches(f.baseDepthIn) + inches(f.beddingDepthIn)),
		steps,
		wastePercent: (waste - 1) * 100,
		warnings
	};
}

const FT2 = feet(1) ** 2;
const YD3 = feet(3) ** 3;

/**
 * The crew's tasks for a path (its digging is one of the design's digs, `excavationM3`): layers by
 * their loose volume, the surface by area, edge by length, joints by area, steps by count.
 */
export function pathTasks(
	f: PathFeature,
	r: PathResult,
	settings: Settings,
	bucket: string
): LaborTask[] {
	const people = settings.labor.baseCrewSize;
	const areaFt2 = r.areaM2 / FT2;
	const task = (key: Parameters<typeof rateTask>[1], name: string, quantity: number) =>
		rateTask(settings, key, { bucket, task: `${name}: ${f.name}`, quantity, people });
	return [
		task(
			'path-layers',
			'Spread and compact base and bedding',
			(r.baseLooseM3 + r.beddingLooseM3) / YD3
		),
		f.surface === 'flagstone'
			? task('flagstone', 'Lay flagstone', areaFt2)
			: task('pavers', 'Lay pavers', areaFt2),
		task('edge-restraint', 'Set edge restraint', toFeet(r.edgeM)),
		task('joint-fill', 'Fill the joints', f.jointSku ? areaFt2 : 0),
		task('step', 'Build steps', r.steps?.count ?? 0)
	].filter((t) => t.hours > 0);
}
