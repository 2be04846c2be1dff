import { and, asc, eq, gt, lt, sql } from 'drizzle-orm';
import { wallTime } from '$lib/scheduling/zone';
import { db } from '../platform/db';
import { contacts, leads, photos, properties, siteVisits, users } from '../platform/db/schema';
import { partyFor } from './party';

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
