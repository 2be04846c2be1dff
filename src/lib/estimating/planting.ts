/**
 * Planting: plants from bed area and spacing (square or triangular layout), mulch by depth, soil
 * amendment worked in, and the crew's hours. Pure; SI results.
 */
import { areaM2 } from './aggregate';
import { rateTask, type LaborTask } from './labor';
import type { PlantingFeature, Settings } from './schema';
import { feet, inches } from './units';

export type Layout = 'square' | 'triangular';

/**
 * The ground each plant takes at spacing s: s² on a square grid; on a triangular grid the plants sit
 * at the corners of equilateral triangles, each owning a rhombus of side s and angle 60°, s²·√3/2
 * (geometry), so a triangular layout fits 2/√3 ≈ 1.155 times as many plants.
 */
export function cellAreaM2(spacingM: number, layout: Layout): number {
	return layout === 'square' ? spacingM * spacingM : (spacingM * spacingM * Math.sqrt(3)) / 2;
}

/** Plants to fill an area at a spacing: whole plants, at least one for any area at all. */
export function plantsFor(area: number, spacingM: number, layout: Layout): number {
	if (area <= 0) return 0;
	return Math.max(1, Math.ceil(area / cellAreaM2(spacingM, layout) - 1e-9));
}

export interface PlantGroupResult {
	id: string;
	name: string;
	sku?: string;
	container: PlantingFeature['groups'][number]['container'];
	count: number;
	areaM2: number;
}

export interface PlantingResult {
	areaM2: number;
	groups: PlantGroupResult[];
	plantCount: number;
	/** To order, with waste (none without an item). */
	mulchM3: number;
	amendM3: number;
	warnings: string[];
}

export function analysePlanting(f: PlantingFeature, settings: Settings): PlantingResult {
	const area = f.areas.reduce((sum, a) => sum + areaM2(a), 0);
	const waste = 1 + (f.wastePercent ?? settings.aggregateWastePercent) / 100;
	const warnings: string[] = [];
	const groups = f.groups.map((g) => {
		const share = (area * g.coverPercent) / 100;
		const count = g.count ?? plantsFor(share, inches(g.spacingIn), g.layout);
		return { id: g.id, name: g.name, sku: g.sku, container: g.container, count, areaM2: share };
	});
	const covered = f.groups
		.filter((g) => g.count === undefined)
		.reduce((s, g) => s + g.coverPercent, 0);
	if (covered > 100 + 1e-9) {
		warnings.push(
			`${f.name}: the plant groups cover ${covered}% of the beds, more than all of them`
		);
	}
	return {
		areaM2: area,
		groups,
		plantCount: groups.reduce((s, g) => s + g.count, 0),
		mulchM3: f.mulchSku ? area * inches(f.mulchDepthIn) * waste : 0,
		amendM3: f.amendSku ? area * inches(f.amendDepthIn) * waste : 0,
		warnings
	};
}

const YD3 = feet(3) ** 3;

/** Amending, planting by container and mulching, from the counts and volumes and the firm's rates. */
export function plantingTasks(
	f: PlantingFeature,
	r: PlantingResult,
	settings: Settings,
	bucket: string
): LaborTask[] {
	const people = settings.labor.baseCrewSize;
	const task = (key: Parameters<typeof rateTask>[1], name: string, quantity: number) =>
		rateTask(settings, key, { bucket, task: name, quantity, people });
	return [
		task('amend', `Work in soil amendment: ${f.name}`, r.amendM3 / YD3),
		...r.groups.map((g) => task(`plant-${g.container}`, `Plant ${g.name}: ${f.name}`, g.count)),
		task('mulch', `Spread mulch: ${f.name}`, r.mulchM3 / YD3)
	].filter((t) => t.hours > 0);
}
