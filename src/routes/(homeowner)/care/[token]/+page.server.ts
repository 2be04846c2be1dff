import { error, fail } from '@sveltejs/kit';
import { signUpSchema } from '$lib/schema/care';
import { careLink } from '$lib/server/care/links';
import { domainAction } from '$lib/server/http/domain';
import { clientAddress } from '$lib/server/care/http';
import { cancelPlan, homeownerCare, signUp } from '$lib/server/care/subscriptions';
import { startPlanCheckout } from '$lib/server/care/plan-checkout';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';
import { toCheckout } from '../checkout';

const NOT_FOUND = 'This link does not open a care plan. Ask us for a new one.';

async function propertyOf(token: string): Promise<string> {
	const link = await careLink(token);
	if (!link || link.serviceVisitId) error(404, NOT_FOUND);
	return link.propertyId;
}

export const load: PageServerLoad = async ({ params, url }) => {
	const propertyId = await propertyOf(params.token);
	return {
		care: await homeownerCare(propertyId),
		cancelled: url.searchParams.get('cancelled') === '1',
		welcome: url.searchParams.get('welcome') === '1'
	};
};

const checkout = (propertyId: string, token: string) =>
	toCheckout(() => startPlanCheckout(propertyId, token), 'checkout');

export const actions: Actions = {
	signUp: async (event) => {
		const propertyId = await propertyOf(event.params.token);
		const parsed = await parseForm(event.request, signUpSchema, { extra: { form: 'signUp' } });
		if (!parsed.ok) return parsed.failure;
		const done = await domainAction(
			() =>
				signUp(propertyId, {
					planId: parsed.data.planId,
					billing: parsed.data.billing,
					typedName: parsed.data.typedName,
					ipAddress: clientAddress(event)
				}),
			'signUp'
		);
		if (!('billing' in done)) return done;
		if (done.billing === 'year') return checkout(propertyId, event.params.token);
		return { signedUp: true };
	},
	pay: async (event) => {
		const propertyId = await propertyOf(event.params.token);
		return checkout(propertyId, event.params.token);
	},
	cancel: async (event) => {
		const propertyId = await propertyOf(event.params.token);
		const data = await event.request.formData();
		if (data.get('confirm') !== 'on') {
			return fail(400, { form: 'cancel', message: 'Tick the box to confirm you want to cancel.' });
		}
		await cancelPlan(propertyId);
		return { cancelledPlan: true };
	}
};
