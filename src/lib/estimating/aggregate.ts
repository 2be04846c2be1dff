/** Aggregate takeoff: area, volume, weight and purchase quantity with a waste allowance. */
import type { Aggregate, Area, CatalogItem } from './schema';
import { feet, inches, toSI } from './units';

/** Shoelace formula: area of a simple polygon from its corners, in their squared unit. */
export function shoelaceArea(points: readonly (readonly [number, number])[]): number {
	let twice = 0;
	for (let i = 0; i < points.length; i++) {
		const [x1, y1] = points[i];
		const [x2, y2] = points[(i + 1) % points.length];
		twice += x1 * y2 - x2 * y1;
	}
	return Math.abs(twice) / 2;
}

export function areaM2(area: Area): number {
	if (area.shape === 'rectangle') return feet(area.lengthFt) * feet(area.widthFt);
	if (area.shape === 'circle') return (Math.PI / 4) * feet(area.diameterFt) ** 2;
	return toSI(shoelaceArea(area.pointsFt), 'area', 'ft2');
}

export interface AggregateResult {
	id: string;
	name: string;
	sku: string;
	areaM2: number;
	depthM: number;
	/** In place, before waste. */
	netVolumeM3: number;
	wastePercent: number;
	/** To order, with waste. */
	volumeM3: number;
	massKg?: number;
	optionId?: string;
}

export function aggregateResult(
	aggregate: Aggregate,
	item: CatalogItem | undefined,
	defaultWastePercent: number
): AggregateResult {
	const area = aggregate.areas.reduce((sum, a) => sum + areaM2(a), 0);
	const depthM = inches(aggregate.depthIn);
	const netVolumeM3 = area * depthM;
	const wastePercent = aggregate.wastePercent ?? defaultWastePercent;
	const volumeM3 = netVolumeM3 * (1 + wastePercent / 100);
	const density = item?.bulkDensityLbFt3;
	return {
		id: aggregate.id,
		name: aggregate.name,
		sku: aggregate.sku,
		areaM2: area,
		depthM,
		netVolumeM3,
		wastePercent,
		volumeM3,
		massKg: density === undefined ? undefined : volumeM3 * toSI(density, 'density', 'lb/ft3'),
		optionId: aggregate.optionId
	};
}
