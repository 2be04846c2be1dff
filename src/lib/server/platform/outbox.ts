// E-mail that must not be lost or sent twice: the message is written to the outbox (in the
// caller's transaction when there is one), then a queued job sends it and marks it sent.
// A job that runs twice finds it sent and does nothing; an SMTP outage only delays it.
import { eq } from 'drizzle-orm';
import { db, type Tx } from './db';
import { outbox } from './db/schema';
import { newId } from './crypto';
import { sendMail, type Message } from './mail';
import { defineJob, enqueue } from './queue';

export interface OutgoingMail extends Omit<Message, 'attachments'> {
	dedupeKey: string;
	leadId?: string;
	/** Text as is; binary files (photos) as base64 with `encoding: 'base64'`. */
	attachments?: { filename: string; content: string; contentType: string; encoding?: 'base64' }[];
}

/** Writes the message; returns its id, or null when a message with that key already exists. */
export async function writeMail(
	mail: OutgoingMail,
	tx: Tx | typeof db = db
): Promise<string | null> {
	const id = newId();
	const rows = await tx
		.insert(outbox)
		.values({
			id,
			dedupeKey: mail.dedupeKey,
			to: mail.to,
			subject: mail.subject,
			text: mail.text,
			html: mail.html,
			attachments: mail.attachments ?? [],
			leadId: mail.leadId
		})
		.onConflictDoNothing({ target: outbox.dedupeKey })
		.returning({ id: outbox.id });
	return rows[0]?.id ?? null;
}

/** Queues the sending of an outbox message (call after the transaction that wrote it commits). */
export async function dispatchMail(
	outboxId: string,
	options: { startAfter?: Date } = {}
): Promise<void> {
	await enqueue('mail.send', { outboxId }, { singletonKey: outboxId, ...options });
}

/** Writes and queues in one go, outside any transaction. */
export async function queueMail(mail: OutgoingMail): Promise<void> {
	const id = await writeMail(mail);
	if (id) await dispatchMail(id);
}

/**
 * Sends one outbox message. The row stays locked (FOR UPDATE SKIP LOCKED) while it is sent and
 * marked, so when two workers, in one process or several, get the same message at once, one
 * sends it and the other finds it busy and leaves it; the sender's own job retries on failure.
 */
export async function deliverOutboxMessage(
	outboxId: string
): Promise<'sent' | 'already-sent' | 'missing' | 'busy'> {
	let failure: Error | null = null;
	const outcome = await db.transaction(async (tx) => {
		const [row] = await tx
			.select()
			.from(outbox)
			.where(eq(outbox.id, outboxId))
			.limit(1)
			.for('update', { skipLocked: true });
		if (!row) {
			const [exists] = await tx
				.select({ id: outbox.id })
				.from(outbox)
				.where(eq(outbox.id, outboxId));
			return exists ? 'busy' : 'missing';
		}
		if (row.sentAt) return 'already-sent';
		try {
			await sendMail({
				to: row.to,
				subject: row.subject,
				text: row.text,
				html: row.html,
				messageId: `<${row.id}@rillstone.mail>`,
				attachments: row.attachments.map((a) => ({
					filename: a.filename,
					content: a.content,
					contentType: a.contentType,
					...(a.encoding ? { encoding: a.encoding } : {})
				}))
			});
		} catch (error) {
			failure = error as Error;
			await tx
				.update(outbox)
				.set({ attempts: row.attempts + 1, lastError: failure.message.slice(0, 500) })
				.where(eq(outbox.id, row.id));
			return 'failed';
		}
		await tx
			.update(outbox)
			.set({ sentAt: new Date(), attempts: row.attempts + 1, lastError: null })
			.where(eq(outbox.id, row.id));
		return 'sent';
	});
	if (outcome === 'failed') throw failure!; // pg-boss retries with backoff
	return outcome;
}

defineJob<{ outboxId: string }>('mail.send', async ({ outboxId }) => {
	await deliverOutboxMessage(outboxId);
});
