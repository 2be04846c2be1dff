// Input schemas of job costing: the crew lead's time entries (checked on the phone before they
// are queued, and again on the server), materials picked, returned and invoiced, other costs,
// costing settings and the confirmation of a learned labor rate.
import { z } from 'zod';
import { isDate } from '$lib/scheduling/zone';
import { RATE_KEYS } from '$lib/costing/rates';
import { centsField } from './money';

const isoDay = z
	.string()
	.regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date such as 2027-05-14')
	.refine(isDate, 'That date is not real');

/** Hours typed as 7.5, 7,5 or 7:30 → minutes; null when unreadable. */
export function minutesFrom(text: string): number | null {
	const t = text.trim();
	const clock = /^(\d{1,2}):([0-5]\d)$/.exec(t);
	if (clock) return Number(clock[1]) * 60 + Number(clock[2]);
	if (!/^\d{1,2}([.,]\d{1,2})?$/.test(t)) return null;
	return Math.round(Number(t.replace(',', '.')) * 60);
}

export const timeEntrySchema = z
	.object({
		clientKey: z
			.string()
			.regex(/^[A-Za-z0-9-]{16,64}$/, 'The entry has no proper key; type it again'),
		taskId: z.string().min(1).max(40).nullable(),
		newTask: z
			.string()
			.trim()
			.max(120, 'Keep the task name under 120 characters')
			.nullable()
			.transform((v) => (v ? v : null)),
		person: z
			.string()
			.trim()
			.min(1, 'Who worked these hours?')
			.max(80, 'Keep the name under 80 characters'),
		workDate: isoDay,
		minutes: z
			.number({ message: 'Enter the hours, such as 7.5' })
			.int('Whole minutes')
			.min(1, 'Enter the hours, such as 7.5')
			.max(24 * 60, 'At most 24 hours in a day'),
		startedAt: z.iso.datetime({ offset: true }).nullable().default(null),
		endedAt: z.iso.datetime({ offset: true }).nullable().default(null),
		note: z.string().trim().max(500, 'Keep the note under 500 characters').default('')
	})
	.refine((e) => Boolean(e.taskId) !== Boolean(e.newTask), {
		message: 'Pick a task, or name a new one',
		path: ['taskId']
	});
export type TimeEntryInput = z.output<typeof timeEntrySchema>;

/** What the phone posts: the waiting entries of one job, at most a hundred a send. */
export const timeBatchSchema = z.object({
	entries: z.array(z.unknown()).min(1, 'Nothing to send').max(100, 'At most 100 entries a send')
});

/** The form on the phone, before the entry is queued (the same rules, typed text in). */
export const timeFormSchema = z.object({
	task: z.string().min(1, 'Pick a task, or name a new one'),
	newTask: z.string().trim().max(120, 'Keep the task name under 120 characters'),
	person: z.string().trim().min(1, 'Who worked these hours?').max(80),
	workDate: isoDay,
	hours: z.string().transform((v, ctx) => {
		const m = minutesFrom(v);
		if (m === null || m < 1 || m > 24 * 60) {
			ctx.addIssue({ code: 'custom', message: 'Enter the hours, such as 7.5 or 7:30' });
			return z.NEVER;
		}
		return m;
	}),
	note: z.string().trim().max(500, 'Keep the note under 500 characters')
});

const quantity = z.coerce
	.number({ message: 'Enter a quantity such as 1.5' })
	.min(0, 'Zero or more')
	.max(100_000, 'That quantity is too large');

const dollars = centsField('Enter an amount such as 412.50');

export const usageSchema = z
	.object({
		materialId: z.string().min(1, 'Pick a material'),
		picked: quantity,
		returned: quantity,
		invoiceCost: z.union([z.literal('').transform(() => null), dollars]),
		invoiceReference: z.string().trim().max(60, 'Keep the reference under 60 characters')
	})
	.refine((u) => u.returned <= u.picked, {
		message: 'More returned than picked',
		path: ['returned']
	});

export const jobCostSchema = z.object({
	kind: z.enum(['equipment', 'other'], { message: 'Equipment or other?' }),
	description: z.string().trim().min(1, 'Say what it was').max(200),
	amount: dollars,
	incurredOn: isoDay
});

export const costingSettingsSchema = z.object({
	overrunPercent: z.coerce
		.number({ message: 'Enter a percentage such as 15' })
		.int('A whole percentage')
		.min(0, '0 or more')
		.max(500, 'At most 500'),
	learnFromJobs: z.coerce
		.number({ message: 'Enter a number of jobs' })
		.int('Whole jobs')
		.min(1, 'At least 1')
		.max(100, 'At most 100'),
	warrantyMonths: z.coerce
		.number({ message: 'Enter months such as 12' })
		.int('Whole months')
		.min(0, '0 or more')
		.max(120, 'At most 120')
});

export const confirmRateSchema = z.object({
	rateKey: z.enum(RATE_KEYS, { message: 'Pick a rate' }),
	/** The proposal the owner saw; refused if the ratio has moved since (a stale page). */
	proposedHours: z.coerce.number().positive().max(1000)
});
