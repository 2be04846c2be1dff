import { error } from '@sveltejs/kit';
import { confirmReturn } from '$lib/server/payments/checkout';
import { homeownerView } from '$lib/server/payments/views';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url }) => {
	const sessionId = url.searchParams.get('session') ?? '';
	if (!/^cs_[A-Za-z0-9_]{1,200}$/.test(sessionId)) error(404, 'There is no such payment.');
	const back = await confirmReturn(params.token, sessionId).catch((e) => {
		console.error('[payments] return', e);
		return 'unreachable' as const;
	});
	if (back === null) error(404, 'This payment link is not valid.');
	if (back === 'unreachable') {
		return { token: params.token, state: 'pending' as const, amountCents: 0, view: null };
	}
	if (!back.request) error(404, 'There is no such payment for this job.');
	return {
		token: params.token,
		state: back.request.status === 'paid' ? ('paid' as const) : ('pending' as const),
		amountCents: back.request.amountCents,
		view: await homeownerView(back.job)
	};
};
