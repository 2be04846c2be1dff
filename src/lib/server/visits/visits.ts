// Site visits: availability, bookable slots, booking with the database as the last word on
// double-booking (exclusion constraint site_visits_no_overlap), reschedule, cancel, the
// homeowner's private link, reminders the day before, the agenda and the visit notes.
import { and, asc, eq, gt, inArray, isNull, lt, ne, or, sql } from 'drizzle-orm';
import {
	blockedSpan,
	freeSlots,
	refusal,
	REFUSALS,
	type Busy,
	type Refusal,
	type Rules,
	type Slot
} from '$lib/scheduling/slots';
import { reminderPlan } from '$lib/scheduling/reminders';
import { addDays, wallTime, zonedInstant } from '$lib/scheduling/zone';
import type { AvailabilityInput, VisitNotes } from '$lib/schema/visits';
import { db, type Tx } from '../platform/db';
import {
	activities,
	availability,
	contacts,
	leads,
	outbox,
	photos,
	properties,
	settings,
	siteVisitLinks,
	siteVisits,
	timeOff,
	users,
	type Settings,
	type SiteVisit
} from '../platform/db/schema';
import { newId, newToken, sha256 } from '../platform/crypto';
import { dispatchMail, writeMail } from '../platform/outbox';
import { defineJob, enqueue } from '../platform/queue';
import { firmSettings } from '../platform/settings';
import { writeVisitMails, type VisitMailKind, type VisitParty } from './mail';
import { visitPhotoLinks } from '../photos/visit-photos';


export const DEFAULT_RULES: Rules = {
	weeklyHours: Object.fromEntries(
		['1', '2', '3', '4', '5'].map((d) => [d, [{ start: '08:00', end: '17:00' }]])
	),
	visitMinutes: 60,
	bufferMinutes: 30,
	noticeMinutes: 120,
	daysAhead: 21
};

export type VisitErrorCode =
	Refusal | 'not_found' | 'lead_has_visit' | 'not_salesperson' | 'closed';

export class VisitError extends Error {
	constructor(
		readonly code: VisitErrorCode,
		message: string = (REFUSALS as Record<string, string>)[code] ?? code
	) {
		super(message);
		this.name = 'VisitError';
	}
}

/** The PostgreSQL error code under a Drizzle error, if any. */
function pgCode(error: unknown): string | undefined {
	let e = error as { code?: string; cause?: unknown } | undefined;
	for (let i = 0; e && i < 4; i++) {
		if (typeof e.code === 'string') return e.code;
		e = e.cause as typeof e;
	}
	return undefined;
}

/** The firm's settings read inside the caller's transaction (a pooled read could wait forever). */
async function settingsIn(tx: Tx | typeof db): Promise<Settings> {
	const [row] = await tx.select().from(settings).where(eq(settings.id, 1));
	if (!row) throw new Error('The firm settings are missing: run `npm run seed`.');
	return row;
}

function rangeText(span: Busy): string {
	return `[${span.start.toISOString()},${span.end.toISOString()})`;
}

// ---------------------------------------------------------------------------------------------
// Availability and time off

export async function salespeople() {
	return db
		.select({ id: users.id, name: users.name, role: users.role })
		.from(users)
		.where(and(inArray(users.role, ['owner', 'sales']), isNull(users.disabledAt)))
		.orderBy(asc(users.name));
}

export async function rulesFor(userId: string, tx: Tx | typeof db = db): Promise<Rules> {
	const [row] = await tx.select().from(availability).where(eq(availability.userId, userId));
	if (!row) return DEFAULT_RULES;
	return {
		weeklyHours: row.weeklyHours,
		visitMinutes: row.visitMinutes,
		bufferMinutes: row.bufferMinutes,
		noticeMinutes: row.noticeMinutes,
		daysAhead: row.daysAhead
	};
}

export async function saveAvailability(
	userId: string,
	input: AvailabilityInput,
	actorId: string
): Promise<void> {
	const values = { ...input, updatedBy: actorId };
	await db
		.insert(availability)
		.values({ userId, ...values })
		.onConflictDoUpdate({ target: availability.userId, set: values });
}

export async function listTimeOff(userId: string, from = new Date()) {
	return db
		.select()
		.from(timeOff)
		.where(and(eq(timeOff.userId, userId), gt(timeOff.endsAt, from)))
		.orderBy(asc(timeOff.startsAt));
}

export async function addTimeOff(
	userId: string,
	input: { startDate: string; startTime: string; endDate: string; endTime: string; reason: string }
): Promise<void> {
	const { timeZone } = await firmSettings();
	const toMinutes = (t: string) => Number(t.slice(0, 2)) * 60 + Number(t.slice(3));
	await db.insert(timeOff).values({
		id: newId(),
		userId,
		startsAt: zonedInstant(input.startDate, toMinutes(input.startTime), timeZone),
		endsAt: zonedInstant(input.endDate, toMinutes(input.endTime), timeZone),
		reason: input.reason
	});
}

export async function removeTimeOff(userId: string, id: string): Promise<void> {
	await db.delete(timeOff).where(and(eq(timeOff.id, id), eq(timeOff.userId, userId)));
}

// ---------------------------------------------------------------------------------------------
// Slots

interface Facts extends Rules {
	timeZone: string;
	booked: Busy[];
	timeOff: Busy[];
}

async function factsFor(
	userId: string,
	from: Date,
	to: Date,
	excludeVisitId: string | undefined,
	tx: Tx | typeof db = db
): Promise<Facts> {
	const [{ timeZone }, rules, booked, off] = await Promise.all([
		settingsIn(tx),
		rulesFor(userId, tx),
		tx
			.select({
				start: siteVisits.startsAt,
				ends: siteVisits.endsAt,
				buffer: siteVisits.bufferMinutes
			})
			.from(siteVisits)
			.where(
				and(
					eq(siteVisits.salespersonId, userId),
					eq(siteVisits.status, 'booked'),
					lt(siteVisits.startsAt, to),
					sql`${siteVisits.endsAt} + make_interval(mins => ${siteVisits.bufferMinutes}) > ${from.toISOString()}::timestamptz`,
					excludeVisitId ? ne(siteVisits.id, excludeVisitId) : undefined
				)
			),
		tx
			.select({ start: timeOff.startsAt, end: timeOff.endsAt })
			.from(timeOff)
			.where(and(eq(timeOff.userId, userId), lt(timeOff.startsAt, to), gt(timeOff.endsAt, from)))
	]);
	return {
		...rules,
		timeZone,
		booked: booked.map((b) => ({
			start: b.start,
			end: new Date(b.ends.getTime() + b.buffer * 60_000)
		})),
		timeOff: off
	};
}

export async function slotsFor(
	userId: string,
	from: string,
	to: string,
	options: { now?: Date; excludeVisitId?: string } = {}
): Promise<{ timeZone: string; slots: Slot[]; rules: Rules } | null> {
	const [person] = await db
		.select({ role: users.role, disabledAt: users.disabledAt })
		.from(users)
		.where(eq(users.id, userId));
	if (!person || person.disabledAt || person.role === 'crew') return null;
	const { timeZone } = await firmSettings();
	const wideFrom = zonedInstant(addDays(from, -2), 0, timeZone);
	const wideTo = zonedInstant(addDays(to, 2), 0, timeZone);
	const facts = await factsFor(userId, wideFrom, wideTo, options.excludeVisitId);
	const slots = freeSlots({ ...facts, from, to, now: options.now ?? new Date() });
	return { timeZone, slots, rules: facts };
}

// ---------------------------------------------------------------------------------------------
// Booking, rescheduling, cancelling

async function partyFor(tx: Tx | typeof db, visit: SiteVisit): Promise<VisitParty> {
	const [row] = await tx
		.select({
			number: leads.number,
			name: contacts.name,
			email: contacts.email,
			street: properties.street,
			town: properties.town,
			postalCode: properties.postalCode
		})
		.from(leads)
		.innerJoin(contacts, eq(contacts.id, leads.contactId))
		.leftJoin(properties, eq(properties.id, leads.propertyId))
		.where(eq(leads.id, visit.leadId));
	const [person] = await tx
		.select({ name: users.name, email: users.email })
		.from(users)
		.where(eq(users.id, visit.salespersonId));
	const address = [row.street, [row.town, row.postalCode].filter(Boolean).join(' ')]
		.filter(Boolean)
		.join(', ');
	return {
		visit,
		leadNumber: row.number,
		homeowner: { name: row.name, email: row.email },
		salesperson: person,
		address: address || 'address to be confirmed',
		firm: await settingsIn(tx)
	};
}

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

function whenShort(visit: Pick<SiteVisit, 'startsAt' | 'timeZone'>): string {
	return new Intl.DateTimeFormat('en-US', {
		timeZone: visit.timeZone,
		weekday: 'short',
		month: 'short',
		day: 'numeric',
		hour: 'numeric',
		minute: '2-digit',
		timeZoneName: 'short'
	}).format(visit.startsAt);
}

/** The visit, locked; with `leadId`, a visit of another lead is refused as if it did not exist. */
async function lockVisit(tx: Tx, visitId: string, leadId?: string): Promise<SiteVisit> {
	const [row] = await tx.select().from(siteVisits).where(eq(siteVisits.id, visitId)).for('update');
	if (!row) throw new VisitError('not_found', 'That visit does not exist.');
	if (leadId !== undefined && row.leadId !== leadId) {
		throw new VisitError('not_found', 'That visit is not one of this lead’s visits.');
	}
	return row;
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

// ---------------------------------------------------------------------------------------------
// Reminders: one job per visit SEQUENCE; a job for an older sequence finds it stale and stops.
// When it goes out (a day before, three hours before, or not at all) is reminderPlan's choice.

async function scheduleReminder(visit: SiteVisit, now: Date): Promise<void> {
	const plan = reminderPlan(visit.startsAt, now);
	if (!plan) return; // the visit is only hours away: the invitation just sent stands in
	await enqueue(
		'visit.reminder',
		{ visitId: visit.id, sequence: visit.sequence },
		{ startAfter: plan.at, singletonKey: `visit-reminder:${visit.id}:${visit.sequence}` }
	);
}

export async function sendVisitReminder(
	data: { visitId: string; sequence: number },
	now = new Date()
): Promise<'sent' | 'stale' | 'missing'> {
	const [visit] = await db.select().from(siteVisits).where(eq(siteVisits.id, data.visitId));
	if (!visit) return 'missing';
	if (visit.status !== 'booked' || visit.sequence !== data.sequence || visit.startsAt <= now) {
		return 'stale';
	}
	const prefix = `visit:${visit.id}:${visit.sequence}:reminder:`;
	await db.transaction(async (tx) => {
		const party = await partyFor(tx, visit);
		await writeVisitMails(tx, party, 'reminder' satisfies VisitMailKind, null, now);
	});
	// Written once per sequence (dedupe keys); dispatch whatever of it is still unsent.
	const unsent = await db
		.select({ id: outbox.id })
		.from(outbox)
		.where(and(sql`${outbox.dedupeKey} like ${prefix + '%'}`, isNull(outbox.sentAt)));
	for (const m of unsent) await dispatchMail(m.id);
	return 'sent';
}

defineJob<{ visitId: string; sequence: number }>('visit.reminder', async (data) => {
	await sendVisitReminder(data);
});

// ---------------------------------------------------------------------------------------------
// The homeowner's private page

export async function visitByToken(token: string, now = new Date()) {
	if (!token || token.length > 64) return null;
	const hash = sha256(token);
	const laterLink = db
		.select({ visitId: siteVisitLinks.visitId })
		.from(siteVisitLinks)
		.where(eq(siteVisitLinks.tokenHash, hash));
	const [visit] = await db
		.select()
		.from(siteVisits)
		.where(
			and(
				or(eq(siteVisits.tokenHash, hash), inArray(siteVisits.id, laterLink)),
				gt(siteVisits.tokenExpiresAt, now)
			)
		);
	if (!visit) return null;
	return partyFor(db, visit);
}

export async function confirmByHomeowner(token: string): Promise<boolean> {
	const party = await visitByToken(token);
	if (!party || party.visit.status !== 'booked') return false;
	if (party.visit.confirmedAt) return true;
	await db.transaction(async (tx) => {
		await tx
			.update(siteVisits)
			.set({ confirmedAt: new Date() })
			.where(eq(siteVisits.id, party.visit.id));
		await tx.insert(activities).values({
			leadId: party.visit.leadId,
			kind: 'visit',
			body: `The homeowner confirmed the site visit of ${whenShort(party.visit)}`,
			data: { visitId: party.visit.id, action: 'confirmed' }
		});
	});
	return true;
}

export async function requestOtherTime(token: string, message: string): Promise<boolean> {
	const party = await visitByToken(token);
	if (!party || party.visit.status !== 'booked') return false;
	let mailId: string | null = null;
	await db.transaction(async (tx) => {
		await tx
			.update(siteVisits)
			.set({ changeRequest: message, changeRequestedAt: new Date() })
			.where(eq(siteVisits.id, party.visit.id));
		await tx.insert(activities).values({
			leadId: party.visit.leadId,
			kind: 'visit',
			body: `The homeowner asked for another time: ${message}`,
			data: { visitId: party.visit.id, action: 'change_requested' }
		});
		mailId = await writeMail(
			{
				dedupeKey: `visit:${party.visit.id}:${party.visit.sequence}:change-request:${sha256(message).slice(0, 12)}`,
				to: party.salesperson.email,
				subject: `R-${party.leadNumber}: ${party.homeowner.name} asks for another visit time`,
				text: `${party.homeowner.name} asks to move the site visit of ${whenShort(party.visit)}:\n\n${message}`,
				html: `<p>${escape(party.homeowner.name)} asks to move the site visit of ${escape(whenShort(party.visit))}:</p><blockquote>${escape(message)}</blockquote>`,
				leadId: party.visit.leadId
			},
			tx
		);
	});
	if (mailId) await dispatchMail(mailId);
	return true;
}

function escape(value: string): string {
	return value.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

export async function cancelByHomeowner(token: string, reason: string): Promise<boolean> {
	const party = await visitByToken(token);
	if (!party || party.visit.status !== 'booked') return false;
	await cancelVisit(party.visit.id, { reason, actorId: null, by: 'homeowner' });
	return true;
}

// ---------------------------------------------------------------------------------------------
// Agenda, lead view, notes

export interface AgendaVisit {
	id: string;
	leadId: string;
	leadNumber: number;
	salespersonId: string;
	salespersonName: string;
	status: 'booked' | 'cancelled';
	startsAt: Date;
	endsAt: Date;
	bufferMinutes: number;
	homeowner: string;
	phone: string | null;
	address: string;
	services: string[];
	message: string;
	confirmedAt: Date | null;
	changeRequest: string | null;
	hasNotes: boolean;
}

export async function agenda(
	from: Date,
	to: Date,
	salespersonId: string | null
): Promise<AgendaVisit[]> {
	const rows = await db
		.select({
			id: siteVisits.id,
			leadId: siteVisits.leadId,
			leadNumber: leads.number,
			salespersonId: siteVisits.salespersonId,
			salespersonName: users.name,
			status: siteVisits.status,
			startsAt: siteVisits.startsAt,
			endsAt: siteVisits.endsAt,
			bufferMinutes: siteVisits.bufferMinutes,
			homeowner: contacts.name,
			phone: contacts.phone,
			street: properties.street,
			town: properties.town,
			services: leads.services,
			message: leads.message,
			confirmedAt: siteVisits.confirmedAt,
			changeRequest: siteVisits.changeRequest,
			notes: siteVisits.notes
		})
		.from(siteVisits)
		.innerJoin(leads, eq(leads.id, siteVisits.leadId))
		.innerJoin(contacts, eq(contacts.id, leads.contactId))
		.leftJoin(properties, eq(properties.id, leads.propertyId))
		.innerJoin(users, eq(users.id, siteVisits.salespersonId))
		.where(
			and(
				eq(siteVisits.status, 'booked'),
				lt(siteVisits.startsAt, to),
				gt(siteVisits.endsAt, from),
				salespersonId ? eq(siteVisits.salespersonId, salespersonId) : undefined
			)
		)
		.orderBy(asc(siteVisits.startsAt));
	return rows.map(({ street, town, notes, ...r }) => ({
		...r,
		address: [street, town].filter(Boolean).join(', '),
		hasNotes: notes !== null
	}));
}

export async function visitDetail(visitId: string) {
	const [visit] = await db.select().from(siteVisits).where(eq(siteVisits.id, visitId));
	if (!visit) return null;
	const party = await partyFor(db, visit);
	const [lead] = await db
		.select({
			services: leads.services,
			message: leads.message,
			budget: leads.budget,
			stage: leads.stage
		})
		.from(leads)
		.where(eq(leads.id, visit.leadId));
	const pictures = await db
		.select()
		.from(photos)
		.where(eq(photos.leadId, visit.leadId))
		.orderBy(asc(photos.createdAt));
	return { ...party, lead, photos: pictures };
}

/** The visits of a lead, newest first (the lead page shows them). */
export async function visitsOfLead(leadId: string) {
	return db
		.select({
			id: siteVisits.id,
			status: siteVisits.status,
			startsAt: siteVisits.startsAt,
			endsAt: siteVisits.endsAt,
			timeZone: siteVisits.timeZone,
			salespersonId: siteVisits.salespersonId,
			salespersonName: users.name,
			noteForHomeowner: siteVisits.noteForHomeowner,
			confirmedAt: siteVisits.confirmedAt,
			changeRequest: siteVisits.changeRequest,
			cancelReason: siteVisits.cancelReason,
			notes: siteVisits.notes,
			sequence: siteVisits.sequence
		})
		.from(siteVisits)
		.innerJoin(users, eq(users.id, siteVisits.salespersonId))
		.where(eq(siteVisits.leadId, leadId))
		.orderBy(sql`${siteVisits.startsAt} desc`);
}

/**
 * What the lead page shows of its visits' notes: every visit with notes or photos, and a booked
 * one still waiting for them; newest first, each with its photos' short-lived links.
 */
export async function visitNotesOfLead(leadId: string) {
	const visits = await visitsOfLead(leadId);
	const withPhotos = await Promise.all(
		visits.map(async (v) => ({ ...v, photos: await visitPhotoLinks(v.id) }))
	);
	return withPhotos
		.filter((v) => v.notes !== null || v.photos.length > 0 || v.status === 'booked')
		.map((v) => ({
			id: v.id,
			status: v.status,
			startsAt: v.startsAt,
			timeZone: v.timeZone,
			salespersonName: v.salespersonName,
			notes: v.notes as Partial<VisitNotes> | null,
			photos: v.photos
		}));
}

export async function saveNotes(
	visitId: string,
	notes: VisitNotes,
	actorId: string
): Promise<boolean> {
	const rows = await db
		.update(siteVisits)
		.set({ notes, notesUpdatedAt: new Date(), notesUpdatedBy: actorId })
		.where(eq(siteVisits.id, visitId))
		.returning({ leadId: siteVisits.leadId });
	if (!rows.length) return false;
	await db.insert(activities).values({
		leadId: rows[0].leadId,
		kind: 'visit',
		actorId,
		body: 'Visit notes saved',
		data: { visitId, action: 'notes' }
	});
	return true;
}

/** Local date of an instant in the firm's zone (for links and grouping). */
export function localDate(instant: Date, timeZone: string): string {
	return wallTime(instant, timeZone).date;
}

/** What the booking page shows of a lead. */
export async function leadForVisit(leadId: string) {
	const [row] = await db
		.select({
			id: leads.id,
			number: leads.number,
			stage: leads.stage,
			assigneeId: leads.assigneeId,
			name: contacts.name,
			email: contacts.email,
			street: properties.street,
			town: properties.town
		})
		.from(leads)
		.innerJoin(contacts, eq(contacts.id, leads.contactId))
		.leftJoin(properties, eq(properties.id, leads.propertyId))
		.where(eq(leads.id, leadId));
	return row ?? null;
}
