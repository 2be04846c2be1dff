/**
 * The starting features for what the homeowner asked for: a pond for "pond", a pondless stream for
 * "stream", the stone fountain for "water-feature" (and when no water feature was asked for), and
 * all of them for several. A stream asked for with a pond falls into the pond and runs on its pump.
 * Parts take the firm's price-list items; what the list cannot supply is noted. Sizes are starting
 * points the salesperson changes; `sizeFeaturesToSpot` fits them to the visit notes.
 */
import { standardFountain } from './standard-feature';
import type { CatalogItem, Design, FeatureInput } from './schema';
export type PondInput = Extract<FeatureInput, { kind: 'pond' }>;
export type StreamInput = Extract<FeatureInput, { kind: 'stream' }>;
import type { Pick, Slot } from './starter-slots';
import { settingsSchema } from './schema';
import { starterPath, starterPlanting } from './starter-yard';

type Note = (text: string) => void;

const LINER: Slot = { category: 'liner', measure: { count: 1, areaM2: 1 }, exclude: /underlay/i };
const UNDERLAY: Slot = {
	category: 'liner',
	measure: { count: 1, areaM2: 1 },
	hint: /underlay/i,
	strict: true
};
const POND_GRAVEL: Slot = {
	category: 'aggregate',
	measure: { volumeM3: 1, areaM2: 1 },
	hint: /river|pebble|gravel/i
};
const STREAM_GRAVEL: Slot = {
	category: 'aggregate',
	measure: { volumeM3: 1, areaM2: 1 },
	hint: /stream/i
};
const EDGE: Slot = {
	category: 'stone',
	measure: { volumeM3: 1, areaM2: 1 },
	hint: /edg|flag|coping/i,
	strict: true
};
const BOULDER: Slot = {
	category: 'stone',
	measure: { count: 1, massKg: 1, volumeM3: 1 },
	hint: /bank|boulder/i,
	exclude: /column|edg|flag/i
};
const WEIR: Slot = { category: 'filtration', measure: { count: 1 }, hint: /weir/i, strict: true };
const RESERVOIR: Slot = {
	category: 'basin',
	measure: { count: 1, volumeM3: 1 },
	hint: /reservoir|vault/i
};
const FILL: Slot = { category: 'aggregate', measure: { volumeM3: 1 }, hint: /gravel/i };

const WATER_SERVICES = ['water-feature', 'pond', 'stream'];

/** The pipe the firm stocks for a stream's supply: flexible first, then rigid, 1-1/2 in or up. */
function supplyPipe(items: readonly CatalogItem[]) {
	const order = ['flex-pvc', 'poly-sidr15', 'pvc-sch40'] as const;
	const sizes = ['1-1/2', '2', '1-1/4', '3'] as const;
	for (const material of order) {
		for (const size of sizes) {
			if (items.some((i) => i.pipe?.material === material && i.pipe.size === size)) {
				return { material, size };
			}
		}
	}
	return { material: 'flex-pvc' as const, size: '1-1/2' as const };
}

export function starterPond(): PondInput {
	return {
		id: 'pond-1',
		kind: 'pond',
		name: 'Pond',
		outline: { shape: 'oval', lengthFt: 12, widthFt: 8 },
		// A planting shelf, a middle step and a deep zone (common practice, no source).
		zones: [
			{ depthIn: 8, percent: 30 },
			{ depthIn: 18, percent: 40 },
			{ depthIn: 30, percent: 30 }
		],
		use: 'fish',
		fishInches: 0,
		returnLiftFt: 1,
		gravelDepthIn: 2,
		edgeWidthFt: 1,
		edgeDepthIn: 2
	};
}

export function starterStream(items: readonly CatalogItem[]): StreamInput {
	return {
		id: 'stream-1',
		kind: 'stream',
		name: 'Stream',
		riseFt: 3,
		segments: [1, 2, 3].map((n) => ({
			id: `seg-${n}`,
			lengthFt: 8,
			widthFt: 2,
			waterDepthIn: 2,
			fallHeightIn: 10,
			weirWidthIn: 12
		})),
		flow: { method: 'per-inch' },
		supply: { pipe: supplyPipe(items), lengthFt: 30, fittings: [{ kind: 'elbow-90', count: 2 }] },
		reservoir: { kind: 'gravel', lengthFt: 6, widthFt: 4, depthFt: 3, voidFraction: 0.35 },
		gravelDepthIn: 2,
		boulder: { lengthIn: 16, widthIn: 12, heightIn: 10, rock: 'granite', spacingFt: 3 }
	};
}

/**
 * A reservoir for the stream: 4 ft wide and 3 ft deep in gravel, as long as it must be to hold the
 * drain-back times the reserve factor (common practice, no source).
 */
export function sizeReservoir(stream: StreamInput, settings: unknown) {
	const parsed = settingsSchema.safeParse(settings ?? {});
	const s = parsed.success ? parsed.data : settingsSchema.parse({});
	const reservoir = stream.reservoir;
	if (!reservoir) return;
	const ft3 = stream.segments.reduce(
		(sum, seg) => sum + seg.lengthFt * seg.widthFt * ((seg.waterDepthIn ?? 2) / 12),
		0
	);
	const neededFt3 = ft3 * s.stream.reserveFactor * 1.1; // a tenth more for the supply pipe
	const voids = reservoir.kind === 'gravel' ? (reservoir.voidFraction ?? 0.35) : 1;
	const usableDepth = reservoir.depthFt - (reservoir.pumpMinLevelIn ?? 6) / 12;
	reservoir.lengthFt = Math.max(
		3,
		Math.ceil(neededFt3 / (reservoir.widthFt * usableDepth * voids))
	);
}

function pondParts(pond: PondInput, pick: Pick, note: Note) {
	const assign = (slot: Slot, what: string, set: (sku: string) => void) => {
		const item = pick(slot, undefined);
		if (item) set(item.sku);
		else note(`${pond.name}: no ${what} in the price list; not priced.`);
	};
	assign(LINER, 'liner', (sku) => (pond.linerSku = sku));
	assign(UNDERLAY, 'underlayment', (sku) => (pond.underlaymentSku = sku));
	assign(POND_GRAVEL, 'gravel for the liner', (sku) => (pond.gravelSku = sku));
	assign(EDGE, 'edge stone', (sku) => (pond.edgeStoneSku = sku));
}

function streamParts(stream: StreamInput, pick: Pick, note: Note) {
	const assign = (slot: Slot, what: string, set: (sku: string) => void) => {
		const item = pick(slot, undefined);
		if (item) set(item.sku);
		else note(`${stream.name}: no ${what} in the price list; not priced.`);
	};
	assign(LINER, 'liner', (sku) => (stream.linerSku = sku));
	assign(UNDERLAY, 'underlayment', (sku) => (stream.underlaymentSku = sku));
	assign(STREAM_GRAVEL, 'stream gravel', (sku) => (stream.gravelSku = sku));
	assign(BOULDER, 'bank boulder', (sku) => (stream.boulderSku = sku));
	assign(WEIR, 'weir box', (sku) => (stream.weirBoxSku = sku));
	if (stream.reservoir) {
		const reservoir = stream.reservoir;
		assign(RESERVOIR, 'reservoir', (sku) => (reservoir.sku = sku));
		assign(FILL, 'reservoir gravel', (sku) => (reservoir.fillSku = sku));
	}
}

/**
 * Replaces the standard fountain with the features the services ask for. Without a fountain, the
 * column stones, the core drilling and the topping around the columns go too.
 */
export function featuresForServices(
	design: Design,
	services: readonly string[],
	items: readonly CatalogItem[],
	pick: Pick,
	note: Note
) {
	const wanted = WATER_SERVICES.filter((s) => services.includes(s));
	const yard = yardFeaturesFor(services, items);
	if (wanted.length === 0 && (yard.length || services.includes('lighting'))) {
		dryYard(design, services, yard);
		return;
	}
	if (wanted.length === 0 || (wanted.length === 1 && wanted[0] === 'water-feature')) {
		if (wanted.length) design.features = [...(design.features ?? []), ...yard];
		return;
	}
	const fountain = standardFountain();
	const features: FeatureInput[] = [];
	const pond = wanted.includes('pond') ? starterPond() : undefined;
	if (pond) {
		pondParts(pond, pick, note);
		features.push(pond);
	}
	if (wanted.includes('stream')) {
		const stream = starterStream(items);
		if (pond) {
			stream.feedsPondId = pond.id;
			stream.name = 'Waterfall stream into the pond';
			delete stream.reservoir;
		}
		streamParts(stream, pick, note);
		features.push(stream);
	}
	if (wanted.includes('water-feature')) features.push(fountain);
	features.push(...yard);
	design.features = features;
	design.name = wanted.length > 1 ? 'Water features' : pond ? 'Pond' : 'Pondless stream';
	if (!wanted.includes('water-feature')) {
		design.stones = (design.stones ?? []).filter((s) => !s.wetted);
		design.extraLines = [];
		design.aggregates = [];
		design.alternates = [];
	}
}

/** A path for "patio", planting beds for "planting" (see starter-yard.ts). */
function yardFeaturesFor(services: readonly string[], items: readonly CatalogItem[]) {
	const out: FeatureInput[] = [];
	if (services.includes('patio')) out.push(starterPath(items));
	if (services.includes('planting')) out.push(starterPlanting(items));
	return out;
}

/**
 * A yard with no water: the paths and planting asked for, the lighting only when it was asked for,
 * the wall only for walls; the fountain's stones, topping, core drilling and their choices go.
 */
function dryYard(design: Design, services: readonly string[], yard: FeatureInput[]) {
	design.features = yard;
	design.stones = [];
	design.aggregates = [];
	design.extraLines = [];
	design.alternates = [];
	if (services.includes('walls')) {
		design.walls = (design.walls ?? []).map((w) => ({ ...w, optionId: undefined }));
	} else design.walls = [];
	design.options = [];
	if (services.includes('lighting') && design.lighting) {
		design.lighting = {
			...design.lighting,
			fixtures: design.lighting.fixtures.map((f) => ({
				...f,
				name: f.name.replace(/^Column uplight$/, 'Uplight')
			}))
		};
	} else delete design.lighting;
	const names = [
		services.includes('patio') ? 'path' : '',
		services.includes('planting') ? 'planting' : '',
		services.includes('lighting') ? 'lighting' : ''
	].filter(Boolean);
	const text = names.join(', ').replace(/, ([^,]*)$/, ' and $1');
	design.name = text.charAt(0).toUpperCase() + text.slice(1);
}

/** What the estimate is called at first: "<name> — water feature", or the dry-yard work asked for. */
export function starterLabel(name: string, services: readonly string[]): string {
	const water = WATER_SERVICES.some((s) => services.includes(s));
	const dry = ['patio', 'planting', 'lighting'].filter((s) => services.includes(s));
	if (water || dry.length === 0) return `${name} — water feature`;
	const words = dry.map((s) => (s === 'patio' ? 'path' : s));
	return `${name} — ${words.join(', ').replace(/, ([^,]*)$/, ' and $1')}`;
}
