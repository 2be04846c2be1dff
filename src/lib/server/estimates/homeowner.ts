// The homeowner's side of an estimate: opening the link, accepting (which makes the job) and
// writing to the firm.
import { and, eq } from 'drizzle-orm';
import { cleanChoices, totalsForChoices, type Choices } from '$lib/estimating/overrides';
import { db, type Tx } from '../platform/db';
import {
	activities,
	contacts,
	estimateAcceptances,
	estimates,
	leads,
	type Estimate,
	type EstimateAcceptance
} from '../platform/db/schema';
import { newId, sha256 } from '../platform/crypto';
import { dispatchMail, writeMail } from '../platform/outbox';
import { acceptedMails, homeownerMessageMail } from './mail';
import { formatCents } from '$lib/money';
import { convertAcceptedEstimate } from '../jobs/conversion';
import type { StoredResult } from './records';
import { mailContext } from './sending';

export type TokenView =
	| { kind: 'open'; estimate: Estimate; stored: StoredResult }
	| { kind: 'accepted'; estimate: Estimate; acceptance: EstimateAcceptance }
	| { kind: 'declined'; estimate: Estimate }
	| { kind: 'unavailable' };

/** A wrong, expired or superseded link all read as "unavailable": no hint of other estimates. */
export async function openByToken(token: string): Promise<TokenView> {
	if (!/^[A-Za-z0-9_-]{20,64}$/.test(token)) return { kind: 'unavailable' };
	const [row] = await db
		.select()
		.from(estimates)
		.where(eq(estimates.tokenHash, sha256(token)))
		.limit(1);
	if (!row) return { kind: 'unavailable' };
	if (row.status === 'accepted') {
		const [acceptance] = await db
			.select()
			.from(estimateAcceptances)
			.where(eq(estimateAcceptances.estimateId, row.id));
		return acceptance ? { kind: 'accepted', estimate: row, acceptance } : { kind: 'unavailable' };
	}
	if (row.status === 'declined') return { kind: 'declined', estimate: row };
	if (row.status !== 'sent' || !row.expiresAt || row.expiresAt <= new Date() || !row.result) {
		return { kind: 'unavailable' };
	}
	return { kind: 'open', estimate: row, stored: row.result as unknown as StoredResult };
}

/**
 * Called inside the acceptance transaction, once per estimate: marks the contact a customer and
 * turns the estimate into a job.
 */
export async function onEstimateAccepted(estimateId: string, tx: Tx): Promise<void> {
	const [row] = await tx
		.select({ contactId: leads.contactId })
		.from(estimates)
		.innerJoin(leads, eq(leads.id, estimates.leadId))
		.where(eq(estimates.id, estimateId));
	if (row) {
		await tx.update(contacts).set({ isCustomer: true }).where(eq(contacts.id, row.contactId));
	}
	await convertAcceptedEstimate(estimateId, tx);
}

export interface AcceptInput {
	fullName: string;
	options: string[];
	alternates: Record<string, string>;
}

export type AcceptOutcome =
	{ kind: 'accepted'; acceptance: EstimateAcceptance; first: boolean } | { kind: 'unavailable' };

/** One acceptance per estimate: the row lock orders concurrent accepts, the unique key backs it. */
export async function acceptEstimate(
	token: string,
	input: AcceptInput,
	meta: { ip: string | null; userAgent: string | null }
): Promise<AcceptOutcome> {
	const tokenHash = sha256(token);
	const outcome = await db.transaction(async (tx) => {
		const [row] = await tx
			.select()
			.from(estimates)
			.where(eq(estimates.tokenHash, tokenHash))
			.for('update')
			.limit(1);
		if (!row) return { kind: 'unavailable' as const };
		const [existing] = await tx
			.select()
			.from(estimateAcceptances)
			.where(eq(estimateAcceptances.estimateId, row.id));
		if (existing) {
			return { kind: 'accepted' as const, acceptance: existing, first: false, mails: [] };
		}
		if (row.status !== 'sent' || !row.expiresAt || row.expiresAt <= new Date() || !row.result) {
			return { kind: 'unavailable' as const };
		}
		const stored = row.result as unknown as StoredResult;
		const pricing = stored.priced.pricing;
		const choices: Choices = cleanChoices(pricing, input);
		const totals = totalsForChoices(pricing, choices, stored.priced.depositPercent);
		const [acceptance] = await tx
			.insert(estimateAcceptances)
			.values({
				id: newId(),
				estimateId: row.id,
				estimateNumber: row.number,
				typedName: input.fullName,
				ipAddress: meta.ip,
				userAgent: meta.userAgent?.slice(0, 500) ?? null,
				revision: row.revision,
				optionsChosen: choices,
				totalCents: totals.totalCents,
				depositCents: totals.depositCents,
				result: { choices, totals, pricing, lines: stored.priced.lines }
			})
			.onConflictDoNothing({ target: estimateAcceptances.estimateId })
			.returning();
		if (!acceptance) return { kind: 'unavailable' as const };
		await tx.update(estimates).set({ status: 'accepted' }).where(eq(estimates.id, row.id));
		await tx
			.update(leads)
			.set({ stage: 'sold', lastTouchAt: new Date() })
			.where(eq(leads.id, row.leadId));
		await tx.insert(activities).values({
			leadId: row.leadId,
			kind: 'estimate.accepted',
			body: `${input.fullName} accepted estimate v${row.number}: ${formatCents(totals.totalCents)}, deposit ${formatCents(totals.depositCents)}`,
			data: { estimateId: row.id, number: row.number, totalCents: totals.totalCents, choices }
		});
		await onEstimateAccepted(row.id, tx);
		const ctx = await mailContext(row);
		const mails: string[] = [];
		if (ctx) {
			for (const mail of acceptedMails(ctx, row, acceptance, stored)) {
				const id = await writeMail(mail, tx);
				if (id) mails.push(id);
			}
		}
		return { kind: 'accepted' as const, acceptance, first: true, mails };
	});
	if (outcome.kind === 'accepted') {
		for (const id of outcome.mails) await dispatchMail(id);
		return { kind: 'accepted', acceptance: outcome.acceptance, first: outcome.first };
	}
	return outcome;
}

/** The homeowner declines (with a reason) or asks a question: on the timeline, mailed to sales. */
export async function homeownerMessage(
	token: string,
	kind: 'decline' | 'question',
	text: string
): Promise<boolean> {
	const view = await openByToken(token);
	if (view.kind !== 'open') return false;
	const row = view.estimate;
	const ctx = await mailContext(row);
	const outboxId = await db.transaction(async (tx) => {
		if (kind === 'decline') {
			const updated = await tx
				.update(estimates)
				.set({ status: 'declined', declinedAt: new Date(), declineReason: text })
				.where(and(eq(estimates.id, row.id), eq(estimates.status, 'sent')))
				.returning({ id: estimates.id });
			if (!updated.length) return undefined;
		}
		const [activity] = await tx
			.insert(activities)
			.values({
				leadId: row.leadId,
				kind: kind === 'decline' ? 'estimate.declined' : 'estimate.question',
				body: text,
				data: { estimateId: row.id, number: row.number }
			})
			.returning({ id: activities.id });
		await tx.update(leads).set({ lastTouchAt: new Date() }).where(eq(leads.id, row.leadId));
		const mail = ctx ? homeownerMessageMail(ctx, row, kind, text, activity.id) : null;
		return mail ? writeMail(mail, tx) : null;
	});
	if (outboxId === undefined) return false;
	if (outboxId) await dispatchMail(outboxId);
	return true;
}
