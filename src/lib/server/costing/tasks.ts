// A job's labor lines: the sold estimate's tasks for the parts the homeowner bought (merged by
// name, each with the labor rate it was timed from), plus tasks the crew added on site.
// Written the first time anyone asks, so jobs sold before time keeping began get theirs too.
import { and, asc, eq, max } from 'drizzle-orm';
import { db } from '../platform/db';
import { estimates, jobTasks, type Job, type JobTask } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { includedBuckets } from '../jobs/materials';
import { rateKeyOf, type RateKey } from '$lib/costing/rates';

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];
type Db = Tx | typeof db;

interface StoredTask {
	bucket?: string;
	key?: string;
	task?: string;
	hours?: number;
}

/** The estimate's labor tasks the homeowner bought, merged by name, in the estimate's order. */
export function soldTasks(
	result: Record<string, unknown> | null,
	choices: Job['frozen']['choices']
): { name: string; hours: number; rateKey: RateKey | null }[] {
	const stored = (result ?? {}) as { engine?: { labor?: { tasks?: StoredTask[] } } };
	const list = stored.engine?.labor?.tasks;
	if (!Array.isArray(list)) return [];
	const included = includedBuckets(choices);
	const merged = new Map<string, { hours: number; rateKey: RateKey | null }>();
	for (const t of list) {
		if (!t.task || !(Number(t.hours) > 0) || !included.has(t.bucket ?? 'base')) continue;
		const acc = merged.get(t.task) ?? { hours: 0, rateKey: rateKeyOf(t) };
		acc.hours += Number(t.hours);
		merged.set(t.task, acc);
	}
	return [...merged].map(([name, v]) => ({ name, ...v }));
}

/** The job's tasks, writing the estimate's the first time (safe under concurrent first reads). */
export async function ensureJobTasks(job: Job, tx: Db = db): Promise<JobTask[]> {
	const existing = await tx
		.select()
		.from(jobTasks)
		.where(eq(jobTasks.jobId, job.id))
		.orderBy(asc(jobTasks.sortOrder), asc(jobTasks.createdAt));
	if (existing.length) return existing;
	const [estimate] = await tx
		.select({ result: estimates.result })
		.from(estimates)
		.where(eq(estimates.id, job.estimateId));
	const sold = soldTasks(estimate?.result ?? null, job.frozen.choices);
	if (!sold.length) return [];
	await tx
		.insert(jobTasks)
		.values(
			sold.map((t, i) => ({
				id: newId(),
				jobId: job.id,
				name: t.name,
				rateKey: t.rateKey,
				estimatedHours: t.hours,
				sortOrder: i
			}))
		)
		.onConflictDoNothing();
	return tx
		.select()
		.from(jobTasks)
		.where(eq(jobTasks.jobId, job.id))
		.orderBy(asc(jobTasks.sortOrder), asc(jobTasks.createdAt));
}

/** A task named on site: the existing one of that name, or a new one with no estimated hours. */
export async function taskNamed(tx: Tx, jobId: string, name: string, userId: string) {
	const [found] = await tx
		.select()
		.from(jobTasks)
		.where(and(eq(jobTasks.jobId, jobId), eq(jobTasks.name, name)));
	if (found) return found;
	const [last] = await tx
		.select({ n: max(jobTasks.sortOrder) })
		.from(jobTasks)
		.where(eq(jobTasks.jobId, jobId));
	await tx
		.insert(jobTasks)
		.values({
			id: newId(),
			jobId,
			name,
			rateKey: null,
			estimatedHours: 0,
			sortOrder: (last?.n ?? 0) + 1,
			createdBy: userId
		})
		.onConflictDoNothing();
	const [made] = await tx
		.select()
		.from(jobTasks)
		.where(and(eq(jobTasks.jobId, jobId), eq(jobTasks.name, name)));
	return made;
}
