/**
 * Ponds: surface, volume by depth zones, liner size, turnover flow, skimmer and filter choice,
 * fish-load guideline, gravel and edge stone, evaporation and top-ups. Pure; inputs in US units
 * as the design stores them, results in SI like the rest of the engine.
 */
import { shoelaceArea } from './aggregate';
import { crossingEdges, ellipsePerimeter, extent, perimeter } from './polygon';
import type { CatalogItem, Pond, PondOutline, Settings } from './schema';
import { feet, fromSI, gph, inches, toSI } from './units';

export interface PondPlan {
	/** Plan area, ft². */
	areaFt2: number;
	perimeterFt: number;
	/** The outline's longest and shortest extents, ft. */
	lengthFt: number;
	widthFt: number;
}

export function pondPlan(outline: PondOutline): PondPlan {
	if (outline.shape === 'rectangle') {
		return {
			areaFt2: outline.lengthFt * outline.widthFt,
			perimeterFt: 2 * (outline.lengthFt + outline.widthFt),
			lengthFt: Math.max(outline.lengthFt, outline.widthFt),
			widthFt: Math.min(outline.lengthFt, outline.widthFt)
		};
	}
	if (outline.shape === 'oval') {
		const [a, b] = [outline.lengthFt / 2, outline.widthFt / 2];
		return {
			areaFt2: Math.PI * a * b,
			perimeterFt: ellipsePerimeter(a, b),
			lengthFt: Math.max(outline.lengthFt, outline.widthFt),
			widthFt: Math.min(outline.lengthFt, outline.widthFt)
		};
	}
	const box = extent(outline.pointsFt);
	return {
		areaFt2: shoelaceArea(outline.pointsFt),
		perimeterFt: perimeter(outline.pointsFt),
		lengthFt: box.length,
		widthFt: box.width
	};
}

/** Field errors the schema cannot see: crossing edges, zones that do not make up the whole. */
export function pondErrors(pond: Pond): { path: (string | number)[]; message: string }[] {
	const errors: { path: (string | number)[]; message: string }[] = [];
	if (pond.outline.shape === 'polygon') {
		const crossing = crossingEdges(pond.outline.pointsFt);
		if (crossing) {
			errors.push({
				path: ['outline', 'pointsFt'],
				message: `Edges ${crossing[0] + 1} and ${crossing[1] + 1} cross: list the corners in order around the pond`
			});
		} else if (shoelaceArea(pond.outline.pointsFt) <= 0) {
			errors.push({ path: ['outline', 'pointsFt'], message: 'The corners enclose no area' });
		}
	}
	const share = pond.zones.reduce((s, z) => s + z.percent, 0);
	if (Math.abs(share - 100) > 0.5) {
		errors.push({
			path: ['zones'],
			message: `The depth zones cover ${share.toFixed(0)}% of the surface: they must add up to 100%`
		});
	}
	return errors;
}

/** Gallons in a pond whose zones each cover a share of the surface at their own depth. */
export function pondGallons(
	areaFt2: number,
	zones: readonly { depthIn: number; percent: number }[]
) {
	const ft3 = zones.reduce((s, z) => s + areaFt2 * (z.percent / 100) * (z.depthIn / 12), 0);
	return fromSI(toSI(ft3, 'volume', 'ft3'), 'volume', 'gal');
}

/**
 * The liner rectangle: the pond's length and width each plus the deepest zone down and up again
 * plus the overlap at each edge, L + 2·D + 2·overlap (common practice, no source).
 */
export function linerSizeFt(
	lengthFt: number,
	widthFt: number,
	maxDepthFt: number,
	overlapFt: number
) {
	return {
		lengthFt: lengthFt + 2 * maxDepthFt + 2 * overlapFt,
		widthFt: widthFt + 2 * maxDepthFt + 2 * overlapFt
	};
}

/** Flow that turns the pond's volume over once in the given hours, gph. */
export const turnoverGph = (gallons: number, hours: number) => gallons / hours;

/** The smallest item rated for at least the need (then the cheapest), or undefined. */
export function smallestRated(
	items: readonly CatalogItem[],
	rating: (i: CatalogItem) => number | undefined,
	need: number
): CatalogItem | undefined {
	return items
		.filter((i) => (rating(i) ?? -1) >= need)
		.sort((a, b) => rating(a)! - rating(b)! || a.unitPrice - b.unitPrice)[0];
}

export interface PondResult {
	id: string;
	name: string;
	areaM2: number;
	perimeterM: number;
	maxDepthM: number;
	volumeM3: number;
	gallons: number;
	liner: { lengthFt: number; widthFt: number };
	turnoverHours: number;
	turnoverFlowM3s: number;
	/** Inches of fish the pond can carry by the guideline; 0 for a plant pond. */
	fishCapacityIn: number;
	skimmerSku?: string;
	filterSku?: string;
	gravelAreaM2: number;
	gravelVolumeM3: number;
	edgeAreaM2: number;
	edgeVolumeM3: number;
	evaporationM3PerDay: number;
	daysBetweenTopUps: number | null;
	warnings: string[];
}

export function analysePond(
	pond: Pond,
	items: readonly CatalogItem[],
	settings: Settings,
	pumpFlowM3s?: number
): PondResult {
	const plan = pondPlan(pond.outline);
	const s = settings.pond;
	const maxDepthIn = Math.max(...pond.zones.map((z) => z.depthIn));
	const gallons = pondGallons(plan.areaFt2, pond.zones);
	const turnoverHours = pond.use === 'fish' ? s.turnoverHoursFish : s.turnoverHoursPlants;
	const turnoverFlowM3s = gph(turnoverGph(gallons, turnoverHours));
	const flowGphNeeded = fromSI(pumpFlowM3s ?? turnoverFlowM3s, 'flow', 'gph');
	const warnings: string[] = [];
	const byId = new Map(items.map((i) => [i.sku, i]));
	const pinned = (sku: string | undefined) => (sku ? byId.get(sku) : undefined);
	const skimmer =
		pinned(pond.skimmerSku) ??
		smallestRated(
			items.filter((i) => i.category === 'filtration'),
			(i) => i.ratedFlowGph,
			flowGphNeeded
		);
	const filter =
		pinned(pond.filterSku) ??
		smallestRated(
			items.filter((i) => i.category === 'filtration'),
			(i) => i.ratedVolumeGal,
			gallons
		);
	const name = pond.name;
	if (!skimmer) {
		warnings.push(
			`${name}: no skimmer in the price list is rated for ${flowGphNeeded.toFixed(0)} gph`
		);
	} else if ((skimmer.ratedFlowGph ?? Infinity) < flowGphNeeded) {
		warnings.push(
			`${name}: ${skimmer.name} is rated below the ${flowGphNeeded.toFixed(0)} gph the pump moves`
		);
	}
	if (!filter) {
		warnings.push(
			`${name}: no biological filter in the price list is rated for ${gallons.toFixed(0)} gal`
		);
	} else if ((filter.ratedVolumeGal ?? Infinity) < gallons) {
		warnings.push(
			`${name}: ${filter.name} is rated for less than the pond’s ${gallons.toFixed(0)} gal`
		);
	}
	const fishCapacityIn = pond.use === 'fish' ? gallons / s.fishGalPerInch : 0;
	if (pond.fishInches > fishCapacityIn) {
		warnings.push(
			pond.use === 'fish'
				? `${name}: ${pond.fishInches} in of fish is over the guideline of ${fishCapacityIn.toFixed(0)} in for ${gallons.toFixed(0)} gal (1 in per ${s.fishGalPerInch} gal)`
				: `${name}: fish are planned in a pond set up for plants; switch it to a fish pond for a faster turnover`
		);
	}
	const areaM2 = toSI(plan.areaFt2, 'area', 'ft2');
	const perimeterM = feet(plan.perimeterFt);
	const edgeAreaM2 = perimeterM * feet(pond.edgeWidthFt);
	const evaporationM3PerDay = areaM2 * inches(settings.evaporationInPerDay);
	return {
		id: pond.id,
		name,
		areaM2,
		perimeterM,
		maxDepthM: inches(maxDepthIn),
		volumeM3: toSI(gallons, 'volume', 'gal'),
		gallons,
		liner: linerSizeFt(plan.lengthFt, plan.widthFt, maxDepthIn / 12, s.linerOverlapFt),
		turnoverHours,
		turnoverFlowM3s,
		fishCapacityIn,
		skimmerSku: skimmer?.sku,
		filterSku: filter?.sku,
		gravelAreaM2: areaM2,
		gravelVolumeM3: areaM2 * inches(pond.gravelDepthIn),
		edgeAreaM2,
		edgeVolumeM3: edgeAreaM2 * inches(pond.edgeDepthIn),
		evaporationM3PerDay,
		daysBetweenTopUps:
			settings.evaporationInPerDay > 0 ? s.topUpDropIn / settings.evaporationInPerDay : null,
		warnings
	};
}
