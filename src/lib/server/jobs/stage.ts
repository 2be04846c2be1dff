import { and, eq, isNull, sql } from 'drizzle-orm';
import { db } from '../platform/db';
import { jobs, punchItems, type Job, type JobStage } from '../platform/db/schema';
import type { SessionUser } from '../auth/sessions';
import { recordFeaturesOfJob } from '../care/features';
import { scheduleCareAfterCompletion } from '../care/reminders';
import { requestTestimonial } from './testimonials';
import { JobError } from './errors';
import { JOB_STAGE_LABELS } from '$lib/stages';
import { jobRef } from './labels';
import { addActivity } from '../leads/timeline';
import { jobFor } from './read';
import { jobBalance } from '../payments/balance';

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
				`A job that is ${JOB_STAGE_LABELS[job.stage].toLowerCase()} cannot move to ${JOB_STAGE_LABELS[to].toLowerCase()}.`
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
			`Job ${jobRef(job.number)}: ${JOB_STAGE_LABELS[job.stage]} → ${JOB_STAGE_LABELS[to]}`,
			user.id,
			{ jobId, from: job.stage, to }
		);
	});
	for (const run of after) await run();
}
