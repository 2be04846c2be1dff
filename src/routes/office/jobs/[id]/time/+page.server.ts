import { fail } from '@sveltejs/kit';
import { timeFormSchema } from '$lib/schema/costing';
import { requireRole } from '$lib/server/auth/access';
import { orHttp } from '$lib/server/http/domain';
import { jobFor } from '$lib/server/jobs/read';
import { jobRef } from '$lib/server/jobs/labels';
import { firmToday } from '$lib/server/platform/settings';
import { ensureJobTasks } from '$lib/server/costing/tasks';
import { recordTimeEntries, timeEntriesOf } from '$lib/server/costing/time';
import { newToken } from '$lib/server/platform/crypto';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales', 'crew');
	const job = await orHttp(() => jobFor(user, event.params.id));
	const [tasks, entries, today] = await Promise.all([
		ensureJobTasks(job),
		timeEntriesOf(job.id),
		firmToday()
	]);
	return {
		job: { id: job.id, ref: jobRef(job.number), title: job.title },
		// Hours only: a crew phone never receives a price or a cost.
		tasks: tasks.map((t) => ({ id: t.id, name: t.name, estimatedHours: t.estimatedHours })),
		entries: entries.map(({ clientKey: _k, ...e }) => e),
		today,
		person: user.name,
		// For the form without JavaScript: a key per page view, so a resent post stores once.
		formKey: newToken().replace(/_/g, '-')
	};
};

export const actions: Actions = {
	/** Without JavaScript the form posts here; with it, the phone queues and sends to the API. */
	add: async (event) => {
		const user = requireRole(event, 'owner', 'sales', 'crew');
		const data = await event.request.formData();
		const parsed = await parseForm(data, timeFormSchema);
		if (!parsed.ok) return parsed.failure;
		const { values } = parsed;
		const f = parsed.data;
		const isNew = f.task === 'new';
		if (isNew && !f.newTask) {
			return fail(400, { values, errors: { newTask: 'Name the new task' } });
		}
		const result = await orHttp(() =>
			recordTimeEntries(user, event.params.id, [
				{
					clientKey: String(data.get('clientKey') ?? ''),
					taskId: isNew ? null : f.task,
					newTask: isNew ? f.newTask : null,
					person: f.person,
					workDate: f.workDate,
					minutes: f.hours,
					note: f.note
				}
			])
		);
		if (result.refused.length) {
			return fail(400, { values, errors: { task: result.refused[0].message } });
		}
		return { saved: true };
	}
};
