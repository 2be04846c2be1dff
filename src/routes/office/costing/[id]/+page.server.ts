import { z } from 'zod';
import { jobCostSchema, usageSchema } from '$lib/schema/costing';
import { requireRole } from '$lib/server/auth/access';
import { domainAction as jobAction, orHttp } from '$lib/server/http/domain';
import { jobFor } from '$lib/server/jobs/read';
import { jobRef } from '$lib/server/jobs/labels';
import { firmToday } from '$lib/server/platform/settings';
import { costingOf } from '$lib/server/costing/report';
import { addJobCost, removeJobCost, saveUsage } from '$lib/server/costing/materials';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner');
	const job = await orHttp(() => jobFor(user, event.params.id));
	const [report, today] = await Promise.all([costingOf(job), firmToday()]);
	return {
		job: { id: job.id, ref: jobRef(job.number), title: job.title, stage: job.stage },
		...report,
		today
	};
};

export const actions: Actions = {
	usage: async (event) => {
		const user = requireRole(event, 'owner');
		const data = await event.request.formData();
		const parsed = await parseForm(data, usageSchema, {
			extra: { form: 'usage', materialId: String(data.get('materialId') ?? '') }
		});
		if (!parsed.ok) return parsed.failure;
		return jobAction(async () => {
			await saveUsage(user, event.params.id, parsed.data);
			return { form: 'usage', materialId: parsed.data.materialId, saved: true };
		}, 'usage');
	},
	cost: async (event) => {
		const user = requireRole(event, 'owner');
		const data = await event.request.formData();
		const parsed = await parseForm(data, jobCostSchema, { extra: { form: 'cost' } });
		if (!parsed.ok) return parsed.failure;
		return jobAction(async () => {
			await addJobCost(user, event.params.id, parsed.data);
			return { form: 'cost', saved: true };
		}, 'cost');
	},
	removeCost: async (event) => {
		const user = requireRole(event, 'owner');
		const parsed = await parseForm(event.request, z.object({ costId: z.string().min(1) }), {
			extra: { form: 'cost' },
			message: 'Pick a cost'
		});
		if (!parsed.ok) return parsed.failure;
		return jobAction(() => removeJobCost(user, event.params.id, parsed.data.costId), 'cost');
	}
};
