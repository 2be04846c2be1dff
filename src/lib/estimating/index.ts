/**
 * The sizing and takeoff engine. Pure TypeScript: no I/O, safe in the browser and on the server.
 * `estimate(design, catalog)` validates both, then returns quantities, per-part results,
 * warnings and cautions, or field-level errors. It never throws and never returns NaN.
 */
import type { z } from 'zod';
import { aggregateResult, type AggregateResult } from './aggregate';
import type { BasinBudget } from './basin';
import { cautionsFor, type Caution } from './cautions';
import {
	analyseFeatures,
	featureDigs,
	featureTasks,
	fountainBasins,
	openWater,
	type FeatureResult
} from './features';
import type { HydraulicsResult } from './hydraulics';
import { siteWork, type SiteWorkResult } from './equipment';
import { laborSummary, laborTasks, planMachines, type LaborSummary, type LaborTask } from './labor';
import { analyseLighting, type LightingResult } from './lighting';
import { includedBuckets, pickLaborRate, priceSummary, type PriceSummary } from './pricing';
import type { PumpMatch } from './pumps';
import {
	designSchema,
	type Catalog,
	type Design,
	type ParsedCatalog,
	type ParsedDesign
} from './schema';
import { analyseStones, type StonesResult } from './stones';
import { prepareCatalog, readCatalog } from './prepared';
import { buildTakeoff } from './takeoff';
import { formatQuantity, type DisplayKind, type UnitSystem } from './units';
import { upgradeDesign } from './upgrade';
import { crossCheck, type FieldError } from './validate';
import { wallTakeoff, type WallResult } from './walls';
import { yardQuantities, yardWarnings } from './yard';
import type { WaterSystem } from './watersystem';

export interface QuantityLine {
	id: string;
	label: string;
	kind: DisplayKind;
	/** In SI: m, m², m³, m³/s, m of water, kg. */
	si: number;
	display: string;
}

export interface EstimateSuccess {
	ok: true;
	units: UnitSystem;
	quantities: QuantityLine[];
	/** One per pump: fountains, ponds (with the streams that fall into them), pondless streams. */
	systems: WaterSystem[];
	/** Per feature, in the design's order: its basin, pond or stream figures. */
	features: FeatureResult[];
	/** The first fountain's outlets and pump (kept for readers of single-fountain results). */
	water?: HydraulicsResult & { pump: PumpMatch };
	/** The first fountain's basin. */
	basin?: BasinBudget;
	stones: StonesResult;
	aggregates: AggregateResult[];
	walls: WallResult[];
	lighting?: LightingResult;
	labor: { tasks: LaborTask[]; summary: LaborSummary };
	/** Machines, deliveries and spoil, each priced as a line of its own. */
	siteWork: SiteWorkResult;
	pricing: PriceSummary;
	warnings: string[];
	cautions: Caution[];
}

export interface EstimateFailure {
	ok: false;
	errors: FieldError[];
}

export type EstimateResult = EstimateSuccess | EstimateFailure;

export interface EstimateOptions {
	units?: UnitSystem;
}

function zodErrors(root: string, error: z.ZodError): FieldError[] {
	return error.issues.map((issue) => ({
		path: [root, ...issue.path.map(String)].join('.'),
		message: issue.message
	}));
}

function parse(design: unknown, catalog: unknown) {
	const d = designSchema.safeParse(upgradeDesign(design));
	const c = readCatalog(catalog);
	const errors = [
		...(d.success ? [] : zodErrors('design', d.error)),
		...(c.success ? [] : zodErrors('catalog', c.error))
	];
	if (!d.success || !c.success) return { errors };
	const cross = crossCheck(d.data, c.data);
	return cross.length ? { errors: cross } : { design: d.data, catalog: c.data, errors: [] };
}

/** The path to the first number that is not finite, so none ever reaches a caller. */
function firstNonFinite(value: unknown, path: string[] = []): string | undefined {
	if (typeof value === 'number') return Number.isFinite(value) ? undefined : path.join('.');
	if (value === null || typeof value !== 'object') return undefined;
	// Arrays by index (a for-in over an array walks its keys as strings, far slower).
	if (Array.isArray(value)) {
		for (let i = 0; i < value.length; i++) {
			const inner: unknown = value[i];
			if (typeof inner === 'number' && Number.isFinite(inner)) continue;
			if (inner === null || (typeof inner !== 'number' && typeof inner !== 'object')) continue;
			path.push(String(i));
			const found = firstNonFinite(inner, path);
			path.pop();
			if (found) return found;
		}
		return undefined;
	}
	const record = value as Record<string, unknown>;
	for (const key in record) {
		const inner = record[key];
		if (typeof inner === 'number' && Number.isFinite(inner)) continue;
		if (inner === null || (typeof inner !== 'number' && typeof inner !== 'object')) continue;
		path.push(key);
		const found = firstNonFinite(inner, path);
		path.pop();
		if (found) return found;
	}
	return undefined;
}

type PartResults = Omit<EstimateSuccess, 'quantities' | 'ok' | 'cautions'>;

function quantities(result: PartResults, units: UnitSystem) {
	const lines: QuantityLine[] = [];
	const add = (id: string, label: string, kind: DisplayKind, si: number) =>
		lines.push({ id, label, kind, si, display: formatQuantity(si, kind, units).text });
	const many = result.features.length > 1;
	for (const system of result.systems) {
		const key = many ? `-${system.featureId}` : '';
		const of = many ? `, ${system.name}` : '';
		add(`total-flow${key}`, `Total flow${of}`, 'flow', system.flowM3s);
		const head = system.kind === 'fountain' ? 'Head at the hardest branch' : 'Head at the pump';
		add(`required-head${key}`, `${head}${of}`, 'head', system.requiredHeadM);
	}
	for (const f of result.features) {
		const key = many ? `-${f.id}` : '';
		const of = many ? `, ${f.name}` : '';
		if (f.basin) {
			add(`basin-water${key}`, `Water the basin holds${of}`, 'volume', f.basin.waterCapacityM3);
			add(`basin-reserve${key}`, `Usable reserve${of}`, 'volume', f.basin.usableReserveM3);
			add(`daily-loss${key}`, `Daily water loss${of}`, 'volume', f.basin.dailyLossM3);
		}
		if (f.pond) {
			add(`pond-water-${f.id}`, `${f.name}: water`, 'volume', f.pond.volumeM3);
			add(`pond-area-${f.id}`, `${f.name}: surface`, 'area', f.pond.areaM2);
			add(
				`pond-loss-${f.id}`,
				`${f.name}: evaporation a day`,
				'volume',
				f.pond.evaporationM3PerDay
			);
		}
		if (f.stream) {
			add(`stream-length-${f.id}`, `${f.name}: length`, 'length', f.stream.lengthM);
			add(`stream-drain-${f.id}`, `${f.name}: drains back`, 'volume', f.stream.drainBackM3);
			add(
				`stream-reserve-${f.id}`,
				`${f.name}: reservoir must hold`,
				'volume',
				f.stream.requiredReserveM3
			);
		}
	}
	for (const f of result.features) {
		for (const q of yardQuantities(f)) {
			add(`${q.key}-${f.id}`, `${f.name}: ${q.label}`, q.kind, q.si);
		}
	}
	if (result.stones.stones.length) {
		add('stone-weight', 'Stone, total weight', 'mass', result.stones.totalWeightKg);
		add('heaviest-stone', 'Heaviest stone', 'mass', result.stones.heaviestKg);
	}
	result.aggregates.forEach((a) => {
		add(`aggregate-${a.id}`, a.name, 'bulkVolume', a.volumeM3);
		if (a.massKg !== undefined) {
			add(`aggregate-${a.id}-weight`, `${a.name}, weight`, 'bulkMass', a.massKg);
		}
	});
	for (const s of result.siteWork.spoil) {
		const of = s.bucket === 'base' ? '' : ` (${s.bucket})`;
		add(`spoil-${s.bucket}`, `Dug soil, loose${of}`, 'bulkVolume', s.looseM3);
	}
	result.walls.forEach((w) => {
		add(`wall-${w.id}-pad`, `${w.name}, levelling pad`, 'bulkVolume', w.padVolumeM3);
		add(`wall-${w.id}-drain`, `${w.name}, drainage stone`, 'bulkVolume', w.drainVolumeM3);
	});
	return lines;
}

function cautionFacts(result: PartResults, design: ParsedDesign, openWaterDepthIn: number) {
	const deepest = openWater(design, result.features);
	return {
		digs: Boolean(
			design.features.some((f) => f.kind !== 'fountain' || f.basin || f.branches.length) ||
			design.walls.length ||
			design.lighting
		),
		hasPump: result.systems.length > 0,
		hasLighting: Boolean(result.lighting),
		stonesNeedingHelp: result.stones.stones.filter((s) => s.handling.people > 1).map((s) => s.name),
		machines: result.siteWork.machines.some((m) => m.delivered),
		wallsNeedingPermit: result.walls.filter((w) => w.needsPermit).map((w) => w.name),
		wallsNeedingEngineering: result.walls.filter((w) => w.needsEngineering).map((w) => w.name),
		openWaterDepthM: deepest.depthM,
		openWaterWhere: deepest.where,
		openWaterLimitM: openWaterDepthIn * 0.0254,
		drainsWater: design.features
			.filter((f) => f.kind === 'drainage' || f.kind === 'path')
			.map((f) => f.name),
		soakaways: design.features
			.filter((f) => f.kind === 'drainage' && f.soakaway)
			.map((f) => f.name),
		steps: design.features.filter((f) => f.kind === 'path' && f.steps).map((f) => f.name)
	};
}

function analyseParts(design: ParsedDesign, catalog: ParsedCatalog, units: UnitSystem) {
	const settings = catalog.settings;
	const features = analyseFeatures(design, catalog, units);
	const stoneInputs = [...design.stones, ...features.stones];
	const stones = analyseStones(stoneInputs, settings);
	fountainBasins(design, features, stones, catalog);
	const items = new Map(catalog.items.map((i) => [i.sku, i]));
	const firstFountain = features.systems.find((s) => s.kind === 'fountain');
	return {
		systems: features.systems,
		features: features.results,
		water: firstFountain?.hydraulics
			? Object.assign({}, firstFountain.hydraulics, { pump: firstFountain.pump })
			: undefined,
		basin: features.results.find((r) => r.basin)?.basin,
		stoneInputs,
		stones,
		aggregates: design.aggregates.map((a) =>
			aggregateResult(a, items.get(a.sku), settings.aggregateWastePercent)
		),
		walls: design.walls.map((w) => wallTakeoff(w, settings)),
		lighting: design.lighting ? analyseLighting(design.lighting, settings) : undefined
	};
}

type Parts = ReturnType<typeof analyseParts>;

function labor(design: ParsedDesign, parts: Parts, catalog: ParsedCatalog) {
	const settings = catalog.settings;
	const included = includedBuckets(design);
	const digs = [
		...featureDigs(design, parts.features),
		...parts.walls.map((w) => ({
			bucket: w.optionId ?? 'base',
			what: `the footing: ${w.name}`,
			volumeM3: w.trenchVolumeM3
		}))
	];
	const machines = planMachines(digs, parts.stones.stones, design.site, settings);
	const tasks = laborTasks(
		{
			features: featureTasks(design, parts.features, catalog),
			digs,
			stones: parts.stones.stones,
			aggregates: parts.aggregates,
			walls: parts.walls,
			lighting: parts.lighting && { result: parts.lighting, optionId: design.lighting?.optionId },
			extra: design.extraLabor,
			site: design.site,
			machines
		},
		settings
	);
	return { tasks, digs, machines, summary: laborSummary(tasks, included, settings) };
}

function collectWarnings(parts: Parts, takeoffWarnings: string[], unpricedLabor: boolean) {
	const named = (system: WaterSystem, text: string) =>
		parts.systems.length > 1 ? `${system.name}: ${text}` : text;
	return [
		...parts.systems.flatMap((s) => [...s.warnings, ...s.pump.warnings.map((w) => named(s, w))]),
		...parts.features.flatMap((f) => [
			...(f.basin?.warnings ?? []),
			...(f.pond?.warnings ?? []),
			...(f.stream?.warnings ?? []),
			...yardWarnings(f)
		]),
		...parts.stones.warnings,
		...(parts.lighting?.warnings ?? []),
		...takeoffWarnings,
		...(unpricedLabor ? ['No labor rate in the price list: labor is not priced'] : [])
	];
}

function compute(design: ParsedDesign, catalog: ParsedCatalog, units: UnitSystem): EstimateResult {
	const settings = catalog.settings;
	const parts = analyseParts(design, catalog, units);
	const takeoff = buildTakeoff({ design, ...parts }, catalog);
	if (takeoff.errors.length) return { ok: false, errors: takeoff.errors };
	const work = labor(design, parts, catalog);
	const site = siteWork(
		{
			digs: work.digs,
			machines: work.machines,
			tasks: work.tasks,
			stones: parts.stones.stones.map((result, i) => ({ result, sku: parts.stoneInputs[i]?.sku })),
			walls: parts.walls.map((result, i) => ({
				result,
				unitSku: design.walls[i].unitSku,
				capSku: design.walls[i].capSku
			})),
			lines: takeoff.lines,
			site: design.site
		},
		catalog
	);
	const lines = [...takeoff.lines, ...site.lines];
	const pricing = priceSummary(design, lines, work.tasks, pickLaborRate(catalog), settings);
	const unpricedLabor = catalog.laborRates.length === 0 && work.tasks.length > 0;
	// The stone inputs were for the takeoff; the result carries the analysed stones only.
	const shown: Omit<Parts, 'stoneInputs'> & { stoneInputs?: unknown } = { ...parts };
	delete shown.stoneInputs;
	const partial = Object.assign(shown, {
		units,
		labor: { tasks: work.tasks, summary: work.summary },
		siteWork: site.result,
		pricing,
		warnings: collectWarnings(parts, [...takeoff.warnings, ...site.warnings], unpricedLabor)
	});
	const cautions = cautionsFor(cautionFacts(partial, design, settings.openWaterDepthIn));
	return Object.assign(partial, {
		ok: true as const,
		quantities: quantities(partial, units),
		cautions
	});
}

export function estimate(
	design: unknown,
	catalog: unknown,
	options: EstimateOptions = {}
): EstimateResult {
	const units = options.units ?? 'us';
	try {
		const parsed = parse(design, catalog);
		if (!parsed.design || !parsed.catalog) return { ok: false, errors: parsed.errors };
		const result = compute(parsed.design, parsed.catalog, units);
		const bad = result.ok ? firstNonFinite(result, ['result']) : undefined;
		if (bad) {
			return {
				ok: false,
				errors: [{ path: bad, message: 'This value could not be computed from the inputs' }]
			};
		}
		return result;
	} catch (error) {
		// A last guard so the builder never sees an exception; validation should make this unreachable.
		const message = error instanceof Error ? error.message : String(error);
		return {
			ok: false,
			errors: [{ path: 'design', message: `The estimate could not be computed: ${message}` }]
		};
	}
}

export type { Design, Catalog, ParsedDesign, ParsedCatalog, FieldError };
export type { Settings, CatalogItem, PumpModel } from './schema';
export type { HydraulicsResult, BranchResult } from './hydraulics';
export type { PumpMatch, PumpEvaluation, CurvePoint, OperatingPoint } from './pumps';
export type { BasinBudget } from './basin';
export type { WaterSystem } from './watersystem';
export type { FeatureResult } from './features';
export type { PondResult } from './pond';
export type { StreamResult } from './stream';
export type { Feature, FeatureKind, Fountain, Pond, Stream } from './schema';
export { readDesign, upgradeDesign } from './upgrade';
export type { StonesResult, StoneResult, HandlingPlan } from './stones';
export type { AggregateResult } from './aggregate';
export type { WallResult } from './walls';
export type { LightingResult, RunResult, TransformerResult } from './lighting';
export type { LaborTask, LaborSummary } from './labor';
export type { PriceSummary, PricedLine, BucketTotals } from './pricing';
export type { Caution } from './cautions';
export { designSchema, catalogSchema } from './schema';
export { prepareCatalog };
export { formatQuantity, type UnitSystem, type DisplayKind } from './units';
