// Estimates: versioned per lead (v1, v2, …), saved with the engine run again on the server, sent
// to the homeowner through a private link (stored hashed), accepted once and frozen.
import { and, desc, eq, max, ne, sql } from 'drizzle-orm';
import { estimate as runEngine, type EstimateSuccess } from '$lib/estimating';
import {
	cleanChoices,
	defaultChoices,
	priceWithOverrides,
	totalsForChoices,
	type Choices,
	type LineOverride,
	type PricedEstimate
} from '$lib/estimating/overrides';
import { scopeFromNotes, starterDesign } from '$lib/estimating/prefill';
import { starterFromCatalog, starterGapsNote } from '$lib/estimating/starter';
import { starterLabel } from '$lib/estimating/starter-features';
import type { SaveEstimateInput } from '$lib/schema/estimates';
import { db } from './db';
import {
	activities,
	contacts,
	estimateAcceptances,
	estimates,
	leads,
	users,
	type Estimate,
	type EstimateAcceptance
} from './db/schema';
import { newId, newToken, sha256 } from './crypto';
import { dispatchMail, writeMail } from './outbox';
import { estimatingConfig, loadCatalog } from './pricelist';
import { acceptedMails, homeownerMessageMail, sentMail, type MailContext } from './estimate-mail';
import { firmSettings } from './settings';
import type { SessionUser } from './auth';

export type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

/** What the builder and the homeowner's page read back: the engine result plus the priced lines. */
export interface StoredResult {
	engine: EstimateSuccess;
	priced: PricedEstimate;
}

export const DAY_MS = 24 * 60 * 60 * 1000;

export async function leadWithContact(leadId: string) {
	const [row] = await db
		.select({ lead: leads, contact: contacts })
		.from(leads)
		.innerJoin(contacts, eq(contacts.id, leads.contactId))
		.where(eq(leads.id, leadId))
		.limit(1);
	return row ?? null;
}

export async function estimatesForLead(leadId: string) {
	return db
		.select()
		.from(estimates)
		.where(eq(estimates.leadId, leadId))
		.orderBy(desc(estimates.number));
}

export async function getEstimate(id: string): Promise<Estimate | null> {
	const [row] = await db.select().from(estimates).where(eq(estimates.id, id)).limit(1);
	return row ?? null;
}

/** The latest site-visit notes for the lead, when the visits table exists and has notes. */
async function latestVisitNotes(leadId: string): Promise<Record<string, unknown> | null> {
	const [exists] = await db.execute<{ t: string | null }>(
		sql`select to_regclass('public.site_visits')::text as t`
	);
	if (!exists?.t) return null;
	const rows = await db.execute<{ notes: Record<string, unknown> | null }>(
		sql`select notes from site_visits where lead_id = ${leadId} and notes is not null
			order by notes_updated_at desc nulls last, starts_at desc limit 1`
	);
	return rows[0]?.notes ?? null;
}

// The starting design and scope from the visit notes live in $lib/estimating/prefill (pure).
export { starterDesign };

/** Runs the engine with the current price list and prices the overrides. */
export function compute(design: unknown, catalog: unknown, overrides: readonly LineOverride[]) {
	const engine = runEngine(design, catalog);
	if (!engine.ok) return { ok: false as const, errors: engine.errors };
	const priced = priceWithOverrides(engine, design, catalog, overrides);
	return { ok: true as const, stored: { engine, priced } satisfies StoredResult };
}

async function nextNumber(leadId: string, tx: Tx) {
	const [row] = await tx
		.select({ n: max(estimates.number) })
		.from(estimates)
		.where(eq(estimates.leadId, leadId));
	return (row?.n ?? 0) + 1;
}

async function insertVersion(
	tx: Tx,
	leadId: string,
	user: SessionUser,
	design: Record<string, unknown>,
	overrides: LineOverride[],
	scope: string
) {
	const catalog = await loadCatalog();
	const computed = compute(design, catalog, overrides);
	const stored = computed.ok ? computed.stored : null;
	const number = await nextNumber(leadId, tx);
	const id = newId();
	await tx.insert(estimates).values({
		id,
		leadId,
		number,
		design,
		overrides,
		scope,
		catalog: catalog as Record<string, unknown>,
		result: stored as unknown as Record<string, unknown>,
		totalCents: stored?.priced.pricing.totalCents ?? 0,
		taxCents: stored
			? totalsForChoices(stored.priced.pricing, defaultChoices(stored.priced.pricing), 0).taxCents
			: 0,
		depositCents: stored?.priced.pricing.depositCents ?? 0,
		createdBy: user.id,
		updatedBy: user.id
	});
	await tx.insert(activities).values({
		leadId,
		kind: 'estimate.created',
		actorId: user.id,
		body: `Estimate v${number} started`,
		data: { estimateId: id, number }
	});
	return id;
}

/** v1 from the visit notes (or the lead), in the lead's "estimating" stage. */
export async function createEstimate(leadId: string, user: SessionUser) {
	const found = await leadWithContact(leadId);
	if (!found) return null;
	const [notes, config, catalog] = await Promise.all([
		latestVisitNotes(leadId),
		estimatingConfig(),
		loadCatalog()
	]);
	const label = starterLabel(found.contact.name, found.lead.services ?? []);
	// What the price list cannot supply goes to the staff's timeline, never into the homeowner's scope.
	const ownDesign = Boolean(notes && typeof notes.design === 'object' && notes.design);
	const services = found.lead.services ?? [];
	const gaps = ownDesign ? '' : starterGapsNote(starterFromCatalog(catalog, services).notes);
	const scope = scopeFromNotes(notes, found.lead.message);
	return db.transaction(async (tx) => {
		await tx.execute(sql`select id from leads where id = ${leadId} for update`);
		const id = await insertVersion(
			tx,
			leadId,
			user,
			starterDesign(label, notes, config.engine, catalog, services),
			[],
			scope
		);
		if (gaps) await tx.insert(activities).values({ leadId, kind: 'note', body: gaps, data: {} });
		await tx
			.update(leads)
			.set({ stage: 'estimating', lastTouchAt: new Date() })
			.where(and(eq(leads.id, leadId), sql`${leads.stage} in ('new','contacted','visit_booked')`));
		return id;
	});
}

/** A new draft copied from an existing version (a sent or accepted one stays as it was). */
export async function newVersion(estimateId: string, user: SessionUser) {
	const source = await getEstimate(estimateId);
	if (!source) return null;
	return db.transaction(async (tx) => {
		await tx.execute(sql`select id from leads where id = ${source.leadId} for update`);
		return insertVersion(
			tx,
			source.leadId,
			user,
			source.design,
			source.overrides as LineOverride[],
			source.scope
		);
	});
}

export type SaveOutcome =
	| {
			kind: 'saved';
			revision: number;
			stored: StoredResult | null;
			errors: { path: string; message: string }[];
	  }
	| { kind: 'missing' }
	| { kind: 'frozen'; status: string }
	| { kind: 'conflict'; revision: number; by: string | null; at: Date };

/** Saves the design when the caller saw the latest revision; the server runs the engine again. */
export async function saveEstimate(
	id: string,
	input: SaveEstimateInput,
	user: SessionUser
): Promise<SaveOutcome> {
	const catalog = await loadCatalog();
	const overrides = input.overrides as LineOverride[];
	const computed = compute(input.design, catalog, overrides);
	return db.transaction(async (tx) => {
		const [row] = await tx
			.select()
			.from(estimates)
			.where(eq(estimates.id, id))
			.for('update')
			.limit(1);
		if (!row) return { kind: 'missing' as const };
		if (row.status !== 'draft') return { kind: 'frozen' as const, status: row.status };
		if (row.revision !== input.revision) {
			const [by] = row.updatedBy
				? await tx.select({ name: users.name }).from(users).where(eq(users.id, row.updatedBy))
				: [];
			return {
				kind: 'conflict' as const,
				revision: row.revision,
				by: by?.name ?? null,
				at: row.updatedAt
			};
		}
		const stored = computed.ok ? computed.stored : null;
		const pricing = stored?.priced.pricing;
		await tx
			.update(estimates)
			.set({
				design: input.design,
				overrides,
				scope: input.scope,
				catalog: catalog as Record<string, unknown>,
				result: stored as unknown as Record<string, unknown>,
				totalCents: pricing?.totalCents ?? 0,
				taxCents: pricing ? totalsForChoices(pricing, defaultChoices(pricing), 0).taxCents : 0,
				depositCents: pricing?.depositCents ?? 0,
				revision: row.revision + 1,
				updatedBy: user.id,
				updatedAt: new Date()
			})
			.where(eq(estimates.id, id));
		return {
			kind: 'saved' as const,
			revision: row.revision + 1,
			stored,
			errors: computed.ok ? [] : computed.errors
		};
	});
}

async function mailContext(row: Estimate): Promise<MailContext | null> {
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
			body: `${renewing ? 'Sent a fresh link for' : 'Sent'} estimate v${row.number} to ${ctx.contact.email} (${formatTotal(locked.totalCents)})`,
			data: { estimateId: id, number: row.number, totalCents: locked.totalCents }
		});
		return writeMail(sentMail(ctx, { ...locked, expiresAt }, token, tokenHash), tx);
	});
	if (outboxId === false) return { kind: 'invalid', message: 'This version can no longer be sent' };
	if (outboxId) await dispatchMail(outboxId);
	return { kind: 'sent', token, expiresAt };
}

const formatTotal = (cents: number) =>
	`$${(cents / 100).toLocaleString('en-US', { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;

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
 * The hook the jobs issue extends: called inside the acceptance transaction, once per estimate.
 * Today it marks the contact a customer; turning the estimate into a job is added there.
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
	await (await import('./jobsite')).convertAcceptedEstimate(estimateId, tx);
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
			body: `${input.fullName} accepted estimate v${row.number}: ${formatTotal(totals.totalCents)}, deposit ${formatTotal(totals.depositCents)}`,
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

export async function acceptanceFor(estimateId: string) {
	const [row] = await db
		.select()
		.from(estimateAcceptances)
		.where(eq(estimateAcceptances.estimateId, estimateId));
	return row ?? null;
}

/** The office list: every estimate's latest state with its lead and homeowner. */
export async function listEstimates() {
	return db
		.select({
			id: estimates.id,
			leadId: estimates.leadId,
			number: estimates.number,
			status: estimates.status,
			totalCents: estimates.totalCents,
			sentAt: estimates.sentAt,
			updatedAt: estimates.updatedAt,
			leadNumber: leads.number,
			homeowner: contacts.name
		})
		.from(estimates)
		.innerJoin(leads, eq(leads.id, estimates.leadId))
		.innerJoin(contacts, eq(contacts.id, leads.contactId))
		.orderBy(desc(estimates.updatedAt))
		.limit(300);
}
