import { beforeEach, describe, expect, it } from 'vitest';
import { db } from '$lib/server/platform/db';
import { outbox } from '$lib/server/platform/db/schema';
import { deliverOutboxMessage, writeMail } from '$lib/server/platform/outbox';
import { resetDatabase } from '../support/database';
import { allMail, clearMail, waitForMail } from '../support/mailbox';

beforeEach(async () => {
	await resetDatabase();
	await clearMail();
});

const message = {
	dedupeKey: 'test:one',
	to: 'homeowner@test.example',
	subject: 'Your inquiry R-1001',
	text: 'Thanks',
	html: '<p>Thanks</p>'
};

describe('the outbox', () => {
	it('sends a message once even when its job runs twice', async () => {
		const id = await writeMail(message);
		expect(id).toBeTruthy();
		expect(await deliverOutboxMessage(id!)).toBe('sent');
		expect(await deliverOutboxMessage(id!)).toBe('already-sent');
		await waitForMail(message.to, /R-1001/);
		await new Promise((r) => setTimeout(r, 300));
		expect((await allMail()).filter((m) => m.subject === message.subject)).toHaveLength(1);
	});

	it('keeps one message per dedupe key', async () => {
		expect(await writeMail(message)).toBeTruthy();
		expect(await writeMail({ ...message, subject: 'again' })).toBeNull();
		expect(await db.select().from(outbox)).toHaveLength(1);
	});
});
