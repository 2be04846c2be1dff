// Time on site: the entries a crew lead's phone sends, each stored once however often it is
// sent (the entry's client key is unique; a replay finds the stored row and answers the same).
import { and, asc, eq, inArray } from 'drizzle-orm';
import { db } from '../platform/db';
import { jobTasks, timeEntries, users } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import type { SessionUser } from '../auth/sessions';
import { jobFor } from '../jobs/read';
import { fieldErrors } from '$lib/schema/auth';
import { timeEntrySchema } from '$lib/schema/costing';
import { ensureJobTasks, taskNamed } from './tasks';

export interface TimeSendResult {
	stored: { clientKey: string; id: string; duplicate: boolean }[];
	refused: { clientKey: string; message: string }[];
}

function keyOf(raw: unknown): string {
	const k = (raw as { clientKey?: unknown } | null)?.clientKey;
	return typeof k === 'string' ? k.slice(0, 64) : '';
}

/**
 * Stores the entries for one job. Each entry is checked and written on its own, so one bad entry
 * never holds back the others; a refused entry comes back with the reason to show on the phone.
 */
export async function recordTimeEntries(
	user: SessionUser,
	jobId: string,
	raw: readonly unknown[]
): Promise<TimeSendResult> {
	const job = await jobFor(user, jobId);
	await ensureJobTasks(job);
	const out: TimeSendResult = { stored: [], refused: [] };
	for (const item of raw) {
		const parsed = timeEntrySchema.safeParse(item);
		if (!parsed.success) {
			const errors = fieldErrors(parsed.error);
			out.refused.push({ clientKey: keyOf(item), message: Object.values(errors)[0] });
			continue;
		}
		const e = parsed.data;
		const result = await db.transaction(async (tx) => {
			const [already] = await tx
				.select({ id: timeEntries.id, jobId: timeEntries.jobId })
				.from(timeEntries)
				.where(eq(timeEntries.clientKey, e.clientKey));
			if (already) return already.jobId === job.id ? { id: already.id, duplicate: true } : null;
			let taskId = e.taskId;
			if (e.newTask) {
				taskId = (await taskNamed(tx, job.id, e.newTask, user.id)).id;
			} else {
				const [task] = await tx
					.select({ id: jobTasks.id })
					.from(jobTasks)
					.where(and(eq(jobTasks.id, e.taskId!), eq(jobTasks.jobId, job.id)));
				if (!task) return 'no-task' as const;
			}
			const [row] = await tx
				.insert(timeEntries)
				.values({
					id: newId(),
					jobId: job.id,
					taskId: taskId!,
					person: e.person,
					workDate: e.workDate,
					minutes: e.minutes,
					startedAt: e.startedAt ? new Date(e.startedAt) : null,
					endedAt: e.endedAt ? new Date(e.endedAt) : null,
					note: e.note,
					clientKey: e.clientKey,
					recordedBy: user.id
				})
				.onConflictDoNothing({ target: timeEntries.clientKey })
				.returning({ id: timeEntries.id });
			if (row) return { id: row.id, duplicate: false };
			// A copy of the same entry arrived at the same moment and was stored first.
			const [winner] = await tx
				.select({ id: timeEntries.id })
				.from(timeEntries)
				.where(eq(timeEntries.clientKey, e.clientKey));
			return { id: winner.id, duplicate: true };
		});
		if (result === null) {
			out.refused.push({ clientKey: e.clientKey, message: 'This entry belongs to another job.' });
		} else if (result === 'no-task') {
			out.refused.push({ clientKey: e.clientKey, message: 'That task is not on this job.' });
		} else {
			out.stored.push({ clientKey: e.clientKey, ...result });
		}
	}
	return out;
}

/** The job's stored entries, newest day first, with the task's name and who sent them. */
export async function timeEntriesOf(jobId: string) {
	return db
		.select({
			id: timeEntries.id,
			taskId: timeEntries.taskId,
			task: jobTasks.name,
			person: timeEntries.person,
			workDate: timeEntries.workDate,
			minutes: timeEntries.minutes,
			note: timeEntries.note,
			clientKey: timeEntries.clientKey,
			recordedBy: users.name
		})
		.from(timeEntries)
		.innerJoin(jobTasks, eq(jobTasks.id, timeEntries.taskId))
		.leftJoin(users, eq(users.id, timeEntries.recordedBy))
		.where(eq(timeEntries.jobId, jobId))
		.orderBy(asc(timeEntries.workDate), asc(timeEntries.createdAt));
}

/** Minutes per task of one or more jobs (callback hours apart). */
export async function minutesByTask(jobIds: string[]) {
	if (!jobIds.length) return [];
	return db
		.select({
			jobId: timeEntries.jobId,
			taskId: timeEntries.taskId,
			callbackId: timeEntries.callbackId,
			minutes: timeEntries.minutes
		})
		.from(timeEntries)
		.where(inArray(timeEntries.jobId, jobIds));
}
