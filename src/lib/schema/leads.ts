// Query parameters of the leads list (API, table URL and CSV export) and the lead page's forms.
// Shared by the browser (labels, URL building) and the server (validation).
import { z } from 'zod';
import { isDate } from '$lib/scheduling/zone';
import { CLOSE_REASONS, LEAD_STAGES, LEAD_STAGE_LABELS, type LeadStage } from '$lib/stages';
import { BUDGETS as INTAKE_BUDGETS, SERVICES as INTAKE_SERVICES } from './intake';

// The list's and the forms' names for the lead vocabulary, which $lib/stages declares.
export const STAGES = LEAD_STAGES;
export type Stage = LeadStage;
export const STAGE_LABELS = LEAD_STAGE_LABELS;
export { CLOSE_REASONS, CLOSE_REASON_LABELS } from '$lib/stages';

export const PRIORITIES = ['low', 'normal', 'high'] as const;

/** Budget ranges in ascending order (the budget sort follows it; unknown keys sort last). */
export const BUDGETS = Object.keys(INTAKE_BUDGETS);
export const BUDGET_LABELS: Record<string, string> = INTAKE_BUDGETS;
export const SERVICES = Object.keys(INTAKE_SERVICES);
export const SERVICE_LABELS: Record<string, string> = {
	...INTAKE_SERVICES,
	'water-feature': 'Water feature'
};

/** A key's label, or the key in words; only the map's own keys count ("constructor" is no label). */
export const label = (map: Record<string, string>, key: string | null | undefined) =>
	key ? (Object.hasOwn(map, key) ? map[key] : key.replaceAll('_', ' ')) : '';

export const SORTS = ['received', 'name', 'town', 'stage', 'budget', 'last_touch'] as const;
export type SortKey = (typeof SORTS)[number];
export const PAGE_SIZES = [25, 50, 100] as const;

const day = z
	.string()
	.regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2027-04-30')
	.refine(isDate, 'Not a real date');

const list = <T extends z.ZodType>(item: T) =>
	z.preprocess(
		(v) => (v === undefined ? [] : Array.isArray(v) ? v : [v]),
		z.array(item).max(20, 'Too many values')
	);

/** The list query. Unknown parameters are refused, so a typo answers 400 instead of being ignored. */
export const leadQuerySchema = z
	.object({
		sort: z.enum(SORTS, { message: `sort must be one of ${SORTS.join(', ')}` }).default('received'),
		dir: z.enum(['asc', 'desc'], { message: 'dir must be asc or desc' }).default('desc'),
		stage: list(z.enum(STAGES, { message: `stage must be one of ${STAGES.join(', ')}` })),
		service: list(z.string().min(1).max(40)),
		assignee: z.string().min(1).max(40).optional().describe('a user id, "mine" or "unassigned"'),
		budget: list(z.string().min(1).max(40)),
		from: day.optional(),
		to: day.optional(),
		awaiting: z
			.enum(['1', 'true', '0', 'false'], { message: 'awaiting must be 1 or 0' })
			.optional()
			.transform((v) => v === '1' || v === 'true'),
		q: z.string().trim().max(100, 'Search at most 100 characters').optional(),
		page: z.coerce
			.number({ message: 'page must be a number' })
			.int('page must be a whole number')
			.min(1, 'page starts at 1')
			.max(100_000, 'page is too large')
			.default(1),
		size: z.coerce
			.number({ message: 'size must be a number' })
			.refine((v) => (PAGE_SIZES as readonly number[]).includes(v), {
				message: `size must be one of ${PAGE_SIZES.join(', ')}`
			})
			.default(25)
	})
	.strict()
	.refine((v) => !v.from || !v.to || v.from <= v.to, {
		path: ['to'],
		message: 'to must not be before from'
	});
export type LeadQuery = z.output<typeof leadQuerySchema>;

const MULTI = new Set(['stage', 'service', 'budget']);

/** URLSearchParams to a plain object, repeated keys as arrays (the shape the schema expects). */
export function searchParamsObject(params: URLSearchParams): Record<string, string | string[]> {
	const out: Record<string, string | string[]> = {};
	for (const key of new Set(params.keys())) {
		const values = params.getAll(key).filter((v) => v !== '');
		if (values.length === 0) continue;
		out[key] = MULTI.has(key) ? values : values[values.length - 1];
	}
	return out;
}

export function parseLeadQuery(params: URLSearchParams) {
	return leadQuerySchema.safeParse(searchParamsObject(params));
}

/** The canonical URL query of a list state: defaults left out, so links stay short. */
export function leadQueryString(q: Partial<LeadQuery>): string {
	const p = new URLSearchParams();
	if (q.sort && q.sort !== 'received') p.set('sort', q.sort);
	if (q.dir && q.dir !== 'desc') p.set('dir', q.dir);
	for (const s of q.stage ?? []) p.append('stage', s);
	for (const s of q.service ?? []) p.append('service', s);
	if (q.assignee) p.set('assignee', q.assignee);
	for (const s of q.budget ?? []) p.append('budget', s);
	if (q.from) p.set('from', q.from);
	if (q.to) p.set('to', q.to);
	if (q.awaiting) p.set('awaiting', '1');
	if (q.q) p.set('q', q.q);
	if (q.page && q.page !== 1) p.set('page', String(q.page));
	if (q.size && q.size !== 25) p.set('size', String(q.size));
	const s = p.toString();
	return s ? `?${s}` : '';
}

// --- the lead page's forms -------------------------------------------------------------------

const version = z.coerce.number().int().min(1);

export const stageFormSchema = z
	.object({
		version,
		stage: z.enum(STAGES, { message: 'Pick a stage' }),
		closeReason: z.enum(CLOSE_REASONS, { message: 'Pick the reason' }).optional(),
		closeNote: z.string().trim().max(1000, 'Keep the note under 1,000 characters').optional()
	})
	.refine((v) => v.stage !== 'closed' || v.closeReason, {
		path: ['closeReason'],
		message: 'Closing a lead needs a reason'
	});

export const assignFormSchema = z.object({
	version,
	assigneeId: z
		.string()
		.max(40)
		.transform((v) => v || null)
});

export const priorityFormSchema = z.object({
	version,
	priority: z.enum(PRIORITIES, { message: 'Pick a priority' })
});

export const logFormSchema = z.object({
	kind: z.enum(['call', 'note'], { message: 'Call or note?' }),
	body: z
		.string()
		.trim()
		.min(1, 'Write what was said or noted')
		.max(4000, 'Keep it under 4,000 characters')
});

export const detailsFormSchema = z.object({
	version,
	name: z.string().trim().min(1, 'Enter a name').max(120),
	email: z
		.string()
		.trim()
		.toLowerCase()
		.max(254)
		.refine((v) => v === '' || z.email().safeParse(v).success, 'Enter a valid e-mail address'),
	phone: z.string().trim().max(40),
	street: z.string().trim().max(200),
	town: z.string().trim().max(120),
	postalCode: z.string().trim().max(20),
	siteNotes: z.string().trim().max(4000)
});

export const mailFormSchema = z.object({
	template: z.string().min(1).max(40),
	/** Made when the form is shown: a double submit sends one e-mail. */
	sendKey: z.string().regex(/^[A-Za-z0-9_-]{8,40}$/, 'Reload the page and try again'),
	subject: z.string().trim().min(1, 'Enter a subject').max(200),
	body: z.string().trim().min(1, 'Write the message').max(8000)
});

/** The lead page's merge action: the other contact, the same person as this lead's. */
export const mergeFormSchema = z.object({
	contactId: z.string().trim().min(1, 'Pick the contact to merge').max(64)
});
