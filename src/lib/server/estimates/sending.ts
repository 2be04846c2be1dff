// Sending a version to the homeowner: a private link, and the e-mail through the outbox.
import { and, eq, ne } from 'drizzle-orm';
import { db } from '../platform/db';
import { activities, estimates, leads, users, type Estimate } from '../platform/db/schema';
import { newToken, sha256 } from '../platform/crypto';
import { dispatchMail, writeMail } from '../platform/outbox';
import { estimatingConfig } from '../pricelist/catalog';
import { sentMail, type MailContext } from './mail';
import { formatCents } from '$lib/money';
import { firmSettings } from '../platform/settings';
import type { SessionUser } from '../auth/sessions';
import { DAY_MS, leadWithContact, getEstimate } from './records';

export async function mailContext(row: Estimate): Promise<MailContext | null> {
	const found = await leadWithContact(row.leadId);
	if (!found) return null;
	const firm = await firmSettings();
	const people = await db.select().from(users).where(ne(users.role, 'crew'));
	const salesId = found.lead.assigneeId ?? row.createdBy;
	const salesperson = people.find((u) => u.id === salesId && !u.disabledAt) ?? null;
	const owners = people.filter((u) => u.role === 'owner' && !u.disabledAt);
	return { firm, lead: found.lead, contact: found.contact, salesperson, owners };
}

export type SendOutcome =
	| { kind: 'sent'; token: string; expiresAt: Date }
	| { kind: 'missing' }
	| { kind: 'invalid'; message: string };

/**
 * Sends (or re-sends with a fresh link) a version: a new token each time, stored hashed, expiring
 * after the firm's validity days. A draft becomes "sent" and read-only; older sent versions of the
 * lead stop opening, so only the newest link works.
 */
export async function sendEstimate(id: string, user: SessionUser): Promise<SendOutcome> {
	const row = await getEstimate(id);
	if (!row) return { kind: 'missing' };
	if (row.status === 'accepted' || row.status === 'declined') {
		return {
			kind: 'invalid',
			message: `This version is ${row.status}: make a new version to send`
		};
	}
	if (!row.result) {
		return { kind: 'invalid', message: 'Fix the errors in the design before sending' };
	}
	const ctx = await mailContext(row);
	if (!ctx) return { kind: 'missing' };
	if (!ctx.contact.email) {
		return { kind: 'invalid', message: 'The homeowner has no e-mail address on the lead' };
	}
	const config = await estimatingConfig();
	const token = newToken();
	const tokenHash = sha256(token);
	const now = new Date();
	const expiresAt = new Date(now.getTime() + config.validDays * DAY_MS);
	const renewing = row.status === 'sent';
	const outboxId = await db.transaction(async (tx) => {
		const [locked] = await tx.select().from(estimates).where(eq(estimates.id, id)).for('update');
		if (!locked || (locked.status !== 'draft' && locked.status !== 'sent')) return false;
		await tx
			.update(estimates)
			.set({ expiresAt: now })
			.where(
				and(eq(estimates.leadId, row.leadId), eq(estimates.status, 'sent'), ne(estimates.id, id))
			);
		await tx
			.update(estimates)
			.set({ status: 'sent', tokenHash, expiresAt, sentAt: locked.sentAt ?? now, sentBy: user.id })
			.where(eq(estimates.id, id));
		await tx
			.update(leads)
			.set({ stage: 'estimate_sent', lastTouchAt: now })
			.where(and(eq(leads.id, row.leadId), ne(leads.stage, 'sold')));
		await tx.insert(activities).values({
			leadId: row.leadId,
			kind: renewing ? 'estimate.renewed' : 'estimate.sent',
			actorId: user.id,
			body: `${renewing ? 'Sent a fresh link for' : 'Sent'} estimate v${row.number} to ${ctx.contact.email} (${formatCents(locked.totalCents)})`,
			data: { estimateId: id, number: row.number, totalCents: locked.totalCents }
		});
		return writeMail(sentMail(ctx, { ...locked, expiresAt }, token, tokenHash), tx);
	});
	if (outboxId === false) return { kind: 'invalid', message: 'This version can no longer be sent' };
	if (outboxId) await dispatchMail(outboxId);
	return { kind: 'sent', token, expiresAt };
}
