// Form schemas of seasonal care, shared by the office forms and their actions.
import { z } from 'zod';
import { centsField } from './money';
import {
	FEATURE_KINDS,
	FEATURE_SIZES,
	VISIT_KINDS,
	type FeatureKind,
	type FeatureSize
} from '$lib/care/kinds';
import { inquirySchema } from './intake';
import { isMonthDay } from '$lib/care/seasons';

const text = (max: number) => z.string().trim().max(max, `At most ${max} characters`);

export const featureSchema = z.object({
	kind: z.enum(FEATURE_KINDS, { message: 'Pick a kind of feature' }),
	size: z.enum(FEATURE_SIZES, { message: 'Pick a size' }),
	pump: text(120).default(''),
	lights: z.coerce.number().int('Whole lights only').min(0).max(200).default(0),
	notes: text(2000).default(''),
	builtBy: z.enum(['us', 'others']).default('others')
});

export const pinSchema = z.object({
	lat: z.coerce
		.number()
		.min(-90, 'Latitude is between -90 and 90')
		.max(90, 'Latitude is between -90 and 90'),
	lng: z.coerce
		.number()
		.min(-180, 'Longitude is between -180 and 180')
		.max(180, 'Longitude is between -180 and 180')
});

/** Dollars as typed ("150", "150.00") to cents; empty means "not covered". */
const dollars = z
	.string()
	.optional()
	.transform((v) => v?.trim() || '0')
	.pipe(centsField('Dollars and cents, like 150 or 150.00', { wholeDigits: 6 }));

export const planSchema = z
	.object({
		name: text(80).min(1, 'Give the plan a name'),
		summary: text(500).default(''),
		terms: text(4000).min(1, 'Write the terms the homeowner accepts'),
		payYearly: z.boolean(),
		payPerVisit: z.boolean(),
		active: z.boolean(),
		visits: z
			.array(
				z.object({
					kind: z.enum(VISIT_KINDS),
					minutes: z.coerce
						.number()
						.int()
						.min(15, 'At least 15 minutes')
						.max(480, 'At most 8 hours'),
					checklist: z.array(text(200).min(1)).max(30)
				})
			)
			.min(1, 'Include at least one visit'),
		prices: z.record(z.enum(FEATURE_KINDS), z.record(z.enum(FEATURE_SIZES), dollars))
	})
	.refine((p) => p.payYearly || p.payPerVisit, {
		message: 'Offer at least one way to pay',
		path: ['payYearly']
	});
export type PlanInput = z.output<typeof planSchema>;

export const seasonSettingsSchema = z.object({
	firstFrost: z.string().refine(isMonthDay, 'Month and day as MM-DD, like 10-15'),
	shutdownDays: z.coerce.number().int().min(7, 'At least a week').max(120),
	springStart: z.string().refine(isMonthDay, 'Month and day as MM-DD, like 04-15'),
	springDays: z.coerce.number().int().min(7, 'At least a week').max(120),
	summerStart: z.string().refine(isMonthDay, 'Month and day as MM-DD, like 06-15'),
	summerDays: z.coerce.number().int().min(7, 'At least a week').max(120),
	depotLat: z.coerce.number().min(-90).max(90),
	depotLng: z.coerce.number().min(-180).max(180),
	speedKmh: z.coerce.number().int().min(10, 'At least 10 km/h').max(120)
});

export const signUpSchema = z.object({
	planId: z.string().min(1, 'Pick a plan'),
	billing: z.enum(['year', 'visit'], { message: 'Choose how to pay' }),
	typedName: text(120).min(2, 'Type your full name to accept'),
	accept: z.literal('on', { message: 'Tick the box to accept the terms' })
});

/** How many of each kind a homeowner may list on the public sign-up (more: we talk first). */
export const PUBLIC_MAX_PER_KIND = 4;

const featureCount = z.coerce
	.number({ message: 'A whole number' })
	.int('A whole number')
	.min(0, 'Not fewer than 0')
	.max(PUBLIC_MAX_PER_KIND, `At most ${PUBLIC_MAX_PER_KIND}; call us for more`)
	.default(0);
const featureSize = z.enum(FEATURE_SIZES, { message: 'Pick a size' }).default('medium');

/**
 * The public care sign-up: who and where, how many of each kind of feature and their size, the
 * plan, how to pay and the terms accepted. Fields are flat (`pondCount`, `pondSize`) so the form
 * works without JavaScript.
 */
export const publicSignUpSchema = inquirySchema
	.pick({ name: true, email: true, phone: true, street: true, town: true })
	.extend({
		postalCode: text(20).min(3, 'Enter the postal code: we plan visits by it'),
		fountainCount: featureCount,
		fountainSize: featureSize,
		pondCount: featureCount,
		pondSize: featureSize,
		streamCount: featureCount,
		streamSize: featureSize,
		lightingCount: featureCount,
		lightingSize: featureSize,
		...signUpSchema.shape,
		planId: z.string({ message: 'Pick a plan' }).min(1, 'Pick a plan')
	})
	.refine((v) => FEATURE_KINDS.some((k) => Number(v[`${k}Count`]) > 0), {
		message: 'Tell us about at least one feature',
		path: ['features'],
		// Checked even when another field is wrong, so every message shows at once.
		when: () => true
	});
export type PublicSignUpInput = z.output<typeof publicSignUpSchema>;

/** The features a public sign-up lists, one entry per feature, numbered for the price lines. */
export function listedFeatures(
	v: Partial<Record<`${FeatureKind}Count`, number>> &
		Partial<Record<`${FeatureKind}Size`, FeatureSize>>
): { id: string; kind: FeatureKind; size: FeatureSize }[] {
	return FEATURE_KINDS.flatMap((kind) =>
		Array.from(
			{ length: Math.max(0, Math.min(PUBLIC_MAX_PER_KIND, v[`${kind}Count`] ?? 0)) },
			(_, i) => ({
				id: `${kind}-${i + 1}`,
				kind,
				size: v[`${kind}Size`] ?? 'medium'
			})
		)
	);
}
