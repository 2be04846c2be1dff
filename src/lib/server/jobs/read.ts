// Reading jobs, with ownership: lists, install days, crew conflicts and the crew's and office's views.
import { and, asc, eq, gte, inArray, isNull, lte, ne, sql } from 'drizzle-orm';
import { db, type Db } from '../platform/db';
import {
	contacts,
	jobDays,
	jobMaterials,
	jobs,
	photos,
	properties,
	punchItems,
	siteVisits,
	users,
	type FrozenEstimate,
	type Job
} from '../platform/db/schema';
import type { SessionUser } from '../auth/sessions';
import { JobError } from './errors';

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
