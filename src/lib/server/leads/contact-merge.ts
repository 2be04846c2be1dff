// One person per contact, joined only by e-mail at intake. Inquiries that share a phone number or
// a name but give another e-mail become contacts of their own, and the office sees them here as
// possible duplicates. Merging is a staff decision: the merged contact's row stays (pointing at
// the kept one through merged_into_id), so every name, e-mail and phone stays on record, and
// each lead keeps its own contact, so its mail still goes to the address its inquiry gave.
import { and, eq, inArray, ne, or, sql } from 'drizzle-orm';
import { db } from '../platform/db';
import { activities, contacts, leads, type Contact } from '../platform/db/schema';
import type { SessionUser } from '../auth/sessions';

export interface PersonContact {
	id: string;
	name: string;
	email: string | null;
	phone: string | null;
	leads: { id: string; number: number }[];
}
export interface DuplicateCandidate extends PersonContact {
	reasons: ('phone' | 'name')[];
}

export class MergeError extends Error {
	constructor(
		readonly code: 'not_found' | 'already_merged',
		message: string
	) {
		super(message);
	}
}

const rootOf = (c: Pick<Contact, 'id' | 'mergedIntoId'>) => c.mergedIntoId ?? c.id;
const sameRoot = sql`coalesce(${contacts.mergedIntoId}, ${contacts.id})`;

async function withLeads(rows: Contact[]): Promise<Map<string, PersonContact['leads']>> {
	const byContact = new Map<string, PersonContact['leads']>();
	if (!rows.length) return byContact;
	const found = await db
		.select({ id: leads.id, number: leads.number, contactId: leads.contactId })
		.from(leads)
		.where(
			inArray(
				leads.contactId,
				rows.map((r) => r.id)
			)
		)
		.orderBy(leads.number);
	for (const l of found) {
		const list = byContact.get(l.contactId) ?? [];
		list.push({ id: l.id, number: l.number });
		byContact.set(l.contactId, list);
	}
	return byContact;
}

const shape = (c: Contact, leadsOf: Map<string, PersonContact['leads']>): PersonContact => ({
	id: c.id,
	name: c.name,
	email: c.email,
	phone: c.phone,
	leads: leadsOf.get(c.id) ?? []
});

/** The other contacts of the same person (merged with this one), with their leads. */
export async function samePerson(contactId: string): Promise<PersonContact[]> {
	const [me] = await db.select().from(contacts).where(eq(contacts.id, contactId));
	if (!me) return [];
	const rows = await db
		.select()
		.from(contacts)
		.where(and(sql`${sameRoot} = ${rootOf(me)}`, ne(contacts.id, me.id)))
		.orderBy(contacts.createdAt);
	const leadsOf = await withLeads(rows);
	return rows.map((c) => shape(c, leadsOf));
}

/** Contacts of other people (not merged with this one) with the same phone digits or name. */
export async function possibleDuplicates(contactId: string): Promise<DuplicateCandidate[]> {
	const [me] = await db.select().from(contacts).where(eq(contacts.id, contactId));
	if (!me) return [];
	const phone = me.phoneDigits && me.phoneDigits.length >= 7 ? me.phoneDigits : null;
	const name = me.name.trim().toLowerCase();
	const rows = await db
		.select()
		.from(contacts)
		.where(
			and(
				sql`${sameRoot} <> ${rootOf(me)}`,
				or(
					phone ? eq(contacts.phoneDigits, phone) : sql`false`,
					sql`lower(trim(${contacts.name})) = ${name}`
				)
			)
		)
		.orderBy(contacts.createdAt)
		.limit(10);
	const leadsOf = await withLeads(rows);
	return rows.map((c) => ({
		...shape(c, leadsOf),
		reasons: [
			...(phone && c.phoneDigits === phone ? (['phone'] as const) : []),
			...(c.name.trim().toLowerCase() === name ? (['name'] as const) : [])
		]
	}));
}

const describe = (c: Contact) =>
	[c.name, c.email && `<${c.email}>`, c.phone].filter(Boolean).join(' ');

/**
 * Records that two contacts are one person: the other contact's group joins the kept contact's
 * group. Nothing is deleted or overwritten; every lead of both gets a timeline entry.
 */
export async function mergeContacts(
	keepId: string,
	otherId: string,
	actor: Pick<SessionUser, 'id' | 'name'>
): Promise<void> {
	await db.transaction(async (tx) => {
		const rows = await tx
			.select()
			.from(contacts)
			.where(inArray(contacts.id, [keepId, otherId]))
			.orderBy(contacts.id)
			.for('update');
		const keep = rows.find((r) => r.id === keepId);
		const other = rows.find((r) => r.id === otherId);
		if (!keep || !other) throw new MergeError('not_found', 'That contact no longer exists.');
		const keepRoot = rootOf(keep);
		const otherRoot = rootOf(other);
		if (keepRoot === otherRoot) {
			throw new MergeError('already_merged', 'These contacts are already one person.');
		}
		// Both groups' rows, locked, so two merges at once cannot build a chain or a loop.
		const members = await tx
			.select()
			.from(contacts)
			.where(
				or(
					inArray(contacts.id, [keepRoot, otherRoot]),
					inArray(contacts.mergedIntoId, [keepRoot, otherRoot])
				)
			)
			.orderBy(contacts.id)
			.for('update');
		const now = new Date();
		await tx
			.update(contacts)
			.set({ mergedIntoId: keepRoot, mergedAt: now })
			.where(or(eq(contacts.id, otherRoot), eq(contacts.mergedIntoId, otherRoot)));
		const affected = await tx
			.select({ id: leads.id, number: leads.number })
			.from(leads)
			.where(
				inArray(
					leads.contactId,
					members.map((m) => m.id)
				)
			);
		const refs = affected.map((l) => `R-${l.number}`).join(', ');
		if (affected.length) {
			await tx.insert(activities).values(
				affected.map((l) => ({
					leadId: l.id,
					kind: 'contact.merged',
					actorId: actor.id,
					body: `${describe(keep)} and ${describe(other)} are one person (leads ${refs}). Each lead's mail still goes to the address its inquiry gave.`,
					data: { keptContactId: keepRoot, mergedContactId: otherRoot, leads: refs }
				}))
			);
		}
	});
}
