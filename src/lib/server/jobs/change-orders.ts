// Change orders: lines added or removed with prices, sent to the homeowner through a private
// link, approved or declined with the same acceptance record as an estimate. Approved ones
// change the job's total (jobBalance) and its materials list; all of it goes on the timeline.
import { DomainError } from '../platform/errors';
import { and, asc, eq, sql } from 'drizzle-orm';
import { db, type Db } from '../platform/db';
import {
	changeOrders,
	contacts,
	jobMaterials,
	jobs,
	type ChangeOrder,
	type ChangeOrderLine
} from '../platform/db/schema';
import { newId, newToken, sha256 } from '../platform/crypto';
import { dispatchMail, writeMail } from '../platform/outbox';
import { origin } from '../platform/env';
import { firmSettings } from '../platform/settings';
import { changeOrderDecisionMail, changeOrderMail } from './mail';
import { addActivity } from '../leads/timeline';
import { JobError } from './errors';
import { jobRef } from './labels';
import { roundCents } from '$lib/estimating/pricing';
import type { SessionUser } from '../auth/sessions';
import type { z } from 'zod';
import type { changeOrderSchema } from '$lib/schema/jobs';
import { formatCents } from '$lib/money';

const LINK_DAYS = 30;
/** Categories that are work rather than material: they change the total, not the load list. */
const NOT_MATERIAL = new Set(['labor', 'labour', 'service']);

export function priceLines(lines: z.output<typeof changeOrderSchema>['lines']): ChangeOrderLine[] {
	return lines.map((l) => ({
		...l,
		extendedCents: Math.sign(l.quantity) * roundCents(Math.abs(l.quantity) * l.unitPriceCents)
	}));
}

function refuseIfClosed(job: { stage: string }) {
	if (job.stage === 'paid') {
		throw new JobError('job_paid', 'This job is paid and closed: it takes no more change orders.');
	}
}

export async function listChangeOrders(jobId: string): Promise<ChangeOrder[]> {
	return db
		.select()
		.from(changeOrders)
		.where(eq(changeOrders.jobId, jobId))
		.orderBy(asc(changeOrders.number));
}

export async function createChangeOrder(
	jobId: string,
	input: z.output<typeof changeOrderSchema>,
	actor: SessionUser
): Promise<string> {
	return db.transaction(async (tx) => {
		const [job] = await tx.select().from(jobs).where(eq(jobs.id, jobId)).for('update');
		if (!job) throw new JobError('not_found', 'There is no such job.');
		refuseIfClosed(job);
		const [{ next }] = await tx
			.select({ next: sql<number>`coalesce(max(${changeOrders.number}), 0)::int + 1` })
			.from(changeOrders)
			.where(eq(changeOrders.jobId, jobId));
		const lines = priceLines(input.lines);
		const id = newId();
		const totalCents = lines.reduce((s, l) => s + l.extendedCents, 0);
		await tx.insert(changeOrders).values({
			id,
			jobId,
			number: next,
			title: input.title,
			note: input.note,
			lines,
			totalCents,
			createdBy: actor.id
		});
		await addActivity(
			tx,
			job.leadId,
			'change_order.created',
			`${jobRef(job.number)} CO-${next} drafted: ${input.title} (${formatCents(totalCents)})`,
			actor.id,
			{ jobId, changeOrderId: id }
		);
		return id;
	});
}

/** Sends (or sends again, with a fresh link) a draft or sent change order to the homeowner. */
export async function sendChangeOrder(
	jobId: string,
	changeOrderId: string,
	actor: SessionUser
): Promise<{ url: string }> {
	const firm = await firmSettings();
	const token = newToken();
	const url = `${origin()}/change-order/${token}`;
	const outboxId = await db.transaction(async (tx) => {
		const [job] = await tx.select().from(jobs).where(eq(jobs.id, jobId)).for('update');
		if (!job) throw new JobError('not_found', 'There is no such job.');
		refuseIfClosed(job);
		const [co] = await tx
			.select()
			.from(changeOrders)
			.where(and(eq(changeOrders.id, changeOrderId), eq(changeOrders.jobId, jobId)))
			.for('update');
		if (!co) throw new JobError('not_found', 'There is no such change order.');
		if (co.status !== 'draft' && co.status !== 'sent') {
			throw new JobError('bad_stage', `CO-${co.number} is already ${co.status}.`);
		}
		const [contact] = await tx.select().from(contacts).where(eq(contacts.id, job.contactId));
		if (!contact.email) {
			throw new JobError('invalid', 'The homeowner has no e-mail address on file.');
		}
		const sentAt = new Date();
		await tx
			.update(changeOrders)
			.set({
				status: 'sent',
				tokenHash: sha256(token),
				tokenExpiresAt: new Date(sentAt.getTime() + LINK_DAYS * 86_400_000),
				sentAt
			})
			.where(eq(changeOrders.id, co.id));
		await addActivity(
			tx,
			job.leadId,
			'change_order.sent',
			`${jobRef(job.number)} CO-${co.number} sent to ${contact.email}`,
			actor.id,
			{ jobId, changeOrderId: co.id }
		);
		const mail = changeOrderMail({
			firm,
			name: contact.name,
			jobTitle: job.title,
			number: co.number,
			title: co.title,
			lines: co.lines,
			totalCents: co.totalCents,
			url
		});
		return writeMail(
			{
				dedupeKey: `change-order:${co.id}:${sentAt.getTime()}`,
				to: contact.email,
				...mail,
				leadId: job.leadId
			},
			tx
		);
	});
	if (outboxId) await dispatchMail(outboxId);
	return { url };
}

async function byToken(token: string, tx: Db = db) {
	const [row] = await tx
		.select({ co: changeOrders, job: jobs })
		.from(changeOrders)
		.innerJoin(jobs, eq(jobs.id, changeOrders.jobId))
		.where(eq(changeOrders.tokenHash, sha256(token)));
	return row ?? null;
}

/** What the homeowner's link shows; null for an unknown token. */
export async function changeOrderForHomeowner(token: string) {
	const row = await byToken(token);
	if (!row) return null;
	const { co, job } = row;
	return {
		number: co.number,
		jobRef: jobRef(job.number),
		jobTitle: job.title,
		title: co.title,
		note: co.note,
		lines: co.lines,
		totalCents: co.totalCents,
		status: co.status,
		expired: co.status === 'sent' && (co.tokenExpiresAt?.getTime() ?? 0) < Date.now(),
		jobClosed: job.stage === 'paid',
		decidedAt: co.decidedAt,
		typedName: co.typedName
	};
}

/** The homeowner's link no longer allows a decision (unknown, decided, expired or job closed). */
export class DecisionError extends DomainError<'decided'> {
	constructor(message: string) {
		super('decided', message);
	}
}

/** Records the homeowner's approval or refusal, once; then tells the office by e-mail. */
export async function decideChangeOrder(
	token: string,
	input: { decision: 'approve' | 'decline'; typedName: string; reason?: string },
	meta: { ipAddress: string | null; userAgent: string | null }
): Promise<'approved' | 'declined'> {
	const firm = await firmSettings();
	const { status, outboxId } = await db.transaction(async (tx) => {
		const found = await byToken(token, tx);
		if (!found) throw new DecisionError('This link is not valid.');
		const [co] = await tx
			.select()
			.from(changeOrders)
			.where(eq(changeOrders.id, found.co.id))
			.for('update');
		const [job] = await tx.select().from(jobs).where(eq(jobs.id, co.jobId)).for('update');
		if (co.status !== 'sent') throw new DecisionError(`This change order is already ${co.status}.`);
		if ((co.tokenExpiresAt?.getTime() ?? 0) < Date.now()) {
			throw new DecisionError('This link has expired; ask us for a fresh one.');
		}
		if (job.stage === 'paid') {
			throw new DecisionError('This job is paid and closed; call us about further changes.');
		}
		const status = input.decision === 'approve' ? ('approved' as const) : ('declined' as const);
		await tx
			.update(changeOrders)
			.set({
				status,
				typedName: input.typedName,
				decidedAt: new Date(),
				ipAddress: meta.ipAddress,
				userAgent: meta.userAgent?.slice(0, 500) ?? null,
				acceptedTotalCents: status === 'approved' ? co.totalCents : null,
				declineReason: status === 'declined' ? input.reason || null : null
			})
			.where(eq(changeOrders.id, co.id));
		if (status === 'approved') {
			const materials = co.lines.filter((l) => !NOT_MATERIAL.has(l.category.toLowerCase()));
			if (materials.length) {
				await tx.insert(jobMaterials).values(
					materials.map((l, i) => ({
						id: newId(),
						jobId: job.id,
						category: l.category || 'other',
						name: l.description,
						description: `CO-${co.number}`,
						unit: l.unit,
						quantity: l.quantity,
						changeOrderId: co.id,
						sortOrder: 10_000 + co.number * 100 + i
					}))
				);
			}
		}
		await addActivity(
			tx,
			job.leadId,
			`change_order.${status}`,
			`${jobRef(job.number)} CO-${co.number} ${status} by ${input.typedName} (${formatCents(co.totalCents)})`,
			null,
			{ jobId: job.id, changeOrderId: co.id, ipAddress: meta.ipAddress }
		);
		const mail = changeOrderDecisionMail({
			firm,
			jobRef: jobRef(job.number),
			number: co.number,
			title: co.title,
			decision: status,
			typedName: input.typedName,
			totalCents: co.totalCents,
			reason: input.reason,
			url: `${origin()}/office/jobs/${job.id}`
		});
		const outboxId = await writeMail(
			{ dedupeKey: `change-order-decision:${co.id}`, to: firm.email, ...mail, leadId: job.leadId },
			tx
		);
		return { status, outboxId };
	});
	if (outboxId) await dispatchMail(outboxId);
	return status;
}
