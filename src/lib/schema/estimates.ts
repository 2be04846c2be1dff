// Shared by the builder (client) and the server: what a save carries, and the homeowner's forms.
import { z } from 'zod';
import { ITEM_UNITS } from '$lib/estimating/schema';

export const overrideSchema = z.object({
	key: z.string().min(1).max(300),
	kind: z.enum(['override', 'added']),
	bucket: z.string().min(1).max(80),
	description: z.string().trim().min(1, 'Describe the line').max(300),
	unit: z.enum(ITEM_UNITS, { message: 'Pick a unit from the list' }),
	quantity: z.number().nonnegative('No negative quantities').max(1e6, 'Too large'),
	unitPriceCents: z.number().int('Whole cents').nonnegative('Must not be negative').max(1e9),
	unitCostCents: z.number().int('Whole cents').nonnegative('Must not be negative').max(1e9),
	taxable: z.boolean(),
	computed: z.object({ quantity: z.number(), unitPriceCents: z.number().int() }).optional(),
	reason: z.string().trim().min(3, 'Say why the line was changed').max(500)
});

export const saveEstimateSchema = z.object({
	/** The revision the builder last saw; a save against a newer one answers 409. */
	revision: z.number().int().positive(),
	design: z.record(z.string(), z.unknown()),
	overrides: z.array(overrideSchema).max(500).default([]),
	scope: z.string().max(5000).default('')
});
export type SaveEstimateInput = z.infer<typeof saveEstimateSchema>;

export const acceptSchema = z.object({
	fullName: z
		.string()
		.trim()
		.min(3, 'Type your full name')
		.max(120)
		.refine((v) => /\S+\s+\S+/.test(v), 'Type your first and last name'),
	agree: z.literal('on', { message: 'Tick the box to agree to the estimate and its terms' }),
	options: z.array(z.string().max(80)).max(50).default([]),
	alternates: z.record(z.string().max(80), z.string().max(80)).default({})
});

export const declineSchema = z.object({
	reason: z.string().trim().min(3, 'Tell us briefly why').max(2000)
});

export const questionSchema = z.object({
	question: z.string().trim().min(3, 'Type your question').max(2000)
});

/** The version a builder button acts on (new version, send). */
export const estimateActionSchema = z.object({
	estimateId: z.string().trim().min(1, 'Pick a version').max(64)
});
