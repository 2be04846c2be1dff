// The public care sign-up: server-rendered (it has a form), never prerendered.
import { fail, redirect } from '@sveltejs/kit';
import { listedFeatures, publicSignUpSchema } from '$lib/schema/care';
import { CareError } from '$lib/server/care/db';
import { clientAddress } from '$lib/server/care/http';
import { publicPlans, publicSignUp, SignUpFieldError } from '$lib/server/care/public';
import { startPlanCheckout } from '$lib/server/care/plan-checkout';
import { minutes, SharedRateLimiter } from '$lib/server/platform/rate-limit';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

export const prerender = false;

// Each sign-up writes a contact and a property: a few an hour from one address is plenty
// (common practice, no source).
const signUpLimiter = new SharedRateLimiter('care-signup', [
	{ hits: 6, windowMs: minutes(15) },
	{ hits: 30, windowMs: minutes(24 * 60) }
]);

export const load: PageServerLoad = async () => ({ plans: await publicPlans() });

/** The form's text fields, to refill it after a refusal. */
function typed(data: FormData): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [k, v] of data) if (typeof v === 'string' && k !== 'accept') out[k] = v.slice(0, 400);
	return out;
}

export const actions: Actions = {
	// Without JavaScript the prices are worked out here: the form comes back with them filled in.
	price: async ({ request }) => ({ form: 'price', values: typed(await request.formData()) }),
	signUp: async (event) => {
		const data = await event.request.formData();
		const values = typed(data);
		const parsed = await parseForm(data, publicSignUpSchema, { extra: { form: 'signUp' } });
		// The refill is the typed fields cut to length, as the price step sends them back.
		if (!parsed.ok) return fail(400, { ...parsed.failure.data, values });
		if (await signUpLimiter.isLimited(event)) {
			return fail(429, {
				form: 'signUp',
				errors: {},
				values,
				message:
					'Several sign-ups came from your address just now. Please wait a few minutes, or call us.'
			});
		}
		const input = { ...parsed.data, features: listedFeatures(parsed.data) };
		let outcome;
		try {
			outcome = await publicSignUp(input, clientAddress(event));
		} catch (e) {
			if (e instanceof SignUpFieldError) {
				return fail(400, { form: 'signUp', errors: { [e.field]: e.message }, values });
			}
			if (e instanceof CareError) {
				return fail(409, { form: 'signUp', errors: {}, values, message: e.message });
			}
			throw e;
		}
		if (outcome.kind === 'mailed') return { form: 'signUp', mailed: parsed.data.email };
		if (outcome.billing === 'visit') redirect(303, `/care/${outcome.token}?welcome=1`);
		let checkoutUrl: string;
		try {
			checkoutUrl = await startPlanCheckout(outcome.propertyId, outcome.token);
		} catch (e) {
			// Signed up but not paid: their private page shows the plan waiting, with a pay button.
			console.error('[care] public checkout', e);
			redirect(303, `/care/${outcome.token}`);
		}
		redirect(303, checkoutUrl);
	}
};
