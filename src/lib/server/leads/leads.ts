// Leads in the office: the list query (shared by the API, the CSV export and the benchmark's
// bare baseline), the lead page's reads and every staff edit with its timeline entry.
// Edits that change the lead carry the version the editor saw: a stale version is refused with
// who changed it and when, so two people never silently overwrite each other.
import { DomainError } from '../platform/errors';
import { and, asc, eq, inArray, isNull, sql } from 'drizzle-orm';
import { STAGES, type LeadQuery, type Stage } from '$lib/schema/leads';
import { searchParts, type LeadList, type ListContext } from './list-sql';
import { KeptFacets, PREPARED, runList, type RunStatement } from './kept-facets';
import { inZone } from '$lib/firm-time';
import { client, db, type Tx } from '../platform/db';
import {
	activities,
	contacts,
	leads,
	photos,
	properties,
	users,
	type Lead
} from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { firmSettings } from '../platform/settings';

// --- the list ----------------------------------------------------------------------------------

export { exportSql } from './export-sql';
export { listSql, searchTerms, type LeadList, type LeadRow, type ListContext } from './list-sql';

type Param = Parameters<typeof client.unsafe>[1];

/** Facets counted exactly, kept per view while no lead changes (see listSql). */
const keptFacets = new KeptFacets();

const runStatement: RunStatement = (s) => client.unsafe(s.text, s.params as Param, PREPARED);

export async function listLeads(q: LeadQuery, ctx: ListContext): Promise<LeadList> {
	const run = (asTyped: boolean) => runList(q, ctx, keptFacets, runStatement, asTyped);
	const list = await run(false);
	// The word search knows whole tokens only, and keeps an e-mail address as one: the "gmail"
	// of "ada@gmail.example" is no word of it. When the words find
	// no lead in any stage, the terms are looked for as typed in the search text instead.
	const found = Object.values(list.facets).some((n) => n > 0);
	if (found || !searchParts(q.q).words) return list;
	return run(true);
}

// --- one lead ----------------------------------------------------------------------------------

export async function getLead(id: string) {
	const [row] = await db
		.select({ lead: leads, contact: contacts, property: properties })
		.from(leads)
		.innerJoin(contacts, eq(contacts.id, leads.contactId))
		.leftJoin(properties, eq(properties.id, leads.propertyId))
		.where(eq(leads.id, id))
		.limit(1);
	if (!row) return null;
	const [leadPhotos, timeline, editor] = await Promise.all([
		db.select().from(photos).where(eq(photos.leadId, id)).orderBy(asc(photos.createdAt)),
		db
			.select({
				id: activities.id,
				kind: activities.kind,
				body: activities.body,
				data: activities.data,
				createdAt: activities.createdAt,
				actorName: users.name
			})
			.from(activities)
			.leftJoin(users, eq(users.id, activities.actorId))
			.where(eq(activities.leadId, id))
			.orderBy(sql`${activities.createdAt} desc, ${activities.id} desc`),
		row.lead.updatedBy
			? db.select({ name: users.name }).from(users).where(eq(users.id, row.lead.updatedBy))
			: Promise.resolve([])
	]);
	return { ...row, photos: leadPhotos, timeline, updatedByName: editor[0]?.name ?? null };
}

/** Owners and salespeople who can take a lead. */
export async function assignableStaff() {
	return db
		.select({ id: users.id, name: users.name, role: users.role })
		.from(users)
		.where(and(inArray(users.role, ['owner', 'sales']), isNull(users.disabledAt)))
		.orderBy(asc(users.name));
}

// --- edits -------------------------------------------------------------------------------------

export class LeadNotFoundError extends DomainError<'not_found'> {
	constructor() {
		super('not_found', 'This lead does not exist (any more).');
	}
}

/** Someone else saved the lead since the editor loaded it. */
export class LeadConflictError extends DomainError<'stale'> {
	constructor(
		readonly by: string,
		readonly at: Date,
		timeZone: string
	) {
		super(
			'stale',
			`Changed by ${by} at ${inZone(at, timeZone, 'when')}: reload to see their change.`
		);
	}
}

export class LeadEditError extends DomainError<'invalid'> {
	constructor(message: string) {
		super('invalid', message);
	}
}

/**
 * Updates the lead only if it is still at the version the editor saw; bumps the version.
 * Throws LeadConflictError (who changed it and when) otherwise.
 */
async function updateAtVersion(
	tx: Tx,
	id: string,
	version: number,
	userId: string,
	set: Partial<typeof leads.$inferInsert>
): Promise<Lead> {
	const [updated] = await tx
		.update(leads)
		.set({
			...set,
			version: sql`${leads.version} + 1`,
			updatedBy: userId,
			updatedAt: new Date()
		})
		.where(and(eq(leads.id, id), eq(leads.version, version)))
		.returning();
	if (updated) return updated;
	const [current] = await tx
		.select({ updatedAt: leads.updatedAt, by: users.name })
		.from(leads)
		.leftJoin(users, eq(users.id, leads.updatedBy))
		.where(eq(leads.id, id));
	if (!current) throw new LeadNotFoundError();
	const firm = await firmSettings();
	throw new LeadConflictError(current.by ?? 'someone else', current.updatedAt, firm.timeZone);
}

async function lockedLead(tx: Tx, id: string): Promise<Lead> {
	const [lead] = await tx.select().from(leads).where(eq(leads.id, id)).for('update');
	if (!lead) throw new LeadNotFoundError();
	return lead;
}

async function record(
	tx: Tx,
	leadId: string,
	actorId: string,
	kind: string,
	body = '',
	data: Record<string, unknown> = {}
) {
	await tx.insert(activities).values({ leadId, actorId, kind, body, data });
}

export async function changeStage(
	userId: string,
	id: string,
	input: { version: number; stage: Stage; closeReason?: string; closeNote?: string }
): Promise<void> {
	await db.transaction(async (tx) => {
		const before = await lockedLead(tx, id);
		const closing = input.stage === 'closed';
		if (closing && !input.closeReason) throw new LeadEditError('Closing a lead needs a reason');
		await updateAtVersion(tx, id, input.version, userId, {
			stage: input.stage,
			closeReason: closing ? (input.closeReason as Lead['closeReason']) : null,
			closeNote: closing ? input.closeNote || null : null,
			lastTouchAt: new Date()
		});
		if (before.stage !== input.stage || closing) {
			await record(tx, id, userId, 'stage', closing ? input.closeNote || '' : '', {
				from: before.stage,
				to: input.stage,
				...(closing ? { reason: input.closeReason } : {})
			});
		}
	});
}

export async function assignLead(
	userId: string,
	id: string,
	input: { version: number; assigneeId: string | null }
): Promise<void> {
	await db.transaction(async (tx) => {
		let assigneeName: string | null = null;
		if (input.assigneeId) {
			const [person] = await tx
				.select({ name: users.name, role: users.role, disabledAt: users.disabledAt })
				.from(users)
				.where(eq(users.id, input.assigneeId));
			if (!person || person.disabledAt || person.role === 'crew') {
				throw new LeadEditError('Pick an owner or salesperson from the list');
			}
			assigneeName = person.name;
		}
		const before = await lockedLead(tx, id);
		await updateAtVersion(tx, id, input.version, userId, { assigneeId: input.assigneeId });
		if (before.assigneeId !== input.assigneeId) {
			await record(tx, id, userId, 'assign', '', {
				assigneeId: input.assigneeId,
				assigneeName
			});
		}
	});
}

export async function setPriority(
	userId: string,
	id: string,
	input: { version: number; priority: Lead['priority'] }
): Promise<void> {
	await db.transaction(async (tx) => {
		const before = await lockedLead(tx, id);
		await updateAtVersion(tx, id, input.version, userId, { priority: input.priority });
		if (before.priority !== input.priority) {
			await record(tx, id, userId, 'priority', '', { from: before.priority, to: input.priority });
		}
	});
}

export async function updateDetails(
	userId: string,
	id: string,
	input: {
		version: number;
		name: string;
		email: string;
		phone: string;
		street: string;
		town: string;
		postalCode: string;
		siteNotes: string;
	}
): Promise<void> {
	await db.transaction(async (tx) => {
		const before = await lockedLead(tx, id);
		let propertyId = before.propertyId;
		if (propertyId) {
			await tx
				.update(properties)
				.set({
					street: input.street,
					town: input.town,
					postalCode: input.postalCode,
					siteNotes: input.siteNotes
				})
				.where(eq(properties.id, propertyId));
		} else {
			propertyId = newId();
			await tx.insert(properties).values({
				id: propertyId,
				contactId: before.contactId,
				street: input.street,
				town: input.town,
				postalCode: input.postalCode,
				siteNotes: input.siteNotes
			});
		}
		try {
			await tx
				.update(contacts)
				.set({
					name: input.name,
					email: input.email || null,
					phone: input.phone || null,
					phoneDigits: input.phone.replace(/\D/g, '') || null
				})
				.where(eq(contacts.id, before.contactId));
		} catch (error) {
			if ((error as { code?: string }).code === '23505') {
				throw new LeadEditError('Another contact already uses that e-mail address');
			}
			throw error;
		}
		await updateAtVersion(tx, id, input.version, userId, { propertyId });
		await record(tx, id, userId, 'edit', 'Contact and property details edited');
	});
}

/**
 * The first staff reply (a logged call or a sent e-mail) sets the first-reply time, and a lead
 * still "new" becomes "contacted" (recorded on the timeline and bumping the version).
 */
export async function markReplied(tx: Tx, lead: Lead, userId: string, at: Date): Promise<void> {
	const advance = lead.stage === 'new';
	await tx
		.update(leads)
		.set({
			firstReplyAt: lead.firstReplyAt ?? at,
			lastTouchAt: at,
			...(advance
				? {
						stage: 'contacted' as const,
						version: sql`${leads.version} + 1`,
						updatedBy: userId,
						updatedAt: at
					}
				: {})
		})
		.where(eq(leads.id, lead.id));
	if (advance) {
		await record(tx, lead.id, userId, 'stage', '', { from: 'new', to: 'contacted', auto: true });
	}
}

export async function logActivity(
	userId: string,
	id: string,
	input: { kind: 'call' | 'note'; body: string }
): Promise<void> {
	await db.transaction(async (tx) => {
		const lead = await lockedLead(tx, id);
		const now = new Date();
		await record(tx, id, userId, input.kind, input.body);
		if (input.kind === 'call') await markReplied(tx, lead, userId, now);
		else await tx.update(leads).set({ lastTouchAt: now }).where(eq(leads.id, id));
	});
}

export { lockedLead, record };

// --- Today -------------------------------------------------------------------------------------

export async function todaySummary() {
	const [awaiting, stages, sources, median] = await Promise.all([
		client<
			{
				id: string;
				number: number;
				name: string;
				town: string | null;
				createdAt: Date;
				assigneeName: string | null;
				services: string[];
			}[]
		>`
			select l.id, l.number, c.name, p.town, l.created_at as "createdAt", u.name as "assigneeName", l.services
			from leads l
			join contacts c on c.id = l.contact_id
			left join properties p on p.id = l.property_id
			left join users u on u.id = l.assignee_id
			where l.first_reply_at is null and l.stage = 'new'
			order by l.created_at asc, l.number asc
			limit 50`,
		client<{ stage: Stage; n: number }[]>`
			select stage, count(*)::int as n from leads group by stage`,
		client<{ source: string; leads: number; sold: number }[]>`
			select source, count(*)::int as leads, count(*) filter (where stage = 'sold')::int as sold
			from leads where created_at >= now() - interval '90 days'
			group by source order by count(*) desc, source`,
		client<{ ms: number | null; n: number }[]>`
			select (percentile_cont(0.5) within group (
				order by extract(epoch from first_reply_at - created_at)) * 1000)::float8 as ms,
				count(*)::int as n
			from leads
			where first_reply_at is not null and created_at >= now() - interval '30 days'`
	]);
	const [awaitingCount] = await client<{ n: number }[]>`
		select count(*)::int as n from leads where first_reply_at is null and stage = 'new'`;
	const counts = Object.fromEntries(STAGES.map((st) => [st, 0])) as Record<Stage, number>;
	for (const r of stages) counts[r.stage] = r.n;
	return {
		awaiting: awaiting.map((a) => ({ ...a, createdAt: new Date(a.createdAt).toISOString() })),
		awaitingCount: awaitingCount.n,
		stages: counts,
		sources: sources.map((s) => ({ ...s, share: s.leads ? s.sold / s.leads : 0 })),
		medianReplyMs: median[0]?.ms ?? null,
		repliedCount: median[0]?.n ?? 0
	};
}
