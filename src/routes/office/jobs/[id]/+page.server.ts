import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { fieldErrors } from '$lib/schema/auth';
import {
	changeOrderSchema,
	punchSchema,
	scheduleSchema,
	sendChangeOrderSchema
} from '$lib/schema/jobs';
import { parseCents } from '$lib/money';
import { JOB_STAGES_BY_HAND } from '$lib/stages';
import { requireRole } from '$lib/server/auth/access';
import {
	createChangeOrder,
	listChangeOrders,
	sendChangeOrder
} from '$lib/server/jobs/change-orders';
import { domainAction, orHttp } from '$lib/server/http/domain';
import { addPunchItem, setMaterialFlag, setPunchDone } from '$lib/server/jobs/checklists';
import { addJobPhoto } from '$lib/server/photos/job-photos';
import { signPhotos } from '$lib/server/photos/links';
import {
	crewConflicts,
	crewJobView,
	crewLeads,
	jobFor,
	officeJobView
} from '$lib/server/jobs/read';
import { jobBalance } from '$lib/server/payments/balance';
import { scheduleJob } from '$lib/server/jobs/schedule';
import { setStage } from '$lib/server/jobs/stage';
import { PhotoError } from '$lib/server/platform/images';
import { StorageUnavailableError } from '$lib/server/platform/storage';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales', 'crew');
	const job = await orHttp(() => jobFor(user, event.params.id));
	if (user.role === 'crew') {
		// Built from quantities and site facts only: no price, cost or margin reaches a crew phone.
		const view = await crewJobView(job);
		return { role: 'crew' as const, job: { ...view, photos: await signPhotos(view.photos) } };
	}
	const [view, balance, changeOrders, leads, conflicts] = await Promise.all([
		officeJobView(job),
		jobBalance(job.id),
		listChangeOrders(job.id),
		crewLeads(),
		crewConflicts(job.id)
	]);
	return {
		role: 'office' as const,
		job: { ...view, photos: await signPhotos(view.photos) },
		balance,
		changeOrders: changeOrders.map(({ tokenHash: _t, ...co }) => co),
		crewLeads: leads,
		conflicts
	};
};

const idSchema = z.object({ itemId: z.string().min(1), on: z.enum(['1', '0']) });
const stageSchema = z.object({ to: z.enum(JOB_STAGES_BY_HAND) });

/** Every line row of the draft form as typed, in form order (the form refills from these). */
function typedLines(data: FormData) {
	const field = (name: string, i: number) => String(data.getAll(name)[i] ?? '');
	return data.getAll('description').map((description, i) => ({
		description: String(description),
		category: field('category', i) || 'other',
		unit: field('unit', i) || 'each',
		quantity: field('quantity', i),
		unitPrice: field('unitPrice', i)
	}));
}
type TypedLine = ReturnType<typeof typedLines>[number];

/** A zod path inside the parsed lines back to the form's own row and input name. */
function formPath(key: string, rows: number[]): string {
	const m = /^lines\.(\d+)\.(\w+)$/.exec(key);
	if (!m) return key;
	const input = m[2] === 'unitPriceCents' ? 'unitPrice' : m[2];
	return `lines.${rows[Number(m[1])]}.${input}`;
}

function parseDraft(data: FormData) {
	const typed = typedLines(data);
	const rows = typed.flatMap((l, i) => (l.description.trim() || l.quantity.trim() ? [i] : []));
	const parsed = changeOrderSchema.safeParse({
		title: data.get('title') ?? '',
		note: data.get('note') ?? '',
		lines: rows.map((i) => lineInput(typed[i]))
	});
	const values = { title: String(data.get('title') ?? ''), lines: typed };
	if (parsed.success) return { ok: true as const, draft: parsed.data };
	const errors: Record<string, string> = {};
	for (const [key, message] of Object.entries(fieldErrors(parsed.error))) {
		errors[formPath(key, rows)] ??= message;
	}
	return { ok: false as const, values, errors };
}

function lineInput(l: TypedLine) {
	return {
		description: l.description,
		category: l.category,
		unit: l.unit,
		quantity: l.quantity,
		// Not an amount (letters, a minus, three decimals) reaches the schema as NaN, which it refuses.
		unitPriceCents:
			l.unitPrice.trim() === '' ? 0 : (parseCents(l.unitPrice, { wholeDigits: 9 }) ?? Number.NaN)
	};
}

export const actions: Actions = {
	schedule: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const parsed = await parseForm(event.request, scheduleSchema, {
			extra: { form: 'schedule' },
			read: (data) => ({
				days: data
					.getAll('day')
					.map(String)
					.filter((d) => d !== ''),
				crewLeadId: String(data.get('crewLeadId') ?? ''),
				crewSize: String(data.get('crewSize') ?? '')
			})
		});
		if (!parsed.ok) return parsed.failure;
		return domainAction(async () => {
			const conflicts = await scheduleJob(event.params.id, parsed.data, user);
			return { form: 'schedule', saved: true, conflicts: conflicts.length };
		}, 'schedule');
	},
	ordered: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const parsed = await parseForm(event.request, idSchema, {
			extra: { form: 'materials' },
			message: 'Pick a material'
		});
		if (!parsed.ok) return parsed.failure;
		return domainAction(async () => {
			await setMaterialFlag(
				user,
				event.params.id,
				parsed.data.itemId,
				'ordered',
				parsed.data.on === '1'
			);
		}, 'materials');
	},
	picked: async (event) => {
		const user = requireRole(event, 'owner', 'sales', 'crew');
		const parsed = await parseForm(event.request, idSchema, {
			extra: { form: 'materials' },
			message: 'Pick a material'
		});
		if (!parsed.ok) return parsed.failure;
		return domainAction(async () => {
			await setMaterialFlag(
				user,
				event.params.id,
				parsed.data.itemId,
				'picked',
				parsed.data.on === '1'
			);
		}, 'materials');
	},
	punch: async (event) => {
		const user = requireRole(event, 'owner', 'sales', 'crew');
		const parsed = await parseForm(event.request, punchSchema, {
			extra: { form: 'punch' },
			message: true
		});
		if (!parsed.ok) return parsed.failure;
		return domainAction(() => addPunchItem(user, event.params.id, parsed.data.body), 'punch');
	},
	punchDone: async (event) => {
		const user = requireRole(event, 'owner', 'sales', 'crew');
		const parsed = await parseForm(event.request, idSchema, {
			extra: { form: 'punch' },
			message: 'Pick an item'
		});
		if (!parsed.ok) return parsed.failure;
		return domainAction(
			() => setPunchDone(user, event.params.id, parsed.data.itemId, parsed.data.on === '1'),
			'punch'
		);
	},
	stage: async (event) => {
		const user = requireRole(event, 'owner', 'sales', 'crew');
		const parsed = await parseForm(event.request, stageSchema, {
			extra: { form: 'stage' },
			message: 'Pick a stage'
		});
		if (!parsed.ok) return parsed.failure;
		return domainAction(() => setStage(user, event.params.id, parsed.data.to), 'stage');
	},
	photo: async (event) => {
		const user = requireRole(event, 'owner', 'sales', 'crew');
		await orHttp(() => jobFor(user, event.params.id));
		const file = (await event.request.formData()).get('photo');
		if (!(file instanceof File) || file.size === 0) {
			return fail(400, { form: 'photo', message: 'Choose a photo first' });
		}
		try {
			await addJobPhoto(user, event.params.id, file);
		} catch (e) {
			if (e instanceof PhotoError) return fail(400, { form: 'photo', message: e.message });
			if (e instanceof StorageUnavailableError) {
				return fail(503, {
					form: 'photo',
					message: 'Photo storage is out of reach; try again shortly.'
				});
			}
			throw e;
		}
		return { form: 'photo', saved: true };
	},
	changeOrder: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const result = parseDraft(await event.request.formData());
		if (!result.ok) {
			return fail(400, {
				form: 'changeOrder',
				values: result.values,
				errors: result.errors,
				message: 'Not saved: check the fields marked.'
			});
		}
		return domainAction(async () => {
			await createChangeOrder(event.params.id, result.draft, user);
			return { form: 'changeOrder', saved: true };
		}, 'changeOrder');
	},
	sendChangeOrder: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const parsed = await parseForm(event.request, sendChangeOrderSchema, {
			extra: { form: 'changeOrder' },
			message: true
		});
		if (!parsed.ok) return parsed.failure;
		return domainAction(async () => {
			// Refuses (404) a change order of another job: it is looked up by both ids.
			await sendChangeOrder(event.params.id, parsed.data.changeOrderId, user);
			return { form: 'changeOrder', sent: true };
		}, 'changeOrder');
	}
};
