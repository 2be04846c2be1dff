import { error, fail, redirect } from '@sveltejs/kit';
import { jobForToken, startCheckout } from '$lib/server/payments/checkout';
import { PaymentError } from '$lib/server/payments/ledger';
import { homeownerView } from '$lib/server/payments/views';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url }) => {
	const job = await jobForToken(params.token);
	if (!job) error(404, 'This payment link is not valid.');
	return {
		view: await homeownerView(job),
		cancelled: url.searchParams.get('cancelled') === '1',
		token: params.token
	};
};

export const actions: Actions = {
	default: async ({ params }) => {
		let url: string;
		try {
			url = await startCheckout(params.token);
		} catch (e) {
			if (e instanceof PaymentError) {
				return fail(e.code === 'not_found' ? 404 : 409, { message: e.message });
			}
			console.error('[payments] checkout', e);
			return fail(503, {
				message:
					'The payment service did not answer. Nothing was charged; please try again in a minute.'
			});
		}
		redirect(303, url);
	}
};
