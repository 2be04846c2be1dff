/** Zod schemas for the design (US customary input, JSON-serialisable) and the catalog. */
import { z } from 'zod';
import { FITTING_KINDS, NOMINAL_SIZES, PIPE_MATERIALS } from './pipes';
import { ROCK_TYPES } from './stones';
import { GAUGES } from './lighting';
import { CATEGORIES } from './categories';

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
			fixtures: z.array(z.object({ fixtureId: id, distanceFt: nonNegative })).min(1, 'Empty run')
		})
	),
	optionId
});

const extraLineSchema = z.object({ sku: id, quantity: positive, optionId });
const extraLaborSchema = z.object({ task: name, hours: positive, optionId });

export const designSchema = z.object({
	name: name.default('Untitled design'),
	outlets: z.array(outletSchema).default([]),
	supply: supplySchema.optional(),
	branches: z.array(branchSchema).default([]),
	pumpModelId: z.string().optional(),
	basin: basinSchema.optional(),
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

export const ITEM_UNITS = ['each', 'ft', 'ft2', 'ft3', 'yd3', 'ton', 'lb', 'bag', 'load'] as const;
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
	lift: z
		.object({
			// NIOSH 94-110 ideal geometry: hands 25 cm out, starting at 75 cm, moving 25 cm or less.
			horizontalCm: positive.default(25),
			originHeightCm: nonNegative.default(75),
			travelCm: nonNegative.default(25),
			asymmetryDeg: nonNegative.default(0),
			frequencyMultiplier: z.number().min(0).max(1).default(1),
			couplingMultiplier: z.number().min(0).max(1).default(1)
		})
		.prefault({}),
	// UK HSE L23: a two-person team manages about two-thirds of the sum of its members (from memory).
	teamLiftEfficiency: z
		.number()
		.gt(0)
		.max(1)
		.default(2 / 3),
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
			unitWastePercent: percent.default(5)
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
			basinHours: hours.default(6),
			outletHours: hours.default(1.5),
			stoneHours: z
				.object({
					'one-person': hours.default(0.25),
					'team-lift': hours.default(0.75),
					cart: hours.default(1),
					hoist: hours.default(2),
					'compact-loader': hours.default(1.5),
					'larger-machine': hours.default(4)
				})
				.prefault({}),
			fixtureHours: hours.default(0.75),
			cableHoursPerFt: hours.default(0.02),
			toppingHoursPerFt2: hours.default(0.02),
			wallHoursPerUnit: hours.default(0.1)
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
export type Branch = ParsedDesign['branches'][number];
export type Supply = NonNullable<ParsedDesign['supply']>;
export type Basin = NonNullable<ParsedDesign['basin']>;
export type Stone = ParsedDesign['stones'][number];
export type Aggregate = ParsedDesign['aggregates'][number];
export type Area = z.output<typeof areaSchema>;
export type Wall = ParsedDesign['walls'][number];
export type Lighting = NonNullable<ParsedDesign['lighting']>;
export type Outlet = ParsedDesign['outlets'][number];
