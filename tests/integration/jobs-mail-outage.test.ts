// Jobs (issue 9): with the SMTP stand-in out of reach, a homeowner's change-order approval and a
// seasonal care reminder are still recorded, their mails wait in the outbox with a queued retry,
// and go out (once) when mail is back.
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { db } from '$lib/server/platform/db';
import { changeOrders, outbox } from '$lib/server/platform/db/schema';
import { convertAcceptedEstimate } from '$lib/server/jobs/conversion';
import {
	createChangeOrder,
	decideChangeOrder,
	sendChangeOrder
} from '$lib/server/jobs/change-orders';
import { sendCareReminder } from '$lib/server/care/reminders';
import { deliverOutboxMessage } from '$lib/server/platform/outbox';
import { stopQueue } from '$lib/server/platform/queue';
import { resetDatabase } from '../support/database';
import { smtpRelay } from '../support/smtp-relay';
import { allMail, clearMail, waitForMail } from '../support/mailbox';
import { makeEstimate, makeUser, seedFirm } from './fixtures';

// Mail goes through a switchable relay in front of the SMTP stand-in, so a test can take it down.
const relay = smtpRelay();
beforeAll(() => relay.start());

afterAll(async () => {
	relay.stop();
	await stopQueue();
});

beforeEach(async () => {
	await resetDatabase();
	await clearMail();
	relay.down = false;
	await seedFirm();
});

async function outboxRow(dedupeKey: string) {
	const [row] = await db.select().from(outbox).where(eq(outbox.dedupeKey, dedupeKey));
	return row;
}

/** The pg-boss send job that will retry this message (with the queue's retry limit). */
async function queuedSend(outboxId: string) {
	const rows = await db.execute<{ retry_limit: number }>(
		sql`select retry_limit from pgboss.job where name = 'mail.send' and data->>'outboxId' = ${outboxId}`
	);
	return [...rows];
}

describe('an SMTP outage', () => {
	it('keeps the homeowner’s change-order approval and sends its mail when SMTP is back', async () => {
		const owner = await makeUser('owner');
		const { estimateId } = await makeEstimate({ accepted: true });
		const { jobId } = await convertAcceptedEstimate(estimateId);
		const coId = await createChangeOrder(
			jobId,
			{
				title: 'A third uplight',
				note: '',
				lines: [
					{
						description: 'Uplight on the tall column',
						category: 'lighting',
						unit: 'each',
						quantity: 1,
						unitPriceCents: 18_500
					}
				]
			},
			owner
		);
		const { url } = await sendChangeOrder(jobId, coId, owner);

		relay.down = true;
		const token = new URL(url).pathname.split('/').pop()!;
		expect(
			await decideChangeOrder(
				token,
				{ decision: 'approve', typedName: 'Ines Harrow' },
				{ ipAddress: '203.0.113.7', userAgent: 'phone' }
			)
		).toBe('approved');
		const [co] = await db.select().from(changeOrders).where(eq(changeOrders.id, coId));
		expect(co.status).toBe('approved');
		const mail = await outboxRow(`change-order-decision:${coId}`);
		expect(await queuedSend(mail.id)).toEqual([{ retry_limit: 8 }]);
		await expect(deliverOutboxMessage(mail.id)).rejects.toThrow();
		await expect(deliverOutboxMessage(mail.id)).rejects.toThrow();
		const waiting = await outboxRow(`change-order-decision:${coId}`);
		expect(waiting).toMatchObject({ sentAt: null, attempts: 2 });
		expect(waiting.lastError).toBeTruthy();

		relay.down = false;
		expect(await deliverOutboxMessage(mail.id)).toBe('sent');
		expect(await deliverOutboxMessage(mail.id)).toBe('already-sent');
		const caught = await waitForMail('office@test.example', /CO-1 approved by the homeowner/);
		expect(caught.text).toMatch(/Ines Harrow approved change order CO-1/);
		expect(
			(await allMail()).filter((m) => /CO-1 approved by the homeowner/.test(m.subject))
		).toHaveLength(1);
	});

	it('records the care reminder once and sends it when SMTP is back', async () => {
		const { estimateId, email } = await makeEstimate({ accepted: true });
		const { jobId } = await convertAcceptedEstimate(estimateId);

		relay.down = true;
		expect(await sendCareReminder(jobId, 'shutdown-2027', { chain: false })).toBe('sent');
		const mail = await outboxRow(`care:${jobId}:shutdown-2027`);
		expect(await queuedSend(mail.id)).not.toHaveLength(0);
		await expect(deliverOutboxMessage(mail.id)).rejects.toThrow();
		// The season's run again (a pg-boss retry of the reminder job) adds no second message.
		expect(await sendCareReminder(jobId, 'shutdown-2027', { chain: false })).toBe('already-sent');
		const rows = await db
			.select()
			.from(outbox)
			.where(eq(outbox.dedupeKey, `care:${jobId}:shutdown-2027`));
		expect(rows).toHaveLength(1);
		expect(rows[0]).toMatchObject({ sentAt: null, attempts: 1 });

		relay.down = false;
		expect(await deliverOutboxMessage(mail.id)).toBe('sent');
		const caught = await waitForMail(email, /autumn shut-down/);
		expect(caught.text).toMatch(/\/care\/unsubscribe\//);
		expect((await allMail()).filter((m) => /autumn shut-down/.test(m.subject))).toHaveLength(1);
	});
});
