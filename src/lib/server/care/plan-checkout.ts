// Paying a care plan's year by card through the payment provider (as for deposits): the checkout
// for the first year or the renewal, its fulfilment in the webhook's transaction, and the return
// page's own check with the provider.
import { and, desc, eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { db } from '../platform/db';
import { careCheckouts, careSubscriptions, serviceVisits } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { origin } from '../platform/env';
import { firmSettings } from '../platform/settings';
import { CURRENCY, dispatchAll } from '../payments/ledger';
import { createCheckout, paymentsClient } from '../payments/provider';
import { CareError, dayIn, plusYear, type Tx } from './db';
import { propertyRecord } from './features';
import { planById } from './plans';
import { dayText } from './mail';
import { addDays } from '$lib/scheduling/zone';
import { currentSubscription, renewalDue, welcomeMail } from './subscriptions';
import { queueRenewal } from './renewal';

/** Starts (or reuses) the provider checkout for the year ahead: the first year, or the renewal. */
export async function startPlanCheckout(propertyId: string, token: string): Promise<string> {
	const s = await currentSubscription(propertyId);
	if (!s || s.billing !== 'year') throw new CareError('invalid', 'Nothing is due on this plan.');
	const firm = await firmSettings();
	const renewing = s.status === 'active';
	if (renewing && !renewalDue(s, dayIn(firm.timeZone))) {
		throw new CareError('invalid', 'This year is paid.');
	}
	const coversThrough = addDays(renewing ? plusYear(s.renewsOn) : s.renewsOn, -1);
	const [open] = await db
		.select()
		.from(careCheckouts)
		.where(
			and(
				eq(careCheckouts.subscriptionId, s.id),
				eq(careCheckouts.status, 'open'),
				eq(careCheckouts.coversThrough, coversThrough)
			)
		)
		.orderBy(desc(careCheckouts.createdAt))
		.limit(1);
	if (open && open.amountCents === s.yearCents) {
		const session = await paymentsClient().checkout.sessions.retrieve(open.providerSessionId);
		if (session.status === 'open' && session.url) return session.url;
	}
	const plan = await planById(s.planId);
	const record = await propertyRecord(propertyId);
	const base = `${origin()}/care/${encodeURIComponent(token)}`;
	const session = await createCheckout({
		amountCents: s.yearCents,
		currency: CURRENCY,
		description: `${plan.name}, a year of care to ${dayText(coversThrough)}`,
		reference: s.id,
		email: record.contact.email ?? undefined,
		successUrl: `${base}/paid?session={CHECKOUT_SESSION_ID}`,
		cancelUrl: `${base}?cancelled=1`,
		metadata: { careSubscriptionId: s.id }
	});
	await db.insert(careCheckouts).values({
		id: newId(),
		subscriptionId: s.id,
		coversThrough,
		amountCents: s.yearCents,
		currency: CURRENCY,
		providerSessionId: session.id,
		url: session.url
	});
	return session.url;
}

type PaidSession = Pick<
	Stripe.Checkout.Session,
	'id' | 'amount_total' | 'currency' | 'payment_status'
>;

/**
 * Records a paid care checkout once, in the webhook's (or the return page's) transaction.
 * Returns null when the checkout is not one of care's, so the job payments take it.
 */
export async function fulfilCareInTx(
	tx: Tx,
	session: PaidSession
): Promise<{ outcome: string; mails: string[]; after: (() => Promise<void>)[] } | null> {
	const [request] = await tx
		.select()
		.from(careCheckouts)
		.where(eq(careCheckouts.providerSessionId, session.id))
		.for('update');
	if (!request) return null;
	if (session.payment_status !== 'paid') return { outcome: 'not_paid', mails: [], after: [] };
	if (request.status === 'paid') return { outcome: 'duplicate_checkout', mails: [], after: [] };
	if (
		session.amount_total !== request.amountCents ||
		(session.currency ?? '').toLowerCase() !== request.currency
	) {
		await tx
			.update(careCheckouts)
			.set({ problem: `Asked ${request.amountCents}, provider reported ${session.amount_total}` })
			.where(eq(careCheckouts.id, request.id));
		return { outcome: 'amount_mismatch', mails: [], after: [] };
	}
	await tx
		.update(careCheckouts)
		.set({ status: 'paid', paidAt: new Date() })
		.where(eq(careCheckouts.id, request.id));
	if (request.serviceVisitId) {
		await tx
			.update(serviceVisits)
			.set({ paidAt: new Date() })
			.where(eq(serviceVisits.id, request.serviceVisitId));
		return { outcome: 'recorded', mails: [], after: [] };
	}
	const [s] = await tx
		.select()
		.from(careSubscriptions)
		.where(eq(careSubscriptions.id, request.subscriptionId!))
		.for('update');
	const wasPending = s.status === 'pending';
	const [updated] = await tx
		.update(careSubscriptions)
		.set({
			status: s.status === 'cancelled' ? 'cancelled' : 'active',
			paidThrough: request.coversThrough
		})
		.where(eq(careSubscriptions.id, s.id))
		.returning();
	const mails = wasPending ? await welcomeMail(tx, updated) : [];
	return {
		outcome: 'recorded',
		mails,
		after: wasPending ? [() => queueRenewal(updated)] : []
	};
}

/** The return page: asks the provider and records the payment if the webhook has not yet. */
export async function confirmCareReturn(
	sessionId: string,
	owner: { subscriptionId?: string; serviceVisitId?: string }
) {
	const [request] = await db
		.select()
		.from(careCheckouts)
		.where(
			and(
				eq(careCheckouts.providerSessionId, sessionId),
				owner.subscriptionId
					? eq(careCheckouts.subscriptionId, owner.subscriptionId)
					: eq(careCheckouts.serviceVisitId, owner.serviceVisitId ?? '')
			)
		);
	if (!request) return null;
	if (request.status === 'open') {
		const session = await paymentsClient().checkout.sessions.retrieve(sessionId);
		if (session.status === 'complete') {
			const done = await db.transaction((tx) => fulfilCareInTx(tx, session));
			if (done) {
				await dispatchAll(done.mails);
				for (const run of done.after) await run();
			}
		}
	}
	const [fresh] = await db.select().from(careCheckouts).where(eq(careCheckouts.id, request.id));
	return fresh;
}
