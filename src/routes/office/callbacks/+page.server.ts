import { z } from 'zod';
import { requireRole } from '$lib/server/auth/access';
import { domainAction as jobAction } from '$lib/server/http/domain';
import { finishedJobs, listCallbacks, sendCallbackLink } from '$lib/server/callbacks/callbacks';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

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
		const parsed = await parseForm(
			event.request,
			z.object({ jobId: z.string().min(1, 'Pick a finished job') }),
			{
				extra: { form: 'link' },
				message: 'Pick a finished job'
			}
		);
		if (!parsed.ok) return parsed.failure;
		return jobAction(async () => {
			await sendCallbackLink(parsed.data.jobId);
			return { form: 'link', sent: true };
		}, 'link');
	}
};
