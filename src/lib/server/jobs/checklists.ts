// The job's two checklists: materials ordered and picked, and the punch list.
import { and, eq } from 'drizzle-orm';
import { db } from '../platform/db';
import { jobMaterials, punchItems } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import type { SessionUser } from '../auth/sessions';
import { JobError } from './errors';
import { addActivity } from '../leads/timeline';
import { jobFor } from './read';

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
