/**
 * Segmental wall takeoff: courses (a buried course under every wall, seat walls too), units, caps,
 * levelling pad (bought loose, laid compacted), drainage stone, the drain pipe behind a retaining
 * wall, and the trench that is dug for it.
 */
import type { Settings, Wall } from './schema';
import { feet, inches, toInches, toSI } from './units';

// Bury at least 6 in, or 1 in for every 8 in of wall height, whichever is more, and never less
// than one whole course, seat walls as well as retaining walls: the buried course keeps the base
// from being undermined (common practice in segmental-wall installation guides, no source).
const MIN_BURY_IN = 6;
const BURY_FRACTION = 1 / 8;
// Levelling pad: 6 in of compacted base, 6 in wider than the unit in front and behind
// (common practice, no source).
const PAD_DEPTH_IN = 6;
const PAD_EXTRA_WIDTH_IN = 12;
// Drainage zone of clean crushed stone 12 in deep behind a retaining wall, full height
// (common practice, no source).
const DRAIN_ZONE_IN = 12;
// A seat wall retains little: drainage stone only beside its buried course, 6 in wide (common
// practice, no source).
const SEAT_DRAIN_IN = 6;

export interface WallResult {
	id: string;
	name: string;
	purpose: Wall['purpose'];
	buriedCourses: number;
	courses: number;
	unitsPerCourse: number;
	units: number;
	caps: number;
	/** The units' and caps' weight, each a solid block of its size at the settings' density. */
	unitsMassKg: number;
	capsMassKg: number;
	/** From the bottom of the levelling pad to the top of the units. */
	heightFromFootingM: number;
	exposedHeightM: number;
	lengthM: number;
	/** Face of all courses, buried ones too: what the wall labor is timed by. */
	faceAreaM2: number;
	/** The levelling pad, compacted in place. */
	padVolumeM3: number;
	/** The pad's base material as bought, loose: compacted volume × the compaction factor. */
	padLooseVolumeM3: number;
	drainVolumeM3: number;
	/** Perforated drain pipe behind a retaining wall, with its outlet run; 0 for a seat wall. */
	drainPipeLengthM: number;
	/** The trench for the pad and the buried courses (bank volume), for digging and spoil. */
	trenchVolumeM3: number;
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
	const retaining = wall.purpose === 'retaining';
	const buried = buriedCourses(wall.exposedHeightIn, unit.heightIn);
	const courses = buried + ceil(wall.exposedHeightIn / unit.heightIn);
	const unitsPerCourse = ceil((wall.lengthFt * 12) / unit.lengthIn);
	const units = ceil(courses * unitsPerCourse * (1 + settings.wall.unitWastePercent / 100));
	const caps = wall.capSku ? ceil((wall.lengthFt * 12) / (wall.capLengthIn ?? unit.lengthIn)) : 0;
	const density = toSI(settings.wall.unitDensityLbFt3, 'density', 'lb/ft3');
	const unitM3 = inches(unit.lengthIn) * inches(unit.heightIn) * inches(unit.depthIn);
	const capM3 =
		inches(wall.capLengthIn ?? unit.lengthIn) *
		inches(unit.depthIn) *
		inches(settings.wall.capThicknessIn);
	const lengthM = feet(wall.lengthFt);
	const padWidthM = inches(unit.depthIn + PAD_EXTRA_WIDTH_IN);
	const padVolumeM3 = lengthM * padWidthM * inches(PAD_DEPTH_IN);
	const builtHeightM = inches(courses * unit.heightIn);
	const buriedHeightM = inches(buried * unit.heightIn);
	const drainVolumeM3 =
		wall.purpose === 'retaining'
			? lengthM * inches(DRAIN_ZONE_IN) * builtHeightM
			: lengthM * inches(SEAT_DRAIN_IN) * buriedHeightM;
	const heightFromFootingM = builtHeightM + inches(PAD_DEPTH_IN);
	const exposedHeightM = inches(wall.exposedHeightIn);
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
		caps,
		unitsMassKg: units * unitM3 * density,
		capsMassKg: caps * capM3 * density,
		heightFromFootingM,
		exposedHeightM,
		lengthM,
		faceAreaM2: lengthM * builtHeightM,
		padVolumeM3,
		padLooseVolumeM3: padVolumeM3 * settings.wall.padCompactionFactor,
		drainVolumeM3,
		drainPipeLengthM: retaining ? lengthM + feet(settings.wall.drainOutletFt) : 0,
		trenchVolumeM3: lengthM * padWidthM * (inches(PAD_DEPTH_IN) + buriedHeightM),
		needsPermit:
			retaining && (wall.surcharge || toInches(heightFromFootingM) > settings.wall.permitHeightIn),
		needsEngineering: retaining && wall.exposedHeightIn > engineeredLimitIn,
		optionId: wall.optionId
	};
}
