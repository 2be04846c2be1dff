// Shared input schemas of the jobs domain (office forms, crew forms, homeowner token pages).
import { z } from 'zod';
import { parseCents } from '$lib/money';
import { isDate } from '$lib/scheduling/zone';

const isoDay = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date such as 2027-05-14');

export const scheduleSchema = z.object({
	days: z
		.array(isoDay)
		.max(30, 'At most 30 install days')
		.refine((days) => days.every(isDate), 'One of the dates is not real'),
	crewLeadId: z
		.string()
		.trim()
		.transform((v) => v || null),
	crewSize: z
		.union([z.literal(''), z.coerce.number().int('Whole people').min(1, 'At least 1').max(20)])
		.transform((v) => (v === '' ? null : v))
});

export const punchSchema = z.object({
	body: z.string().trim().min(1, 'Say what needs doing').max(500, 'Keep it under 500 characters')
});

export const saleByHandSchema = z.object({
	estimateId: z.string().min(1, 'Pick the estimate that was accepted'),
	typedName: z.string().trim().min(2, 'Enter the name of the person who accepted').max(120),
	method: z.enum(['paper', 'phone'], { message: 'Paper or phone?' }),
	acceptedOn: isoDay
});

export const changeOrderLineSchema = z.object({
	description: z
		.string()
		.trim()
		.min(1, 'Describe the line')
		.max(200, 'Keep it under 200 characters'),
	category: z.string().trim().max(40).default('other'),
	unit: z.string().trim().min(1).max(20).default('each'),
	quantity: z.coerce
		.number({ message: 'Enter a quantity such as 2 or -1' })
		.refine((n) => Number.isFinite(n) && n !== 0, 'Use a quantity other than 0 (negative removes)')
		.refine((n) => Math.abs(n) <= 100_000, 'That quantity is too large'),
	unitPriceCents: z.coerce
		.number({ message: 'Enter a price such as 120.50' })
		.int('Enter a price such as 120.50')
		.min(0, 'A price of 0 or more')
		.max(100_000_000, 'That price is too large')
});

export const changeOrderSchema = z.object({
	title: z.string().trim().min(1, 'Give the change a short title').max(120),
	note: z.string().trim().max(2000).default(''),
	lines: z.array(changeOrderLineSchema).min(1, 'Add at least one line').max(30)
});
export type ChangeOrderInput = z.input<typeof changeOrderSchema>;

/**
 * One row of the office's draft form as typed (`lines.N.description`, `lines.N.quantity`, …).
 * A row left empty (no description, no quantity) is no line: it becomes null. Any other row is
 * read as a change order line, its messages keyed by the row's own inputs, so they show beside
 * them: `lines.2.unitPrice`, not the schema's `unitPriceCents`.
 */
const draftRowSchema = z
	.object({
		description: z.string().default(''),
		category: z.string().default(''),
		unit: z.string().default(''),
		quantity: z.string().default(''),
		unitPrice: z.string().default('')
	})
	.transform((row, ctx) => {
		if (!row.description.trim() && !row.quantity.trim()) return null;
		const price = row.unitPrice.trim();
		const line = changeOrderLineSchema.safeParse({
			description: row.description,
			category: row.category || 'other',
			unit: row.unit || 'each',
			quantity: row.quantity,
			// Not an amount (letters, a minus, three decimals) reaches the line schema as NaN, which
			// it refuses with its own message.
			unitPriceCents: price === '' ? 0 : (parseCents(price, { wholeDigits: 9 }) ?? Number.NaN)
		});
		if (line.success) return line.data;
		for (const issue of line.error.issues) {
			const [key] = issue.path;
			ctx.addIssue({
				code: 'custom',
				message: issue.message,
				path: [key === 'unitPriceCents' ? 'unitPrice' : String(key)]
			});
		}
		return z.NEVER;
	});

/** The office's change order draft form: its rows as typed, the empty ones left out. */
export const changeOrderDraftSchema = z
	.object({
		title: changeOrderSchema.shape.title,
		note: changeOrderSchema.shape.note,
		lines: z
			.array(draftRowSchema)
			.refine((rows) => rows.some((l) => l !== null), 'Add at least one line')
			.refine((rows) => rows.filter((l) => l !== null).length <= 30, 'At most 30 lines')
	})
	.transform((draft) => ({
		...draft,
		lines: draft.lines.filter((l): l is NonNullable<typeof l> => l !== null)
	}));

export const sendChangeOrderSchema = z.object({
	changeOrderId: z
		.string({ message: 'Pick a change order' })
		.trim()
		.min(1, 'Pick a change order')
		.max(64, 'Pick a change order')
});

export const decisionSchema = z.discriminatedUnion('decision', [
	z.object({
		decision: z.literal('approve'),
		typedName: z.string().trim().min(2, 'Type your full name to approve').max(120)
	}),
	z.object({
		decision: z.literal('decline'),
		typedName: z.string().trim().min(2, 'Type your full name').max(120),
		reason: z.string().trim().max(1000).default('')
	})
]);

export const testimonialSchema = z.object({
	body: z
		.string()
		.trim()
		.min(20, 'A sentence or two, please (at least 20 characters)')
		.max(2000, 'Keep it under 2000 characters'),
	displayName: z.string().trim().min(1, 'The name to show, e.g. your first name').max(60),
	town: z.string().trim().max(60).default('')
});

const month = z.coerce.number().int().min(1, 'Pick a month').max(12, 'Pick a month');
export const careSettingsSchema = z
	.object({
		enabled: z
			.union([z.literal('on'), z.literal('')])
			.optional()
			.transform((v) => v === 'on'),
		shutdownMonth: month,
		startupMonth: month,
		testimonialDelayDays: z.coerce.number().int().min(0).max(60)
	})
	.refine((v) => v.shutdownMonth !== v.startupMonth, {
		path: ['startupMonth'],
		message: 'Start-up and shut-down need different months'
	});
