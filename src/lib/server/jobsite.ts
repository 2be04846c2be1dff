// Jobs: an accepted estimate becomes exactly one job (the estimate row is locked and jobs has a
// unique estimate id), with a frozen copy of what was sold, the materials from the takeoff, the
// deposit due, install days, a crew lead, a punch list and completion.
import { and, asc, eq, gte, inArray, isNull, lte, ne, sql } from 'drizzle-orm';
import { db } from './db';
import {
	activities,
	contacts,
	estimateAcceptances,
	estimates,
	jobDays,
	jobMaterials,
	jobs,
	leads,
	photos,
	properties,
	punchItems,
	siteVisits,
	users,
	type FrozenEstimate,
	type Job,
	type JobStage
} from './db/schema';
import { newId } from './crypto';
import type { SessionUser } from './auth';
import { recordFeaturesOfJob } from './care/features';

export type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];
type Db = Tx | typeof db;

export type JobErrorCode =
	| 'not_found'
	| 'not_accepted'
	| 'already_converted'
	| 'forbidden'
	| 'job_paid'
	| 'open_punch_items'
	| 'bad_stage'
	| 'invalid';

export class JobError extends Error {
	constructor(
		readonly code: JobErrorCode,
		message: string,
		readonly jobId?: string
	) {
		super(message);
		this.name = 'JobError';
	}
}

export const STAGE_LABELS: Record<JobStage, string> = {
	scheduled: 'Scheduled',
	underway: 'Underway',
	punch_list: 'Punch list',
	complete: 'Complete',
	paid: 'Paid'
};

export const jobRef = (n: number) => `J-${n}`;

// ---------------------------------------------------------------------------------------------
// The engine result, read defensively (it is stored as jsonb)

interface StoredLine {
	bucket?: string;
	sku?: string;
	name?: string;
	description?: string;
	unit?: string;
	quantity?: number;
}

function resultLines(result: Record<string, unknown>): StoredLine[] {
	const pricing = result.pricing as { lines?: StoredLine[] } | undefined;
	return Array.isArray(pricing?.lines) ? pricing.lines : [];
}

/** The buckets the homeowner bought: the base, the options chosen, the alternates picked. */
export function includedBuckets(choices: FrozenEstimate['choices']): Set<string> {
	return new Set(['base', ...choices.options, ...Object.values(choices.alternates)]);
}

export function crewNeededFrom(result: Record<string, unknown>): number {
	const stones = result.stones as { crewNeeded?: number } | undefined;
	const n = Number(stones?.crewNeeded ?? 0);
	return Number.isFinite(n) && n > 0 ? Math.round(n) : 0;
}

function isWaterFeature(result: Record<string, unknown>): boolean {
	const systems = result.systems;
	return (
		Boolean(result.water) || Boolean(result.basin) || (Array.isArray(systems) && systems.length > 0)
	);
}

const CATEGORY_ORDER = [
	'stone',
	'basin',
	'liner',
	'filtration',
	'pump',
	'pipe',
	'fitting',
	'valve',
	'aggregate',
	'wall',
	'lighting',
	'electrical',
	'other'
];

/** The materials list from the takeoff lines of the buckets bought, grouped by category. */
export function materialsFromResult(
	result: Record<string, unknown>,
	catalog: Record<string, unknown> | null,
	choices: FrozenEstimate['choices']
) {
	const items = Array.isArray(catalog?.items)
		? (catalog.items as { sku: string; category: string }[])
		: [];
	const categoryOf = new Map(items.map((i) => [i.sku, i.category]));
	const included = includedBuckets(choices);
	const rows = resultLines(result)
		.filter((l) => included.has(l.bucket ?? 'base') && Number(l.quantity) > 0)
		.map((l) => ({
			category: l.sku?.startsWith('pump:') ? 'pump' : (categoryOf.get(l.sku ?? '') ?? 'other'),
			sku: l.sku ?? '',
			name: l.name ?? l.description ?? 'Item',
			description: l.description ?? '',
			unit: l.unit ?? 'each',
			quantity: Number(l.quantity)
		}));
	const rank = (c: string) => {
		const i = CATEGORY_ORDER.indexOf(c);
		return i === -1 ? CATEGORY_ORDER.length : i;
	};
	return rows
		.sort((a, b) => rank(a.category) - rank(b.category) || a.name.localeCompare(b.name))
		.map((r, i) => ({ ...r, sortOrder: i }));
}

/** The design's own name (the builder starts it as "<homeowner> — water feature"), else the services and the lead number. */
function jobTitle(design: unknown, lead: { services: string[] | null; number: number }): string {
	const name = (design as { name?: unknown } | null)?.name;
	if (typeof name === 'string' && name.trim()) return name.trim().slice(0, 120);
	return `${(lead.services ?? []).join(', ') || 'Water feature'} for R-${lead.number}`;
}

export async function addActivity(
	tx: Db,
	leadId: string,
	kind: string,
	body: string,
	actorId: string | null,
	data: Record<string, unknown> = {}
): Promise<void> {
	await tx.insert(activities).values({ leadId, kind, body, actorId, data });
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
		`Sold: estimate v${estimate.number} became job ${jobRef(inserted[0].number)} (${materials.length} material lines, deposit due ${(acceptance.depositCents / 100).toFixed(2)}).`,
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

// ---------------------------------------------------------------------------------------------
// Reading jobs, with ownership

/** The job, if this user may open it: 404 when missing, 403 for another crew lead's job. */
export async function jobFor(user: SessionUser, jobId: string): Promise<Job> {
	const [job] = await db.select().from(jobs).where(eq(jobs.id, jobId));
	if (!job) throw new JobError('not_found', 'There is no such job.');
	if (user.role === 'crew' && job.crewLeadId !== user.id) {
		throw new JobError('forbidden', 'This job is assigned to another crew lead.');
	}
	return job;
}

export async function listJobs(user: SessionUser) {
	const rows = await db
		.select({
			id: jobs.id,
			number: jobs.number,
			title: jobs.title,
			stage: jobs.stage,
			crewLeadId: jobs.crewLeadId,
			crewLeadName: users.name,
			contactName: contacts.name,
			town: properties.town,
			street: properties.street
		})
		.from(jobs)
		.innerJoin(contacts, eq(contacts.id, jobs.contactId))
		.leftJoin(properties, eq(properties.id, jobs.propertyId))
		.leftJoin(users, eq(users.id, jobs.crewLeadId))
		.where(user.role === 'crew' ? eq(jobs.crewLeadId, user.id) : undefined)
		.orderBy(sql`${jobs.number} desc`);
	const days = rows.length
		? await db
				.select({ jobId: jobDays.jobId, day: jobDays.day })
				.from(jobDays)
				.where(
					inArray(
						jobDays.jobId,
						rows.map((r) => r.id)
					)
				)
				.orderBy(asc(jobDays.day))
		: [];
	return rows.map((r) => ({ ...r, days: days.filter((d) => d.jobId === r.id).map((d) => d.day) }));
}

/** Install days between two dates (inclusive, yyyy-mm-dd), for the calendar. */
export async function installDays(user: SessionUser, from: string, to: string) {
	return db
		.select({
			day: jobDays.day,
			jobId: jobs.id,
			number: jobs.number,
			title: jobs.title,
			stage: jobs.stage,
			crewLeadId: jobs.crewLeadId,
			crewLeadName: users.name,
			street: properties.street,
			town: properties.town
		})
		.from(jobDays)
		.innerJoin(jobs, eq(jobs.id, jobDays.jobId))
		.leftJoin(users, eq(users.id, jobs.crewLeadId))
		.leftJoin(properties, eq(properties.id, jobs.propertyId))
		.where(
			and(
				gte(jobDays.day, from),
				lte(jobDays.day, to),
				user.role === 'crew' ? eq(jobs.crewLeadId, user.id) : undefined
			)
		)
		.orderBy(asc(jobDays.day), asc(jobs.number));
}

/** Other jobs the same crew lead is booked on, on the same days. */
export async function crewConflicts(jobId: string, tx: Db = db) {
	const [job] = await tx.select().from(jobs).where(eq(jobs.id, jobId));
	if (!job?.crewLeadId) return [];
	const mine = tx.select({ day: jobDays.day }).from(jobDays).where(eq(jobDays.jobId, jobId));
	return tx
		.select({ day: jobDays.day, jobId: jobs.id, number: jobs.number, title: jobs.title })
		.from(jobDays)
		.innerJoin(jobs, eq(jobs.id, jobDays.jobId))
		.where(
			and(
				eq(jobs.crewLeadId, job.crewLeadId),
				ne(jobs.id, jobId),
				inArray(jobDays.day, mine),
				inArray(jobs.stage, ['scheduled', 'underway', 'punch_list'])
			)
		)
		.orderBy(asc(jobDays.day));
}

export async function crewLeads() {
	return db
		.select({ id: users.id, name: users.name })
		.from(users)
		.where(and(eq(users.role, 'crew'), isNull(users.disabledAt)))
		.orderBy(asc(users.name));
}

async function siteFor(job: Job) {
	const [contact] = await db.select().from(contacts).where(eq(contacts.id, job.contactId));
	const [property] = job.propertyId
		? await db.select().from(properties).where(eq(properties.id, job.propertyId))
		: [];
	const visits = await db
		.select({ startsAt: siteVisits.startsAt, notes: siteVisits.notes })
		.from(siteVisits)
		.where(and(eq(siteVisits.leadId, job.leadId), eq(siteVisits.status, 'booked')));
	const days = await db
		.select({ day: jobDays.day })
		.from(jobDays)
		.where(eq(jobDays.jobId, job.id))
		.orderBy(asc(jobDays.day));
	const materials = await db
		.select()
		.from(jobMaterials)
		.where(eq(jobMaterials.jobId, job.id))
		.orderBy(asc(jobMaterials.sortOrder), asc(jobMaterials.createdAt));
	const punch = await db
		.select()
		.from(punchItems)
		.where(eq(punchItems.jobId, job.id))
		.orderBy(asc(punchItems.createdAt));
	const allPhotos = await db
		.select()
		.from(photos)
		.where(sql`${photos.leadId} = ${job.leadId} or ${photos.jobId} = ${job.id}`)
		.orderBy(asc(photos.createdAt));
	const [crewLead] = job.crewLeadId
		? await db
				.select({ id: users.id, name: users.name, phone: users.phone })
				.from(users)
				.where(eq(users.id, job.crewLeadId))
		: [];
	const address = property
		? [property.street, property.town, property.postalCode].filter(Boolean).join(', ')
		: '';
	const visitNotes = visits.flatMap((v) =>
		Object.entries(v.notes ?? {})
			.filter(([, value]) => typeof value === 'string' || typeof value === 'number')
			.map(([key, value]) => ({ key, value: String(value) }))
	);
	return {
		contact,
		address,
		siteNotes: property?.siteNotes ?? '',
		visitNotes,
		days: days.map((d) => d.day),
		materials,
		punch,
		photos: allPhotos,
		crewLead: crewLead ?? null
	};
}

const cautionsOf = (frozen: FrozenEstimate) => {
	const list = (frozen.engine?.cautions ?? frozen.result.cautions) as
		{ title?: string; reason?: string }[] | undefined;
	return Array.isArray(list)
		? list.map((c) => [c.title, c.reason].filter(Boolean).join(': ')).filter(Boolean)
		: [];
};

/** What a crew lead's phone receives: quantities and site facts, never a price or a margin. */
export async function crewJobView(job: Job) {
	const site = await siteFor(job);
	return {
		id: job.id,
		number: job.number,
		title: job.title,
		stage: job.stage,
		scope: job.frozen.scope,
		crewNeeded: job.crewNeeded,
		crewSize: job.crewSize,
		homeowner: { name: site.contact.name, phone: site.contact.phone },
		address: site.address,
		directions: [site.address, site.siteNotes].filter(Boolean).join('\n'),
		visitNotes: site.visitNotes,
		days: site.days,
		cautions: cautionsOf(job.frozen),
		materials: site.materials.map((m) => ({
			id: m.id,
			category: m.category,
			name: m.name,
			description: m.description,
			unit: m.unit,
			quantity: m.quantity,
			picked: Boolean(m.pickedAt),
			fromChangeOrder: Boolean(m.changeOrderId)
		})),
		punch: site.punch.map((p) => ({ id: p.id, body: p.body, done: Boolean(p.doneAt) })),
		photos: site.photos.map((p) => ({
			id: p.id,
			thumbKey: p.thumbKey,
			displayKey: p.displayKey,
			context: p.jobId ? 'job' : p.context,
			width: p.width,
			height: p.height
		}))
	};
}

/** The office's view of a job: everything the crew sees, plus money and the sale record. */
export async function officeJobView(job: Job) {
	const crew = await crewJobView(job);
	const site = await siteFor(job);
	return {
		...crew,
		estimateId: job.estimateId,
		leadId: job.leadId,
		homeowner: {
			name: site.contact.name,
			phone: site.contact.phone,
			email: site.contact.email
		},
		siteNotes: site.siteNotes,
		crewLeadId: job.crewLeadId,
		crewLead: site.crewLead,
		materials: site.materials.map((m) => ({
			...crew.materials.find((c) => c.id === m.id)!,
			ordered: Boolean(m.orderedAt)
		})),
		acceptance: job.frozen.acceptance,
		estimateNumber: job.frozen.number,
		contractCents: job.contractCents,
		depositDueCents: job.depositDueCents,
		finalBalanceCents: job.finalBalanceCents,
		completedAt: job.completedAt
	};
}

// ---------------------------------------------------------------------------------------------
// Money: the one place the balance is worked out (the payments issue adds payments here)

export async function jobBalance(jobId: string, tx: Db = db) {
	const [job] = await tx
		.select({ contractCents: jobs.contractCents, depositDueCents: jobs.depositDueCents })
		.from(jobs)
		.where(eq(jobs.id, jobId));
	if (!job) throw new JobError('not_found', 'There is no such job.');
	const { approvedChangeOrdersCents } = await import('./change-orders');
	const changeOrdersCents = await approvedChangeOrdersCents(jobId, tx);
	// Payments received (issue 10): card, cheque, cash, transfer; refunds are negative.
	const { paymentsReceivedCents } = await import('./payments/ledger');
	const paidCents = await paymentsReceivedCents(jobId, tx);
	const totalCents = job.contractCents + changeOrdersCents;
	return {
		contractCents: job.contractCents,
		changeOrdersCents,
		totalCents,
		paidCents,
		depositDueCents: job.depositDueCents,
		balanceCents: totalCents - paidCents
	};
}

// ---------------------------------------------------------------------------------------------
// Scheduling, materials, punch list, stages

export async function scheduleJob(
	jobId: string,
	input: { days: string[]; crewLeadId: string | null; crewSize: number | null },
	actor: SessionUser
) {
	return db.transaction(async (tx) => {
		const [job] = await tx.select().from(jobs).where(eq(jobs.id, jobId)).for('update');
		if (!job) throw new JobError('not_found', 'There is no such job.');
		if (job.stage === 'complete' || job.stage === 'paid') {
			throw new JobError('bad_stage', 'A finished job cannot be rescheduled.');
		}
		if (input.crewLeadId) {
			const [lead] = await tx
				.select({ role: users.role })
				.from(users)
				.where(and(eq(users.id, input.crewLeadId), isNull(users.disabledAt)));
			if (lead?.role !== 'crew') throw new JobError('invalid', 'Pick a crew lead from the team.');
		}
		await tx
			.update(jobs)
			.set({ crewLeadId: input.crewLeadId, crewSize: input.crewSize })
			.where(eq(jobs.id, jobId));
		await tx.delete(jobDays).where(eq(jobDays.jobId, jobId));
		const days = [...new Set(input.days)].sort();
		if (days.length) {
			await tx.insert(jobDays).values(days.map((day) => ({ id: newId(), jobId, day })));
		}
		await addActivity(
			tx,
			job.leadId,
			'job.scheduled',
			days.length
				? `Job ${jobRef(job.number)} scheduled for ${days.join(', ')}`
				: `Job ${jobRef(job.number)}: install days cleared`,
			actor.id,
			{ jobId, days, crewLeadId: input.crewLeadId }
		);
		return crewConflicts(jobId, tx);
	});
}

export async function setMaterialFlag(
	user: SessionUser,
	jobId: string,
	materialId: string,
	flag: 'ordered' | 'picked',
	on: boolean
): Promise<void> {
	const job = await jobFor(user, jobId);
	if (flag === 'ordered' && user.role === 'crew') {
		throw new JobError('forbidden', 'The office orders materials.');
	}
	const now = on ? new Date() : null;
	const set =
		flag === 'ordered' ? { orderedAt: now } : { pickedAt: now, pickedBy: on ? user.id : null };
	const updated = await db
		.update(jobMaterials)
		.set(set)
		.where(and(eq(jobMaterials.id, materialId), eq(jobMaterials.jobId, job.id)))
		.returning({ id: jobMaterials.id });
	if (!updated.length) throw new JobError('not_found', 'That material is not on this job.');
}

export async function addPunchItem(user: SessionUser, jobId: string, body: string) {
	const job = await jobFor(user, jobId);
	if (job.stage === 'complete' || job.stage === 'paid') {
		throw new JobError('bad_stage', 'The job is complete; add a change order instead.');
	}
	await db.transaction(async (tx) => {
		await tx.insert(punchItems).values({ id: newId(), jobId, body, createdBy: user.id });
		await addActivity(tx, job.leadId, 'job.punch', `Punch list: ${body}`, user.id, { jobId });
	});
}

export async function setPunchDone(
	user: SessionUser,
	jobId: string,
	itemId: string,
	done: boolean
) {
	const job = await jobFor(user, jobId);
	const updated = await db
		.update(punchItems)
		.set({ doneAt: done ? new Date() : null, doneBy: done ? user.id : null })
		.where(and(eq(punchItems.id, itemId), eq(punchItems.jobId, job.id)))
		.returning({ id: punchItems.id });
	if (!updated.length) throw new JobError('not_found', 'That item is not on this job.');
}

const NEXT: Partial<Record<JobStage, JobStage[]>> = {
	scheduled: ['underway'],
	underway: ['punch_list', 'complete', 'scheduled'],
	punch_list: ['complete', 'underway']
};

/**
 * Moves a job along. Completion needs an empty punch list; it fixes the final balance and
 * queues the testimonial request and the seasonal care reminders (after the commit).
 */
export async function setStage(user: SessionUser, jobId: string, to: JobStage): Promise<void> {
	await jobFor(user, jobId);
	const after: (() => Promise<void>)[] = [];
	await db.transaction(async (tx) => {
		const [job] = await tx.select().from(jobs).where(eq(jobs.id, jobId)).for('update');
		if (!NEXT[job.stage]?.includes(to)) {
			throw new JobError(
				'bad_stage',
				`A job that is ${STAGE_LABELS[job.stage].toLowerCase()} cannot move to ${STAGE_LABELS[to].toLowerCase()}.`
			);
		}
		const set: Partial<Job> = { stage: to };
		if (to === 'underway' && !job.startedAt) set.startedAt = new Date();
		if (to === 'complete') {
			const [open] = await tx
				.select({ n: sql<number>`count(*)::int` })
				.from(punchItems)
				.where(and(eq(punchItems.jobId, jobId), isNull(punchItems.doneAt)));
			if (open.n > 0) {
				throw new JobError(
					'open_punch_items',
					`${open.n} punch-list item${open.n === 1 ? ' is' : 's are'} still open; finish ${open.n === 1 ? 'it' : 'them'} before marking the job complete.`
				);
			}
			set.completedAt = new Date();
			set.finalBalanceCents = (await jobBalance(jobId, tx)).balanceCents;
			const { requestTestimonial } = await import('./testimonials');
			const { scheduleCareAfterCompletion } = await import('./care');
			// The finished work goes on record for the property, for care plans and service visits
			// (first, so the completion mail can offer a plan priced for it).
			await recordFeaturesOfJob(tx, job);
			after.push(await requestTestimonial(job, tx));
			// Water features get the shut-down and start-up reminders, lighting-only jobs a check.
			after.push(await scheduleCareAfterCompletion(job));
		}
		await tx.update(jobs).set(set).where(eq(jobs.id, jobId));
		await addActivity(
			tx,
			job.leadId,
			'job.stage',
			`Job ${jobRef(job.number)}: ${STAGE_LABELS[job.stage]} → ${STAGE_LABELS[to]}`,
			user.id,
			{ jobId, from: job.stage, to }
		);
	});
	for (const run of after) await run();
}

export async function attachJobPhoto(
	user: SessionUser,
	jobId: string,
	photo: { displayKey: string; thumbKey: string; width: number; height: number; bytes: number },
	originalName: string
): Promise<void> {
	const job = await jobFor(user, jobId);
	await db.insert(photos).values({
		id: newId(),
		jobId: job.id,
		context: 'job',
		...photo,
		originalName,
		uploadedBy: user.id
	});
}
