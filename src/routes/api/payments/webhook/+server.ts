// Public: the payment provider calls this. Trust comes from the signature, checked with the
// provider's SDK on the raw body (see $lib/server/payments/webhook.ts).
import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { handleWebhook } from '$lib/server/payments/webhook';

export const POST: RequestHandler = async ({ request }) => {
	const answer = await handleWebhook(await request.text(), request.headers.get('stripe-signature'));
	return json(answer.body, { status: answer.status });
};
