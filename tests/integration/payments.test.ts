// Payments against the provider stand-in started by `npm test`: its webhooks arrive at the
// app's ORIGIN, served here by a tiny node:http wrapper around the real webhook handler (the
// same function the SvelteKit route calls). Stopping the wrapper is "the app is down".
import { createServer, type Server } from 'node:http';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import Stripe from 'stripe';
import { db } from '$lib/server/platform/db';
import {
	checkoutRequests,
	invoices,
	jobs,
	outbox,
	paymentEvents,
	payments
} from '$lib/server/platform/db/schema';
import { handleWebhook } from '$lib/server/payments/webhook';
import { confirmReturn, startCheckout } from '$lib/server/payments/checkout';
import {
	jobMoney,
	PaymentError,
	recordHandPayment,
	recordRefund
} from '$lib/server/payments/ledger';
import { ensureInvoice } from '$lib/server/payments/invoices';
import { openBalances } from '$lib/server/payments/balances';
import { jobBalance } from '$lib/server/payments/balance';
import { deliverOutboxMessage } from '$lib/server/platform/outbox';
import { stopQueue } from '$lib/server/platform/queue';
import { resetDatabase } from '../support/database';
import { clearMail, waitForMail } from '../support/mailbox';
import { makeUser, seedFirm } from './fixtures';
import { approveChangeOrder, makePaymentJob } from './payments-fixtures';

const APP_PORT = Number(process.env.PORT);
const PAY = `http://127.0.0.1:${process.env.PAYMENTS_API_PORT}`;
const SECRET = process.env.PAYMENTS_WEBHOOK_SECRET!;
const signer = new Stripe('sk_test_signer_only');
let app: Server | null = null;
let owner: Awaited<ReturnType<typeof makeUser>>;

function startApp(): Promise<void> {
	app = createServer((req, res) => {
		let body = '';
		req.setEncoding('utf8');
		req.on('data', (c) => (body += c));
		req.on('end', () => {
			const sig = req.headers['stripe-signature'];
			handleWebhook(body, typeof sig === 'string' ? sig : null).then(
				(a) =>
					res
						.writeHead(a.status, { 'content-type': 'application/json' })
						.end(JSON.stringify(a.body)),
				() => res.writeHead(500).end()
			);
		});
	});
	return new Promise((resolve) => app!.listen(APP_PORT, '127.0.0.1', () => resolve()));
}
function stopApp(): Promise<void> {
	const s = app;
	app = null;
	return new Promise((resolve) => {
		if (!s) return resolve();
		s.closeAllConnections();
		s.close(() => resolve());
	});
}

async function until<T>(
	read: () => Promise<T | undefined | null | false>,
	ms = 20_000
): Promise<T> {
	const deadline = Date.now() + ms;
	while (Date.now() < deadline) {
		const v = await read();
		if (v) return v;
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error('condition not met in time');
}

const sessionOf = (url: string) => url.split('/pay/')[1];
const payOn = (url: string, what: 'succeed' | 'decline' | 'abandon') =>
	fetch(`${url}/${what}`, { method: 'POST', redirect: 'manual' });
const paymentsFor = (jobId: string) => db.select().from(payments).where(eq(payments.jobId, jobId));
const requestFor = async (sessionId: string) =>
	(
		await db
			.select()
			.from(checkoutRequests)
			.where(eq(checkoutRequests.providerSessionId, sessionId))
	)[0];

function signed(event: object) {
	const payload = JSON.stringify(event);
	return { payload, header: signer.webhooks.generateTestHeaderString({ payload, secret: SECRET }) };
}
function completedEvent(
	session: { id: string; amount_total: number; currency: string },
	id = `evt_test_${Math.random().toString(36).slice(2)}`
) {
	return {
		id,
		object: 'event',
		type: 'checkout.session.completed',
		created: Math.floor(Date.now() / 1000),
		livemode: false,
		data: {
			object: {
				object: 'checkout.session',
				status: 'complete',
				payment_status: 'paid',
				payment_intent: 'pi_test_x',
				...session
			}
		}
	};
}

beforeAll(startApp);
afterAll(async () => {
	await stopApp();
	await stopQueue();
});

/** Sends what the outbox holds (the queue's workers do this in the app). */
async function sendOutbox() {
	for (const m of await db.select().from(outbox)) await deliverOutboxMessage(m.id);
}
beforeEach(async () => {
	await resetDatabase();
	await clearMail();
	await seedFirm();
	owner = await makeUser('owner');
});

describe('the webhook', () => {
	it('answers 400 and records nothing for a missing or wrong signature', async () => {
		const { job } = await makePaymentJob();
		const url = await startCheckout((await makePaymentJob()).token);
		const { payload, header } = signed(
			completedEvent({ id: sessionOf(url), amount_total: 372_000, currency: 'usd' })
		);
		expect((await handleWebhook(payload, null)).status).toBe(400);
		const forged = new Stripe('x').webhooks.generateTestHeaderString({
			payload,
			secret: 'whsec_other'
		});
		expect((await handleWebhook(payload, forged)).status).toBe(400);
		expect((await handleWebhook(payload.replace('372000', '1'), header)).status).toBe(400);
		expect(await db.select().from(paymentEvents)).toHaveLength(0);
		expect(await db.select().from(payments)).toHaveLength(0);
		expect(job.stage).toBe('scheduled');
	});

	it('records a paid deposit once: ready to schedule, receipt e-mailed, replay ignored', async () => {
		const { job, token, email } = await makePaymentJob();
		expect((await jobMoney(job)).readyToSchedule).toBe(false);
		const url = await startCheckout(token);
		expect(url.startsWith(`${PAY}/pay/cs_test_`)).toBe(true);
		const paid = await payOn(url, 'succeed');
		expect(paid.status).toBe(303);
		expect(paid.headers.get('location')).toContain(
			`/pay/${token}/receipt?session=${sessionOf(url)}`
		);
		const [payment] = await until(async () => {
			const rows = await paymentsFor(job.id);
			return rows.length ? rows : null;
		});
		expect(payment).toMatchObject({
			kind: 'deposit',
			method: 'card',
			amountCents: 372_000,
			currency: 'usd'
		});
		expect((await requestFor(sessionOf(url))).status).toBe('paid');
		const money = await jobMoney(job);
		expect(money.readyToSchedule).toBe(true);
		expect(money.balanceCents).toBe(1_240_000 - 372_000);
		await sendOutbox();
		const receipt = await waitForMail(email, /Receipt: \$3,720\.00 received/);
		expect(receipt.text).toContain('Balance still to pay: $8,680.00');

		// The same event again (the provider's replay), and the return page asking too.
		const deliveries: { eventId: string; type: string }[] = await (
			await fetch(`${PAY}/_standin/deliveries`)
		).json();
		const event = deliveries.filter((d) => d.type === 'checkout.session.completed').at(-1)!;
		const replay = await (
			await fetch(`${PAY}/_standin/redeliver/${event.eventId}`, { method: 'POST' })
		).json();
		expect(replay.delivered).toBe(true);
		const back = await confirmReturn(token, sessionOf(url));
		expect(back?.request?.status).toBe('paid');
		expect(await paymentsFor(job.id)).toHaveLength(1);
		const [row] = await db
			.select()
			.from(paymentEvents)
			.where(eq(paymentEvents.eventId, event.eventId));
		expect(row.outcome).toBe('recorded');
	});

	it('handles the same event delivered five times at once as one payment', async () => {
		const { job, token } = await makePaymentJob();
		const url = await startCheckout(token);
		const { payload, header } = signed(
			completedEvent(
				{ id: sessionOf(url), amount_total: 372_000, currency: 'usd' },
				'evt_test_same'
			)
		);
		const answers = await Promise.all(
			Array.from({ length: 5 }, () => handleWebhook(payload, header))
		);
		expect(answers.map((a) => a.status)).toEqual([200, 200, 200, 200, 200]);
		expect(answers.filter((a) => a.body.outcome === 'recorded')).toHaveLength(1);
		expect(await paymentsFor(job.id)).toHaveLength(1);
	});

	it('records nothing for a checkout it never started, and tells the office', async () => {
		const { job } = await makePaymentJob();
		const { payload, header } = signed(
			completedEvent({ id: 'cs_test_nobody_asked', amount_total: 50_000, currency: 'usd' })
		);
		const answer = await handleWebhook(payload, header);
		expect(answer).toEqual({ status: 200, body: { received: true, outcome: 'unknown_checkout' } });
		expect(await paymentsFor(job.id)).toHaveLength(0);
		const alerts = await db.select().from(outbox).where(eq(outbox.to, 'office@test.example'));
		expect(alerts.map((a) => a.subject)).toEqual(['Payments: a checkout we did not start']);
	});

	it('refuses an amount or currency that differs from what was asked', async () => {
		const { job, token } = await makePaymentJob();
		const url = await startCheckout(token);
		for (const wrong of [
			{ amount_total: 37_200, currency: 'usd' },
			{ amount_total: 372_000, currency: 'eur' }
		]) {
			const { payload, header } = signed(completedEvent({ id: sessionOf(url), ...wrong }));
			expect((await handleWebhook(payload, header)).body.outcome).toBe('amount_mismatch');
		}
		expect(await paymentsFor(job.id)).toHaveLength(0);
		const request = await requestFor(sessionOf(url));
		expect(request.status).toBe('open');
		expect(request.problem).toContain('Asked $3,720.00');
		expect((await jobMoney(job)).readyToSchedule).toBe(false);
	});

	it('is recorded once the app is back when the webhook came while it was down', async () => {
		const { job, token } = await makePaymentJob();
		const url = await startCheckout(token);
		await stopApp();
		try {
			expect((await payOn(url, 'succeed')).status).toBe(303);
			await until(async () => {
				const list: { type: string; attempts: number; delivered: boolean; eventId: string }[] =
					await (await fetch(`${PAY}/_standin/deliveries`)).json();
				return list.find(
					(d) => d.type === 'checkout.session.completed' && !d.delivered && d.attempts >= 2
				);
			});
			expect(await paymentsFor(job.id)).toHaveLength(0);
		} finally {
			await startApp();
		}
		const rows = await until(async () => {
			const r = await paymentsFor(job.id);
			return r.length ? r : null;
		});
		expect(rows).toHaveLength(1);
		expect(rows[0].amountCents).toBe(372_000);
	});
});

describe('checkouts that do not complete', () => {
	it('a declined card records nothing and the checkout stays open', async () => {
		const { job, token } = await makePaymentJob();
		const url = await startCheckout(token);
		const declined = await payOn(url, 'decline');
		expect(await declined.text()).toContain('Your card was declined');
		expect((await requestFor(sessionOf(url))).status).toBe('open');
		expect(await paymentsFor(job.id)).toHaveLength(0);
		// Asking again reuses the same open checkout rather than creating a second one.
		expect(await startCheckout(token)).toBe(url);
	});

	it('an abandoned checkout returns to the pay page, records nothing, and expires later', async () => {
		const { job, token } = await makePaymentJob();
		const url = await startCheckout(token);
		const back = await payOn(url, 'abandon');
		expect(back.status).toBe(303);
		expect(back.headers.get('location')).toMatch(new RegExp(`/pay/${token}\\?cancelled=1$`));
		const expired = await (
			await fetch(`${PAY}/_standin/expire/${sessionOf(url)}`, { method: 'POST' })
		).json();
		expect(expired.eventId).toMatch(/^evt_test_/);
		await until(async () => (await requestFor(sessionOf(url))).status === 'expired');
		expect(await paymentsFor(job.id)).toHaveLength(0);
		const again = await startCheckout(token);
		expect(again).not.toBe(url);
	});
});

describe('payments larger than the balance', () => {
	it('refuses a hand-recorded payment above the balance, recording nothing', async () => {
		const { job } = await makePaymentJob({ contractCents: 500_000, depositCents: 150_000 });
		const input = {
			kind: 'final' as const,
			method: 'cheque' as const,
			reference: '1042',
			receivedOn: '2027-05-02',
			note: ''
		};
		await expect(
			recordHandPayment(job.id, { ...input, amountCents: 500_001 }, owner)
		).rejects.toThrow(PaymentError);
		expect(await paymentsFor(job.id)).toHaveLength(0);
		await recordHandPayment(job.id, { ...input, amountCents: 500_000 }, owner);
		await expect(
			recordHandPayment(job.id, { ...input, reference: '1043', amountCents: 1 }, owner)
		).rejects.toThrow(/Nothing is owed/);
		expect((await jobBalance(job.id)).balanceCents).toBe(0);
	});

	it('records money the provider took beyond the balance as a credit and alerts the office', async () => {
		const { job, token } = await makePaymentJob({ contractCents: 500_000, depositCents: 150_000 });
		const url = await startCheckout(token);
		await recordHandPayment(
			job.id,
			{
				kind: 'final',
				method: 'bank_transfer',
				amountCents: 500_000,
				reference: 'TRF-88',
				receivedOn: '2027-05-02',
				note: ''
			},
			owner
		);
		await payOn(url, 'succeed');
		await until(async () => (await paymentsFor(job.id)).length === 2);
		const money = await jobMoney(job);
		expect(money.balanceCents).toBe(-150_000);
		expect(money.creditCents).toBe(150_000);
		await until(async () =>
			(await db.select().from(outbox).where(eq(outbox.to, 'office@test.example'))).some((m) =>
				m.subject.includes('paid more than the balance')
			)
		);
		await expect(startCheckout(token)).rejects.toThrow(/Nothing is due/);
	});
});

describe('the balance', () => {
	it('is total + approved change orders − payments, refunds included; paid in full moves the job to paid', async () => {
		const { job, token, email } = await makePaymentJob({
			contractCents: 800_000,
			depositCents: 240_000
		});
		await approveChangeOrder(job.id, 1, 45_000);
		await approveChangeOrder(job.id, 2, -20_000);
		await recordHandPayment(
			job.id,
			{
				kind: 'deposit',
				method: 'cheque',
				amountCents: 240_000,
				reference: '311',
				receivedOn: '2027-04-01',
				note: ''
			},
			owner
		);
		await recordRefund(
			job.id,
			{
				method: 'cheque',
				amountCents: 10_000,
				reference: 'R-1',
				receivedOn: '2027-04-03',
				reason: 'Lighting option dropped'
			},
			owner
		);
		await expect(
			recordRefund(
				job.id,
				{
					method: 'cash',
					amountCents: 230_001,
					reference: '',
					receivedOn: '2027-04-03',
					reason: 'Too much'
				},
				owner
			)
		).rejects.toThrow(/cannot be larger/);
		const b = await jobBalance(job.id);
		expect(b).toMatchObject({ totalCents: 825_000, paidCents: 230_000, balanceCents: 595_000 });
		expect((await paymentsFor(job.id)).find((p) => p.kind === 'refund')?.amountCents).toBe(-10_000);
		// The deposit is short by the refund: the job is not ready to schedule any more.
		expect((await jobMoney(job)).depositOutstandingCents).toBe(10_000);

		await db
			.update(jobs)
			.set({ stage: 'complete', completedAt: new Date() })
			.where(eq(jobs.id, job.id));
		const [complete] = await db.select().from(jobs).where(eq(jobs.id, job.id));
		expect((await jobMoney(complete)).due).toEqual({ kind: 'final', amountCents: 595_000 });
		const url = await startCheckout(token);
		await payOn(url, 'succeed');
		const paid = await until(async () => {
			const [j] = await db.select().from(jobs).where(eq(jobs.id, job.id));
			return j.stage === 'paid' ? j : null;
		});
		expect(paid.paidAt).toBeInstanceOf(Date);
		expect((await jobBalance(job.id)).balanceCents).toBe(0);
		await sendOutbox();
		const mail = await waitForMail(email, /Receipt: \$5,950\.00/);
		expect(mail.text).toContain('paid in full');
		const [final] = await db.select().from(invoices).where(eq(invoices.jobId, job.id));
		expect(final).toMatchObject({
			kind: 'final',
			totalCents: 825_000,
			paymentsCents: 230_000,
			balanceDueCents: 595_000
		});
		expect(final.snapshot.lines.map((l) => l.amountCents)).toEqual([800_000, 45_000, -20_000]);
	});
});

describe('invoices', () => {
	it('are numbered without gaps under concurrency, one per job and kind', async () => {
		const made = [];
		for (let i = 0; i < 6; i++) made.push(await makePaymentJob());
		// A call for a job that does not exist races with the others; it must fail without taking
		// a number. Its outcome is kept and asserted after the race, not thrown away.
		const missing: Promise<unknown>[] = [];
		const calls = made.flatMap(({ job }) => {
			missing.push(ensureInvoice('no-such-job', 'final'));
			return [
				ensureInvoice(job.id, 'deposit'),
				ensureInvoice(job.id, 'deposit'),
				ensureInvoice(job.id, 'final')
			];
		});
		const [, missed] = await Promise.all([Promise.all(calls), Promise.allSettled(missing)]);
		expect(missed).toHaveLength(6);
		for (const outcome of missed) {
			expect(outcome.status).toBe('rejected');
			const reason = (outcome as PromiseRejectedResult).reason;
			expect(reason).toBeInstanceOf(PaymentError);
			expect(reason).toMatchObject({ code: 'not_found', message: 'There is no such job.' });
		}
		await expect(ensureInvoice('no-such-job', 'final')).rejects.toThrow('There is no such job.');
		const rows = await db.select().from(invoices);
		expect(rows).toHaveLength(12);
		expect(rows.map((r) => r.number).sort((a, b) => a - b)).toEqual(
			Array.from({ length: 12 }, (_, i) => i + 1)
		);
		const next = await ensureInvoice((await makePaymentJob()).job.id, 'deposit');
		expect(next.number).toBe(13);
	});
});

describe('open balances', () => {
	it('lists what is owed, overdue first', async () => {
		const fresh = await makePaymentJob();
		const old = await makePaymentJob();
		await db
			.update(jobs)
			.set({ createdAt: new Date(Date.now() - 30 * 86_400_000) })
			.where(eq(jobs.id, old.job.id));
		const settled = await makePaymentJob({ contractCents: 100_000, depositCents: 30_000 });
		await recordHandPayment(
			settled.job.id,
			{
				kind: 'deposit',
				method: 'cash',
				amountCents: 30_000,
				reference: '',
				receivedOn: '2027-04-01',
				note: ''
			},
			owner
		);
		const list = await openBalances();
		expect(list.map((r) => r.jobId)).toEqual([old.job.id, fresh.job.id]);
		expect(list[0].daysOverdue).toBe(23);
		expect(list[1].daysOverdue).toBe(0);
	});
});

describe("the job's payments page", () => {
	it('puts a duplicate reference beside the reference, too large an amount beside the amount, and a bad invoice kind beside the invoice buttons', async () => {
		const { actions } = await import('../../src/routes/office/payments/[jobId]/+page.server');
		const { job } = await makePaymentJob({ contractCents: 500_000, depositCents: 150_000 });
		const post = async (action: 'record' | 'invoice', fields: Record<string, string>) => {
			const body = new FormData();
			for (const [k, v] of Object.entries(fields)) body.set(k, v);
			const url = `http://127.0.0.1/office/payments/${job.id}?/${action}`;
			return (await actions[action]({
				params: { jobId: job.id },
				locals: { user: owner },
				url: new URL(url),
				request: new Request(url, { method: 'POST', body })
			} as never)) as { status?: number; data?: { errors: Record<string, string> } };
		};
		const cheque = {
			kind: 'deposit',
			method: 'cheque',
			amount: '1000.00',
			reference: '2201',
			receivedOn: '2026-11-02',
			note: ''
		};
		expect(await post('record', cheque)).toEqual({ form: 'record', saved: 'Payment recorded.' });
		const again = await post('record', cheque);
		expect(again.status).toBe(400);
		expect(again.data?.errors).toEqual({
			reference: 'A cheque with reference 2201 is already recorded on this job.'
		});
		const tooMuch = await post('record', { ...cheque, reference: '2202', amount: '9000' });
		expect(Object.keys(tooMuch.data?.errors ?? {})).toEqual(['amount']);
		expect(tooMuch.data?.errors.amount).toMatch(/more than the \$4,000\.00 still owed/);
		const badKind = await post('invoice', { kind: 'progress' });
		expect(badKind.status).toBe(400);
		expect(badKind.data?.errors).toEqual({ kind: 'Pick the deposit or the final invoice' });
		expect(await db.select().from(invoices)).toHaveLength(0);
	});
});
