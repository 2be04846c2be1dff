// Inputs of the site-visit screens and API, shared by client and server.
import { z } from 'zod';
import { isDate, isTimeZone, parseClock } from '$lib/scheduling/zone';

export const dateSchema = z.string().refine(isDate, 'Use a date such as 2027-03-15');
export const timeZoneSchema = z
	.string()
	.refine(isTimeZone, 'Use a time zone name such as America/Denver');

export const slotsQuerySchema = z
	.object({
		salespersonId: z.string().min(1, 'Pick a salesperson').max(64),
		from: dateSchema,
		to: dateSchema,
		timeZone: timeZoneSchema.optional(),
		excludeVisitId: z.string().max(64).optional()
	})
	.refine((q) => q.from <= q.to, { path: ['to'], message: 'The end date is before the start' })
	.refine((q) => Date.parse(q.to) - Date.parse(q.from) <= 62 * 86_400_000, {
		path: ['to'],
		message: 'Ask for at most 62 days at a time'
	});

const instant = z.iso.datetime({
	offset: true,
	message: 'Use an ISO date and time with its offset'
});

export const bookSchema = z.object({
	salespersonId: z.string().min(1, 'Pick a salesperson').max(64),
	startsAt: instant,
	noteForHomeowner: z.string().trim().max(1000, 'Keep the note under 1000 characters').default('')
});

export const rescheduleSchema = z.object({
	salespersonId: z.string().min(1, 'Pick a salesperson').max(64),
	startsAt: instant,
	noteForHomeowner: z.string().trim().max(1000).default('')
});

export const cancelSchema = z.object({
	reason: z.string().trim().max(500, 'Keep the reason under 500 characters').default('')
});

const visitIdField = z
	.string({ message: 'Pick the visit to change' })
	.trim()
	.min(1, 'Pick the visit to change')
	.max(64, 'Not a visit');
/** The staff forms on a lead's visit page name the visit they change. */
export const rescheduleFormSchema = rescheduleSchema.extend({ visitId: visitIdField });
export const cancelFormSchema = cancelSchema.extend({ visitId: visitIdField });

const clock = z.string().refine((v) => parseClock(v) !== null, 'Use a time such as 08:30');
export const intervalSchema = z
	.object({ start: clock, end: clock })
	.refine((i) => (parseClock(i.end) ?? 0) > (parseClock(i.start) ?? 0), {
		path: ['end'],
		message: 'The end must come after the start'
	});

export const availabilitySchema = z.object({
	// partialRecord: in zod 4 a record keyed by an enum requires every key; a day off has none.
	weeklyHours: z.partialRecord(
		z.enum(['0', '1', '2', '3', '4', '5', '6']),
		z.array(intervalSchema).max(4)
	),
	visitMinutes: z.coerce.number().int().min(15, 'At least 15 minutes').max(480, 'At most 8 hours'),
	bufferMinutes: z.coerce.number().int().min(0, 'Zero or more').max(240, 'At most 4 hours'),
	noticeMinutes: z.coerce
		.number()
		.int()
		.min(0, 'Zero or more')
		.max(14 * 24 * 60, 'At most two weeks'),
	daysAhead: z.coerce.number().int().min(1, 'At least 1 day').max(120, 'At most 120 days')
});
export type AvailabilityInput = z.infer<typeof availabilitySchema>;

export const timeOffSchema = z
	.object({
		startDate: dateSchema,
		startTime: clock.default('00:00'),
		endDate: dateSchema,
		endTime: clock.default('24:00'),
		reason: z.string().trim().max(200).default('')
	})
	.refine((t) => `${t.endDate} ${t.endTime}` > `${t.startDate} ${t.startTime}`, {
		path: ['endDate'],
		message: 'The end must come after the start'
	});

const measure = (label: string, max: number) =>
	z.preprocess(
		(v) => (v === '' || v === null || v === undefined ? undefined : v),
		z.coerce
			.number({ message: `${label}: enter a number` })
			.min(0, `${label} cannot be negative`)
			.max(max, `${label}: at most ${max}`)
			.optional()
	);
const choice = <T extends readonly [string, ...string[]]>(values: T) =>
	z.preprocess((v) => (v === '' ? undefined : v), z.enum(values).optional());
const note = z.string().trim().max(2000, 'Keep this under 2000 characters').default('');

export const SLOPES = ['flat', 'gentle', 'moderate', 'steep'] as const;
export const SOILS = ['loam', 'clay', 'sand', 'rocky', 'fill', 'unknown'] as const;
export const SUN = ['full', 'part', 'shade'] as const;
export const YES_NO = ['yes', 'no', 'unknown'] as const;

/** What the salesperson records on site; the estimate starts from it. Lengths in feet. */
export const visitNotesSchema = z.object({
	spotLengthFt: measure('Length', 500),
	spotWidthFt: measure('Width', 500),
	depthAvailableIn: measure('Depth', 240),
	toPatioFt: measure('Distance to the patio', 2000),
	toHouseFt: measure('Distance to the house', 2000),
	slope: choice(SLOPES),
	soil: choice(SOILS),
	sun: choice(SUN),
	powerLocation: note,
	powerGfci: choice(YES_NO),
	buriedLinesKnown: choice(YES_NO),
	buriedLinesMarked: choice(YES_NO),
	locateRequested: choice(YES_NO),
	accessWidthIn: measure('Access width', 600),
	notes: note
});
export type VisitNotes = z.infer<typeof visitNotesSchema>;
