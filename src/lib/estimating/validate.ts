/** Checks that need the whole design and catalog at once: references, sizes, curves. */
import { pipeExists } from './pipes';
import { pondErrors } from './pond';
import { firstNonMonotoneIndex } from './pumps';
import type { Fountain, ParsedCatalog, ParsedDesign, Supply } from './schema';
import { streamErrors } from './stream';
import { isYardFeature, yardSkus } from './yard';

export interface FieldError {
	path: string;
	message: string;
}

type Path = (string | number)[];

class Collector {
	errors: FieldError[] = [];
	add(path: Path, message: string) {
		this.errors.push({ path: path.join('.'), message });
	}
}

function checkUnique(c: Collector, items: readonly { id: string }[], path: Path) {
	const seen = new Set<string>();
	items.forEach((item, i) => {
		if (seen.has(item.id)) c.add([...path, i, 'id'], `Duplicate id "${item.id}"`);
		seen.add(item.id);
	});
}

function checkSupply(c: Collector, supply: Supply | undefined, path: Path) {
	if (supply && !pipeExists(supply.pipe.material, supply.pipe.size)) {
		c.add([...path, 'pipe', 'size'], `${supply.pipe.material} has no ${supply.pipe.size} in size`);
	}
}

function checkFountain(c: Collector, f: Fountain, at: Path) {
	const outletIds = new Set(f.outlets.map((o) => o.id));
	const fed = new Map<string, number>();
	f.branches.forEach((b, i) => {
		if (!outletIds.has(b.outletId)) {
			c.add([...at, 'branches', i, 'outletId'], `No outlet "${b.outletId}"`);
		}
		fed.set(b.outletId, (fed.get(b.outletId) ?? 0) + 1);
		if (!pipeExists(b.pipe.material, b.pipe.size)) {
			c.add(
				[...at, 'branches', i, 'pipe', 'size'],
				`${b.pipe.material} has no ${b.pipe.size} in size`
			);
		}
	});
	f.outlets.forEach((o, i) => {
		const branches = fed.get(o.id) ?? 0;
		if (branches === 0) c.add([...at, 'outlets', i], 'This outlet has no branch to feed it');
		if (branches > 1) c.add([...at, 'outlets', i], 'This outlet is fed by more than one branch');
	});
	checkSupply(c, f.supply, [...at, 'supply']);
	checkUnique(c, f.outlets, [...at, 'outlets']);
	checkUnique(c, f.branches, [...at, 'branches']);
}

function checkFeatures(c: Collector, design: ParsedDesign) {
	const ponds = new Set(design.features.filter((f) => f.kind === 'pond').map((f) => f.id));
	design.features.forEach((f, i) => {
		const at: Path = ['design', 'features', i];
		if (f.kind === 'fountain') checkFountain(c, f, at);
		else if (isYardFeature(f)) return;
		else if (f.kind === 'pond') {
			checkSupply(c, f.supply, [...at, 'supply']);
			for (const e of pondErrors(f)) c.add([...at, ...e.path], e.message);
		} else {
			checkSupply(c, f.supply, [...at, 'supply']);
			for (const e of streamErrors(f)) c.add([...at, ...e.path], e.message);
			if (f.feedsPondId && !ponds.has(f.feedsPondId)) {
				c.add([...at, 'feedsPondId'], `No pond "${f.feedsPondId}" in this design`);
			}
		}
	});
	checkUnique(c, design.features, ['design', 'features']);
	const features = new Set(design.features.map((f) => f.id));
	design.stones.forEach((s, i) => {
		if (s.featureId && !features.has(s.featureId)) {
			c.add(['design', 'stones', i, 'featureId'], `No feature "${s.featureId}"`);
		}
	});
}

function checkPumps(c: Collector, design: ParsedDesign, catalog: ParsedCatalog) {
	catalog.pumps.forEach((pump, i) => {
		const bad = firstNonMonotoneIndex(pump.curve);
		if (bad >= 0) {
			c.add(
				['catalog', 'pumps', i, 'curve', bad],
				'Flow must rise and head must not rise from one curve point to the next'
			);
		}
	});
	checkUnique(c, catalog.pumps, ['catalog', 'pumps']);
	design.features.forEach((f, i) => {
		if ('pumpModelId' in f && f.pumpModelId && !catalog.pumps.some((p) => p.id === f.pumpModelId)) {
			c.add(
				['design', 'features', i, 'pumpModelId'],
				`No pump model "${f.pumpModelId}" in the price list`
			);
		}
	});
}

function skuReferences(design: ParsedDesign): [Path, string | undefined][] {
	const refs: [Path, string | undefined][] = [];
	const push = (path: Path, sku: string | undefined) => refs.push([['design', ...path], sku]);
	design.features.forEach((f, i) => {
		const at = ['features', i];
		if (f.kind === 'fountain') {
			push([...at, 'basin', 'sku'], f.basin?.sku);
			if (f.basin?.fill.kind === 'gravel') push([...at, 'basin', 'fill', 'sku'], f.basin.fill.sku);
			return;
		}
		if (isYardFeature(f)) {
			for (const [path, sku] of yardSkus(f)) push([...at, ...path], sku);
			return;
		}
		for (const key of ['linerSku', 'underlaymentSku', 'gravelSku'] as const) {
			push([...at, key], f[key]);
		}
		if (f.kind === 'pond') {
			for (const key of ['skimmerSku', 'filterSku', 'edgeStoneSku'] as const) {
				push([...at, key], f[key]);
			}
		} else {
			push([...at, 'weirBoxSku'], f.weirBoxSku);
			push([...at, 'boulderSku'], f.boulderSku);
			push([...at, 'reservoir', 'sku'], f.reservoir?.sku);
			push([...at, 'reservoir', 'fillSku'], f.reservoir?.fillSku);
		}
	});
	design.stones.forEach((s, i) => push(['stones', i, 'sku'], s.sku));
	design.aggregates.forEach((a, i) => push(['aggregates', i, 'sku'], a.sku));
	design.walls.forEach((w, i) => {
		for (const key of ['unitSku', 'capSku', 'padSku', 'drainSku'] as const) {
			push(['walls', i, key], w[key]);
		}
	});
	design.lighting?.fixtures.forEach((f, i) => push(['lighting', 'fixtures', i, 'sku'], f.sku));
	design.lighting?.transformers.forEach((t, i) =>
		push(['lighting', 'transformers', i, 'sku'], t.sku)
	);
	design.lighting?.runs.forEach((r, i) => push(['lighting', 'runs', i, 'cableSku'], r.cableSku));
	design.extraLines.forEach((l, i) => push(['extraLines', i, 'sku'], l.sku));
	return refs;
}

function checkSkus(c: Collector, design: ParsedDesign, catalog: ParsedCatalog) {
	const skus = new Set<string>();
	catalog.items.forEach((item, i) => {
		if (skus.has(item.sku)) c.add(['catalog', 'items', i, 'sku'], `Duplicate SKU "${item.sku}"`);
		skus.add(item.sku);
	});
	for (const [path, sku] of skuReferences(design)) {
		if (sku !== undefined && !skus.has(sku)) c.add(path, `No price-list item "${sku}"`);
	}
}

function checkLighting(c: Collector, design: ParsedDesign) {
	const lighting = design.lighting;
	if (!lighting) return;
	const fixtures = new Set(lighting.fixtures.map((f) => f.id));
	const transformers = new Map(lighting.transformers.map((t) => [t.id, t]));
	lighting.runs.forEach((run, i) => {
		const path = ['design', 'lighting', 'runs', i];
		const transformer = transformers.get(run.transformerId);
		if (!transformer) c.add([...path, 'transformerId'], `No transformer "${run.transformerId}"`);
		else if (!transformer.tapsV.includes(run.tapV)) {
			c.add([...path, 'tapV'], `${transformer.name} has no ${run.tapV} V tap`);
		}
		run.fixtures.forEach((f, j) => {
			if (!fixtures.has(f.fixtureId)) {
				c.add([...path, 'fixtures', j, 'fixtureId'], `No fixture "${f.fixtureId}"`);
			}
		});
	});
	checkUnique(c, lighting.fixtures, ['design', 'lighting', 'fixtures']);
	checkUnique(c, lighting.transformers, ['design', 'lighting', 'transformers']);
}

function optionReferences(design: ParsedDesign): [Path, string | undefined][] {
	return [
		...design.stones.map((s, i): [Path, string | undefined] => [['stones', i], s.optionId]),
		...design.aggregates.map((a, i): [Path, string | undefined] => [['aggregates', i], a.optionId]),
		...design.walls.map((w, i): [Path, string | undefined] => [['walls', i], w.optionId]),
		...design.extraLines.map((l, i): [Path, string | undefined] => [['extraLines', i], l.optionId]),
		...design.extraLabor.map((l, i): [Path, string | undefined] => [['extraLabor', i], l.optionId]),
		[['lighting'], design.lighting?.optionId],
		...design.features.map((f, i): [Path, string | undefined] => [['features', i], f.optionId])
	];
}

function checkOptions(c: Collector, design: ParsedDesign) {
	const buckets = new Set([
		...design.options.map((o) => o.id),
		...design.alternates.flatMap((a) => a.choices.map((ch) => ch.id))
	]);
	for (const [path, optionId] of optionReferences(design)) {
		if (optionId !== undefined && !buckets.has(optionId)) {
			c.add(['design', ...path, 'optionId'], `No option or alternate choice "${optionId}"`);
		}
	}
	design.alternates.forEach((group, i) => {
		if (!group.choices.some((ch) => ch.id === group.selectedChoiceId)) {
			c.add(['design', 'alternates', i, 'selectedChoiceId'], 'Pick one of the choices');
		}
	});
	if (buckets.has('base')) c.add(['design', 'options'], '"base" is reserved');
}

export function crossCheck(design: ParsedDesign, catalog: ParsedCatalog): FieldError[] {
	const c = new Collector();
	checkFeatures(c, design);
	checkPumps(c, design, catalog);
	checkSkus(c, design, catalog);
	checkLighting(c, design);
	checkOptions(c, design);
	const rateId = catalog.settings.labor.rateId;
	if (rateId && !catalog.laborRates.some((r) => r.id === rateId)) {
		c.add(['catalog', 'settings', 'labor', 'rateId'], `No labor rate "${rateId}"`);
	}
	return c.errors;
}
