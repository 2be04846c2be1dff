import { z } from 'zod';
import {
	changeOrderDraftSchema,
	punchSchema,
	scheduleSchema,
	sendChangeOrderSchema
} from '$lib/schema/jobs';
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
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { parseForm } from '$lib/server/platform/forms';
import { photoUpload } from '$lib/server/http/photo-upload';

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

/**
 * The draft form's fields as the schema reads them: its rows `lines.N.input` as an array in row
 * order, so each message comes back keyed by the input it is about (`lines.1.quantity`).
 */
function draftInput(form: FormData) {
	const lines: Record<string, string>[] = [];
	for (const [key, value] of form) {
		const m = /^lines\.(\d{1,2})\.(\w+)$/.exec(key);
		if (m && typeof value === 'string') (lines[Number(m[1])] ??= {})[m[2]] = value;
	}
	return {
		title: String(form.get('title') ?? ''),
		note: String(form.get('note') ?? ''),
		lines: Array.from(lines, (row) => row ?? {})
	};
}

/** Ticks a material line ordered or picked (or clears it). */
async function materialFlag(
	event: RequestEvent,
	flag: 'ordered' | 'picked',
	user: ReturnType<typeof requireRole>
) {
	const parsed = await parseForm(event.request, idSchema, {
		extra: { form: 'materials' },
		message: 'Pick a material'
	});
	if (!parsed.ok) return parsed.failure;
	return domainAction(async () => {
		await setMaterialFlag(user, event.params.id, parsed.data.itemId, flag, parsed.data.on === '1');
	}, 'materials');
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
	ordered: (event) => materialFlag(event, 'ordered', requireRole(event, 'owner', 'sales')),
	picked: (event) => materialFlag(event, 'picked', requireRole(event, 'owner', 'sales', 'crew')),
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
		return photoUpload(file, (f) => addJobPhoto(user, event.params.id, f));
	},
	changeOrder: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const parsed = await parseForm(event.request, changeOrderDraftSchema, {
			extra: { form: 'changeOrder' },
			read: draftInput,
			message: 'Not saved: check the fields marked.'
		});
		if (!parsed.ok) return parsed.failure;
		return domainAction(async () => {
			await createChangeOrder(event.params.id, parsed.data, user);
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
