// Testimonials: asked for by e-mail a few days after completion (through a private link),
// written by the homeowner, shown on the public Kind words page only once the owner approves.
import { and, desc, eq, isNotNull } from 'drizzle-orm';
import { db, type Tx } from '../platform/db';
import { contacts, jobs, properties, testimonials, type Job } from '../platform/db/schema';
import { newId, newToken, sha256 } from '../platform/crypto';
import { dispatchMail, writeMail } from '../platform/outbox';
import { origin } from '../platform/env';
import { firmSettings } from '../platform/settings';
import { testimonialRequestMail } from './mail';
import { careSettings } from '../care/reminders';
import { completionCareOffer } from '../care/offers';
import { addActivity } from '../leads/timeline';
import { jobRef } from './labels';
import type { SessionUser } from '../auth/sessions';
import { newCallbackLink } from '../callbacks/callbacks';

const LINK_DAYS = 60;

/**
 * Called in the completion transaction: writes the request (once per job) and returns what
 * to run after the commit, which queues it for the delay set in the jobs settings.
 */
export async function requestTestimonial(job: Job, tx: Tx): Promise<() => Promise<void>> {
	const [contact] = await tx.select().from(contacts).where(eq(contacts.id, job.contactId));
	if (!contact?.email) return async () => {};
	const token = newToken();
	const inserted = await tx
		.insert(testimonials)
		.values({
			id: newId(),
			jobId: job.id,
			tokenHash: sha256(token),
			tokenExpiresAt: new Date(Date.now() + LINK_DAYS * 86_400_000)
		})
		.onConflictDoNothing({ target: testimonials.jobId })
		.returning({ id: testimonials.id });
	if (!inserted.length) return async () => {};
	const firm = await firmSettings();
	const delayDays = (await careSettings(tx)).testimonialDelayDays;
	const mail = testimonialRequestMail({
		firm,
		name: contact.name,
		jobTitle: job.title,
		url: `${origin()}/testimonial/${token}`,
		care: job.propertyId
			? ((await completionCareOffer(tx, job.propertyId)) ?? undefined)
			: undefined,
		// The homeowner's way in when something goes wrong later (warranty callbacks).
		problemUrl: await newCallbackLink(job.id, tx)
	});
	const outboxId = await writeMail(
		{ dedupeKey: `testimonial:${job.id}`, to: contact.email, ...mail, leadId: job.leadId },
		tx
	);
	await addActivity(
		tx,
		job.leadId,
		'testimonial.requested',
		`Testimonial request for ${jobRef(job.number)} queued (${delayDays} day${delayDays === 1 ? '' : 's'} after completion)`,
		null,
		{ jobId: job.id }
	);
	return async () => {
		if (!outboxId) return;
		const startAfter = new Date(Date.now() + delayDays * 86_400_000);
		await dispatchMail(outboxId, delayDays > 0 ? { startAfter } : {});
	};
}

async function byToken(token: string) {
	const [row] = await db
		.select({
			t: testimonials,
			jobTitle: jobs.title,
			contactName: contacts.name,
			town: properties.town
		})
		.from(testimonials)
		.innerJoin(jobs, eq(jobs.id, testimonials.jobId))
		.innerJoin(contacts, eq(contacts.id, jobs.contactId))
		.leftJoin(properties, eq(properties.id, jobs.propertyId))
		.where(eq(testimonials.tokenHash, sha256(token)));
	return row ?? null;
}

export async function testimonialForHomeowner(token: string) {
	const row = await byToken(token);
	if (!row) return null;
	return {
		jobTitle: row.jobTitle,
		suggestedName: row.contactName.split(/\s+/)[0] ?? '',
		suggestedTown: row.town ?? '',
		submitted: Boolean(row.t.submittedAt),
		expired: row.t.tokenExpiresAt.getTime() < Date.now()
	};
}

export async function submitTestimonial(
	token: string,
	input: { body: string; displayName: string; town: string }
): Promise<'saved' | 'expired' | 'missing'> {
	const row = await byToken(token);
	if (!row) return 'missing';
	if (row.t.tokenExpiresAt.getTime() < Date.now()) return 'expired';
	// Editing is allowed until the owner approves; an approved text is not changed behind them.
	await db
		.update(testimonials)
		.set({ ...input, submittedAt: new Date() })
		.where(and(eq(testimonials.id, row.t.id)));
	return 'saved';
}

/** Submitted testimonials for the owner to approve or withdraw. */
export async function submittedTestimonials() {
	return db
		.select({
			id: testimonials.id,
			jobId: testimonials.jobId,
			jobNumber: jobs.number,
			body: testimonials.body,
			displayName: testimonials.displayName,
			town: testimonials.town,
			submittedAt: testimonials.submittedAt,
			approvedAt: testimonials.approvedAt
		})
		.from(testimonials)
		.innerJoin(jobs, eq(jobs.id, testimonials.jobId))
		.where(isNotNull(testimonials.submittedAt))
		.orderBy(desc(testimonials.submittedAt));
}

export async function setTestimonialApproved(
	owner: SessionUser,
	id: string,
	approved: boolean
): Promise<void> {
	await db
		.update(testimonials)
		.set(
			approved
				? { approvedAt: new Date(), approvedBy: owner.id }
				: { approvedAt: null, approvedBy: null }
		)
		.where(and(eq(testimonials.id, id), isNotNull(testimonials.submittedAt)));
}

/** What the public page shows: approved words only, first name and town, nothing else. */
export async function approvedTestimonials() {
	return db
		.select({
			id: testimonials.id,
			body: testimonials.body,
			displayName: testimonials.displayName,
			town: testimonials.town,
			approvedAt: testimonials.approvedAt
		})
		.from(testimonials)
		.where(and(isNotNull(testimonials.approvedAt), isNotNull(testimonials.body)))
		.orderBy(desc(testimonials.approvedAt));
}
