/**
 * The yard features that hold no water of their own: paths and patios, dry creeks and drainage,
 * and planting. This module sizes them, lists their price-list references, gives their takeoff
 * lines and their crew's tasks; features.ts calls it for each such feature in the design.
 */
import type { Dig, LaborTask } from './labor';
import { analyseDrainage, creekBoulders, drainageTasks, type DrainageResult } from './drainage';
import { analysePath, pathTasks, type PathResult } from './paths';
import { analysePlanting, plantingTasks, type PlantingResult } from './planting';
import type { Measure } from './pricing';
import type { CatalogItem, Feature, Settings, Stone, YardFeature } from './schema';
import { toSI, type DisplayKind } from './units';

export const YARD_KINDS = ['path', 'drainage', 'planting'] as const;

export const isYardFeature = (f: Feature): f is YardFeature =>
	(YARD_KINDS as readonly string[]).includes(f.kind);

export interface YardResult {
	path?: PathResult;
	drainage?: DrainageResult;
	planting?: PlantingResult;
}

export function analyseYard(f: YardFeature, settings: Settings): YardResult {
	if (f.kind === 'path') return { path: analysePath(f, settings) };
	if (f.kind === 'drainage') return { drainage: analyseDrainage(f, settings) };
	return { planting: analysePlanting(f, settings) };
}

/** Stones the feature brings (a dry creek's bank boulders). */
export function yardStones(f: YardFeature, r: YardResult): Stone[] {
	if (f.kind !== 'drainage' || !r.drainage?.creek) return [];
	const stone = creekBoulders(f, r.drainage.creek.boulderCount);
	return stone ? [stone] : [];
}

/** Every price-list reference of the feature, by its path under the feature. */
export function yardSkus(f: YardFeature): [string[], string | undefined][] {
	if (f.kind === 'path') {
		return [
			[['surfaceSku'], f.surfaceSku],
			[['baseSku'], f.baseSku],
			[['beddingSku'], f.beddingSku],
			[['jointSku'], f.jointSku],
			[['edgeSku'], f.edgeSku],
			[['steps', 'sku'], f.steps?.sku]
		];
	}
	if (f.kind === 'drainage') {
		return [
			[['cobbleSku'], f.cobbleSku],
			[['fabricSku'], f.fabricSku],
			[['boulderSku'], f.boulderSku],
			[['soakaway', 'sku'], f.soakaway?.sku],
			[['soakaway', 'fabricSku'], f.soakaway?.fabricSku]
		];
	}
	return [
		[['mulchSku'], f.mulchSku],
		[['amendSku'], f.amendSku],
		...f.groups.map((g, k): [string[], string | undefined] => [['groups', String(k), 'sku'], g.sku])
	];
}

type Add = (
	path: string,
	bucket: string,
	sku: string | undefined,
	description: string,
	measure: Measure
) => void;

export function yardLines(f: YardFeature, i: number, r: YardResult, bucket: string, add: Add) {
	const at = `design.features.${i}`;
	const named = (text: string) => `${f.name}: ${text}`;
	if (f.kind === 'path' && r.path) {
		const p = r.path;
		if (f.surface === 'flagstone') {
			add(`${at}.surfaceSku`, bucket, f.surfaceSku, named('flagstone'), {
				massKg: p.stoneMassKg,
				volumeM3: p.stoneVolumeM3,
				areaM2: p.areaM2 * (1 + p.wastePercent / 100)
			});
		} else {
			add(`${at}.surfaceSku`, bucket, f.surfaceSku, named('pavers'), {
				count: p.paverCount,
				areaM2: p.paverAreaM2
			});
		}
		if (p.baseLooseM3 > 0) {
			add(`${at}.baseSku`, bucket, f.baseSku, named('compacted base'), {
				volumeM3: p.baseLooseM3
			});
		}
		if (p.beddingLooseM3 > 0) {
			add(`${at}.beddingSku`, bucket, f.beddingSku, named('bedding layer'), {
				volumeM3: p.beddingLooseM3
			});
		}
		if (p.jointFillM3 > 0) {
			add(`${at}.jointSku`, bucket, f.jointSku, named('joint fill'), { volumeM3: p.jointFillM3 });
		}
		if (p.edgeM > 0) {
			add(`${at}.edgeSku`, bucket, f.edgeSku, named('edge restraint'), { lengthM: p.edgeM });
		}
		if (p.steps) {
			add(`${at}.steps.sku`, bucket, f.steps?.sku, named('steps'), {
				count: p.steps.count,
				lengthM: p.steps.lengthM
			});
		}
	} else if (f.kind === 'drainage' && r.drainage) {
		const creek = r.drainage.creek;
		const soak = r.drainage.soakaway;
		if (creek) {
			add(`${at}.cobbleSku`, bucket, f.cobbleSku, named('creek cobble'), {
				volumeM3: creek.cobbleVolumeM3
			});
			add(`${at}.fabricSku`, bucket, f.fabricSku, named('creek fabric'), {
				areaM2: creek.fabricAreaM2
			});
		}
		if (soak) {
			add(`${at}.soakaway.sku`, bucket, f.soakaway?.sku, named('soak-away gravel'), {
				volumeM3: soak.gravelVolumeM3
			});
			add(`${at}.soakaway.fabricSku`, bucket, f.soakaway?.fabricSku, named('soak-away fabric'), {
				areaM2: soak.fabricAreaM2
			});
		}
	} else if (f.kind === 'planting' && r.planting) {
		r.planting.groups.forEach((g, k) => {
			if (g.count > 0) {
				add(`${at}.groups.${k}.sku`, bucket, g.sku, named(g.name), { count: g.count });
			}
		});
		if (r.planting.amendM3 > 0) {
			add(`${at}.amendSku`, bucket, f.amendSku, named('soil amendment'), {
				volumeM3: r.planting.amendM3
			});
		}
		if (r.planting.mulchM3 > 0) {
			add(`${at}.mulchSku`, bucket, f.mulchSku, named('mulch'), { volumeM3: r.planting.mulchM3 });
		}
	}
}

// Cobble and gravel without a density on their item are weighed at 100 lb/ft³ for the crew's
// hours (common practice, no source).
const FALLBACK_DENSITY_LB_FT3 = 100;

function massOf(volumeM3: number, item: CatalogItem | undefined) {
	const density = item?.bulkDensityLbFt3 ?? FALLBACK_DENSITY_LB_FT3;
	return volumeM3 * toSI(density, 'density', 'lb/ft3');
}

/** The crew's tasks for the feature (not its digging), from its quantities and the firm's rates. */
export function yardTasks(
	f: YardFeature,
	r: YardResult,
	settings: Settings,
	items: ReadonlyMap<string, CatalogItem>,
	bucket: string
): LaborTask[] {
	if (f.kind === 'path' && r.path) return pathTasks(f, r.path, settings, bucket);
	if (f.kind === 'drainage' && r.drainage) {
		const cobble = r.drainage.creek?.cobbleVolumeM3 ?? 0;
		const gravel = r.drainage.soakaway?.gravelVolumeM3 ?? 0;
		return drainageTasks(f, r.drainage, settings, bucket, {
			cobble: massOf(cobble, f.cobbleSku ? items.get(f.cobbleSku) : undefined),
			gravel: massOf(gravel, f.soakaway?.sku ? items.get(f.soakaway.sku) : undefined)
		});
	}
	if (f.kind === 'planting' && r.planting) return plantingTasks(f, r.planting, settings, bucket);
	return [];
}

/** What the feature digs, in bank volume: a path's layers, a creek's bed, a soak-away's pit. */
export function yardDigs(f: YardFeature, r: YardResult, bucket: string): Dig[] {
	const digs: Dig[] = [];
	if (r.path) digs.push({ bucket, what: f.name, volumeM3: r.path.excavationM3 });
	if (r.drainage?.creek) {
		digs.push({ bucket, what: `the creek: ${f.name}`, volumeM3: r.drainage.creek.excavationM3 });
	}
	if (r.drainage?.soakaway) {
		digs.push({
			bucket,
			what: `the soak-away: ${f.name}`,
			volumeM3: r.drainage.soakaway.gravelVolumeM3
		});
	}
	return digs;
}

export function yardWarnings(r: YardResult): string[] {
	return [
		...(r.path?.warnings ?? []),
		...(r.drainage?.warnings ?? []),
		...(r.planting?.warnings ?? [])
	];
}

/** The figures the estimator reads for the feature, in SI (the builder formats them). */
export function yardQuantities(
	r: YardResult
): { key: string; label: string; kind: DisplayKind; si: number }[] {
	const out: { key: string; label: string; kind: DisplayKind; si: number }[] = [];
	if (r.path) {
		const p = r.path;
		out.push({ key: 'path-area', label: 'area', kind: 'area', si: p.areaM2 });
		if (p.stoneMassKg > 0) {
			out.push({
				key: 'path-stone',
				label: 'flagstone to order',
				kind: 'bulkMass',
				si: p.stoneMassKg
			});
		}
		if (p.paverCount > 0) {
			out.push({ key: 'path-pavers', label: 'pavers to order', kind: 'area', si: p.paverAreaM2 });
		}
		out.push({
			key: 'path-base',
			label: 'base, loose to order',
			kind: 'bulkVolume',
			si: p.baseLooseM3
		});
		out.push({
			key: 'path-bedding',
			label: 'bedding, loose to order',
			kind: 'bulkVolume',
			si: p.beddingLooseM3
		});
		if (p.edgeM > 0) {
			out.push({ key: 'path-edge', label: 'edge restraint', kind: 'length', si: p.edgeM });
		}
		if (p.steps) {
			out.push({
				key: 'path-rise',
				label: 'total rise of the steps',
				kind: 'length',
				si: p.steps.totalRiseM
			});
		}
	}
	if (r.drainage) {
		const d = r.drainage;
		out.push({ key: 'runoff', label: 'peak runoff', kind: 'flow', si: d.peakFlowM3s });
		if (d.creek) {
			out.push({
				key: 'creek-bottom',
				label: 'creek bottom width',
				kind: 'length',
				si: d.creek.bottomM
			});
			out.push({
				key: 'creek-top',
				label: 'creek top width',
				kind: 'length',
				si: d.creek.topWidthM
			});
			out.push({
				key: 'creek-speed',
				label: 'creek water speed',
				kind: 'velocity',
				si: d.creek.velocityMs
			});
			out.push({
				key: 'creek-cobble',
				label: 'cobble',
				kind: 'bulkVolume',
				si: d.creek.cobbleVolumeM3
			});
		}
		if (d.soakaway) {
			out.push({
				key: 'soak-runoff',
				label: 'one storm’s runoff',
				kind: 'volume',
				si: d.soakaway.stormRunoffM3
			});
			out.push({
				key: 'soak-gravel',
				label: 'soak-away gravel',
				kind: 'bulkVolume',
				si: d.soakaway.gravelVolumeM3
			});
			out.push({ key: 'soak-side', label: 'soak-away side', kind: 'length', si: d.soakaway.sideM });
		}
	}
	if (r.planting) {
		const p = r.planting;
		out.push({ key: 'beds', label: 'bed area', kind: 'area', si: p.areaM2 });
		if (p.mulchM3 > 0) {
			out.push({ key: 'mulch', label: 'mulch', kind: 'bulkVolume', si: p.mulchM3 });
		}
		if (p.amendM3 > 0) {
			out.push({ key: 'amend', label: 'soil amendment', kind: 'bulkVolume', si: p.amendM3 });
		}
	}
	return out;
}
