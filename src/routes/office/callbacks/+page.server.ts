import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole } from '$lib/server/auth/access';
import { domainAction as jobAction } from '$lib/server/http/domain';
import { finishedJobs, listCallbacks, sendCallbackLink } from '$lib/server/callbacks/callbacks';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales', 'crew');
	const [list, jobs] = await Promise.all([
		listCallbacks(user),
		user.role === 'crew' ? Promise.resolve([]) : finishedJobs()
	]);
	return { callbacks: list, jobs };
};

export const actions: Actions = {
	/** E-mails a homeowner a fresh problem-report link for a finished job. */
	link: async (event) => {
		requireRole(event, 'owner', 'sales');
		const parsed = z
			.object({ jobId: z.string().min(1, 'Pick a finished job') })
			.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { form: 'link', message: 'Pick a finished job' });
		return jobAction(async () => {
			await sendCallbackLink(parsed.data.jobId);
			return { form: 'link', sent: true };
		}, 'link');
	}
};
