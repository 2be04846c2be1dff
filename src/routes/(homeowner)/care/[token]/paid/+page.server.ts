import { error } from '@sveltejs/kit';
import { confirmCareReturn } from '$lib/server/care/plan-checkout';
import { subscriptionForLink } from '$lib/server/care/subscriptions';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url }) => {
	const sessionId = url.searchParams.get('session') ?? '';
	if (!/^cs_[A-Za-z0-9_]{1,200}$/.test(sessionId)) error(404, 'There is no such payment.');
	const found = await subscriptionForLink(params.token);
	if (!found?.subscription) error(404, 'This link does not open a care plan.');
	const checkout = await confirmCareReturn(sessionId, {
		subscriptionId: found.subscription.id
	}).catch((e) => {
		console.error('[care] return', e);
		return 'unreachable' as const;
	});
	if (checkout === null) error(404, 'There is no such payment for this plan.');
	return {
		token: params.token,
		paid: checkout !== 'unreachable' && checkout.status === 'paid',
		amountCents: checkout === 'unreachable' ? 0 : checkout.amountCents
	};
};
