// An accepted estimate becomes exactly one job (the estimate row is locked and jobs has a unique
// estimate id), with a frozen copy of what was sold, the materials from the takeoff and the deposit due.
import { and, eq, ne, sql } from 'drizzle-orm';
import { db, type Tx } from '../platform/db';
import {
	contacts,
	estimateAcceptances,
	estimates,
	jobMaterials,
	jobs,
	leads,
	type FrozenEstimate
} from '../platform/db/schema';
import { newId } from '../platform/crypto';
import type { SessionUser } from '../auth/sessions';
import { JobError } from './errors';
import { jobRef } from './labels';
import { crewNeededFrom, isWaterFeature, materialsFromResult } from './materials';
import { addActivity } from '../leads/timeline';
import { formatCents } from '$lib/money';

/** The design's own name (the builder starts it as "<homeowner> — water feature"), else the services and the lead number. */
function jobTitle(design: unknown, lead: { services: string[] | null; number: number }): string {
	const name = (design as { name?: unknown } | null)?.name;
	if (typeof name === 'string' && name.trim()) return name.trim().slice(0, 120);
	return `${(lead.services ?? []).join(', ') || 'Water feature'} for R-${lead.number}`;
}
// ---------------------------------------------------------------------------------------------
// Conversion

export interface ConversionOptions {
	actorId?: string | null;
	method?: FrozenEstimate['acceptance']['method'];
}

async function convertIn(tx: Tx, estimateId: string, options: ConversionOptions) {
	// The lock makes concurrent conversions of one estimate wait for each other.
	const [estimate] = await tx
		.select()
		.from(estimates)
		.where(eq(estimates.id, estimateId))
		.for('update');
	if (!estimate) throw new JobError('not_found', 'There is no such estimate.');
	const [existing] = await tx
		.select({ id: jobs.id, number: jobs.number })
		.from(jobs)
		.where(eq(jobs.estimateId, estimateId));
	if (existing) {
		throw new JobError(
			'already_converted',
			`This estimate is already job ${jobRef(existing.number)}.`,
			existing.id
		);
	}
	const [acceptance] = await tx
		.select()
		.from(estimateAcceptances)
		.where(eq(estimateAcceptances.estimateId, estimateId));
	if (!acceptance || estimate.status !== 'accepted') {
		throw new JobError(
			'not_accepted',
			`Estimate v${estimate.number} is ${estimate.status === 'accepted' ? 'marked accepted but has no acceptance record' : estimate.status}, not accepted: nothing to convert yet.`
		);
	}
	const [lead] = await tx.select().from(leads).where(eq(leads.id, estimate.leadId));
	const choices = acceptance.optionsChosen;
	const result = acceptance.result;
	// The estimates module stores { engine, priced }; older or hand-made rows hold the engine result.
	const stored = (estimate.result ?? {}) as Record<string, unknown>;
	const engine = (stored.engine ?? stored) as Record<string, unknown>;
	const frozen: FrozenEstimate = {
		estimateId,
		number: estimate.number,
		revision: acceptance.revision,
		scope: estimate.scope,
		design: estimate.design,
		result,
		engine: { stones: engine.stones ?? null, cautions: engine.cautions ?? [] },
		choices,
		acceptance: {
			typedName: acceptance.typedName,
			acceptedAt: acceptance.acceptedAt.toISOString(),
			ipAddress: acceptance.ipAddress,
			userAgent: acceptance.userAgent,
			method: options.method ?? 'link',
			recordedBy: options.method && options.method !== 'link' ? (options.actorId ?? null) : null
		},
		totalCents: acceptance.totalCents,
		depositCents: acceptance.depositCents
	};
	const title = jobTitle(estimate.design, lead);
	const id = newId();
	const inserted = await tx
		.insert(jobs)
		.values({
			id,
			estimateId,
			leadId: lead.id,
			contactId: lead.contactId,
			propertyId: lead.propertyId,
			title,
			frozen,
			contractCents: acceptance.totalCents,
			depositDueCents: acceptance.depositCents,
			crewNeeded: crewNeededFrom(engine),
			crewSize: crewNeededFrom(engine) || null,
			isWaterFeature: isWaterFeature(engine),
			createdBy: options.actorId ?? null
		})
		.onConflictDoNothing({ target: jobs.estimateId })
		.returning({ id: jobs.id, number: jobs.number });
	if (!inserted[0]) throw new JobError('already_converted', 'This estimate is already a job.');
	const materials = materialsFromResult(result, estimate.catalog, choices);
	if (materials.length) {
		await tx.insert(jobMaterials).values(materials.map((m) => ({ ...m, id: newId(), jobId: id })));
	}
	await tx.update(contacts).set({ isCustomer: true }).where(eq(contacts.id, lead.contactId));
	await tx
		.update(leads)
		.set({ stage: 'sold', lastTouchAt: new Date(), version: sql`${leads.version} + 1` })
		.where(eq(leads.id, lead.id));
	await addActivity(
		tx,
		lead.id,
		'job.created',
		`Sold: estimate v${estimate.number} became job ${jobRef(inserted[0].number)} (${materials.length} material lines, deposit due ${formatCents(acceptance.depositCents)}).`,
		options.actorId ?? null,
		{ jobId: id, estimateId, method: frozen.acceptance.method }
	);
	return { jobId: id, number: inserted[0].number };
}

/**
 * Turns an accepted estimate into its job, in the caller's transaction when given one (the
 * estimates module calls this from onEstimateAccepted). Refuses, with the reason, an estimate
 * that is not accepted or that is already a job.
 */
export async function convertAcceptedEstimate(
	estimateId: string,
	tx?: Tx,
	options: ConversionOptions = {}
): Promise<{ jobId: string; number: number }> {
	if (tx) return convertIn(tx, estimateId, options);
	return db.transaction((t) => convertIn(t, estimateId, options));
}

/**
 * Staff record a yes given on paper or by phone: the acceptance (with the estimate's current
 * choices and result) and the conversion happen in one transaction.
 */
export async function recordSaleByHand(
	estimateId: string,
	input: { typedName: string; method: 'paper' | 'phone'; acceptedOn: Date },
	actor: SessionUser
): Promise<{ jobId: string; number: number }> {
	return db.transaction(async (tx) => {
		const [estimate] = await tx
			.select()
			.from(estimates)
			.where(eq(estimates.id, estimateId))
			.for('update');
		if (!estimate) throw new JobError('not_found', 'There is no such estimate.');
		const [job] = await tx.select().from(jobs).where(eq(jobs.estimateId, estimateId));
		if (job) {
			throw new JobError(
				'already_converted',
				`This estimate is already job ${jobRef(job.number)}.`,
				job.id
			);
		}
		const [acceptance] = await tx
			.select({ id: estimateAcceptances.id })
			.from(estimateAcceptances)
			.where(eq(estimateAcceptances.estimateId, estimateId));
		if (!acceptance) {
			if (estimate.status === 'declined' || !estimate.result) {
				throw new JobError(
					'not_accepted',
					estimate.status === 'declined'
						? 'The homeowner declined this estimate; make a new version first.'
						: 'This estimate has no priced result yet; save it in the estimate builder first.'
				);
			}
			const design = estimate.design as {
				options?: { id: string; selected?: boolean }[];
				alternates?: { id: string; selectedChoiceId: string }[];
			};
			await tx.insert(estimateAcceptances).values({
				id: newId(),
				estimateId,
				estimateNumber: estimate.number,
				typedName: input.typedName,
				acceptedAt: input.acceptedOn,
				ipAddress: null,
				userAgent: `recorded by ${actor.name} (${input.method})`,
				revision: estimate.revision,
				optionsChosen: {
					options: (design.options ?? []).filter((o) => o.selected).map((o) => o.id),
					alternates: Object.fromEntries(
						(design.alternates ?? []).map((a) => [a.id, a.selectedChoiceId])
					)
				},
				totalCents: estimate.totalCents,
				depositCents: estimate.depositCents,
				// The same shape the online acceptance stores: the priced lines for these choices.
				result: byHandResult(estimate.result, estimate.totalCents, estimate.depositCents)
			});
			await tx
				.update(estimates)
				.set({ status: 'accepted', updatedBy: actor.id })
				.where(eq(estimates.id, estimateId));
		}
		return convertIn(tx, estimateId, { actorId: actor.id, method: input.method });
	});
}

function byHandResult(
	stored: Record<string, unknown>,
	totalCents: number,
	depositCents: number
): Record<string, unknown> {
	const priced = stored.priced as { pricing?: unknown; lines?: unknown } | undefined;
	if (!priced) return stored;
	return { totals: { totalCents, depositCents }, pricing: priced.pricing, lines: priced.lines };
}

/** The estimates a staff member can mark sold by hand for a lead (newest first). */
export async function sellableEstimates(leadId: string) {
	return db
		.select({
			id: estimates.id,
			number: estimates.number,
			status: estimates.status,
			scope: estimates.scope,
			totalCents: estimates.totalCents,
			depositCents: estimates.depositCents,
			jobId: jobs.id
		})
		.from(estimates)
		.leftJoin(jobs, eq(jobs.estimateId, estimates.id))
		.where(and(eq(estimates.leadId, leadId), ne(estimates.status, 'declined')))
		.orderBy(sql`${estimates.number} desc`);
}

/** The lead a sale by hand is recorded for: its number and the homeowner's name. */
export async function leadForSale(leadId: string) {
	const [lead] = await db
		.select({ id: leads.id, number: leads.number, name: contacts.name })
		.from(leads)
		.innerJoin(contacts, eq(contacts.id, leads.contactId))
		.where(eq(leads.id, leadId));
	return lead ?? null;
}
