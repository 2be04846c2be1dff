/** Zod schemas for the design (US customary input, JSON-serialisable) and the catalog. */
import { z } from 'zod';
import { FITTING_KINDS, NOMINAL_SIZES, PIPE_MATERIALS } from './pipes';
import { GAUGES, ROCK_TYPES } from './choices';
import { CATEGORIES } from './categories';
import { BASE_COMPACTION_FACTOR, BEDDING_COMPACTION_FACTOR } from './earthwork';
import { LABOR_RATES, SOIL_KINDS, SOILS, type LaborRateKey } from './labor-rates';

const id = z.string().min(1, 'Required');
const name = z.string().min(1, 'Required');
// An upper bound far past any garden keeps every formula finite.
const LARGEST = 1e6;
const tooLarge = `Must be at most ${LARGEST.toLocaleString('en-US')}`;
const positive = z.number().positive('Must be greater than zero').max(LARGEST, tooLarge);
const nonNegative = z.number().nonnegative('Must not be negative').max(LARGEST, tooLarge);
const count = z.number().int('Must be a whole number').nonnegative('Must not be negative');
const cents = z
	.number()
	.int('Must be whole cents')
	.nonnegative('Must not be negative')
	.max(1e11, 'Must be at most $1,000,000,000');
const percent = z.number().nonnegative('Must not be negative').max(100, 'At most 100%');
const optionId = z.string().min(1).optional();

export const pipeSpecSchema = z.object({
	material: z.enum(PIPE_MATERIALS),
	size: z.enum(NOMINAL_SIZES, { message: 'Not a pipe size we know' })
});

const fittingSchema = z.object({ kind: z.enum(FITTING_KINDS), count: count });

const outletSchema = z.discriminatedUnion('kind', [
	z.object({ id, name, kind: z.literal('bubbler'), bubbleHeightIn: positive, boreIn: positive }),
	z.object({
		id,
		name,
		kind: z.literal('spillway'),
		widthIn: positive,
		sheet: z.enum(['light', 'medium', 'heavy'])
	}),
	z.object({ id, name, kind: z.literal('spout'), flowGph: positive, nozzleIn: positive })
]);

const branchSchema = z.object({
	id,
	outletId: id,
	pipe: pipeSpecSchema,
	lengthFt: positive,
	staticLiftFt: nonNegative,
	fittings: z.array(fittingSchema).default([]),
	valve: z.enum(['ball-valve', 'gate-valve', 'globe-valve', 'none']).default('ball-valve')
});

const supplySchema = z.object({
	pipe: pipeSpecSchema,
	lengthFt: nonNegative,
	fittings: z.array(fittingSchema).default([])
});

const basinShapeSchema = z.discriminatedUnion('shape', [
	z.object({
		shape: z.literal('rectangle'),
		lengthFt: positive,
		widthFt: positive,
		depthFt: positive
	}),
	z.object({ shape: z.literal('circle'), diameterFt: positive, depthFt: positive }),
	z.object({ shape: z.literal('capacity'), gallons: positive, depthFt: positive })
]);

const basinSchema = z.object({
	size: basinShapeSchema,
	fill: z.discriminatedUnion('kind', [
		z.object({ kind: z.literal('open') }),
		z.object({
			kind: z.literal('gravel'),
			voidFraction: z.number().gt(0, 'Must be above 0').max(1, 'At most 1'),
			sku: z.string().optional()
		})
	]),
	pumpMinLevelIn: nonNegative.default(6),
	freeboardIn: nonNegative.default(2),
	extraDrainBackGal: nonNegative.default(0),
	sku: z.string().optional()
});

const stoneShapeSchema = z.discriminatedUnion('shape', [
	z.object({ shape: z.literal('column-square'), sideIn: positive, heightIn: positive }),
	z.object({
		shape: z.literal('column-rect'),
		lengthIn: positive,
		widthIn: positive,
		heightIn: positive
	}),
	z.object({ shape: z.literal('column-hex'), acrossFlatsIn: positive, heightIn: positive }),
	z.object({
		shape: z.literal('boulder'),
		lengthIn: positive,
		widthIn: positive,
		heightIn: positive
	}),
	z.object({
		shape: z.literal('slab'),
		lengthIn: positive,
		widthIn: positive,
		thicknessIn: positive
	})
]);

const stoneSchema = z.object({
	id,
	name,
	size: stoneShapeSchema,
	rock: z.enum(ROCK_TYPES),
	count: count.min(1, 'At least one').default(1),
	wetted: z.boolean().default(false),
	/** The fountain whose basin a wetted stone drains into (else the first fountain with a basin). */
	featureId: z.string().optional(),
	sku: z.string().optional(),
	optionId
});

const coordinate = z.number().min(-LARGEST, tooLarge).max(LARGEST, tooLarge);
const point = z.tuple([coordinate, coordinate]);
export const areaSchema = z.discriminatedUnion('shape', [
	z.object({ shape: z.literal('rectangle'), lengthFt: positive, widthFt: positive }),
	z.object({ shape: z.literal('circle'), diameterFt: positive }),
	z.object({
		shape: z.literal('polygon'),
		pointsFt: z.array(point).min(3, 'At least three corners')
	})
]);

const aggregateSchema = z.object({
	id,
	name,
	areas: z.array(areaSchema).min(1, 'At least one area'),
	depthIn: positive,
	sku: id,
	wastePercent: percent.optional(),
	optionId
});

const wallSchema = z.object({
	id,
	name,
	purpose: z.enum(['retaining', 'seat']),
	lengthFt: positive,
	exposedHeightIn: positive,
	unit: z.object({ lengthIn: positive, heightIn: positive, depthIn: positive }),
	unitSku: id,
	capSku: z.string().optional(),
	capLengthIn: positive.optional(),
	padSku: z.string().optional(),
	drainSku: z.string().optional(),
	/** Perforated drain pipe behind a retaining wall, sold by the foot. */
	drainPipeSku: z.string().optional(),
	surcharge: z.boolean().default(false),
	optionId
});

const lightingSchema = z.object({
	fixtures: z.array(z.object({ id, name, va: positive, sku: z.string().optional() })),
	transformers: z.array(
		z.object({
			id,
			name,
			ratingVA: positive,
			tapsV: z.array(positive).min(1, 'At least one tap'),
			sku: z.string().optional()
		})
	),
	runs: z.array(
		z.object({
			id,
			transformerId: id,
			tapV: positive,
			gauge: z.enum(GAUGES),
			cableSku: z.string().optional(),
			// A chain runs fixture to fixture from the transformer; a T runs a lead to a split
			// with two arms (each fixture's distance from the split, on arm a or b); a hub runs a
			// lead to a hub with one spoke a fixture (its distance from the hub).
			layout: z.enum(['chain', 't', 'hub']).default('chain'),
			leadFt: nonNegative.default(0),
			fixtures: z
				.array(
					z.object({
						fixtureId: id,
						distanceFt: nonNegative,
						arm: z.enum(['a', 'b']).optional()
					})
				)
				.min(1, 'Empty run')
		})
	),
	optionId
});

const extraLineSchema = z.object({ sku: id, quantity: positive, optionId });
const extraLaborSchema = z.object({ task: name, hours: positive, optionId });

const waterSupplySchema = supplySchema.optional();

// A stone fountain over a hidden basin: outlets fed by branches from one manifold and one pump.
const fountainFeatureSchema = z.object({
	id,
	kind: z.literal('fountain'),
	name: name.default('Fountain'),
	optionId,
	outlets: z.array(outletSchema).default([]),
	supply: waterSupplySchema,
	branches: z.array(branchSchema).default([]),
	pumpModelId: z.string().optional(),
	basin: basinSchema.optional()
});

export const pondOutlineSchema = z.discriminatedUnion('shape', [
	z.object({ shape: z.literal('rectangle'), lengthFt: positive, widthFt: positive }),
	z.object({ shape: z.literal('oval'), lengthFt: positive, widthFt: positive }),
	z.object({
		shape: z.literal('polygon'),
		pointsFt: z.array(point).min(3, 'At least three corners')
	})
]);

// A pond: an outline, depth zones (shelves), a pump that turns the water over, a skimmer and a
// biological filter, liner, gravel and edge stone. It may feed a waterfall or stream.
const pondFeatureSchema = z.object({
	id,
	kind: z.literal('pond'),
	name: name.default('Pond'),
	optionId,
	outline: pondOutlineSchema,
	zones: z
		.array(
			z.object({ depthIn: positive, percent: z.number().positive('Must be above 0').max(100) })
		)
		.min(1, 'At least one depth zone'),
	use: z.enum(['fish', 'plants']).default('plants'),
	fishInches: nonNegative.default(0),
	returnLiftFt: nonNegative.default(1),
	supply: waterSupplySchema,
	pumpModelId: z.string().optional(),
	linerSku: z.string().optional(),
	underlaymentSku: z.string().optional(),
	skimmerSku: z.string().optional(),
	filterSku: z.string().optional(),
	gravelSku: z.string().optional(),
	gravelDepthIn: nonNegative.default(2),
	edgeStoneSku: z.string().optional(),
	edgeWidthFt: nonNegative.default(1),
	edgeDepthIn: nonNegative.default(6)
});

const streamSegmentSchema = z.object({
	id,
	lengthFt: positive,
	widthFt: positive,
	waterDepthIn: nonNegative.default(2),
	fallHeightIn: nonNegative.default(0),
	weirWidthIn: nonNegative.default(0)
});

export const reservoirSchema = z.object({
	kind: z.enum(['open', 'gravel']),
	lengthFt: positive,
	widthFt: positive,
	depthFt: positive,
	voidFraction: z.number().gt(0, 'Must be above 0').max(1, 'At most 1').default(0.35),
	pumpMinLevelIn: nonNegative.default(6),
	sku: z.string().optional(),
	fillSku: z.string().optional()
});

// A pondless stream or waterfall: segments that fall to a hidden reservoir (or into a pond).
const streamFeatureSchema = z.object({
	id,
	kind: z.literal('stream'),
	name: name.default('Stream'),
	optionId,
	riseFt: positive,
	segments: z.array(streamSegmentSchema).min(1, 'At least one segment'),
	flow: z.discriminatedUnion('method', [
		z.object({ method: z.literal('weir'), sheet: z.enum(['light', 'medium', 'heavy']) }),
		z.object({ method: z.literal('per-inch') })
	]),
	supply: supplySchema,
	pumpModelId: z.string().optional(),
	feedsPondId: z.string().optional(),
	reservoir: reservoirSchema.optional(),
	linerSku: z.string().optional(),
	underlaymentSku: z.string().optional(),
	weirBoxSku: z.string().optional(),
	gravelSku: z.string().optional(),
	gravelDepthIn: nonNegative.default(2),
	boulderSku: z.string().optional(),
	boulder: z
		.object({
			lengthIn: positive,
			widthIn: positive,
			heightIn: positive,
			rock: z.enum(ROCK_TYPES),
			spacingFt: positive
		})
		.optional()
});

// Paths, patios and terraces: flagstone or pavers over areas, on a compacted base and a bedding
// layer, with edge restraint, joint fill and steps.
const stepsSchema = z.object({
	count: count.min(1, 'At least one step'),
	riseIn: positive,
	treadIn: positive,
	widthFt: positive,
	sku: z.string().optional()
});

const pathFeatureSchema = z.object({
	id,
	kind: z.literal('path'),
	name: name.default('Path'),
	optionId,
	surface: z.enum(['flagstone', 'pavers']).default('flagstone'),
	areas: z.array(areaSchema).min(1, 'At least one area'),
	surfaceSku: z.string().optional(),
	thicknessIn: positive.default(1.5),
	rock: z.enum(ROCK_TYPES).default('sandstone'),
	paver: z.object({ lengthIn: positive, widthIn: positive }).default({ lengthIn: 8, widthIn: 4 }),
	/** Flagstone: the share of the area left as joints between stones. */
	jointPercent: z.number().nonnegative('Must not be negative').max(60, 'At most 60%').default(10),
	/** Pavers: the joint width between units. */
	jointWidthIn: nonNegative.default(0.125),
	wastePercent: percent.optional(),
	baseSku: z.string().optional(),
	baseDepthIn: nonNegative.default(4),
	beddingSku: z.string().optional(),
	beddingDepthIn: nonNegative.default(1),
	jointSku: z.string().optional(),
	edgeSku: z.string().optional(),
	/** Edges that need no restraint (against the house, a wall or a step). */
	edgeExcludedFt: nonNegative.default(0),
	steps: stepsSchema.optional()
});

// A dry creek and drainage: the runoff of a roof or yard area, a cobble channel to carry it, a
// gravel soak-away to hold one storm's runoff, and the fall of the ground next to the house.
const drainageFeatureSchema = z.object({
	id,
	kind: z.literal('drainage'),
	name: name.default('Dry creek'),
	optionId,
	catchment: z.object({
		areas: z.array(areaSchema).min(1, 'At least one area'),
		runoffC: z.number().gt(0, 'Must be above 0').max(1, 'At most 1').default(0.9)
	}),
	/** The design rain intensity; blank takes the firm's setting. */
	rainInPerHr: positive.optional(),
	creek: z
		.object({
			lengthFt: positive,
			slopePercent: z.number().positive('Must be greater than zero').max(100, 'At most 100%'),
			flowDepthIn: positive.default(6),
			sideSlope: positive.max(20, 'At most 20').default(2),
			freeboardIn: nonNegative.default(3),
			cobbleDepthIn: positive.default(4),
			fabricOverlapFt: nonNegative.default(1)
		})
		.optional(),
	cobbleSku: z.string().optional(),
	fabricSku: z.string().optional(),
	boulderSku: z.string().optional(),
	boulder: z
		.object({
			lengthIn: positive,
			widthIn: positive,
			heightIn: positive,
			rock: z.enum(ROCK_TYPES),
			spacingFt: positive
		})
		.optional(),
	soakaway: z
		.object({
			depthFt: positive,
			voidFraction: z.number().gt(0, 'Must be above 0').max(1, 'At most 1').default(0.35),
			sku: z.string().optional(),
			fabricSku: z.string().optional()
		})
		.optional(),
	/** The fall of the ground over the first 10 ft from the house, as built or designed. */
	houseFallIn: nonNegative.optional()
});

export const CONTAINER_SIZES = ['1-gal', '2-gal', '5-gal', '15-gal'] as const;
export const PLANT_LAYOUTS = ['square', 'triangular'] as const;

// Planting: beds by area; each group of plants at a spacing and layout over part of the beds (or a
// fixed count), mulch by depth, and soil amendment worked in.
const plantingFeatureSchema = z.object({
	id,
	kind: z.literal('planting'),
	name: name.default('Planting'),
	optionId,
	areas: z.array(areaSchema).min(1, 'At least one area'),
	groups: z
		.array(
			z.object({
				id,
				name,
				sku: z.string().optional(),
				container: z.enum(CONTAINER_SIZES).default('1-gal'),
				spacingIn: positive,
				layout: z.enum(PLANT_LAYOUTS).default('triangular'),
				coverPercent: percent.default(100),
				/** A fixed number of plants (specimens) instead of a spacing over the beds. */
				count: count.optional()
			})
		)
		.default([]),
	mulchSku: z.string().optional(),
	mulchDepthIn: nonNegative.default(3),
	amendSku: z.string().optional(),
	amendDepthIn: nonNegative.default(2),
	wastePercent: percent.optional()
});

export const FEATURE_KINDS = [
	'fountain',
	'pond',
	'stream',
	'path',
	'drainage',
	'planting'
] as const;
export const WATER_FEATURE_KINDS = ['fountain', 'pond', 'stream'] as const;
export const featureSchema = z.discriminatedUnion('kind', [
	fountainFeatureSchema,
	pondFeatureSchema,
	streamFeatureSchema,
	pathFeatureSchema,
	drainageFeatureSchema,
	plantingFeatureSchema
]);

// The ground the work is dug in and how: by hand, by machine, or chosen from the dig volume.
export const siteSchema = z.object({
	soil: z.enum(SOIL_KINDS).default('loam'),
	dig: z.enum(['auto', 'hand', 'machine']).default('auto'),
	haulSpoil: z.boolean().default(true)
});

export const designSchema = z.object({
	name: name.default('Untitled design'),
	site: siteSchema.prefault({}),
	features: z.array(featureSchema).default([]),
	stones: z.array(stoneSchema).default([]),
	aggregates: z.array(aggregateSchema).default([]),
	walls: z.array(wallSchema).default([]),
	lighting: lightingSchema.optional(),
	extraLines: z.array(extraLineSchema).default([]),
	extraLabor: z.array(extraLaborSchema).default([]),
	options: z.array(z.object({ id, name, selected: z.boolean().default(false) })).default([]),
	alternates: z
		.array(
			z.object({
				id,
				name,
				choices: z.array(z.object({ id, name })).min(2, 'An alternate needs two choices'),
				selectedChoiceId: id
			})
		)
		.default([])
});

export const ITEM_UNITS = [
	'each',
	'ft',
	'ft2',
	'ft3',
	'yd3',
	'ton',
	'lb',
	'bag',
	'load',
	'day'
] as const;
export type ItemUnit = (typeof ITEM_UNITS)[number];

const itemSchema = z.object({
	sku: id,
	name,
	category: z.enum(CATEGORIES),
	unit: z.enum(ITEM_UNITS),
	unitCost: cents,
	unitPrice: cents,
	increment: positive.optional(),
	bulkDensityLbFt3: positive.optional(),
	bagVolumeFt3: positive.optional(),
	loadVolumeYd3: positive.optional(),
	pipe: pipeSpecSchema.optional(),
	fitting: z.object({ kind: z.enum(FITTING_KINDS), size: z.enum(NOMINAL_SIZES) }).optional(),
	/** A liner or underlayment sold by the sheet: the sheet's size. */
	sheetLengthFt: positive.optional(),
	sheetWidthFt: positive.optional(),
	/** A skimmer's rated flow, or a biological filter's rated pond volume. */
	ratedFlowGph: positive.optional(),
	ratedVolumeGal: positive.optional(),
	/** Sheets of one family (one liner material) are the same goods in different sizes. */
	sheetFamily: z.string().optional(),
	taxable: z.boolean().default(true)
});

const curvePoint = z.object({ flowGph: nonNegative, headFt: nonNegative });

const pumpSchema = z.object({
	id,
	name,
	curve: z.array(curvePoint).min(2, 'A curve needs at least two points'),
	watts: positive,
	priceCents: cents,
	costCents: cents.optional()
});

const laborRateSchema = z.object({
	id,
	name,
	costPerHourCents: cents,
	pricePerHourCents: cents
});

const hours = nonNegative;
// One entry a labor rate, its default from the rate list (labor-rates.ts).
const laborRateShape = Object.fromEntries(
	LABOR_RATES.map((r) => [r.key, hours.default(r.default)])
) as Record<LaborRateKey, z.ZodDefault<typeof hours>>;
// The firm's settings. Defaults without a note are invented starting points for a firm to replace
// with its own figures (no source).
export const settingsSchema = z.object({
	markupPercent: nonNegative.default(0),
	taxRatePercent: percent.default(0),
	taxAppliesTo: z.enum(['materials', 'all']).default('materials'),
	depositPercent: percent.default(30),
	electricityCentsPerKwh: nonNegative.default(15),
	evaporationInPerDay: nonNegative.default(0.25),
	splashLossPercentPerDay: percent.default(0.05),
	minDaysBetweenTopUps: nonNegative.default(3),
	// 15% flow margin and 5 ft/s in plastic pipe (common practice, no source).
	pumpMarginPercent: percent.default(15),
	velocityLimitFtS: positive.default(5),
	lossPer100Limit: positive.default(10),
	dailyRunHours: z.number().nonnegative().max(24, 'At most 24 hours').default(12),
	seasonMonths: z.number().nonnegative().max(12, 'At most 12 months').default(7),
	wetFilmMm: nonNegative.default(1),
	// ISPSC section 305 wants a barrier around water over 24 in deep (from memory).
	openWaterDepthIn: positive.default(24),
	aggregateWastePercent: percent.default(10),
	// Paths and patios: the compaction factors that turn a compacted base and bedding layer into the
	// loose volume to order (earthwork.ts names the table they come from).
	hardscape: z
		.object({
			baseCompactionFactor: z
				.number()
				.min(1, 'At least 1')
				.max(3, 'At most 3')
				.default(BASE_COMPACTION_FACTOR),
			beddingCompactionFactor: z
				.number()
				.min(1, 'At least 1')
				.max(3, 'At most 3')
				.default(BEDDING_COMPACTION_FACTOR)
		})
		.prefault({}),
	// Drainage. The design rain is the firm's local design storm (NOAA Atlas 14 in the US): the
	// 2 in/h default is an invented starting point to replace. The cobble channel's Manning n is
	// Chow's normal value for a stream bed of gravels, cobbles and few boulders (V. T. Chow,
	// Open-Channel Hydraulics, 1959, Table 5-6; from memory). IRC R401.3 asks for 6 in of fall
	// within the first 10 ft from the foundation.
	drainage: z
		.object({
			designRainInPerHr: positive.default(2),
			stormMinutes: positive.default(60),
			cobbleManningN: z.number().gt(0, 'Must be above 0').max(1, 'At most 1').default(0.04),
			houseFallIn: positive.default(6),
			houseFallOverFt: positive.default(10)
		})
		.prefault({}),
	pond: z
		.object({
			// Turn the pond over once an hour with fish, every two hours for plants; 1 ft of liner
			// overlap at each edge; 1 in of fish per 10 gal (common practice, no source).
			turnoverHoursFish: positive.default(1),
			turnoverHoursPlants: positive.default(2),
			linerOverlapFt: nonNegative.default(1),
			fishGalPerInch: positive.default(10),
			// The drop in level a skimmer pond tolerates before a top-up (common practice, no source).
			topUpDropIn: positive.default(2)
		})
		.prefault({}),
	stream: z
		.object({
			// 100 gph per inch of weir width for a medium sheet, 1 ft of liner lapped under each
			// fall, and a reservoir that holds 1.5 × the drain-back (common practice, no source).
			gphPerInch: positive.default(100),
			fallOverlapFt: nonNegative.default(1),
			reserveFactor: z.number().min(1, 'At least 1').max(10, 'At most 10').default(1.5)
		})
		.prefault({}),
	lift: z
		.object({
			// Setting a stone, in the terms of the NIOSH lifting equation (NIOSH 94-110): lifted from
			// near the ground (hands at 15 cm), held out past the knees (40 cm from the ankles), raised
			// 60 cm onto its bed, facing it (no twist), a few lifts in an hour or less (FM 1.00, table 5,
			// under 0.2 lifts a minute), and a poor grip on rough rock (CM 0.90, table 7). The figures
			// of the geometry are from memory of how a stone is set, for the firm to change.
			horizontalCm: positive.default(40),
			originHeightCm: nonNegative.default(15),
			travelCm: nonNegative.default(60),
			asymmetryDeg: nonNegative.default(0),
			frequencyMultiplier: z.number().min(0).max(1).default(1),
			couplingMultiplier: z.number().min(0).max(1).default(0.9)
		})
		.prefault({}),
	// What a team manages against the sum of its members' limits: two people two-thirds, three
	// people half (UK HSE L23, guidance on the Manual Handling Operations Regulations, from memory);
	// four or more, half as for three (from memory: teams past four rarely work well together).
	teamFactors: z
		.object({
			two: z
				.number()
				.gt(0)
				.max(1)
				.default(2 / 3),
			three: z
				.number()
				.gt(0)
				.max(1)
				.default(1 / 2),
			fourOrMore: z
				.number()
				.gt(0)
				.max(1)
				.default(1 / 2)
		})
		.prefault({}),
	teamLiftLimitLb: positive.default(120),
	maxTeamSize: count.min(2, 'At least two').default(4),
	cartLimitLb: positive.default(500),
	hoistLimitLb: positive.default(1000),
	loaderLimitLb: positive.default(1500),
	machineCrew: count.min(1).default(2),
	wall: z
		.object({
			// IRC R105.2 (permit over 4 ft from the footing) and R404.4 (design over 48 in of
			// unbalanced fill, or over 24 in with a surcharge).
			permitHeightIn: positive.default(48),
			engineeredHeightIn: positive.default(48),
			surchargeEngineeredHeightIn: positive.default(24),
			unitWastePercent: percent.default(5),
			// Loose base bought for a compacted pad: a granular soil's loose ÷ compacted volume,
			// 1.11 ÷ 0.95 (US Army FM 5-434, Earthmoving Operations, table 1-2, sand).
			padCompactionFactor: z
				.number()
				.min(1)
				.max(2)
				.default(SOILS.sand.swell / SOILS.sand.compaction),
			// The drain pipe runs past the wall's ends to daylight (common practice, no source).
			drainOutletFt: nonNegative.default(10),
			// A unit's weight for the truckloads, as a solid block of its size: normal-weight concrete
			// masonry is 125 lb/ft³ or more, oven-dry (the weight classes of ASTM C90, from memory), so
			// the lightest such unit; caps 4 in thick (common practice, no source).
			unitDensityLbFt3: positive.default(125),
			capThicknessIn: positive.default(4)
		})
		.prefault({}),
	lighting: z
		.object({
			// 80% transformer loading and a 10.5–12.5 V window at the fixture (common practice, no source).
			loadWarnRatio: z.number().gt(0).max(1).default(0.8),
			nominalVolts: positive.default(12),
			fixtureMinVolts: positive.default(10.5),
			fixtureMaxVolts: positive.default(12.5),
			cableSlackPercent: percent.default(10)
		})
		.prefault({}),
	labor: z
		.object({
			rateId: z.string().optional(),
			hoursPerDay: positive.default(8),
			baseCrewSize: count.min(1).default(2),
			// Dig with a machine once a bucket's digging passes this many bank yd³ (common
			// practice, no source); a stone set by a machine brings one in anyway.
			machineDigAboveYd3: nonNegative.default(3),
			rates: z.object(laborRateShape).prefault({})
		})
		.prefault({}),
	equipment: z
		.object({
			// Price-list items for the machine lines, deliveries and spoil; a missing item leaves
			// the line unpriced with a warning.
			compactMachineSku: z.string().default('EQUIP-LOADER-DAY'),
			largerMachineSku: z.string().default('EQUIP-EXCAVATOR-DAY'),
			machineDeliverySku: z.string().default('EQUIP-DELIVERY'),
			truckloadSku: z.string().default('DELIVERY-LOAD'),
			haulOffSku: z.string().default('SPOIL-HAUL-YD3'),
			// A small dump truck's payload (common practice, no source).
			truckCapacityTons: positive.default(10),
			// Stone and gravel brought by the firm's own trailer below this weight (no delivery line).
			deliveryAboveTons: nonNegative.default(1)
		})
		.prefault({})
});

export const catalogSchema = z.object({
	items: z.array(itemSchema).default([]),
	pumps: z.array(pumpSchema).default([]),
	laborRates: z.array(laborRateSchema).default([]),
	settings: settingsSchema.prefault({})
});

export type Design = z.input<typeof designSchema>;
export type ParsedDesign = z.output<typeof designSchema>;
export type Catalog = z.input<typeof catalogSchema>;
export type ParsedCatalog = z.output<typeof catalogSchema>;
export type Settings = z.output<typeof settingsSchema>;
export type CatalogItem = ParsedCatalog['items'][number];
export type PumpModel = ParsedCatalog['pumps'][number];
export type Feature = ParsedDesign['features'][number];
export type FeatureInput = NonNullable<Design['features']>[number];
export type FeatureKind = Feature['kind'];
export type Fountain = Extract<Feature, { kind: 'fountain' }>;
export type Pond = Extract<Feature, { kind: 'pond' }>;
export type Stream = Extract<Feature, { kind: 'stream' }>;
export type PathFeature = Extract<Feature, { kind: 'path' }>;
export type DrainageFeature = Extract<Feature, { kind: 'drainage' }>;
export type PlantingFeature = Extract<Feature, { kind: 'planting' }>;
export type WaterFeature = Fountain | Pond | Stream;
export type YardFeature = PathFeature | DrainageFeature | PlantingFeature;
export type PondOutline = Pond['outline'];
export type Reservoir = NonNullable<Stream['reservoir']>;
export type Branch = Fountain['branches'][number];
export type Supply = NonNullable<Fountain['supply']>;
export type Basin = NonNullable<Fountain['basin']>;
export type Stone = ParsedDesign['stones'][number];
export type Aggregate = ParsedDesign['aggregates'][number];
export type Area = z.output<typeof areaSchema>;
export type Wall = ParsedDesign['walls'][number];
export type Lighting = NonNullable<ParsedDesign['lighting']>;
export type Outlet = Fountain['outlets'][number];
export type Site = ParsedDesign['site'];
