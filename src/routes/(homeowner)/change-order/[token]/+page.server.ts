import { error, fail } from '@sveltejs/kit';
import { decisionSchema } from '$lib/schema/jobs';
import {
	changeOrderForHomeowner,
	decideChangeOrder,
	DecisionError
} from '$lib/server/jobs/change-orders';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

export const load: PageServerLoad = async ({ params }) => {
	const co = await changeOrderForHomeowner(params.token);
	if (!co) error(404, 'This link is not valid. Ask us for a fresh one.');
	return { co };
};

export const actions: Actions = {
	default: async (event) => {
		const parsed = await parseForm(event.request, decisionSchema);
		if (!parsed.ok) return parsed.failure;
		try {
			const status = await decideChangeOrder(event.params.token, parsed.data, {
				ipAddress: event.getClientAddress(),
				userAgent: event.request.headers.get('user-agent')
			});
			return { decided: status };
		} catch (e) {
			if (e instanceof DecisionError) return fail(409, { errors: { _form: e.message } });
			throw e;
		}
	}
};
