// Dates in the firm's time zone: at 23:30 in Denver it is still "today" there, although UTC has
// already reached tomorrow. Each check would have shown the next day when dates were cut from
// toISOString().
import { afterAll, afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/platform/db';
import { jobs, payments, settings } from '$lib/server/platform/db/schema';
import { firmToday } from '$lib/server/platform/settings';
import { DEPOSIT_TERMS_DAYS, insertPayment, lockJob } from '$lib/server/payments/ledger';
import { ensureInvoice } from '$lib/server/payments/invoices';
import { openBalances } from '$lib/server/payments/balances';
import { addDays } from '$lib/scheduling/zone';
import { stopQueue } from '$lib/server/platform/queue';
import { resetDatabase } from '../support/database';
import { makeUser, seedFirm } from './fixtures';
import { makePaymentJob } from './payments-fixtures';

// 2027-03-10 23:30 MST (UTC−7, IANA tz database) = 2027-03-11 06:30 UTC.
const EVENING = new Date(Date.UTC(2027, 2, 11, 6, 30));

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
	vi.useFakeTimers({ toFake: ['Date'], now: EVENING });
});
afterEach(() => {
	vi.useRealTimers();
});
afterAll(async () => {
	await stopQueue();
});

describe('dates at 23:30 firm time (America/Denver)', () => {
	it("today is the firm's date, read inside a caller's transaction too", async () => {
		expect(await firmToday()).toBe('2027-03-10');
		// Inside a transaction that holds the settings row: the zone is read through it.
		const inside = await db.transaction(async (tx) => {
			await tx.select().from(settings).where(eq(settings.id, 1)).for('update');
			return firmToday(tx);
		});
		expect(inside).toBe('2027-03-10');
		await db.update(settings).set({ timeZone: 'Pacific/Auckland' });
		// 06:30 UTC is 19:30 NZDT (UTC+13) on the 11th.
		expect(await firmToday()).toBe('2027-03-11');
	});

	it('a payment recorded without a date (card payments) is dated today on the firm calendar', async () => {
		await makeUser('owner');
		const { job } = await makePaymentJob();
		await db.transaction(async (tx) => {
			const locked = await lockJob(tx, job.id);
			await insertPayment(tx, locked, { kind: 'deposit', method: 'card', amountCents: 100_00 });
		});
		const [row] = await db.select().from(payments).where(eq(payments.jobId, job.id));
		expect(row.receivedOn).toBe('2027-03-10');
	});

	it("a deposit's due date counts from the firm's date of the job, not the UTC date", async () => {
		const { job } = await makePaymentJob();
		await db.update(jobs).set({ createdAt: EVENING }).where(eq(jobs.id, job.id));
		const [balance] = await openBalances(EVENING);
		expect(balance.dueOn).toBe(addDays('2027-03-10', DEPOSIT_TERMS_DAYS));
		expect(balance.daysOverdue).toBe(0);
	});

	it("an invoice issued in the firm's evening is due counted from the firm's date", async () => {
		await makeUser('owner');
		const { job } = await makePaymentJob();
		const invoice = await ensureInvoice(job.id, 'deposit');
		expect(invoice.dueOn).toBe(addDays('2027-03-10', DEPOSIT_TERMS_DAYS));
	});
});
