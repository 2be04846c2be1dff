// Online payment: the homeowner's pay link, the hosted checkout the app asks the provider for
// (what was asked is kept, so the webhook can check amount and currency), and the one routine
// that turns a paid checkout into a payment, used by the webhook and by the return page.
import { and, desc, eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { db, type Tx } from '../platform/db';
import {
	checkoutRequests,
	contacts,
	estimates,
	jobs,
	payLinks,
	type Job
} from '../platform/db/schema';
import { newId, newToken, sha256 } from '../platform/crypto';
import { origin } from '../platform/env';
import { jobRef } from '../jobs/labels';
import { writeMail } from '../platform/outbox';
import { createCheckout, paymentsClient } from './provider';
import { CURRENCY, dispatchAll, insertPayment, jobMoney, lockJob, PaymentError } from './ledger';
import { officeAlertMail, payLinkMail } from './mail';
import { ensureInvoice } from './invoices';
import { formatCents } from '$lib/money';

/** A new private link for the homeowner (every link given out keeps working). */
export async function newPayLink(jobId: string, tx: Tx | typeof db = db): Promise<string> {
	const token = newToken();
	await tx.insert(payLinks).values({ id: newId(), jobId, tokenHash: sha256(token) });
	return token;
}

/** The job behind a homeowner's token: a pay link, or the accepted estimate's own link. */
export async function jobForToken(token: string): Promise<Job | null> {
	if (!token || token.length > 200) return null;
	const hash = sha256(token);
	const [viaLink] = await db
		.select({ job: jobs })
		.from(payLinks)
		.innerJoin(jobs, eq(jobs.id, payLinks.jobId))
		.where(eq(payLinks.tokenHash, hash));
	if (viaLink) return viaLink.job;
	const [viaEstimate] = await db
		.select({ job: jobs })
		.from(estimates)
		.innerJoin(jobs, eq(jobs.estimateId, estimates.id))
		.where(eq(estimates.tokenHash, hash));
	return viaEstimate?.job ?? null;
}

/** E-mails the homeowner a fresh pay link (the office's "send payment link"). */
export async function sendPayLink(jobId: string): Promise<string> {
	const outboxId = await db.transaction(async (tx) => {
		const job = await lockJob(tx, jobId);
		const [contact] = await tx.select().from(contacts).where(eq(contacts.id, job.contactId));
		if (!contact?.email) {
			throw new PaymentError('invalid', 'The homeowner has no e-mail address on file.');
		}
		const money = await jobMoney(job, tx);
		const token = await newPayLink(job.id, tx);
		return writeMail(
			{
				...(await payLinkMail(tx, {
					job,
					to: contact.email,
					name: contact.name,
					token,
					dueCents: money.due?.amountCents ?? 0
				})),
				dedupeKey: `pay-link:${sha256(token)}`,
				leadId: job.leadId
			},
			tx
		);
	});
	if (outboxId) await dispatchAll([outboxId]);
	return outboxId ?? '';
}

/**
 * Starts (or reuses) a hosted checkout for what is due now: the deposit after acceptance, the
 * balance after completion. Never asks for more than the balance.
 */
export async function startCheckout(token: string): Promise<string> {
	const job = await jobForToken(token);
	if (!job) throw new PaymentError('not_found', 'This payment link is not valid.');
	const money = await jobMoney(job);
	if (!money.due) throw new PaymentError('nothing_due', 'Nothing is due on this job right now.');
	const due = money.due;
	const [open] = await db
		.select()
		.from(checkoutRequests)
		.where(
			and(
				eq(checkoutRequests.jobId, job.id),
				eq(checkoutRequests.status, 'open'),
				eq(checkoutRequests.kind, due.kind)
			)
		)
		.orderBy(desc(checkoutRequests.createdAt))
		.limit(1);
	if (open && open.amountCents === due.amountCents && !open.problem) {
		const session = await paymentsClient().checkout.sessions.retrieve(open.providerSessionId);
		if (session.status === 'open' && session.url) return session.url;
	}
	await ensureInvoice(job.id, due.kind);
	const [contact] = await db.select().from(contacts).where(eq(contacts.id, job.contactId));
	const base = `${origin()}/pay/${encodeURIComponent(token)}`;
	const session = await createCheckout({
		amountCents: due.amountCents,
		currency: CURRENCY,
		description: `${due.kind === 'deposit' ? 'Deposit' : 'Balance'} for job ${jobRef(job.number)}: ${job.title}`,
		reference: job.id,
		email: contact?.email ?? undefined,
		successUrl: `${base}/receipt?session={CHECKOUT_SESSION_ID}`,
		cancelUrl: `${base}?cancelled=1`,
		metadata: { jobId: job.id, kind: due.kind }
	});
	await db.insert(checkoutRequests).values({
		id: newId(),
		jobId: job.id,
		kind: due.kind,
		amountCents: due.amountCents,
		currency: CURRENCY,
		providerSessionId: session.id,
		url: session.url
	});
	return session.url;
}

export type FulfilOutcome =
	| 'recorded'
	| 'recorded_over_balance'
	| 'duplicate_checkout'
	| 'unknown_checkout'
	| 'amount_mismatch'
	| 'not_paid';

/**
 * Records a paid checkout once, inside the caller's transaction: the request row is locked, the
 * amount and currency must equal what was asked, and the payment's checkout id is unique.
 */
export async function fulfilInTx(
	tx: Tx,
	session: Pick<
		Stripe.Checkout.Session,
		'id' | 'amount_total' | 'currency' | 'payment_status' | 'payment_intent'
	>,
	eventId: string | null
): Promise<{ outcome: FulfilOutcome; mails: string[] }> {
	const alert = async (subject: string, lines: string[]) => {
		const id = await writeMail(
			{
				...(await officeAlertMail(tx, subject, lines)),
				dedupeKey: `payments-alert:${subject}:${session.id}`
			},
			tx
		);
		return id ? [id] : [];
	};
	const [request] = await tx
		.select()
		.from(checkoutRequests)
		.where(eq(checkoutRequests.providerSessionId, session.id))
		.for('update');
	if (!request) {
		return {
			outcome: 'unknown_checkout',
			mails: await alert('a checkout we did not start', [
				`The provider reported checkout ${session.id} (${formatCents(session.amount_total ?? 0, session.currency ?? CURRENCY)}, event ${eventId ?? 'none'}), which Rillstone never started.`,
				'Nothing was recorded. Check the provider dashboard.'
			])
		};
	}
	if (session.payment_status !== 'paid') return { outcome: 'not_paid', mails: [] };
	if (request.status === 'paid') return { outcome: 'duplicate_checkout', mails: [] };
	const currency = (session.currency ?? '').toLowerCase();
	if (session.amount_total !== request.amountCents || currency !== request.currency) {
		const problem = `Asked ${formatCents(request.amountCents, request.currency)}, provider reported ${session.amount_total ?? 'no amount'} ${currency || '(no currency)'}`;
		await tx.update(checkoutRequests).set({ problem }).where(eq(checkoutRequests.id, request.id));
		return {
			outcome: 'amount_mismatch',
			mails: await alert('amount mismatch', [
				`Checkout ${session.id}: ${problem}. No payment was recorded; check the provider dashboard.`
			])
		};
	}
	const job = await lockJob(tx, request.jobId);
	const before = await jobMoney(job, tx);
	const result = await insertPayment(tx, job, {
		kind: request.kind,
		method: 'card',
		amountCents: request.amountCents,
		currency: request.currency,
		providerCheckoutId: session.id,
		reference:
			typeof session.payment_intent === 'string' ? session.payment_intent : (session.id ?? null)
	});
	await tx
		.update(checkoutRequests)
		.set({ status: 'paid' })
		.where(eq(checkoutRequests.id, request.id));
	if (!result.paymentId) return { outcome: 'duplicate_checkout', mails: [] };
	// The money was taken, so it is recorded as received; a payment larger than what was still
	// owed (say, a cheque arrived meanwhile) leaves a credit and tells the office to refund it.
	if (request.amountCents > before.balanceCents) {
		const extra = await alert('paid more than the balance', [
			`Job ${jobRef(job.number)}: ${formatCents(request.amountCents, CURRENCY)} was paid online while ${formatCents(Math.max(0, before.balanceCents), CURRENCY)} was owed.`,
			`Credit owed to the homeowner: ${formatCents(result.after.creditCents, CURRENCY)}. Record the refund under Payments.`
		]);
		return { outcome: 'recorded_over_balance', mails: [...result.mails, ...extra] };
	}
	return { outcome: 'recorded', mails: result.mails };
}

/** The return page: asks the provider about the checkout and records it if the webhook has not. */
export async function confirmReturn(token: string, sessionId: string) {
	const job = await jobForToken(token);
	if (!job) return null;
	const [request] = await db
		.select()
		.from(checkoutRequests)
		.where(
			and(eq(checkoutRequests.providerSessionId, sessionId), eq(checkoutRequests.jobId, job.id))
		);
	if (!request) return { job, request: null, outcome: 'unknown_checkout' as const };
	let outcome: FulfilOutcome | 'open' = request.status === 'paid' ? 'duplicate_checkout' : 'open';
	if (request.status === 'open') {
		const session = await paymentsClient().checkout.sessions.retrieve(sessionId);
		if (session.status === 'complete') {
			const done = await db.transaction((tx) => fulfilInTx(tx, session, null));
			await dispatchAll(done.mails);
			outcome = done.outcome;
		}
	}
	const [fresh] = await db
		.select()
		.from(checkoutRequests)
		.where(eq(checkoutRequests.id, request.id));
	return { job, request: fresh, outcome };
}

export async function expireInTx(tx: Tx, sessionId: string) {
	const updated = await tx
		.update(checkoutRequests)
		.set({ status: 'expired' })
		.where(
			and(eq(checkoutRequests.providerSessionId, sessionId), eq(checkoutRequests.status, 'open'))
		)
		.returning({ id: checkoutRequests.id });
	return updated.length > 0;
}
