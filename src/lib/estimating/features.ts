/**
 * The features of a design (stone fountains over basins, ponds, pondless streams and waterfalls),
 * each with its own water system. This module sizes every feature, lays out the water systems
 * (a stream that falls into a pond runs on the pond's pump), and gives each feature's takeoff
 * lines and labor tasks in its own bucket, so a whole feature can be an option or an alternate.
 */
import { basinBudget, type BasinBudget } from './basin';
import type { HydraulicsResult } from './hydraulics';
import { BASE_BUCKET, rateTask, type Dig, type LaborTask } from './labor';
import type { LaborRateKey } from './labor-rates';
import { analysePond, pondGallons, pondPlan, turnoverGph, type PondResult } from './pond';
import type { Measure } from './pricing';
import type {
	CatalogItem,
	Feature,
	Fountain,
	ParsedCatalog,
	ParsedDesign,
	Pond,
	Stone,
	Stream
} from './schema';
import { fitSheets } from './sheets';
import type { StonesResult } from './stones';
import { analyseStream, bankBoulders, streamFlowM3s, type StreamResult } from './stream';
import { fromSI, gph, toSI, type UnitSystem } from './units';
import { fountainSystem, pondSystem, streamSystem, type WaterSystem } from './watersystem';

export const FEATURE_LABELS: Record<Feature['kind'], string> = {
	fountain: 'Stone fountain over a basin',
	pond: 'Pond',
	stream: 'Pondless stream or waterfall'
};

export const bucketOf = (optionId?: string) => optionId ?? BASE_BUCKET;

export interface FeatureResult {
	id: string;
	kind: Feature['kind'];
	name: string;
	optionId?: string;
	/** The feature whose pump feeds this one (itself, or the pond a stream falls into). */
	systemId?: string;
	basin?: BasinBudget;
	pond?: PondResult;
	stream?: StreamResult;
}

export interface FeaturesAnalysis {
	systems: WaterSystem[];
	results: FeatureResult[];
	/** Bank boulders, to be analysed with the design's own stones. */
	stones: Stone[];
}

/** Fountains, ponds and streams sized, and their pumps matched. Stones come later (basins). */
export function analyseFeatures(
	design: ParsedDesign,
	catalog: ParsedCatalog,
	units: UnitSystem
): FeaturesAnalysis {
	const settings = catalog.settings;
	const systems: WaterSystem[] = [];
	const results: FeatureResult[] = [];
	const stones: Stone[] = [];
	const streamFlows = new Map<string, number>();
	for (const f of design.features) {
		if (f.kind === 'stream') streamFlows.set(f.id, streamFlowM3s(f, settings));
	}
	const feeding = (pondId: string) =>
		design.features
			.filter((f): f is Stream => f.kind === 'stream' && f.feedsPondId === pondId)
			.map((stream) => ({ stream, flowM3s: streamFlows.get(stream.id) ?? 0 }));
	const systemOf = new Map<string, WaterSystem>();
	for (const f of design.features) {
		const base = { id: f.id, kind: f.kind, name: f.name, optionId: f.optionId };
		if (f.kind === 'fountain') {
			const system = fountainSystem(f, catalog, units);
			if (system) systems.push(system);
			results.push({ ...base, systemId: system?.featureId });
		} else if (f.kind === 'pond') {
			const hours =
				f.use === 'fish' ? settings.pond.turnoverHoursFish : settings.pond.turnoverHoursPlants;
			const gallons = pondGallons(pondPlan(f.outline).areaFt2, f.zones);
			const turnover = gph(turnoverGph(gallons, hours));
			const system = pondSystem(f, turnover, feeding(f.id), catalog, units);
			for (const id of system.feeds) systemOf.set(id, system);
			systems.push(system);
			results.push({
				...base,
				systemId: f.id,
				pond: analysePond(f, catalog.items, settings, system.flowM3s)
			});
		} else {
			const intoPond = f.feedsPondId
				? design.features.some((p) => p.kind === 'pond' && p.id === f.feedsPondId)
				: false;
			const system = intoPond
				? undefined
				: streamSystem(f, streamFlows.get(f.id) ?? 0, catalog, units);
			if (system) systems.push(system);
			results.push({ ...base, systemId: intoPond ? f.feedsPondId : f.id });
		}
	}
	// Streams are analysed once every pond's system is known (their supply water drains back).
	for (const result of results) {
		if (result.kind !== 'stream') continue;
		const f = design.features.find((x) => x.id === result.id) as Stream;
		const system = systems.find((s) => s.featureId === result.systemId);
		const flow = streamFlows.get(f.id) ?? 0;
		result.stream = analyseStream(f, settings, system?.pipeDrainBackM3 ?? 0, flow);
		const boulders = bankBoulders(f, result.stream.boulderCount);
		if (boulders) stones.push(boulders);
	}
	return { systems, results, stones };
}

/** Each fountain's basin budget, with the wetted stones that drain into it. */
export function fountainBasins(
	design: ParsedDesign,
	analysis: FeaturesAnalysis,
	stones: StonesResult,
	catalog: ParsedCatalog
) {
	const fountains = design.features.filter((f): f is Fountain => f.kind === 'fountain');
	const firstWithBasin = fountains.find((f) => f.basin)?.id;
	const owner = (i: number) => design.stones[i]?.featureId ?? firstWithBasin;
	for (const f of fountains) {
		const result = analysis.results.find((r) => r.id === f.id)!;
		if (!f.basin) continue;
		const system = analysis.systems.find((s) => s.featureId === f.id);
		const wetted = stones.stones.filter((s, i) => s.wetted && owner(i) === f.id);
		result.basin = basinBudget({
			basin: f.basin,
			pipeDrainBackM3: system?.pipeDrainBackM3 ?? 0,
			wettedStoneAreaM2: wetted.reduce((sum, s) => sum + s.surfaceM2 * s.count, 0),
			wettedStoneTopM2: wetted.reduce((sum, s) => sum + s.topM2 * s.count, 0),
			flowM3s: system?.flowM3s ?? 0,
			settings: catalog.settings
		});
	}
}

export type AddLine = (
	path: string,
	bucket: string,
	sku: string | undefined,
	description: string,
	measure: Measure
) => void;

function sheetLines(
	path: string,
	bucket: string,
	sku: string | undefined,
	need: { lengthFt: number; widthFt: number },
	what: string,
	items: ReadonlyMap<string, CatalogItem>,
	all: readonly CatalogItem[],
	add: AddLine,
	warn: (text: string) => void
) {
	const item = sku ? items.get(sku) : undefined;
	if (!item) return;
	const fit = fitSheets(need, item, all, what);
	if (fit.note) warn(fit.note);
	const measure: Measure =
		item.sheetLengthFt !== undefined && item.unit === 'each'
			? { count: fit.count }
			: { areaM2: toSI(fit.areaFt2, 'area', 'ft2'), count: fit.count };
	add(path, bucket, fit.sku, what, measure);
}

function fountainLines(
	f: Fountain,
	i: number,
	result: FeatureResult,
	add: AddLine,
	several: boolean
) {
	const basin = result.basin;
	if (!f.basin || !basin) return;
	const bucket = bucketOf(f.optionId);
	const path = `design.features.${i}.basin`;
	// A lone fountain's lines read as they always have; with several features they carry its name.
	const named = (text: string) => (several ? `${f.name}: ${text.toLowerCase()}` : text);
	add(`${path}.sku`, bucket, f.basin.sku, named('Basin'), {
		count: 1,
		volumeM3: basin.grossVolumeM3
	});
	if (f.basin.fill.kind === 'gravel') {
		add(`${path}.fill.sku`, bucket, f.basin.fill.sku, named('Basin fill'), {
			volumeM3: basin.grossVolumeM3
		});
	}
}

function pondLines(
	p: Pond,
	i: number,
	r: PondResult,
	catalog: ParsedCatalog,
	add: AddLine,
	warn: (t: string) => void
) {
	const bucket = bucketOf(p.optionId);
	const path = `design.features.${i}`;
	const items = new Map(catalog.items.map((x) => [x.sku, x]));
	const args = [items, catalog.items, add, warn] as const;
	sheetLines(`${path}.linerSku`, bucket, p.linerSku, r.liner, `${p.name}: liner`, ...args);
	sheetLines(
		`${path}.underlaymentSku`,
		bucket,
		p.underlaymentSku,
		r.liner,
		`${p.name}: underlayment`,
		...args
	);
	add(`${path}.skimmerSku`, bucket, r.skimmerSku, `${p.name}: skimmer`, { count: 1 });
	add(`${path}.filterSku`, bucket, r.filterSku, `${p.name}: biological filter`, { count: 1 });
	if (r.gravelVolumeM3 > 0) {
		add(`${path}.gravelSku`, bucket, p.gravelSku, `${p.name}: gravel on the liner`, {
			volumeM3: r.gravelVolumeM3,
			areaM2: r.gravelAreaM2
		});
	}
	if (r.edgeVolumeM3 > 0) {
		add(`${path}.edgeStoneSku`, bucket, p.edgeStoneSku, `${p.name}: edge stone`, {
			volumeM3: r.edgeVolumeM3,
			areaM2: r.edgeAreaM2
		});
	}
}

function streamLines(
	s: Stream,
	i: number,
	r: StreamResult,
	catalog: ParsedCatalog,
	add: AddLine,
	warn: (t: string) => void
) {
	const bucket = bucketOf(s.optionId);
	const path = `design.features.${i}`;
	const items = new Map(catalog.items.map((x) => [x.sku, x]));
	const args = [items, catalog.items, add, warn] as const;
	sheetLines(`${path}.linerSku`, bucket, s.linerSku, r.liner, `${s.name}: liner`, ...args);
	sheetLines(
		`${path}.underlaymentSku`,
		bucket,
		s.underlaymentSku,
		r.liner,
		`${s.name}: underlayment`,
		...args
	);
	add(`${path}.weirBoxSku`, bucket, s.weirBoxSku, `${s.name}: weir box`, { count: 1 });
	if (r.gravelVolumeM3 > 0) {
		add(`${path}.gravelSku`, bucket, s.gravelSku, `${s.name}: stream gravel`, {
			volumeM3: r.gravelVolumeM3,
			areaM2: r.bedAreaM2
		});
	}
	if (s.reservoir && r.reservoir) {
		add(`${path}.reservoir.sku`, bucket, s.reservoir.sku, `${s.name}: reservoir`, {
			count: 1,
			volumeM3: r.reservoir.grossVolumeM3
		});
		if (s.reservoir.kind === 'gravel') {
			add(`${path}.reservoir.fillSku`, bucket, s.reservoir.fillSku, `${s.name}: reservoir gravel`, {
				volumeM3: r.reservoir.grossVolumeM3
			});
		}
	}
}

/** Every feature's own lines (the pipes and pumps come from the water systems). */
export function featureLines(
	design: ParsedDesign,
	results: readonly FeatureResult[],
	catalog: ParsedCatalog,
	add: AddLine,
	warn: (text: string) => void
) {
	design.features.forEach((f, i) => {
		const r = results[i];
		if (f.kind === 'fountain') fountainLines(f, i, r, add, design.features.length > 1);
		else if (f.kind === 'pond' && r.pond) pondLines(f, i, r.pond, catalog, add, warn);
		else if (f.kind === 'stream' && r.stream) streamLines(f, i, r.stream, catalog, add, warn);
	});
}

const yd3 = (m3: number) => fromSI(m3, 'volume', 'yd3');

/** What each feature digs, in bank volume, in its own bucket (the digging tasks come from these). */
export function featureDigs(design: ParsedDesign, results: readonly FeatureResult[]): Dig[] {
	const digs: Dig[] = [];
	const several = design.features.length > 1;
	design.features.forEach((f, i) => {
		const bucket = bucketOf(f.optionId);
		const r = results[i];
		if (f.kind === 'fountain' && r?.basin) {
			digs.push({
				bucket,
				what: several ? `the basin: ${f.name}` : 'the basin',
				volumeM3: r.basin.grossVolumeM3
			});
		} else if (f.kind === 'pond' && r?.pond) {
			// The water and the gravel laid on the liner.
			digs.push({ bucket, what: f.name, volumeM3: r.pond.volumeM3 + r.pond.gravelVolumeM3 });
		} else if (f.kind === 'stream' && r?.stream) {
			// The running water in the bed and the gravel under it.
			digs.push({
				bucket,
				what: `the bed: ${f.name}`,
				volumeM3: r.stream.bedDrainBackM3 + r.stream.gravelVolumeM3
			});
			if (f.reservoir && r.stream.reservoir) {
				digs.push({
					bucket,
					what: `the reservoir: ${f.name}`,
					volumeM3: r.stream.reservoir.grossVolumeM3
				});
			}
		}
	});
	return digs;
}

/**
 * Each feature's labor in its own bucket, from the firm's rates (the digging is timed with the
 * rest of the design's digs, since a machine on site digs them all).
 */
export function featureTasks(
	design: ParsedDesign,
	results: readonly FeatureResult[],
	catalog: ParsedCatalog
): LaborTask[] {
	const settings = catalog.settings;
	const people = settings.labor.baseCrewSize;
	const tasks: LaborTask[] = [];
	const several = design.features.length > 1;
	design.features.forEach((f, i) => {
		const bucket = bucketOf(f.optionId);
		const r = results[i];
		const of = (text: string) => (several ? `${text}: ${f.name}` : text);
		const task = (key: LaborRateKey, name: string, quantity: number) =>
			tasks.push(rateTask(settings, key, { bucket, task: name, quantity, people }));
		if (f.kind === 'fountain') {
			if (f.basin) {
				task('basin', of('Set the basin, pump and vault'), 1);
				if (f.basin.fill.kind === 'gravel' && r?.basin) {
					task('fill', of('Fill the basin with gravel'), yd3(r.basin.grossVolumeM3));
				}
			}
			task('branch', of('Plumb the branches'), f.branches.length);
		} else if (f.kind === 'pond') {
			task('pond-line', `Shape shelves and line ${f.name}`, pondPlan(f.outline).areaFt2);
			task('pond-equipment', `Set skimmer, filter and pump: ${f.name}`, 1);
			if (r?.pond && r.pond.gravelVolumeM3 > 0) {
				task('topping', `Spread gravel on the liner: ${f.name}`, yd3(r.pond.gravelVolumeM3));
			}
		} else if (r?.stream) {
			task('stream', `Shape, line and rock ${f.name}`, fromSI(r.stream.lengthM, 'length', 'ft'));
			task('fall', `Build the falls: ${f.name}`, r.stream.fallCount);
			if (f.reservoir && r.stream.reservoir) {
				task('basin', `Set the reservoir and pump vault: ${f.name}`, 1);
				if (f.reservoir.kind === 'gravel') {
					task(
						'fill',
						`Fill the reservoir with gravel: ${f.name}`,
						yd3(r.stream.reservoir.grossVolumeM3)
					);
				}
			}
			if (r.stream.gravelVolumeM3 > 0) {
				task('topping', `Spread stream gravel: ${f.name}`, yd3(r.stream.gravelVolumeM3));
			}
		}
	});
	return tasks.filter((t) => t.hours > 0);
}

/** The deepest open water in the design and where it is, for the open-water caution. */
export function openWater(design: ParsedDesign, results: readonly FeatureResult[]) {
	let deepest = { depthM: 0, where: 'The basin' };
	results.forEach((r, i) => {
		const f = design.features[i];
		const candidates: { depthM: number; where: string }[] = [];
		if (r.basin) candidates.push({ depthM: r.basin.openWaterDepthM, where: 'The basin' });
		if (r.pond) candidates.push({ depthM: r.pond.maxDepthM, where: r.name });
		if (f.kind === 'stream' && f.reservoir?.kind === 'open') {
			candidates.push({
				depthM: toSI(f.reservoir.depthFt, 'length', 'ft'),
				where: `${r.name}’s reservoir`
			});
		}
		for (const c of candidates) if (c.depthM > deepest.depthM) deepest = c;
	});
	return deepest;
}

export type { WaterSystem, HydraulicsResult };
