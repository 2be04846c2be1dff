/**
 * Pondless streams and waterfalls: flow over the widest fall, the rise, liner for the bed with a
 * lap under each fall, the water that drains back when the pump stops and the reservoir that must
 * hold it, stream gravel and bank boulders. Pure; inputs in US units, results in SI.
 */
import { francisWeirFlowM3s, SPILLWAY_HEAD_IN } from './outlets';
import type { Reservoir, Settings, Stone, Stream } from './schema';
import { feet, fromSI, gph, inches, toSI } from './units';

/** Field errors the schema cannot see: falls that add up to more than the rise. */
export function streamErrors(stream: Stream): { path: (string | number)[]; message: string }[] {
	const errors: { path: (string | number)[]; message: string }[] = [];
	let fallen = 0;
	stream.segments.forEach((seg, i) => {
		fallen += seg.fallHeightIn / 12;
		if (seg.fallHeightIn > 0 && fallen > stream.riseFt + 1e-9) {
			errors.push({
				path: ['segments', i, 'fallHeightIn'],
				message: `The falls reach ${fallen.toFixed(2)} ft, more than the stream’s ${stream.riseFt} ft rise`
			});
		}
		if (seg.fallHeightIn > 0 && seg.weirWidthIn <= 0) {
			errors.push({ path: ['segments', i, 'weirWidthIn'], message: 'A fall needs its weir width' });
		}
	});
	return errors;
}

/** The widest weir in inches (the widest bed when the stream has no falls). */
export function widestWeirIn(stream: Stream): number {
	const weirs = stream.segments.filter((s) => s.fallHeightIn > 0).map((s) => s.weirWidthIn);
	return weirs.length
		? Math.max(...weirs)
		: Math.max(...stream.segments.map((s) => s.widthFt * 12));
}

/**
 * Flow for the stream: the Francis weir over the widest fall at the sheet's head, or the firm's
 * gallons per hour per inch of width.
 */
export function streamFlowM3s(stream: Stream, settings: Settings): number {
	const widthIn = widestWeirIn(stream);
	if (stream.flow.method === 'weir') {
		return francisWeirFlowM3s(inches(widthIn), inches(SPILLWAY_HEAD_IN[stream.flow.sheet]));
	}
	return gph(settings.stream.gphPerInch * widthIn);
}

/**
 * The liner for the bed as one strip: the segments end to end, plus each fall's height, plus a lap
 * under each fall, plus the overlap at both ends; as wide as the widest bed plus its depth up both
 * banks plus the overlap at each edge (common practice, no source).
 */
export function streamLinerFt(stream: Stream, settings: Settings) {
	const overlap = settings.pond.linerOverlapFt;
	const falls = stream.segments.filter((s) => s.fallHeightIn > 0);
	const lengthFt =
		stream.segments.reduce((sum, s) => sum + s.lengthFt, 0) +
		falls.reduce((sum, s) => sum + s.fallHeightIn / 12, 0) +
		falls.length * settings.stream.fallOverlapFt +
		2 * overlap;
	const bedDepthFt = (s: Stream['segments'][number]) =>
		(s.waterDepthIn + stream.gravelDepthIn) / 12;
	const widthFt =
		Math.max(...stream.segments.map((s) => s.widthFt + 2 * bedDepthFt(s))) + 2 * overlap;
	return { lengthFt, widthFt };
}

export interface ReservoirResult {
	/** Water the reservoir holds brim-full (allowing for gravel). */
	capacityM3: number;
	/** Water it holds above the pump's lowest safe level: the room for the drain-back. */
	roomM3: number;
	requiredM3: number;
	surfaceM2: number;
	grossVolumeM3: number;
}

export function reservoirResult(reservoir: Reservoir, requiredM3: number): ReservoirResult {
	const area = feet(reservoir.lengthFt) * feet(reservoir.widthFt);
	const voids = reservoir.kind === 'gravel' ? reservoir.voidFraction : 1;
	const depth = feet(reservoir.depthFt);
	const above = Math.max(0, depth - inches(reservoir.pumpMinLevelIn));
	return {
		capacityM3: area * depth * voids,
		roomM3: area * above * voids,
		requiredM3,
		surfaceM2: area,
		grossVolumeM3: area * depth
	};
}

export interface StreamResult {
	id: string;
	name: string;
	lengthM: number;
	bedAreaM2: number;
	riseM: number;
	fallCount: number;
	widestWeirIn: number;
	flowM3s: number;
	liner: { lengthFt: number; widthFt: number };
	/** Running water in the bed that drains back, m³ (the supply pipe's water is added by the system). */
	bedDrainBackM3: number;
	drainBackM3: number;
	/** Drain-back times the firm's reserve factor: what the reservoir must hold above the pump. */
	requiredReserveM3: number;
	reservoir?: ReservoirResult;
	gravelVolumeM3: number;
	boulderCount: number;
	evaporationM3PerDay: number;
	daysBetweenTopUps: number | null;
	warnings: string[];
}

export function analyseStream(
	stream: Stream,
	settings: Settings,
	supplyVolumeM3: number,
	flowM3s: number
): StreamResult {
	const lengthFt = stream.segments.reduce((s, seg) => s + seg.lengthFt, 0);
	const bedAreaFt2 = stream.segments.reduce((s, seg) => s + seg.lengthFt * seg.widthFt, 0);
	const bedAreaM2 = toSI(bedAreaFt2, 'area', 'ft2');
	const bedDrainBackM3 = stream.segments.reduce(
		(s, seg) => s + toSI(seg.lengthFt * seg.widthFt, 'area', 'ft2') * inches(seg.waterDepthIn),
		0
	);
	const drainBackM3 = bedDrainBackM3 + supplyVolumeM3;
	const requiredReserveM3 = drainBackM3 * settings.stream.reserveFactor;
	const reservoir = stream.reservoir
		? reservoirResult(stream.reservoir, requiredReserveM3)
		: undefined;
	const warnings: string[] = [];
	const gal = (m3: number) => fromSI(m3, 'volume', 'gal').toFixed(0);
	if (!stream.reservoir && !stream.feedsPondId) {
		warnings.push(`${stream.name}: no reservoir and no pond to fall into: add one`);
	}
	if (reservoir && reservoir.roomM3 < requiredReserveM3) {
		warnings.push(
			`${stream.name}: the reservoir holds ${gal(reservoir.roomM3)} gal above the pump, less than the ${gal(drainBackM3)} gal that drains back × ${settings.stream.reserveFactor} = ${gal(requiredReserveM3)} gal: make it larger`
		);
	}
	const openReservoirM2 = stream.reservoir?.kind === 'open' ? (reservoir?.surfaceM2 ?? 0) : 0;
	const evaporationM3PerDay = (bedAreaM2 + openReservoirM2) * inches(settings.evaporationInPerDay);
	const spare = reservoir ? Math.max(0, reservoir.roomM3 - drainBackM3) : 0;
	const boulderCount = stream.boulder
		? 2 * Math.ceil(lengthFt / stream.boulder.spacingFt - 1e-9)
		: 0;
	return {
		id: stream.id,
		name: stream.name,
		lengthM: feet(lengthFt),
		bedAreaM2,
		riseM: feet(stream.riseFt),
		fallCount: stream.segments.filter((s) => s.fallHeightIn > 0).length,
		widestWeirIn: widestWeirIn(stream),
		flowM3s,
		liner: streamLinerFt(stream, settings),
		bedDrainBackM3,
		drainBackM3,
		requiredReserveM3,
		reservoir,
		gravelVolumeM3: bedAreaM2 * inches(stream.gravelDepthIn),
		boulderCount,
		evaporationM3PerDay,
		daysBetweenTopUps: reservoir && evaporationM3PerDay > 0 ? spare / evaporationM3PerDay : null,
		warnings
	};
}

/** The bank boulders as stones, so their weights join the stone-handling plan and the labor. */
export function bankBoulders(stream: Stream, count: number): Stone | undefined {
	const b = stream.boulder;
	if (!b || count <= 0) return undefined;
	return {
		id: `${stream.id}-boulders`,
		name: `${stream.name}: bank boulders`,
		size: { shape: 'boulder', lengthIn: b.lengthIn, widthIn: b.widthIn, heightIn: b.heightIn },
		rock: b.rock,
		count,
		wetted: false,
		sku: stream.boulderSku,
		optionId: stream.optionId
	};
}
