/**
 * The sizing and takeoff engine. Pure TypeScript: no I/O, safe in the browser and on the server.
 * `estimate(design, catalog)` validates both, then returns quantities, per-part results,
 * warnings and cautions, or field-level errors. It never throws and never returns NaN.
 */
import type { z } from 'zod';
import { aggregateResult, type AggregateResult } from './aggregate';
import { basinBudget, type BasinBudget } from './basin';
import { cautionsFor, type Caution } from './cautions';
import { analyseHydraulics, type HydraulicsResult } from './hydraulics';
import { laborSummary, laborTasks, type LaborSummary, type LaborTask } from './labor';
import { analyseLighting, type LightingResult } from './lighting';
import { includedBuckets, pickLaborRate, priceSummary, type PriceSummary } from './pricing';
import { matchPump, type PumpMatch } from './pumps';
import {
	catalogSchema,
	designSchema,
	type Catalog,
	type Design,
	type ParsedCatalog,
	type ParsedDesign
} from './schema';
import { analyseStones, type StonesResult } from './stones';
import { buildTakeoff } from './takeoff';
import { formatQuantity, type DisplayKind, type UnitSystem } from './units';
import { crossCheck, type FieldError } from './validate';
import { wallTakeoff, type WallResult } from './walls';

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
	water?: HydraulicsResult & { pump: PumpMatch };
	basin?: BasinBudget;
	stones: StonesResult;
	aggregates: AggregateResult[];
	walls: WallResult[];
	lighting?: LightingResult;
	labor: { tasks: LaborTask[]; summary: LaborSummary };
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
	const d = designSchema.safeParse(design);
	const c = catalogSchema.safeParse(catalog);
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

function water(design: ParsedDesign, catalog: ParsedCatalog, units: UnitSystem) {
	if (design.outlets.length === 0) return undefined;
	const settings = catalog.settings;
	const hydraulics = analyseHydraulics(
		design.outlets,
		design.branches,
		design.supply,
		settings,
		units
	);
	const pump = matchPump(
		catalog.pumps,
		hydraulics.system,
		hydraulics.totalFlowM3s,
		hydraulics.requiredHeadM,
		settings,
		design.pumpModelId
	);
	return Object.assign(hydraulics, { pump });
}

type PartResults = Omit<EstimateSuccess, 'quantities' | 'ok' | 'cautions'>;

function quantities(result: PartResults, units: UnitSystem) {
	const lines: QuantityLine[] = [];
	const add = (id: string, label: string, kind: DisplayKind, si: number) =>
		lines.push({ id, label, kind, si, display: formatQuantity(si, kind, units).text });
	if (result.water) {
		add('total-flow', 'Total flow', 'flow', result.water.totalFlowM3s);
		add('required-head', 'Head at the hardest branch', 'head', result.water.requiredHeadM);
	}
	if (result.basin) {
		add('basin-water', 'Water the basin holds', 'volume', result.basin.waterCapacityM3);
		add('basin-reserve', 'Usable reserve', 'volume', result.basin.usableReserveM3);
		add('daily-loss', 'Daily water loss', 'volume', result.basin.dailyLossM3);
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
	result.walls.forEach((w) => {
		add(`wall-${w.id}-pad`, `${w.name}, levelling pad`, 'bulkVolume', w.padVolumeM3);
		add(`wall-${w.id}-drain`, `${w.name}, drainage stone`, 'bulkVolume', w.drainVolumeM3);
	});
	return lines;
}

function cautionFacts(result: PartResults, design: ParsedDesign, openWaterDepthIn: number) {
	return {
		digs: Boolean(design.basin || design.branches.length || design.walls.length || design.lighting),
		hasPump: Boolean(result.water),
		hasLighting: Boolean(result.lighting),
		stonesNeedingHelp: result.stones.stones.filter((s) => s.handling.people > 1).map((s) => s.name),
		wallsNeedingPermit: result.walls.filter((w) => w.needsPermit).map((w) => w.name),
		wallsNeedingEngineering: result.walls.filter((w) => w.needsEngineering).map((w) => w.name),
		openWaterDepthM: result.basin?.openWaterDepthM ?? 0,
		openWaterLimitM: openWaterDepthIn * 0.0254
	};
}

function analyseParts(design: ParsedDesign, catalog: ParsedCatalog, units: UnitSystem) {
	const settings = catalog.settings;
	const waterResult = water(design, catalog, units);
	const stones = analyseStones(design.stones, settings);
	const items = new Map(catalog.items.map((i) => [i.sku, i]));
	const basin = design.basin
		? basinBudget({
				basin: design.basin,
				pipeDrainBackM3: waterResult?.drainBackM3 ?? 0,
				wettedStoneAreaM2: stones.wettedSurfaceM2,
				wettedStoneTopM2: stones.wettedTopM2,
				flowM3s: waterResult?.totalFlowM3s ?? 0,
				settings
			})
		: undefined;
	return {
		water: waterResult,
		basin,
		stones,
		aggregates: design.aggregates.map((a) =>
			aggregateResult(a, items.get(a.sku), settings.aggregateWastePercent)
		),
		walls: design.walls.map((w) => wallTakeoff(w, settings)),
		lighting: design.lighting ? analyseLighting(design.lighting, settings) : undefined
	};
}

type Parts = ReturnType<typeof analyseParts>;

function labor(design: ParsedDesign, parts: Parts, settings: ParsedCatalog['settings']) {
	const included = includedBuckets(design);
	const tasks = laborTasks(
		{
			hasBasin: Boolean(design.basin),
			outletCount: design.outlets.length,
			stones: parts.stones.stones,
			aggregates: parts.aggregates,
			walls: parts.walls,
			lighting: parts.lighting && { result: parts.lighting, optionId: design.lighting?.optionId },
			extra: design.extraLabor
		},
		settings
	);
	const includedStones = parts.stones.stones.filter((s) => included.has(s.optionId ?? 'base'));
	const stoneCrew = Math.max(0, ...includedStones.map((s) => s.handling.people));
	return { tasks, summary: laborSummary(tasks, included, stoneCrew, settings) };
}

function collectWarnings(parts: Parts, takeoffWarnings: string[], unpricedLabor: boolean) {
	return [
		...(parts.water?.warnings ?? []),
		...(parts.water?.pump.warnings ?? []),
		...(parts.basin?.warnings ?? []),
		...parts.stones.warnings,
		...(parts.lighting?.warnings ?? []),
		...takeoffWarnings,
		...(unpricedLabor ? ['No labor rate in the price list: labor is not priced'] : [])
	];
}

function compute(design: ParsedDesign, catalog: ParsedCatalog, units: UnitSystem): EstimateResult {
	const settings = catalog.settings;
	const parts = analyseParts(design, catalog, units);
	const pump = catalog.pumps.find((p) => p.id === parts.water?.pump.chosenId);
	const takeoff = buildTakeoff({ design, hydraulics: parts.water, pump, ...parts }, catalog);
	if (takeoff.errors.length) return { ok: false, errors: takeoff.errors };
	const work = labor(design, parts, settings);
	const pricing = priceSummary(design, takeoff.lines, work.tasks, pickLaborRate(catalog), settings);
	const unpricedLabor = catalog.laborRates.length === 0 && work.tasks.length > 0;
	const partial = Object.assign(parts, {
		units,
		labor: work,
		pricing,
		warnings: collectWarnings(parts, takeoff.warnings, unpricedLabor)
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
export type { StonesResult, StoneResult, HandlingPlan } from './stones';
export type { AggregateResult } from './aggregate';
export type { WallResult } from './walls';
export type { LightingResult, RunResult, TransformerResult } from './lighting';
export type { LaborTask, LaborSummary } from './labor';
export type { PriceSummary, PricedLine, BucketTotals } from './pricing';
export type { Caution } from './cautions';
export { designSchema, catalogSchema } from './schema';
export { formatQuantity, type UnitSystem, type DisplayKind } from './units';
export { demoDesign, demoCatalog } from './demo';
