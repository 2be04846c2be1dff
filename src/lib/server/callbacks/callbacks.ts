// Warranty callbacks: a homeowner reports a problem with finished work through the private link
// of their completion mail (words and photos, stored by the inquiry's photo pipeline); it becomes
// a callback on the job, inside or outside the warranty period as it stood that day, assigned to
// a crew lead and dated like a service visit, its hours logged against the job, closed with notes.
import { and, asc, desc, eq, gte, inArray, lte } from 'drizzle-orm';
import { db } from '../platform/db';
import {
	callbackLinks,
	callbackPhotos,
	callbacks,
	contacts,
	jobs,
	photos,
	properties,
	timeEntries,
	users,
	type Callback,
	type Job
} from '../platform/db/schema';
import { newId, newToken, sha256 } from '../platform/crypto';
import type { SessionUser } from '../auth/sessions';
import { origin } from '../platform/env';
import { addActivity } from '../leads/timeline';
import { JobError } from '../jobs/errors';
import { jobRef } from '../jobs/labels';
import { type Tx } from '../platform/db';
import { checkPhotoSize, processPhoto, type ProcessedPhoto } from '../platform/images';
import { discardStored, storePhoto, type StoredPhoto } from '../photos/store';
import { dispatchMail, writeMail } from '../platform/outbox';
import { htmlBody } from '../platform/mail';
import { firmSettings, firmToday } from '../platform/settings';
import { calendarDate } from '$lib/scheduling/zone';
import { insideWarranty, warrantyEndsOn } from '$lib/costing/warranty';
import { costingConfig } from '../costing/report';
import { taskNamed } from '../costing/tasks';
import { DomainError } from '../platform/errors';

export const CALLBACK_TASK = 'Warranty callback';
export const MAX_CALLBACK_PHOTOS = 4;

/**
 * A fresh link for the job's problem reports (a new token replaces the old one, whose hash is
 * all that was kept). Called in the completion transaction and when the office mails it again.
 */
export async function newCallbackLink(jobId: string, tx: Tx | typeof db = db): Promise<string> {
	const token = newToken();
	await tx
		.insert(callbackLinks)
		.values({ jobId, tokenHash: sha256(token) })
		.onConflictDoUpdate({ target: callbackLinks.jobId, set: { tokenHash: sha256(token) } });
	return `${origin()}/callback/${token}`;
}

async function jobByToken(token: string) {
	if (!/^[A-Za-z0-9_-]{20,64}$/.test(token)) return null;
	const [row] = await db
		.select({ job: jobs })
		.from(callbackLinks)
		.innerJoin(jobs, eq(jobs.id, callbackLinks.jobId))
		.where(eq(callbackLinks.tokenHash, sha256(token)));
	return row?.job ?? null;
}

/** What the homeowner's page shows: the work and its callbacks so far (no prices). */
export async function callbackPage(token: string) {
	const job = await jobByToken(token);
	if (!job) return null;
	const reported = await db
		.select({
			reportedOn: callbacks.reportedOn,
			status: callbacks.status,
			description: callbacks.description
		})
		.from(callbacks)
		.where(eq(callbacks.jobId, job.id))
		.orderBy(desc(callbacks.createdAt));
	return { title: job.title, reported };
}

/** Inside or outside the warranty, as the setting stands on the day of the report. */
export async function warrantyOf(job: Pick<Job, 'completedAt'>, reportedOn: string) {
	const { warrantyMonths } = await costingConfig();
	const { timeZone } = await firmSettings();
	if (!job.completedAt) return { inWarranty: true, endsOn: null };
	const endsOn = warrantyEndsOn(calendarDate(job.completedAt, timeZone), warrantyMonths);
	return { inWarranty: insideWarranty(reportedOn, endsOn), endsOn };
}

/** A refusal this module makes; the route shows its message beside the form. */
export class CallbackInputError extends DomainError<'invalid'> {
	constructor(message: string) {
		super('invalid', message);
	}
}

/** The homeowner's report: photos processed and stored first, then the callback in one go. */
export async function reportProblem(token: string, description: string, files: File[]) {
	const job = await jobByToken(token);
	if (!job) return null;
	if (files.length > MAX_CALLBACK_PHOTOS) {
		throw new CallbackInputError(`Send at most ${MAX_CALLBACK_PHOTOS} photos.`);
	}
	const processed: ProcessedPhoto[] = [];
	for (const f of files) {
		checkPhotoSize(f.name, f.size);
		processed.push(await processPhoto(f.name, new Uint8Array(await f.arrayBuffer())));
	}
	const stored: StoredPhoto[] = [];
	try {
		for (const p of processed) stored.push(await storePhoto(p, 'intake'));
	} catch (error) {
		await discardStored(stored);
		throw error;
	}
	const reportedOn = await firmToday();
	const warranty = await warrantyOf(job, reportedOn);
	const firm = await firmSettings();
	const id = newId();
	let outboxId: string | null = null;
	try {
		outboxId = await db.transaction(async (tx) => {
			await tx.insert(callbacks).values({
				id,
				jobId: job.id,
				description,
				inWarranty: warranty.inWarranty,
				warrantyEndsOn: warranty.endsOn,
				reportedOn
			});
			if (stored.length) {
				const rows = stored.map((s) => ({ id: newId(), jobId: job.id, context: 'callback', ...s }));
				await tx.insert(photos).values(rows);
				await tx
					.insert(callbackPhotos)
					.values(rows.map((r) => ({ callbackId: id, photoId: r.id })));
			}
			const where = warranty.inWarranty ? 'inside' : 'outside';
			await addActivity(
				tx,
				job.leadId,
				'callback.reported',
				`Problem reported on ${jobRef(job.number)} (${where} the warranty): ${description.slice(0, 200)}`,
				null,
				{ jobId: job.id, callbackId: id }
			);
			const paragraphs = [
				`The homeowner reported a problem with ${jobRef(job.number)} (${job.title}), ${where} the warranty${warranty.endsOn ? ` (it ends ${warranty.endsOn})` : ''}:`,
				description,
				`${stored.length} photo${stored.length === 1 ? '' : 's'} attached to the callback.`
			];
			return writeMail(
				{
					dedupeKey: `callback:${id}:reported`,
					to: firm.email,
					subject: `${jobRef(job.number)}: a problem reported by the homeowner`,
					text: [...paragraphs, `Open it: ${origin()}/office/callbacks/${id}`].join('\n\n'),
					html: htmlBody(paragraphs, {
						label: 'Open the callback',
						url: `${origin()}/office/callbacks/${id}`
					}),
					leadId: job.leadId
				},
				tx
			);
		});
	} catch (error) {
		await discardStored(stored);
		throw error;
	}
	if (outboxId) await dispatchMail(outboxId);
	return { id, inWarranty: warranty.inWarranty };
}

/** Mails the homeowner a fresh problem-report link for a finished job. */
export async function sendCallbackLink(jobId: string) {
	const [row] = await db
		.select({ job: jobs, email: contacts.email, name: contacts.name })
		.from(jobs)
		.innerJoin(contacts, eq(contacts.id, jobs.contactId))
		.where(eq(jobs.id, jobId));
	if (!row) throw new JobError('not_found', 'There is no such job.');
	if (!row.job.completedAt) throw new JobError('bad_stage', 'The job is not finished yet.');
	if (!row.email) throw new JobError('invalid', 'The homeowner has no e-mail address on file.');
	const firm = await firmSettings();
	const url = await newCallbackLink(jobId);
	const paragraphs = [
		`Hello ${row.name},`,
		`If anything about "${row.job.title}" is not as it should be (a leak, a pump that stops, a light out), tell us through this private link, with a photo or two if you can. We will call you to arrange a visit.`,
		'If water is near any wiring, switch the pump off at its ground-fault (GFCI) outlet first.'
	];
	await db
		.transaction(async (tx) => {
			const id = await writeMail(
				{
					dedupeKey: `callback-link:${jobId}:${newId()}`,
					to: row.email!,
					subject: `Something not right with your water feature? Tell ${firm.firmName}`,
					text: [
						...paragraphs,
						`Report a problem: ${url}`,
						'',
						`${firm.firmName} · ${firm.phone} · ${firm.email}`
					].join('\n\n'),
					html: htmlBody(
						paragraphs,
						{ label: 'Report a problem', url },
						`${firm.firmName} · ${firm.phone} · ${firm.email}`
					),
					leadId: row.job.leadId
				},
				tx
			);
			if (id) {
				await addActivity(
					tx,
					row.job.leadId,
					'callback.link',
					`Problem-report link e-mailed for ${jobRef(row.job.number)}`,
					null,
					{ jobId }
				);
			}
			return id;
		})
		.then(async (id) => {
			if (id) await dispatchMail(id);
		});
}

/** Callbacks for the office (crew: the ones assigned to them), open ones first. */
export async function listCallbacks(user: SessionUser) {
	return db
		.select({
			id: callbacks.id,
			status: callbacks.status,
			description: callbacks.description,
			inWarranty: callbacks.inWarranty,
			reportedOn: callbacks.reportedOn,
			scheduledOn: callbacks.scheduledOn,
			assignee: users.name,
			jobId: jobs.id,
			jobNumber: jobs.number,
			jobTitle: jobs.title,
			homeowner: contacts.name,
			town: properties.town
		})
		.from(callbacks)
		.innerJoin(jobs, eq(jobs.id, callbacks.jobId))
		.innerJoin(contacts, eq(contacts.id, jobs.contactId))
		.leftJoin(properties, eq(properties.id, jobs.propertyId))
		.leftJoin(users, eq(users.id, callbacks.assignedTo))
		.where(user.role === 'crew' ? eq(callbacks.assignedTo, user.id) : undefined)
		.orderBy(asc(callbacks.status), desc(callbacks.reportedOn));
}

/**
 * A crew lead's dated callbacks between two calendar days, for their Today page beside install
 * days and service visits: the job, where it is and the homeowner's own words.
 */
export async function crewCallbackDays(user: SessionUser, from: string, to: string) {
	const rows = await db
		.select({
			id: callbacks.id,
			day: callbacks.scheduledOn,
			status: callbacks.status,
			description: callbacks.description,
			inWarranty: callbacks.inWarranty,
			jobNumber: jobs.number,
			jobTitle: jobs.title,
			homeowner: contacts.name,
			street: properties.street,
			town: properties.town
		})
		.from(callbacks)
		.innerJoin(jobs, eq(jobs.id, callbacks.jobId))
		.innerJoin(contacts, eq(contacts.id, jobs.contactId))
		.leftJoin(properties, eq(properties.id, jobs.propertyId))
		.where(
			and(
				eq(callbacks.assignedTo, user.id),
				gte(callbacks.scheduledOn, from),
				lte(callbacks.scheduledOn, to)
			)
		)
		.orderBy(asc(callbacks.scheduledOn), asc(jobs.number));
	return rows.map(({ jobNumber, street, town, day, ...row }) => ({
		...row,
		day: day!,
		job: `${jobRef(jobNumber)} ${row.jobTitle}`,
		address: [street, town].filter(Boolean).join(', ')
	}));
}

/** A callback this user may open: 404 when missing, 403 for a crew lead it is not assigned to. */
export async function callbackFor(user: SessionUser, id: string): Promise<Callback> {
	const [row] = await db.select().from(callbacks).where(eq(callbacks.id, id));
	if (!row) throw new JobError('not_found', 'There is no such callback.');
	if (user.role === 'crew' && row.assignedTo !== user.id) {
		throw new JobError('forbidden', 'This callback is assigned to someone else.');
	}
	return row;
}

export async function callbackView(user: SessionUser, id: string) {
	const cb = await callbackFor(user, id);
	const [job] = await db.select().from(jobs).where(eq(jobs.id, cb.jobId));
	const [contact] = await db.select().from(contacts).where(eq(contacts.id, job.contactId));
	const [property] = job.propertyId
		? await db.select().from(properties).where(eq(properties.id, job.propertyId))
		: [];
	const pics = await db
		.select({ photo: photos })
		.from(callbackPhotos)
		.innerJoin(photos, eq(photos.id, callbackPhotos.photoId))
		.where(eq(callbackPhotos.callbackId, cb.id));
	const hours = await db
		.select({
			id: timeEntries.id,
			person: timeEntries.person,
			workDate: timeEntries.workDate,
			minutes: timeEntries.minutes
		})
		.from(timeEntries)
		.where(eq(timeEntries.callbackId, cb.id))
		.orderBy(asc(timeEntries.workDate));
	return {
		callback: cb,
		job: { id: job.id, ref: jobRef(job.number), title: job.title, completedAt: job.completedAt },
		homeowner: { name: contact.name, phone: contact.phone, email: contact.email },
		address: property ? [property.street, property.town].filter(Boolean).join(', ') : '',
		photos: pics.map((p) => p.photo),
		hours
	};
}

export async function scheduleCallback(
	id: string,
	input: { assignedTo: string; scheduledOn: string }
) {
	const [crew] = await db
		.select({ role: users.role })
		.from(users)
		.where(eq(users.id, input.assignedTo));
	if (!crew || crew.role === 'sales') {
		throw new JobError('invalid', 'Pick a crew lead or the owner.');
	}
	const [cb] = await db.select().from(callbacks).where(eq(callbacks.id, id));
	if (!cb) throw new JobError('not_found', 'There is no such callback.');
	if (cb.status === 'fixed') throw new JobError('bad_stage', 'This callback is closed.');
	await db
		.update(callbacks)
		.set({ ...input, status: 'scheduled' })
		.where(eq(callbacks.id, id));
}

/** Hours spent on the callback: a time entry of the job, kept apart as callback hours. */
export async function logCallbackHours(
	user: SessionUser,
	id: string,
	input: { person: string; workDate: string; minutes: number; clientKey: string }
) {
	const cb = await callbackFor(user, id);
	await db.transaction(async (tx) => {
		const task = await taskNamed(tx, cb.jobId, CALLBACK_TASK, user.id);
		await tx
			.insert(timeEntries)
			.values({
				id: newId(),
				jobId: cb.jobId,
				taskId: task.id,
				callbackId: cb.id,
				recordedBy: user.id,
				note: '',
				...input
			})
			.onConflictDoNothing({ target: timeEntries.clientKey });
	});
}

export async function closeCallback(user: SessionUser, id: string, notes: string) {
	const cb = await callbackFor(user, id);
	if (cb.status === 'fixed') throw new JobError('bad_stage', 'This callback is already closed.');
	await db
		.update(callbacks)
		.set({ status: 'fixed', closingNotes: notes, closedAt: new Date() })
		.where(eq(callbacks.id, id));
}

/** Finished jobs the office may mail a problem-report link for. */
export async function finishedJobs() {
	return db
		.select({ id: jobs.id, number: jobs.number, title: jobs.title, homeowner: contacts.name })
		.from(jobs)
		.innerJoin(contacts, eq(contacts.id, jobs.contactId))
		.where(inArray(jobs.stage, ['complete', 'paid']))
		.orderBy(desc(jobs.number));
}
