// The money side of a job: what was received (card, cheque, cash, transfer; refunds negative),
// what is due now, and what a payment changes (the deposit makes the job ready to schedule;
// the balance paid on a complete job moves it to paid). Every write locks the job row first,
// so two payments recorded at once cannot both pass the balance check.
import { DomainError } from '../platform/errors';
import { asc, desc, eq } from 'drizzle-orm';
import { db, type Db, type Tx } from '../platform/db';
import {
	contacts,
	jobs,
	payments,
	type Job,
	type PaymentKind,
	type PaymentMethod
} from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { firmToday } from '../platform/settings';
import { addActivity } from '../leads/timeline';
import { jobBalance, paymentsReceivedCents } from './balance';
import { jobRef } from '../jobs/labels';
import { writeMail, dispatchMail } from '../platform/outbox';
import { receiptMail } from './mail';
import type { SessionUser } from '../auth/sessions';
import { formatCents } from '$lib/money';

export const CURRENCY = (process.env.PAYMENTS_CURRENCY ?? 'usd').toLowerCase();
/** Days after acceptance (deposit) or completion (balance) before a payment counts as overdue. */
export const DEPOSIT_TERMS_DAYS = 7;
export const FINAL_TERMS_DAYS = 14;

export class PaymentError extends DomainError<
	'not_found' | 'over_balance' | 'over_refund' | 'nothing_due' | 'duplicate_reference' | 'invalid'
> {}

export type Due = { kind: 'deposit' | 'final'; amountCents: number } | null;

/** The balance (from jobBalance: total + approved change orders − payments) and what is due now. */
export async function jobMoney(job: Job, tx: Db = db) {
	const balance = await jobBalance(job.id, tx);
	const depositOutstandingCents = Math.max(
		0,
		Math.min(job.depositDueCents - balance.paidCents, balance.balanceCents)
	);
	const finished = job.stage === 'complete' || job.stage === 'paid';
	let due: Due = null;
	if (finished && balance.balanceCents > 0) {
		due = { kind: 'final', amountCents: balance.balanceCents };
	} else if (!finished && depositOutstandingCents > 0) {
		due = { kind: 'deposit', amountCents: depositOutstandingCents };
	}
	return {
		...balance,
		depositOutstandingCents,
		readyToSchedule: depositOutstandingCents === 0,
		creditCents: Math.max(0, -balance.balanceCents),
		due
	};
}

export type JobMoney = Awaited<ReturnType<typeof jobMoney>>;

export async function lockJob(tx: Tx, jobId: string): Promise<Job> {
	const [job] = await tx.select().from(jobs).where(eq(jobs.id, jobId)).for('update');
	if (!job) throw new PaymentError('not_found', 'There is no such job.');
	return job;
}

export interface NewPayment {
	kind: PaymentKind;
	method: PaymentMethod;
	amountCents: number;
	currency?: string;
	providerCheckoutId?: string | null;
	reference?: string | null;
	receivedOn?: string;
	reason?: string | null;
	note?: string;
	recordedBy?: string | null;
}

/**
 * Inserts a payment on a locked job and applies what it changes. Returns the payment id (null
 * when the provider checkout was already recorded) and the outbox ids to dispatch after commit.
 */
export async function insertPayment(tx: Tx, job: Job, p: NewPayment) {
	const before = await jobMoney(job, tx);
	const id = newId();
	const inserted = await tx
		.insert(payments)
		.values({
			id,
			jobId: job.id,
			kind: p.kind,
			method: p.method,
			amountCents: p.amountCents,
			currency: p.currency ?? CURRENCY,
			providerCheckoutId: p.providerCheckoutId ?? null,
			reference: p.reference || null,
			receivedOn: p.receivedOn ?? (await firmToday(tx)),
			reason: p.reason ?? null,
			note: p.note ?? '',
			recordedBy: p.recordedBy ?? null
		})
		.onConflictDoNothing()
		.returning({ id: payments.id });
	if (!inserted.length) return { paymentId: null, mails: [] as string[], after: before };
	const after = await jobMoney(job, tx);
	const how = p.method.replace('_', ' ');
	await addActivity(
		tx,
		job.leadId,
		p.amountCents < 0 ? 'payment.refund' : 'payment.received',
		p.amountCents < 0
			? `Refund of ${formatCents(-p.amountCents, CURRENCY)} on ${jobRef(job.number)} (${how}): ${p.reason}`
			: `${formatCents(p.amountCents, CURRENCY)} received on ${jobRef(job.number)} (${p.kind}, ${how}${p.reference ? ` ${p.reference}` : ''}); balance ${formatCents(after.balanceCents, CURRENCY)}`,
		p.recordedBy ?? null,
		{ jobId: job.id, paymentId: id, amountCents: p.amountCents }
	);
	if (before.depositOutstandingCents > 0 && after.depositOutstandingCents === 0) {
		await addActivity(
			tx,
			job.leadId,
			'payment.deposit_paid',
			`Deposit paid on ${jobRef(job.number)}: ready to schedule`,
			p.recordedBy ?? null,
			{ jobId: job.id }
		);
	}
	if (job.stage === 'complete' && after.balanceCents <= 0) {
		await tx.update(jobs).set({ stage: 'paid', paidAt: new Date() }).where(eq(jobs.id, job.id));
		await addActivity(
			tx,
			job.leadId,
			'job.stage',
			`Job ${jobRef(job.number)}: Complete → Paid (balance settled)`,
			p.recordedBy ?? null,
			{ jobId: job.id, from: 'complete', to: 'paid' }
		);
	}
	const mails: string[] = [];
	const [contact] = await tx.select().from(contacts).where(eq(contacts.id, job.contactId));
	if (contact?.email) {
		const outboxId = await writeMail(
			{
				...(await receiptMail(tx, {
					job,
					to: contact.email,
					name: contact.name,
					amountCents: p.amountCents,
					method: p.method,
					reference: p.reference ?? null,
					balanceCents: after.balanceCents,
					reason: p.reason ?? null
				})),
				dedupeKey: `payment-receipt:${id}`,
				leadId: job.leadId
			},
			tx
		);
		if (outboxId) mails.push(outboxId);
	}
	return { paymentId: id, mails, after };
}

export async function dispatchAll(ids: string[]): Promise<void> {
	for (const id of ids) await dispatchMail(id);
}

export interface HandPayment {
	kind: 'deposit' | 'progress' | 'final';
	method: Exclude<PaymentMethod, 'card'>;
	amountCents: number;
	reference: string;
	receivedOn: string;
	note: string;
}

/** The owner records a cheque, cash or a bank transfer; never more than the balance owed. */
export async function recordHandPayment(jobId: string, input: HandPayment, actor: SessionUser) {
	const done = await db.transaction(async (tx) => {
		const job = await lockJob(tx, jobId);
		const money = await jobMoney(job, tx);
		if (input.amountCents > money.balanceCents) {
			throw new PaymentError(
				'over_balance',
				money.balanceCents > 0
					? `That is more than the ${formatCents(money.balanceCents, CURRENCY)} still owed on ${jobRef(job.number)}.`
					: `Nothing is owed on ${jobRef(job.number)}.`
			);
		}
		const result = await insertPayment(tx, job, { ...input, recordedBy: actor.id });
		if (!result.paymentId) {
			throw new PaymentError(
				'duplicate_reference',
				`A ${input.method.replace('_', ' ')} with reference ${input.reference} is already recorded on this job.`
			);
		}
		return result;
	});
	await dispatchAll(done.mails);
	return done.paymentId!;
}

export interface Refund {
	method: PaymentMethod;
	amountCents: number;
	reference: string;
	receivedOn: string;
	reason: string;
}

/** A refund is a negative payment with a reason; never more than was received. */
export async function recordRefund(jobId: string, input: Refund, actor: SessionUser) {
	const done = await db.transaction(async (tx) => {
		const job = await lockJob(tx, jobId);
		const paid = await paymentsReceivedCents(job.id, tx);
		if (input.amountCents > paid) {
			throw new PaymentError(
				'over_refund',
				`Only ${formatCents(paid, CURRENCY)} has been received on ${jobRef(job.number)}; a refund cannot be larger.`
			);
		}
		const result = await insertPayment(tx, job, {
			kind: 'refund',
			method: input.method,
			amountCents: -input.amountCents,
			reference: input.reference,
			receivedOn: input.receivedOn,
			reason: input.reason,
			recordedBy: actor.id
		});
		if (!result.paymentId) {
			throw new PaymentError(
				'duplicate_reference',
				`A refund by ${input.method.replace('_', ' ')} with reference ${input.reference} is already recorded.`
			);
		}
		return result;
	});
	await dispatchAll(done.mails);
	return done.paymentId!;
}

export async function paymentsOf(jobId: string, tx: Db = db) {
	return tx
		.select()
		.from(payments)
		.where(eq(payments.jobId, jobId))
		.orderBy(asc(payments.receivedOn), asc(payments.createdAt));
}

export async function recentPayments(limit = 20) {
	return db
		.select({
			id: payments.id,
			jobId: payments.jobId,
			jobNumber: jobs.number,
			contactName: contacts.name,
			kind: payments.kind,
			method: payments.method,
			amountCents: payments.amountCents,
			reference: payments.reference,
			receivedOn: payments.receivedOn,
			reason: payments.reason
		})
		.from(payments)
		.innerJoin(jobs, eq(jobs.id, payments.jobId))
		.innerJoin(contacts, eq(contacts.id, jobs.contactId))
		.orderBy(desc(payments.receivedOn), desc(payments.createdAt))
		.limit(limit);
}
