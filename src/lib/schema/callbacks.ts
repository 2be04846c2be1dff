// Input schemas of warranty callbacks: the homeowner's report, and the office's day, hours and
// closing notes.
import { z } from 'zod';
import { isDate } from '$lib/scheduling/zone';
import { minutesFrom } from './costing';

const isoDay = z
	.string()
	.regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date such as 2027-05-14')
	.refine(isDate, 'That date is not real');

export const reportSchema = z.object({
	description: z
		.string()
		.trim()
		.min(10, 'Tell us what is wrong in a sentence or two')
		.max(3000, 'Keep it under 3,000 characters')
});

export const scheduleCallbackSchema = z.object({
	assignedTo: z.string().min(1, 'Pick who goes'),
	scheduledOn: isoDay
});

export const callbackHoursSchema = z.object({
	person: z.string().trim().min(1, 'Who worked these hours?').max(80),
	workDate: isoDay,
	hours: z.string().transform((v, ctx) => {
		const m = minutesFrom(v);
		if (m === null || m < 1 || m > 24 * 60) {
			ctx.addIssue({ code: 'custom', message: 'Enter the hours, such as 1.5 or 1:30' });
			return z.NEVER;
		}
		return m;
	}),
	clientKey: z.string().regex(/^[A-Za-z0-9_-]{16,64}$/, 'Reload the page and enter it again')
});

export const closeCallbackSchema = z.object({
	notes: z.string().trim().min(3, 'Say what was done').max(3000)
});
