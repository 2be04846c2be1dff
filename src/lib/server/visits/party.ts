// A visit with its people: the homeowner, the salesperson and the firm (read in the caller's
// transaction), and the short wording of its time.
import { eq } from 'drizzle-orm';
import { db, type Tx } from '../platform/db';
import {
	contacts,
	leads,
	properties,
	settings,
	siteVisits,
	users,
	type Settings,
	type SiteVisit
} from '../platform/db/schema';
import type { VisitParty } from './mail';
import { VisitError } from './errors';
import { inZone } from '$lib/firm-time';

/** The firm's settings read inside the caller's transaction (a pooled read could wait forever). */
export async function settingsIn(tx: Tx | typeof db): Promise<Settings> {
	const [row] = await tx.select().from(settings).where(eq(settings.id, 1));
	if (!row) throw new Error('The firm settings are missing: run `npm run seed`.');
	return row;
}
export async function partyFor(tx: Tx | typeof db, visit: SiteVisit): Promise<VisitParty> {
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

export function whenShort(visit: Pick<SiteVisit, 'startsAt' | 'timeZone'>): string {
	return inZone(visit.startsAt, visit.timeZone, 'whenShort');
}

/** The visit, locked; with `leadId`, a visit of another lead is refused as if it did not exist. */
export async function lockVisit(tx: Tx, visitId: string, leadId?: string): Promise<SiteVisit> {
	const [row] = await tx.select().from(siteVisits).where(eq(siteVisits.id, visitId)).for('update');
	if (!row) throw new VisitError('not_found', 'That visit does not exist.');
	if (leadId !== undefined && row.leadId !== leadId) {
		throw new VisitError('not_found', 'That visit is not one of this lead’s visits.');
	}
	return row;
}
