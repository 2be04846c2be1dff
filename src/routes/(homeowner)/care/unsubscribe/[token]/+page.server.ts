import { error } from '@sveltejs/kit';
import { careJobForToken, unsubscribeCare } from '$lib/server/care/reminders';
import type { Actions, PageServerLoad } from './$types';

// The GET only asks; the POST unsubscribes, so a mail scanner following links changes nothing.
export const load: PageServerLoad = async ({ params }) => {
	const job = await careJobForToken(params.token);
	if (!job) error(404, 'This link is not valid.');
	return { title: job.title, optedOut: Boolean(job.optedOut) };
};

export const actions: Actions = {
	default: async ({ params }) => {
		if (!(await unsubscribeCare(params.token))) error(404, 'This link is not valid.');
		return { done: true };
	}
};
