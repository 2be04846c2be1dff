// The care link pages' "pay by card" step: on to the payment provider's page, or back to the form
// with why not (the plan or visit refuses, or the provider did not answer; nothing was charged).
import { fail, redirect } from '@sveltejs/kit';
import { CareError } from '$lib/server/care/db';

export async function toCheckout(start: () => Promise<string>, what: string) {
	let url: string;
	try {
		url = await start();
	} catch (e) {
		if (e instanceof CareError) return fail(409, { form: 'pay', message: e.message });
		console.error(`[care] ${what}`, e);
		return fail(503, {
			form: 'pay',
			message:
				'The payment service did not answer. Nothing was charged; please try again in a minute.'
		});
	}
	redirect(303, url);
}
