import { error } from '@sveltejs/kit';
import { confirmCareReturn } from '$lib/server/care/plan-checkout';
import { visitForLink } from '$lib/server/care/service';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url }) => {
	const sessionId = url.searchParams.get('session') ?? '';
	if (!/^cs_[A-Za-z0-9_]{1,200}$/.test(sessionId)) error(404, 'There is no such payment.');
	const v = await visitForLink(params.token);
	if (!v) error(404, 'This link does not open a visit.');
	const checkout = await confirmCareReturn(sessionId, { serviceVisitId: v.id }).catch((e) => {
		console.error('[care] visit return', e);
		return 'unreachable' as const;
	});
	if (checkout === null) error(404, 'There is no such payment for this visit.');
	return {
		token: params.token,
		paid: checkout !== 'unreachable' && checkout.status === 'paid',
		amountCents: checkout === 'unreachable' ? 0 : checkout.amountCents
	};
};
