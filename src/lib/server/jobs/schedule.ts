// Scheduling a job: its install days, crew lead and crew size.
import { and, eq, isNull } from 'drizzle-orm';
import { db } from '../platform/db';
import { jobDays, jobs, users } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import type { SessionUser } from '../auth/sessions';
import { JobError } from './errors';
import { jobRef } from './labels';
import { addActivity } from '../leads/timeline';
import { crewConflicts } from './read';

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
