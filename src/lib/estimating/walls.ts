/** Segmental wall takeoff: courses, units, caps, levelling pad and drainage stone. */
import type { Settings, Wall } from './schema';
import { feet, inches, toInches } from './units';

// Bury at least 6 in, or 1 in for every 8 in of wall height, whichever is more, and never less
// than one whole course (common practice in segmental-wall installation guides, no source).
const MIN_BURY_IN = 6;
const BURY_FRACTION = 1 / 8;
// Levelling pad: 6 in of compacted base, 6 in wider than the unit in front and behind
// (common practice, no source).
const PAD_DEPTH_IN = 6;
const PAD_EXTRA_WIDTH_IN = 12;
// Drainage zone of clean crushed stone 12 in deep behind a retaining wall, full height
// (common practice, no source).
const DRAIN_ZONE_IN = 12;

export interface WallResult {
	id: string;
	name: string;
	purpose: Wall['purpose'];
	buriedCourses: number;
	courses: number;
	unitsPerCourse: number;
	units: number;
	caps: number;
	/** From the bottom of the levelling pad to the top of the units. */
	heightFromFootingM: number;
	exposedHeightM: number;
	padVolumeM3: number;
	drainVolumeM3: number;
	needsPermit: boolean;
	needsEngineering: boolean;
	optionId?: string;
}

const ceil = (x: number) => Math.ceil(x - 1e-9);

export function buriedCourses(exposedHeightIn: number, unitHeightIn: number): number {
	const buryIn = Math.max(MIN_BURY_IN, exposedHeightIn * BURY_FRACTION);
	return Math.max(1, ceil(buryIn / unitHeightIn));
}

export function wallTakeoff(wall: Wall, settings: Settings): WallResult {
	const { unit } = wall;
	const buried =
		wall.purpose === 'retaining' ? buriedCourses(wall.exposedHeightIn, unit.heightIn) : 0;
	const courses = buried + ceil(wall.exposedHeightIn / unit.heightIn);
	const unitsPerCourse = ceil((wall.lengthFt * 12) / unit.lengthIn);
	const units = ceil(courses * unitsPerCourse * (1 + settings.wall.unitWastePercent / 100));
	const lengthM = feet(wall.lengthFt);
	const padVolumeM3 = lengthM * inches(unit.depthIn + PAD_EXTRA_WIDTH_IN) * inches(PAD_DEPTH_IN);
	const builtHeightM = inches(courses * unit.heightIn);
	const drainVolumeM3 =
		wall.purpose === 'retaining' ? lengthM * inches(DRAIN_ZONE_IN) * builtHeightM : 0;
	const heightFromFootingM = builtHeightM + inches(PAD_DEPTH_IN);
	const exposedHeightM = inches(wall.exposedHeightIn);
	const retaining = wall.purpose === 'retaining';
	const engineeredLimitIn = wall.surcharge
		? settings.wall.surchargeEngineeredHeightIn
		: settings.wall.engineeredHeightIn;
	return {
		id: wall.id,
		name: wall.name,
		purpose: wall.purpose,
		buriedCourses: buried,
		courses,
		unitsPerCourse,
		units,
		caps: wall.capSku ? ceil((wall.lengthFt * 12) / (wall.capLengthIn ?? unit.lengthIn)) : 0,
		heightFromFootingM,
		exposedHeightM,
		padVolumeM3,
		drainVolumeM3,
		needsPermit:
			retaining && (wall.surcharge || toInches(heightFromFootingM) > settings.wall.permitHeightIn),
		needsEngineering: retaining && wall.exposedHeightIn > engineeredLimitIn,
		optionId: wall.optionId
	};
}
