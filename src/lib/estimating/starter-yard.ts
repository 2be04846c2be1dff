/**
 * Starting points for the yard features: a flagstone path with two steps, a dry creek from a roof
 * corner into a soak-away, and a planting bed. Each takes the firm's price-list items that fit by
 * category and name (none when the list has nothing that fits). Sizes are starting points the
 * salesperson changes; they are rules of thumb (common practice, no source).
 */
import type { CatalogItem, FeatureInput } from './schema';

export type PathInput = Extract<FeatureInput, { kind: 'path' }>;
export type DrainageInput = Extract<FeatureInput, { kind: 'drainage' }>;
export type PlantingInput = Extract<FeatureInput, { kind: 'planting' }>;

type Unit = CatalogItem['unit'];

/** The first item of a category whose name or SKU matches, sold in one of the units that can price it. */
function find(
	items: readonly CatalogItem[],
	category: CatalogItem['category'] | CatalogItem['category'][],
	like: RegExp,
	units: readonly Unit[],
	needs?: (i: CatalogItem) => boolean
): string | undefined {
	const cats = Array.isArray(category) ? category : [category];
	return items.find(
		(i) =>
			cats.includes(i.category) &&
			(like.test(i.name) || like.test(i.sku)) &&
			units.includes(i.unit) &&
			(needs ? needs(i) : true)
	)?.sku;
}

// A volume priced by weight needs a density; by the bag or load, their sizes.
const byVolume = (i: CatalogItem) =>
	i.unit === 'ton' || i.unit === 'lb'
		? i.bulkDensityLbFt3 !== undefined
		: i.unit === 'bag'
			? i.bagVolumeFt3 !== undefined
			: i.unit === 'load'
				? i.loadVolumeYd3 !== undefined
				: true;
const VOLUME_UNITS: Unit[] = ['ft3', 'yd3', 'ton', 'lb', 'bag', 'load'];

export function starterPath(items: readonly CatalogItem[]): PathInput {
	return {
		id: 'path-1',
		kind: 'path',
		name: 'Flagstone path',
		surface: 'flagstone',
		areas: [{ shape: 'rectangle', lengthFt: 20, widthFt: 4 }],
		surfaceSku: find(items, ['paving', 'stone'], /flag/i, ['ton', 'lb', 'ft2']),
		thicknessIn: 1.5,
		rock: 'sandstone',
		jointPercent: 10,
		baseSku: find(items, 'aggregate', /base/i, VOLUME_UNITS, byVolume),
		baseDepthIn: 4,
		beddingSku: find(
			items,
			'aggregate',
			/sand/i,
			VOLUME_UNITS,
			(i) => byVolume(i) && !/joint|poly/i.test(i.name)
		),
		beddingDepthIn: 1,
		jointSku: find(items, 'aggregate', /joint|poly/i, VOLUME_UNITS, byVolume),
		edgeSku: find(items, ['paving', 'other'], /edg/i, ['ft']),
		edgeExcludedFt: 0,
		steps: {
			count: 2,
			riseIn: 6,
			treadIn: 14,
			widthFt: 4,
			sku: find(items, ['paving', 'stone'], /step/i, ['each', 'ft'])
		}
	};
}

export function starterDrainage(items: readonly CatalogItem[]): DrainageInput {
	return {
		id: 'drainage-1',
		kind: 'drainage',
		name: 'Dry creek',
		// A 600 ft² roof section to one downspout; a roof sheds nearly all of its rain.
		catchment: { areas: [{ shape: 'rectangle', lengthFt: 30, widthFt: 20 }], runoffC: 0.9 },
		creek: {
			lengthFt: 30,
			slopePercent: 2,
			flowDepthIn: 6,
			sideSlope: 2,
			freeboardIn: 3,
			cobbleDepthIn: 4,
			fabricOverlapFt: 1
		},
		cobbleSku: find(items, 'aggregate', /cobble/i, VOLUME_UNITS, byVolume),
		fabricSku: find(items, ['other', 'liner'], /fabric/i, ['ft2']),
		boulderSku:
			find(items, 'stone', /creek/i, ['each', 'ton', 'lb']) ??
			find(items, 'stone', /boulder/i, ['each', 'ton', 'lb']),
		boulder: { lengthIn: 18, widthIn: 14, heightIn: 12, rock: 'granite', spacingFt: 6 },
		soakaway: {
			depthFt: 3,
			voidFraction: 0.35,
			sku:
				find(items, 'aggregate', /drain/i, VOLUME_UNITS, byVolume) ??
				find(items, 'aggregate', /gravel/i, VOLUME_UNITS, byVolume),
			fabricSku: find(items, ['other', 'liner'], /fabric/i, ['ft2'])
		}
	};
}

export function starterPlanting(items: readonly CatalogItem[]): PlantingInput {
	const plant = (like: RegExp) => find(items, 'planting', like, ['each']);
	return {
		id: 'planting-1',
		kind: 'planting',
		name: 'Planting beds',
		areas: [{ shape: 'rectangle', lengthFt: 16, widthFt: 6 }],
		groups: [
			{
				id: 'g-perennials',
				name: 'Perennials',
				sku: plant(/perennial/i),
				container: '1-gal',
				spacingIn: 18,
				layout: 'triangular',
				coverPercent: 60
			},
			{
				id: 'g-grasses',
				name: 'Ornamental grasses',
				sku: plant(/grass/i),
				container: '1-gal',
				spacingIn: 24,
				layout: 'triangular',
				coverPercent: 40
			},
			{
				id: 'g-shrubs',
				name: 'Flowering shrubs',
				sku: plant(/shrub/i),
				container: '5-gal',
				spacingIn: 48,
				layout: 'square',
				coverPercent: 0,
				count: 3
			}
		],
		mulchSku: find(items, ['planting', 'aggregate'], /mulch/i, ['yd3', 'ft3', 'bag'], byVolume),
		mulchDepthIn: 3,
		amendSku: find(
			items,
			['planting', 'aggregate'],
			/compost|amend/i,
			['yd3', 'ft3', 'bag'],
			byVolume
		),
		amendDepthIn: 2
	};
}
