/** Turns the part results into price-list lines, grouped by bucket (base, option, alternate). */
import type { AggregateResult } from './aggregate';
import { bucketOf, featureLines, type FeatureResult } from './features';
import type { PipeRun } from './hydraulics';
import type { LightingResult } from './lighting';
import type { FittingKind, NominalSize, PipeMaterial } from './pipes';
import {
	priceLine,
	quantityInUnit,
	roundCents,
	type PricedLine,
	type TakeoffLine
} from './pricing';
import type { CatalogItem, ParsedCatalog, ParsedDesign, PumpModel, Stone } from './schema';
import type { StonesResult } from './stones';
import type { WallResult } from './walls';
import type { WaterSystem } from './watersystem';

export interface TakeoffParts {
	design: ParsedDesign;
	systems: readonly WaterSystem[];
	features: readonly FeatureResult[];
	/** The design's stones followed by the streams' bank boulders, as analysed. */
	stoneInputs: readonly Stone[];
	stones: StonesResult;
	aggregates: readonly AggregateResult[];
	walls: readonly WallResult[];
	lighting?: LightingResult;
}

interface PathedLine extends TakeoffLine {
	path: string;
}

interface Run {
	feature: string;
	run: PipeRun;
	fittings: { kind: FittingKind; count: number }[];
	label: string;
	bucket: string;
}

function pipeLines(
	runs: Run[],
	catalog: ParsedCatalog
): { lines: PathedLine[]; warnings: string[] } {
	const lines: PathedLine[] = [];
	const warnings = new Set<string>();
	const findPipe = (material: PipeMaterial, size: NominalSize) =>
		catalog.items.find((i) => i.pipe?.material === material && i.pipe.size === size);
	const findFitting = (kind: FittingKind, size: NominalSize) =>
		catalog.items.find((i) => i.fitting?.kind === kind && i.fitting.size === size);
	for (const { run, fittings, label, bucket, feature } of runs) {
		const pipe = findPipe(run.material, run.size);
		if (pipe) {
			lines.push({
				bucket,
				feature,
				sku: pipe.sku,
				description: label,
				measure: { lengthM: run.lengthM },
				path: label
			});
		} else {
			warnings.add(`No price-list item for ${run.size} in ${run.material} pipe: not priced`);
		}
		for (const f of fittings.filter((x) => x.count > 0 && !['entrance', 'exit'].includes(x.kind))) {
			const item = findFitting(f.kind, run.size);
			if (item) {
				lines.push({
					bucket,
					feature,
					sku: item.sku,
					description: label,
					measure: { count: f.count },
					path: label
				});
			} else {
				warnings.add(`No price-list item for a ${run.size} in ${f.kind}: not priced`);
			}
		}
	}
	return { lines, warnings: [...warnings] };
}

function waterRuns(parts: TakeoffParts): Run[] {
	const { design } = parts;
	const runs: Run[] = [];
	// With several features, a fountain's lines carry its name so two fountains never share one.
	const named = (name: string, text: string) =>
		design.features.length > 1 ? `${name}: ${text}` : text;
	for (const system of parts.systems) {
		const feature = design.features.find((f) => f.id === system.featureId)!;
		const bucket = bucketOf(feature.optionId);
		if (feature.kind === 'fountain' && system.hydraulics) {
			const hydraulics = system.hydraulics;
			hydraulics.branches.forEach((b, i) => {
				const branch = feature.branches[i];
				const valve = branch.valve === 'none' ? [] : [{ kind: branch.valve, count: 1 }];
				runs.push({
					run: b as PipeRun,
					fittings: [...branch.fittings, ...valve],
					label: named(feature.name, `Branch to ${b.outletName}`),
					bucket,
					feature: feature.id
				});
			});
			if (hydraulics.supply && feature.supply) {
				runs.push({
					run: hydraulics.supply,
					fittings: feature.supply.fittings,
					label: named(feature.name, 'Supply to manifold'),
					bucket,
					feature: feature.id
				});
			}
		} else if (system.supply) {
			const fed = design.features.find(
				(f) => f.kind === 'stream' && system.feeds.includes(f.id) && f.id !== feature.id
			);
			const input = feature.kind === 'pond' && fed?.kind === 'stream' ? fed.supply : feature.supply;
			runs.push({
				run: system.supply,
				fittings: input?.fittings ?? [],
				label: `${system.name}: supply line`,
				bucket,
				feature: feature.id
			});
		}
	}
	return runs;
}

type Add = (
	path: string,
	bucket: string,
	sku: string | undefined,
	description: string,
	measure: TakeoffLine['measure']
) => void;

function stoneAndAggregateLines(
	{ design, stones, stoneInputs, aggregates }: TakeoffParts,
	add: Add
) {
	const own = design.stones.length;
	stones.stones.forEach((s, i) => {
		const input = stoneInputs[i];
		const streamIndex = design.features.findIndex((f) => `${f.id}-boulders` === input.id);
		const path = i < own ? `design.stones.${i}.sku` : `design.features.${streamIndex}.boulderSku`;
		add(path, bucketOf(s.optionId), input.sku, s.name, {
			count: s.count,
			massKg: s.totalWeightKg,
			volumeM3: s.volumeM3 * s.count
		});
	});
	aggregates.forEach((a, i) => {
		add(`design.aggregates.${i}.sku`, bucketOf(a.optionId), a.sku, a.name, {
			volumeM3: a.volumeM3,
			areaM2: a.areaM2,
			massKg: a.massKg
		});
	});
}

function wallLines({ design, walls }: TakeoffParts, add: Add) {
	walls.forEach((w, i) => {
		const input = design.walls[i];
		const bucket = bucketOf(w.optionId);
		const path = `design.walls.${i}`;
		add(`${path}.unitSku`, bucket, input.unitSku, `${w.name} units`, { count: w.units });
		add(`${path}.capSku`, bucket, input.capSku, `${w.name} caps`, { count: w.caps });
		add(`${path}.padSku`, bucket, input.padSku, `${w.name} levelling pad (loose, to compact)`, {
			volumeM3: w.padLooseVolumeM3
		});
		add(`${path}.drainSku`, bucket, input.drainSku, `${w.name} drainage stone`, {
			volumeM3: w.drainVolumeM3
		});
		if (w.drainPipeLengthM > 0) {
			add(`${path}.drainPipeSku`, bucket, input.drainPipeSku, `${w.name} drain pipe`, {
				lengthM: w.drainPipeLengthM
			});
		}
	});
}

function lightingLines({ design, lighting }: TakeoffParts, add: Add) {
	const input = design.lighting;
	if (!input || !lighting) return;
	const bucket = bucketOf(input.optionId);
	const placed = new Map<string, number>();
	for (const run of lighting.runs) {
		for (const f of run.fixtures) placed.set(f.fixtureId, (placed.get(f.fixtureId) ?? 0) + 1);
	}
	input.fixtures.forEach((f, i) => {
		add(`design.lighting.fixtures.${i}.sku`, bucket, f.sku, f.name, {
			count: placed.get(f.id) ?? 0
		});
	});
	input.transformers.forEach((t, i) => {
		add(`design.lighting.transformers.${i}.sku`, bucket, t.sku, t.name, { count: 1 });
	});
	lighting.runs.forEach((r, i) => {
		add(
			`design.lighting.runs.${i}.cableSku`,
			bucket,
			input.runs[i].cableSku,
			`Cable, run ${r.id}`,
			{
				lengthM: r.cableLengthM
			}
		);
	});
}

function partLines(parts: TakeoffParts, catalog: ParsedCatalog, warn: (t: string) => void) {
	const lines: PathedLine[] = [];
	const add: Add = (path, bucket, sku, description, measure) => {
		const n = /^design\.features\.(\d+)\./.exec(path)?.[1];
		const feature = n === undefined ? undefined : parts.design.features[Number(n)]?.id;
		if (sku) {
			lines.push({ path, bucket, sku, description, measure, ...(feature ? { feature } : {}) });
		}
	};
	featureLines(parts.design, parts.features, catalog, add, warn);
	stoneAndAggregateLines(parts, add);
	wallLines(parts, add);
	lightingLines(parts, add);
	parts.design.extraLines.forEach((l, i) => {
		add(`design.extraLines.${i}.sku`, bucketOf(l.optionId), l.sku, 'Added line', {
			direct: l.quantity
		});
	});
	return lines;
}

export interface TakeoffResult {
	lines: PricedLine[];
	errors: { path: string; message: string }[];
	warnings: string[];
}

function pumpLine(
	pump: PumpModel,
	bucket: string,
	description: string,
	feature: string
): PricedLine {
	return {
		bucket,
		feature,
		sku: `pump:${pump.id}`,
		name: pump.name,
		description,
		unit: 'each',
		quantity: 1,
		unitPriceCents: pump.priceCents,
		extendedCents: pump.priceCents,
		costCents: roundCents(pump.costCents ?? 0),
		taxable: true
	};
}

/** Sums lines of one SKU within one bucket before rounding up to the purchase increment. */
export function buildTakeoff(parts: TakeoffParts, catalog: ParsedCatalog): TakeoffResult {
	const water = pipeLines(waterRuns(parts), catalog);
	const warnings = new Set(water.warnings);
	const all = [...water.lines, ...partLines(parts, catalog, (t) => warnings.add(t))];
	const items = new Map<string, CatalogItem>(catalog.items.map((i) => [i.sku, i]));
	const grouped = new Map<
		string,
		{ line: PathedLine; item: CatalogItem; quantity: number; descriptions: Set<string> }
	>();
	const errors: TakeoffResult['errors'] = [];
	for (const line of all) {
		const item = items.get(line.sku)!;
		const quantity = quantityInUnit(line.measure, item);
		if (quantity === undefined) {
			errors.push({
				path: line.path,
				message: `"${item.sku}" is sold by ${item.unit}, which cannot price this part (add a bulk density, bag or load size, or pick another item)`
			});
			continue;
		}
		const key = `${line.bucket}\u0000${line.feature ?? ''}\u0000${line.sku}`;
		const group = grouped.get(key) ?? { line, item, quantity: 0, descriptions: new Set<string>() };
		group.quantity += quantity;
		group.descriptions.add(line.description);
		grouped.set(key, group);
	}
	const lines = [...grouped.values()]
		.filter((g) => g.quantity > 0)
		.map((g) =>
			priceLine({ ...g.line, description: [...g.descriptions].join('; ') }, g.item, g.quantity)
		);
	const pumps = parts.systems.flatMap((system) => {
		const pump = catalog.pumps.find((p) => p.id === system.pump.chosenId);
		if (!pump) return [];
		const feature = parts.design.features.find((f) => f.id === system.featureId);
		const description = parts.systems.length === 1 ? 'Pump' : `Pump for ${system.name}`;
		return [pumpLine(pump, bucketOf(feature?.optionId), description, system.featureId)];
	});
	lines.unshift(...pumps);
	return { lines, errors, warnings: [...warnings] };
}
