// Writing estimates: a new estimate or version (prefilled from the visit notes and the price
// list), and saving the builder's design with the engine's result.
import { and, eq, max, sql } from 'drizzle-orm';
import { estimate as runEngine } from '$lib/estimating';
import {
	defaultChoices,
	priceWithOverrides,
	totalsForChoices,
	type LineOverride
} from '$lib/estimating/overrides';
import { scopeFromNotes, starterDesign } from '$lib/estimating/prefill';
import { starterFromCatalog, starterGapsNote } from '$lib/estimating/starter';
import type { SaveEstimateInput } from '$lib/schema/estimates';
import { db, type Tx } from '../platform/db';
import { activities, estimates, leads, users } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { estimatingConfig, loadCatalog } from '../pricelist/catalog';
import type { SessionUser } from '../auth/sessions';
import { type StoredResult, leadWithContact, getEstimate } from './records';

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
	const label = `${found.contact.name} — water feature`;
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
