// The provider's webhook: verified with the SDK (a missing or bad signature answers 400 and
// records nothing), each event handled once (its id is inserted first, in the same transaction
// as everything it causes), checkouts recorded through fulfilInTx. Anything that throws rolls
// the whole event back and answers 500, so the provider sends it again.
import { eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { db } from '../platform/db';
import { paymentEvents } from '../platform/db/schema';
import { verifyWebhook } from './provider';
import { expireInTx, fulfilInTx } from './checkout';
import { dispatchAll } from './ledger';
import { fulfilCareInTx } from '../care/plan-checkout';

export interface WebhookAnswer {
	status: number;
	body: { received: boolean; outcome?: string; error?: string };
}

export async function handleWebhook(
	rawBody: string,
	signature: string | null
): Promise<WebhookAnswer> {
	let event: Stripe.Event;
	try {
		event = verifyWebhook(rawBody, signature);
	} catch {
		return { status: 400, body: { received: false, error: 'invalid signature' } };
	}
	const session = event.type.startsWith('checkout.session.')
		? (event.data.object as Stripe.Checkout.Session)
		: null;
	const done = await db.transaction(async (tx) => {
		const first = await tx
			.insert(paymentEvents)
			.values({
				eventId: event.id,
				type: event.type,
				providerSessionId: session?.id ?? null,
				outcome: 'pending'
			})
			.onConflictDoNothing()
			.returning({ id: paymentEvents.eventId });
		if (!first.length) return { outcome: 'duplicate_event', mails: [] as string[] };
		let result: { outcome: string; mails: string[]; after?: (() => Promise<void>)[] } = {
			outcome: 'ignored',
			mails: []
		};
		if (
			session &&
			(event.type === 'checkout.session.completed' ||
				event.type === 'checkout.session.async_payment_succeeded')
		) {
			// A care plan's or a service visit's checkout is care's own; the rest are job payments.
			result = (await fulfilCareInTx(tx, session)) ?? (await fulfilInTx(tx, session, event.id));
		} else if (session && event.type === 'checkout.session.expired') {
			result = { outcome: (await expireInTx(tx, session.id)) ? 'expired' : 'ignored', mails: [] };
		}
		await tx
			.update(paymentEvents)
			.set({ outcome: result.outcome })
			.where(eq(paymentEvents.eventId, event.id));
		return result;
	});
	await dispatchAll(done.mails);
	for (const run of 'after' in done ? (done.after ?? []) : []) await run();
	return { status: 200, body: { received: true, outcome: done.outcome } };
}
