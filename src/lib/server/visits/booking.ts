// Booking, rescheduling and cancelling, with the database as the last word on double-booking
// (exclusion constraint site_visits_no_overlap).
import { eq, sql } from 'drizzle-orm';
import { blockedSpan, refusal, type Busy, type Rules } from '$lib/scheduling/slots';
import { db, type Tx } from '../platform/db';
import {
	activities,
	leads,
	siteVisitLinks,
	siteVisits,
	users,
	type SiteVisit
} from '../platform/db/schema';
import { newId, newToken, sha256 } from '../platform/crypto';
import { dispatchMail } from '../platform/outbox';
import { writeVisitMails } from './mail';
import { VisitError } from './errors';
import { partyFor, whenShort, lockVisit } from './party';
import { factsFor } from './slots';
import { scheduleReminder } from './reminders';

/** The PostgreSQL error code under a Drizzle error, if any. */
function pgCode(error: unknown): string | undefined {
	let e = error as { code?: string; cause?: unknown } | undefined;
	for (let i = 0; e && i < 4; i++) {
		if (typeof e.code === 'string') return e.code;
		e = e.cause as typeof e;
	}
	return undefined;
}
function rangeText(span: Busy): string {
	return `[${span.start.toISOString()},${span.end.toISOString()})`;
}
// ---------------------------------------------------------------------------------------------
// Booking, rescheduling, cancelling

async function checkSalesperson(tx: Tx, id: string): Promise<void> {
	const [person] = await tx
		.select({ role: users.role, disabledAt: users.disabledAt })
		.from(users)
		.where(eq(users.id, id));
	if (!person || person.disabledAt || person.role === 'crew') {
		throw new VisitError('not_salesperson', 'Pick a salesperson from the list.');
	}
}

async function checkStart(
	tx: Tx,
	salespersonId: string,
	start: Date,
	now: Date,
	excludeVisitId?: string
): Promise<Rules & { timeZone: string }> {
	const day = 86_400_000;
	const facts = await factsFor(
		salespersonId,
		new Date(start.getTime() - day),
		new Date(start.getTime() + 2 * day),
		excludeVisitId,
		tx
	);
	const why = refusal(start, { ...facts, now });
	if (why) throw new VisitError(why);
	return facts;
}

async function afterCommit(outboxIds: string[], visit: SiteVisit, now: Date): Promise<void> {
	for (const id of outboxIds) await dispatchMail(id);
	await scheduleReminder(visit, now);
}

export interface BookInput {
	leadId: string;
	salespersonId: string;
	startsAt: Date;
	noteForHomeowner: string;
	actorId: string;
	now?: Date;
}

/** Books a visit; throws VisitError with the reason when it cannot. Returns the visit. */
export async function bookVisit(input: BookInput): Promise<SiteVisit> {
	const now = input.now ?? new Date();
	const token = newToken();
	let mails: string[] = [];
	let visit: SiteVisit;
	try {
		visit = await db.transaction(async (tx) => {
			const [lead] = await tx
				.select({ id: leads.id, stage: leads.stage, number: leads.number })
				.from(leads)
				.where(eq(leads.id, input.leadId));
			if (!lead) throw new VisitError('not_found', 'That lead does not exist.');
			if (lead.stage === 'sold' || lead.stage === 'closed') {
				throw new VisitError('closed', 'This lead is closed or sold: reopen it before booking.');
			}
			await checkSalesperson(tx, input.salespersonId);
			const rules = await checkStart(tx, input.salespersonId, input.startsAt, now);
			const span = blockedSpan(input.startsAt, rules.visitMinutes, rules.bufferMinutes);
			const endsAt = new Date(input.startsAt.getTime() + rules.visitMinutes * 60_000);
			const [row] = await tx
				.insert(siteVisits)
				.values({
					id: newId(),
					leadId: input.leadId,
					salespersonId: input.salespersonId,
					startsAt: input.startsAt,
					endsAt,
					bufferMinutes: rules.bufferMinutes,
					blocked: rangeText(span),
					timeZone: rules.timeZone,
					noteForHomeowner: input.noteForHomeowner,
					tokenHash: sha256(token),
					tokenExpiresAt: new Date(endsAt.getTime() + 86_400_000),
					bookedBy: input.actorId
				})
				.returning();
			await tx
				.update(leads)
				.set({
					stage: sql`case when ${leads.stage} in ('new', 'contacted') then 'visit_booked'::lead_stage else ${leads.stage} end`,
					version: sql`${leads.version} + 1`,
					lastTouchAt: now,
					firstReplyAt: sql`coalesce(${leads.firstReplyAt}, ${now.toISOString()}::timestamptz)`,
					updatedBy: input.actorId
				})
				.where(eq(leads.id, input.leadId));
			const party = await partyFor(tx, row);
			await tx.insert(activities).values({
				leadId: input.leadId,
				kind: 'visit',
				actorId: input.actorId,
				body: `Site visit booked with ${party.salesperson.name}: ${whenShort(row)}`,
				data: { visitId: row.id, action: 'booked', startsAt: row.startsAt.toISOString() }
			});
			mails = await writeVisitMails(tx, party, 'booked', token);
			return row;
		});
	} catch (error) {
		throw translate(error);
	}
	await afterCommit(mails, visit, now);
	return visit;
}

function translate(error: unknown): unknown {
	if (error instanceof VisitError) return error;
	const code = pgCode(error);
	if (code === '23P01') return new VisitError('taken');
	if (code === '23505') {
		return new VisitError('lead_has_visit', 'This lead already has a visit booked: move that one.');
	}
	return error;
}

export async function rescheduleVisit(
	visitId: string,
	input: {
		salespersonId: string;
		startsAt: Date;
		noteForHomeowner?: string;
		actorId: string | null;
		now?: Date;
		/** Refuse unless the visit belongs to this lead (the page's lead). */
		leadId?: string;
	}
): Promise<SiteVisit> {
	const now = input.now ?? new Date();
	const token = newToken();
	let mails: string[] = [];
	let visit: SiteVisit;
	try {
		visit = await db.transaction(async (tx) => {
			const current = await lockVisit(tx, visitId, input.leadId);
			if (current.status !== 'booked') {
				throw new VisitError('closed', 'This visit was cancelled: book a new one.');
			}
			await checkSalesperson(tx, input.salespersonId);
			const rules = await checkStart(tx, input.salespersonId, input.startsAt, now, visitId);
			const span = blockedSpan(input.startsAt, rules.visitMinutes, rules.bufferMinutes);
			const endsAt = new Date(input.startsAt.getTime() + rules.visitMinutes * 60_000);
			const [row] = await tx
				.update(siteVisits)
				.set({
					salespersonId: input.salespersonId,
					startsAt: input.startsAt,
					endsAt,
					bufferMinutes: rules.bufferMinutes,
					blocked: rangeText(span),
					timeZone: rules.timeZone,
					sequence: current.sequence + 1,
					noteForHomeowner: input.noteForHomeowner ?? current.noteForHomeowner,
					// The links mailed so far keep working and follow the visit to its new time.
					tokenExpiresAt: new Date(endsAt.getTime() + 86_400_000),
					confirmedAt: null,
					changeRequest: null,
					changeRequestedAt: null
				})
				.where(eq(siteVisits.id, visitId))
				.returning();
			// Only hashes are kept, so the update mail carries a fresh link beside the old ones.
			await tx.insert(siteVisitLinks).values({ tokenHash: sha256(token), visitId });
			await tx
				.update(leads)
				.set({ lastTouchAt: now, version: sql`${leads.version} + 1` })
				.where(eq(leads.id, row.leadId));
			const party = await partyFor(tx, row);
			await tx.insert(activities).values({
				leadId: row.leadId,
				kind: 'visit',
				actorId: input.actorId,
				body: `Site visit moved to ${whenShort(row)} with ${party.salesperson.name}`,
				data: {
					visitId: row.id,
					action: 'rescheduled',
					from: current.startsAt.toISOString(),
					startsAt: row.startsAt.toISOString()
				}
			});
			mails = await writeVisitMails(tx, party, 'rescheduled', token);
			// The salesperson who lost the visit hears of it too.
			if (current.salespersonId !== row.salespersonId) {
				const before = await partyFor(tx, {
					...current,
					sequence: row.sequence,
					status: 'cancelled'
				});
				mails.push(
					...(await writeVisitMails(
						tx,
						{ ...before, homeowner: { ...before.homeowner, email: null } },
						'cancelled',
						null
					))
				);
			}
			return row;
		});
	} catch (error) {
		throw translate(error);
	}
	await afterCommit(mails, visit, now);
	return visit;
}

/** A cancelled visit's link keeps saying so for at least this long after the cancel. */
const CANCELLED_LINK_MS = 7 * 86_400_000;

export async function cancelVisit(
	visitId: string,
	input: {
		reason: string;
		actorId: string | null;
		by: 'staff' | 'homeowner';
		now?: Date;
		leadId?: string;
	}
): Promise<SiteVisit> {
	const now = input.now ?? new Date();
	let mails: string[] = [];
	const visit = await db.transaction(async (tx) => {
		const current = await lockVisit(tx, visitId, input.leadId);
		if (current.status !== 'booked') {
			throw new VisitError('closed', 'This visit is already cancelled.');
		}
		const [row] = await tx
			.update(siteVisits)
			.set({
				status: 'cancelled',
				sequence: current.sequence + 1,
				tokenExpiresAt: new Date(
					Math.max(current.tokenExpiresAt.getTime(), now.getTime() + CANCELLED_LINK_MS)
				),
				cancelledAt: now,
				cancelledBy: input.by,
				cancelReason: input.reason
			})
			.where(eq(siteVisits.id, visitId))
			.returning();
		await tx
			.update(leads)
			.set({
				stage: sql`case when ${leads.stage} = 'visit_booked' then 'contacted'::lead_stage else ${leads.stage} end`,
				lastTouchAt: now,
				version: sql`${leads.version} + 1`
			})
			.where(eq(leads.id, row.leadId));
		await tx.insert(activities).values({
			leadId: row.leadId,
			kind: 'visit',
			actorId: input.actorId,
			body:
				`Site visit of ${whenShort(row)} cancelled by the ${input.by === 'homeowner' ? 'homeowner' : 'office'}` +
				(input.reason ? `: ${input.reason}` : ''),
			data: { visitId: row.id, action: 'cancelled', by: input.by }
		});
		mails = await writeVisitMails(tx, await partyFor(tx, row), 'cancelled', null);
		return row;
	});
	for (const id of mails) await dispatchMail(id);
	return visit;
}
