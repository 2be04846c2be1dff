// The plan drawing's layout, in feet, from the design. The design has sizes but no
// positions, so the layout is a fixed arrangement: the first fountain's basin in the middle with the
// wetted stones (and their outlets) along it, dry stones in front, the toppings centred on it and
// beside it, the other features (ponds, streams with their falls and reservoirs, more basins) to the
// right, walls behind. Sizes are to scale; positions only show what goes where. A dry creek's width
// and a soak-away's size are not in the design but computed from the runoff: the drawing takes them
// from the engine's results (`planSizes`).
import type { FeatureResult, ParsedDesign } from '$lib/estimating';
import { analyseDrainage, type DrainageResult } from '$lib/estimating/drainage';
import {
	settingsSchema,
	type Area,
	type Feature,
	type Fountain,
	type Stone
} from '$lib/estimating/schema';
import { pondPlan } from '$lib/estimating/pond';
import { areaFt2, boxOf, outline, type Box, type Point } from './geometry';

const GAL_PER_FT3 = 7.48052; // US gallons in a cubic foot (exact by definition of the gallon)
const M_PER_FT = 0.3048; // exact, by the international foot
const GAP_FT = 1;

export interface PlanArea {
	points: Point[];
	toppingIndex: number;
}
export interface PlanTopping {
	name: string;
	areaFt2: number;
	depthIn: number;
	optional: boolean;
	pattern: number;
}
export interface PlanWall {
	key: string;
	name: string;
	points: Point[];
	lengthFt: number;
	heightIn: number;
	optional: boolean;
}
export interface PlanMarker {
	n: number;
	name: string;
	detail: string;
	at: Point;
}
export interface PlanRun {
	n: number;
	transformer: string;
	fixtures: { n: number; name: string; distanceFt: number }[];
}
/** A feature drawn beside the first fountain: a pond, a stream, or another fountain's basin. */
export interface PlanFeature {
	key: string;
	kind: Feature['kind'];
	name: string;
	/** The outline (a pond, a basin) or the stream's segments and reservoir, each a polygon. */
	shapes: Point[][];
	/** Short marks across the stream where it falls. */
	falls: [Point, Point][];
	label: string;
	detail: string;
	optional: boolean;
}
export interface Plan {
	basin?: { points: Point[]; label: string; detail: string };
	features: PlanFeature[];
	areas: PlanArea[];
	toppings: PlanTopping[];
	stones: { points: Point[]; optional: boolean }[];
	stoneNames: string[];
	outlets: PlanMarker[];
	walls: PlanWall[];
	runs: PlanRun[];
	lightingOptional: boolean;
	box: Box;
}

/** The sizes the engine computed that the design does not hold, in feet, by feature id. */
export type PlanSizes = Readonly<
	Record<string, { creekWidthFt?: number; soakSideFt?: number; soakDepthFt?: number }>
>;

/** The drawn sizes from the engine's per-feature results (a dry creek's top width, a soak-away's side). */
export function planSizes(features: readonly Pick<FeatureResult, 'id' | 'drainage'>[]): PlanSizes {
	return Object.fromEntries(
		features.flatMap((f) => (f.drainage ? [[f.id, sizesOf(f.drainage)]] : []))
	);
}

function sizesOf(d: DrainageResult) {
	return {
		creekWidthFt: d.creek && d.creek.topWidthM / M_PER_FT,
		soakSideFt: d.soakaway && d.soakaway.sideM / M_PER_FT,
		soakDepthFt: d.soakaway && d.soakaway.depthM / M_PER_FT
	};
}

/** What a bucket means for the drawing: drawn, drawn dashed as an option not taken, or left out. */
export type Inclusion = (bucket: string | undefined) => 'in' | 'option' | 'out';

export function inclusionFor(design: ParsedDesign, chosen: ReadonlySet<string>): Inclusion {
	const options = new Set(design.options.map((o) => o.id));
	return (bucket) => {
		if (!bucket || bucket === 'base' || chosen.has(bucket)) return 'in';
		return options.has(bucket) ? 'option' : 'out';
	};
}

const ft = (inches: number) => inches / 12;
const fmt = (n: number) => String(Math.round(n * 10) / 10);
const shift = (pts: readonly Point[], dx: number, dy: number): Point[] =>
	pts.map(([x, y]) => [x + dx, y + dy] as const);
const rect = (l: number, w: number): Point[] =>
	outline({ shape: 'rectangle', lengthFt: l, widthFt: w });

function ellipse(l: number, w: number): Point[] {
	return Array.from({ length: 20 }, (_, k) => {
		const t = (k / 20) * 2 * Math.PI;
		return [(l / 2) * Math.cos(t), (w / 2) * Math.sin(t)] as const;
	});
}

/** A stone's footprint from above, centred on the origin. */
export function footprint(size: Stone['size']): Point[] {
	switch (size.shape) {
		case 'column-square':
			return rect(ft(size.sideIn), ft(size.sideIn));
		case 'column-rect':
			return rect(ft(size.lengthIn), ft(size.widthIn));
		case 'slab':
			return rect(ft(size.lengthIn), ft(size.widthIn));
		case 'boulder':
			return ellipse(ft(size.lengthIn), ft(size.widthIn));
		case 'column-hex': {
			const r = ft(size.acrossFlatsIn) / Math.sqrt(3);
			return Array.from({ length: 6 }, (_, k) => {
				const t = (k / 6) * 2 * Math.PI;
				return [r * Math.cos(t), r * Math.sin(t)] as const;
			});
		}
	}
}

function basinOf(fountain: Fountain | undefined) {
	const b = fountain?.basin;
	if (!b) return undefined;
	const s = b.size;
	const depth = `${fmt(s.depthFt)} ft deep`;
	if (s.shape === 'rectangle') {
		return {
			points: rect(s.lengthFt, s.widthFt),
			label: `Basin ${fmt(s.lengthFt)} × ${fmt(s.widthFt)} ft`,
			detail: depth
		};
	}
	if (s.shape === 'circle') {
		return {
			points: outline({ shape: 'circle', diameterFt: s.diameterFt }),
			label: `Basin ${fmt(s.diameterFt)} ft across`,
			detail: depth
		};
	}
	const side = Math.sqrt(s.gallons / GAL_PER_FT3 / s.depthFt);
	return {
		points: rect(side, side),
		label: `Basin, ${Math.round(s.gallons)} gal`,
		detail: `${depth} (outline drawn square)`
	};
}

function stonesOf(design: ParsedDesign, include: Inclusion, basinBox: Box | undefined) {
	const kept = design.stones.filter((s) => include(s.optionId) !== 'out');
	const copies = (wet: boolean) =>
		kept.filter((s) => s.wetted === wet).flatMap((s) => Array.from({ length: s.count }, () => s));
	const lay = (list: Stone[], y: number, span: number) => {
		const step = span / (list.length + 1);
		return list.map((s, i) => ({
			stone: s,
			at: [-span / 2 + step * (i + 1), y] as const,
			points: shift(footprint(s.size), -span / 2 + step * (i + 1), y),
			optional: include(s.optionId) === 'option'
		}));
	};
	const width = (list: Stone[]) =>
		list.reduce((sum, s) => {
			const b = boxOf(footprint(s.size));
			return sum + (b.maxX - b.minX) + GAP_FT;
		}, GAP_FT);
	const wet = copies(true);
	const dry = copies(false);
	const span = basinBox ? basinBox.maxX - basinBox.minX : width(wet);
	const front = (basinBox?.maxY ?? 1) + GAP_FT;
	return {
		wet: lay(wet, 0, Math.max(span, width(wet))),
		dry: lay(dry, front, Math.max(span, width(dry)))
	};
}

/** An outlet per wetted stone when the counts match; otherwise evenly along the basin. */
function outletsOf(
	outlets: Fountain['outlets'],
	wetAt: readonly Point[],
	span: number
): PlanMarker[] {
	const n = outlets.length;
	const even = (i: number) => [-span / 2 + (span / (n + 1)) * (i + 1), 0] as const;
	return outlets.map((o, i) => {
		const detail =
			o.kind === 'bubbler'
				? `bubbler, ${fmt(o.bubbleHeightIn)} in high`
				: o.kind === 'spillway'
					? `spillway, ${fmt(o.widthIn)} in wide`
					: `spout, ${Math.round(o.flowGph)} gph`;
		const at = wetAt.length === n ? wetAt[i] : even(i);
		return { n: i + 1, name: o.name, detail, at };
	});
}

function toppingsOf(design: ParsedDesign, include: Inclusion) {
	const areas: PlanArea[] = [];
	const toppings: PlanTopping[] = [];
	let cursor: number | undefined;
	design.aggregates.forEach((a) => {
		const how = include(a.optionId);
		if (how === 'out') return;
		const index = toppings.length;
		toppings.push({
			name: a.name,
			areaFt2: a.areas.reduce((s, x: Area) => s + areaFt2(x), 0),
			depthIn: a.depthIn,
			optional: how === 'option',
			pattern: index % 3
		});
		for (const area of a.areas) {
			const pts = outline(area);
			const b = boxOf(pts);
			const dx = cursor === undefined ? 0 : cursor + GAP_FT - b.minX;
			areas.push({ points: shift(pts, dx, 0), toppingIndex: index });
			cursor = Math.max(cursor ?? -Infinity, b.maxX + dx);
		}
	});
	return { areas, toppings };
}

function wallsOf(design: ParsedDesign, include: Inclusion, top: number): PlanWall[] {
	let y = top - GAP_FT;
	return design.walls.flatMap((w, i) => {
		const how = include(w.optionId);
		if (how === 'out') return [];
		const depth = ft(w.unit.depthIn);
		const points = shift(rect(w.lengthFt, depth), 0, y - depth / 2);
		y -= depth + GAP_FT * 1.5;
		return [
			{
				key: `${w.id}-${i}`,
				name: w.name,
				points,
				lengthFt: w.lengthFt,
				heightIn: w.exposedHeightIn,
				optional: how === 'option'
			}
		];
	});
}

function runsOf(design: ParsedDesign): PlanRun[] {
	const l = design.lighting;
	if (!l) return [];
	const names = new Map(l.fixtures.map((f) => [f.id, f.name]));
	const tx = new Map(l.transformers.map((t) => [t.id, t.name]));
	let n = 0;
	return l.runs.map((r, i) => ({
		n: i + 1,
		transformer: tx.get(r.transformerId) ?? 'Transformer',
		fixtures: [...r.fixtures]
			.sort((a, b) => a.distanceFt - b.distanceFt)
			.map((f) => ({ n: ++n, name: names.get(f.fixtureId) ?? 'Light', distanceFt: f.distanceFt }))
	}));
}

/** Ponds, streams and further fountains, each laid out to scale from its own origin. */
function featureShape(
	f: Feature,
	sizes: PlanSizes
): Omit<PlanFeature, 'key' | 'optional'> | undefined {
	if (f.kind === 'pond') {
		const o = f.outline;
		const plan = pondPlan(o);
		const deepest = Math.max(...f.zones.map((z) => z.depthIn));
		const points =
			o.shape === 'polygon'
				? o.pointsFt.map(([x, y]) => [x, y] as const)
				: o.shape === 'oval'
					? ellipse(o.lengthFt, o.widthFt)
					: rect(o.lengthFt, o.widthFt);
		const size =
			o.shape === 'polygon'
				? `${o.pointsFt.length} corners, ${fmt(plan.lengthFt)} × ${fmt(plan.widthFt)} ft across`
				: `${o.shape === 'oval' ? 'oval' : 'rectangle'} ${fmt(o.lengthFt)} × ${fmt(o.widthFt)} ft`;
		return {
			kind: 'pond',
			name: f.name,
			shapes: [points],
			falls: [],
			label: f.name,
			detail: `${size}, ${fmt(deepest)} in at the deepest, ${f.zones.length} depth zone${f.zones.length === 1 ? '' : 's'}`
		};
	}
	if (f.kind === 'stream') {
		const shapes: Point[][] = [];
		const falls: [Point, Point][] = [];
		let x = 0;
		for (const seg of f.segments) {
			shapes.push(shift(rect(seg.lengthFt, seg.widthFt), x + seg.lengthFt / 2, 0));
			x += seg.lengthFt;
			if (seg.fallHeightIn > 0) {
				falls.push([
					[x, -seg.widthFt / 2 - 0.4],
					[x, seg.widthFt / 2 + 0.4]
				]);
			}
		}
		if (f.reservoir) {
			const r = f.reservoir;
			shapes.push(shift(rect(r.lengthFt, r.widthFt), x + GAP_FT / 2 + r.lengthFt / 2, 0));
		}
		const length = f.segments.reduce((s, seg) => s + seg.lengthFt, 0);
		return {
			kind: 'stream',
			name: f.name,
			shapes,
			falls,
			label: f.name,
			detail: `${fmt(length)} ft long over ${falls.length} fall${falls.length === 1 ? '' : 's'}, rising ${fmt(f.riseFt)} ft; ${f.reservoir ? `reservoir ${fmt(f.reservoir.lengthFt)} × ${fmt(f.reservoir.widthFt)} ft` : 'falls into the pond'}`
		};
	}
	if (f.kind === 'path' || f.kind === 'planting' || f.kind === 'drainage') {
		return yardShape(f, sizes);
	}
	const basin = basinOf(f);
	if (!basin) return undefined;
	return {
		kind: 'fountain',
		name: f.name,
		shapes: [basin.points],
		falls: [],
		label: f.name,
		detail: `${basin.label}, ${basin.detail}, ${f.outlets.length} outlet${f.outlets.length === 1 ? '' : 's'}`
	};
}

/** Areas side by side from the origin, each to scale. */
function areasInRow(areas: readonly Area[]): Point[][] {
	let x = 0;
	return areas.map((a) => {
		const pts = outline(a);
		const box = boxOf(pts);
		const placed = shift(pts, x - box.minX, -(box.minY + box.maxY) / 2);
		x += box.maxX - box.minX + GAP_FT / 2;
		return placed;
	});
}

/** A path's or planting's areas; a dry creek as its channel and soak-away. */
function yardShape(
	f: Extract<Feature, { kind: 'path' | 'planting' | 'drainage' }>,
	sizes: PlanSizes
): Omit<PlanFeature, 'key' | 'optional'> {
	const total = (areas: readonly Area[]) => areas.reduce((s, a) => s + areaFt2(a), 0);
	if (f.kind === 'path') {
		const steps = f.steps ? `, ${f.steps.count} step${f.steps.count === 1 ? '' : 's'}` : '';
		return {
			kind: 'path',
			name: f.name,
			shapes: areasInRow(f.areas),
			falls: [],
			label: f.name,
			detail: `${f.surface} over ${fmt(total(f.areas))} ft²${steps}`
		};
	}
	if (f.kind === 'planting') {
		return {
			kind: 'planting',
			name: f.name,
			shapes: areasInRow(f.areas),
			falls: [],
			label: f.name,
			detail: `beds of ${fmt(total(f.areas))} ft², ${f.groups.length} plant group${f.groups.length === 1 ? '' : 's'}`
		};
	}
	// Without the engine's figures (a page that has none), the sizes at the engine's default settings.
	const size = sizes[f.id] ?? sizesOf(analyseDrainage(f, settingsSchema.parse({})));
	const shapes: Point[][] = [];
	const creek = f.creek;
	const creekWidth = creek ? Math.max(size.creekWidthFt ?? 0, 0.1) : 0;
	if (creek) shapes.push(shift(rect(creek.lengthFt, creekWidth), creek.lengthFt / 2, 0));
	const side = f.soakaway ? Math.max(size.soakSideFt ?? 0, 0.1) : 0;
	if (f.soakaway) {
		const x = creek ? creek.lengthFt + GAP_FT : 0;
		shapes.push(shift(rect(side, side), x + side / 2, 0));
	}
	if (!shapes.length) shapes.push(rect(1, 1));
	const creekText = creek
		? `creek ${fmt(creek.lengthFt)} ft long, ${fmt(creekWidth)} ft across the top`
		: 'no creek';
	const soakText = f.soakaway
		? ` into a soak-away ${fmt(side)} ft square, ${fmt(size.soakDepthFt ?? f.soakaway.depthFt)} ft deep`
		: '';
	return {
		kind: 'drainage',
		name: f.name,
		shapes,
		falls: [],
		label: f.name,
		detail: `${creekText}${soakText}`
	};
}

/** The other features, left to right beside the first fountain's drawing. */
function featuresBeside(
	features: readonly Feature[],
	include: Inclusion,
	startX: number,
	sizes: PlanSizes
): PlanFeature[] {
	let cursor = startX;
	return features.flatMap((f, i) => {
		const how = include(f.optionId);
		const shape = how === 'out' ? undefined : featureShape(f, sizes);
		if (!shape) return [];
		const box = boxOf(shape.shapes.flat());
		const dx = cursor + GAP_FT * 2 - box.minX;
		const dy = -(box.minY + box.maxY) / 2;
		cursor = box.maxX + dx;
		return [
			{
				...shape,
				key: `${f.id}-${i}`,
				shapes: shape.shapes.map((pts) => shift(pts, dx, dy)),
				falls: shape.falls.map(([a, b]) => [
					[a[0] + dx, a[1] + dy],
					[b[0] + dx, b[1] + dy]
				]),
				optional: how === 'option'
			}
		];
	});
}

export function planOf(design: ParsedDesign, include: Inclusion, sizes: PlanSizes = {}): Plan {
	const fountain = design.features.find(
		(f): f is Fountain => f.kind === 'fountain' && include(f.optionId) === 'in'
	);
	const basin = basinOf(fountain);
	const basinBox = basin ? boxOf(basin.points) : undefined;
	const stones = stonesOf(design, include, basinBox);
	const fountainOutlets = fountain?.outlets ?? [];
	const span = basinBox ? basinBox.maxX - basinBox.minX : Math.max(fountainOutlets.length, 2);
	const outlets = outletsOf(
		fountainOutlets,
		stones.wet.map((s) => s.at),
		span
	);
	const { areas, toppings } = toppingsOf(design, include);
	const everything = [
		...(basin?.points ?? []),
		...areas.flatMap((a) => a.points),
		...[...stones.wet, ...stones.dry].flatMap((s) => s.points),
		...outlets.map((o) => o.at)
	];
	const right = everything.length ? boxOf(everything).maxX : -GAP_FT * 2;
	const features = featuresBeside(
		design.features.filter((f) => f !== fountain),
		include,
		right,
		sizes
	);
	const drawn = [...everything, ...features.flatMap((f) => f.shapes.flat())];
	const top = drawn.length ? boxOf(drawn).minY : 0;
	const walls = wallsOf(design, include, top);
	const all = [...drawn, ...walls.flatMap((w) => w.points)];
	const kept = design.stones.filter((s) => include(s.optionId) !== 'out');
	return {
		basin,
		features,
		areas,
		toppings,
		stones: [...stones.wet, ...stones.dry].map((s) => ({ points: s.points, optional: s.optional })),
		stoneNames: kept.map((s) => (s.count > 1 ? `${s.count} × ${s.name}` : s.name)),
		outlets,
		walls,
		runs: include(design.lighting?.optionId) === 'out' ? [] : runsOf(design),
		lightingOptional: include(design.lighting?.optionId) === 'option',
		box: all.length ? boxOf(all) : { minX: -2, minY: -2, maxX: 2, maxY: 2 }
	};
}
