// Estimates that learn: for each task-hours setting, actual against estimated hours over the last
// finished jobs that used it, a proposed corrected setting, and the owner's confirmation (the
// setting changes in the estimating settings and the change is kept in labor_rate_changes).
import { desc, eq, inArray, isNotNull, and } from 'drizzle-orm';
import { db } from '../platform/db';
import {
	estimatingSettings,
	jobTasks,
	jobs,
	laborRateChanges,
	timeEntries,
	users
} from '../platform/db/schema';
import { newId } from '../platform/crypto';
import type { SessionUser } from '../auth/sessions';
import { settingsSchema } from '$lib/estimating/schema';
import {
	learnedRatios,
	proposedRate,
	RATE_KEYS,
	RATE_LABELS,
	rateValue,
	withRate,
	type JobRateHours,
	type RateKey
} from '$lib/costing/rates';
import { costingConfig } from './report';
import { DomainError } from '../platform/errors';

/** A refusal this module makes; the route shows its message beside the form. */
export class RateChangeError extends DomainError<'invalid'> {
	constructor(message: string) {
		super('invalid', message);
	}
}

/** Every finished job's hours per setting, newest job first. */
async function finishedRows(): Promise<JobRateHours[]> {
	const finished = await db
		.select({ id: jobs.id })
		.from(jobs)
		.where(and(inArray(jobs.stage, ['complete', 'paid']), isNotNull(jobs.completedAt)))
		.orderBy(desc(jobs.completedAt));
	if (!finished.length) return [];
	const ids = finished.map((j) => j.id);
	const tasks = await db
		.select()
		.from(jobTasks)
		.where(and(inArray(jobTasks.jobId, ids), isNotNull(jobTasks.rateKey)));
	const minutes = await db
		.select({
			taskId: timeEntries.taskId,
			minutes: timeEntries.minutes,
			callbackId: timeEntries.callbackId
		})
		.from(timeEntries)
		.where(inArray(timeEntries.jobId, ids));
	const rows: JobRateHours[] = [];
	for (const id of ids) {
		const by = new Map<RateKey, { est: number; act: number }>();
		for (const t of tasks.filter((x) => x.jobId === id)) {
			const key = t.rateKey as RateKey;
			if (!RATE_KEYS.includes(key)) continue;
			const acc = by.get(key) ?? { est: 0, act: 0 };
			acc.est += t.estimatedHours;
			// Callback hours are a warranty matter, not the pace of the original work.
			acc.act +=
				minutes
					.filter((m) => m.taskId === t.id && !m.callbackId)
					.reduce((s, m) => s + m.minutes, 0) / 60;
			by.set(key, acc);
		}
		for (const [rateKey, v] of by) {
			rows.push({ jobId: id, rateKey, estimatedHours: v.est, actualHours: v.act });
		}
	}
	return rows;
}

async function engineLabor() {
	const [row] = await db.select().from(estimatingSettings).where(eq(estimatingSettings.id, 1));
	const engine = (row?.engine ?? {}) as Record<string, unknown>;
	const effective = settingsSchema.parse(engine).labor as unknown as Record<string, unknown>;
	return { engine, effective };
}

/** Each setting with its current hours and, where finished jobs say something, the proposal. */
export async function learnedRates() {
	const [rows, config, { effective }] = await Promise.all([
		finishedRows(),
		costingConfig(),
		engineLabor()
	]);
	const learned = learnedRatios(rows, config.learnFromJobs);
	return RATE_KEYS.map((rateKey) => {
		const current = rateValue(effective, rateKey) ?? 0;
		const l = learned.find((x) => x.rateKey === rateKey);
		return {
			rateKey,
			...RATE_LABELS[rateKey],
			current,
			ratio: l?.ratio ?? null,
			jobs: l?.jobs ?? 0,
			proposed: l ? proposedRate(current, l.ratio) : null
		};
	});
}

/**
 * The owner takes a proposal: refused when the proposal has moved since the page was read (a
 * job finished meanwhile) or would not change the setting.
 */
export async function confirmRate(user: SessionUser, rateKey: RateKey, seen: number) {
	const rates = await learnedRates();
	const rate = rates.find((r) => r.rateKey === rateKey)!;
	if (rate.proposed === null || rate.ratio === null) {
		throw new RateChangeError('No finished job has logged hours on this task yet.');
	}
	if (Math.abs(rate.proposed - seen) > 1e-9) {
		throw new RateChangeError(
			`The proposal has changed to ${rate.proposed} h since this page was read; check it again.`
		);
	}
	if (rate.proposed === rate.current) {
		throw new RateChangeError('The finished jobs agree with the current hours.');
	}
	if (!(rate.proposed > 0)) throw new RateChangeError('A proposal of 0 hours cannot be used.');
	await db.transaction(async (tx) => {
		const [row] = await tx
			.select()
			.from(estimatingSettings)
			.where(eq(estimatingSettings.id, 1))
			.for('update');
		const engine = (row?.engine ?? {}) as Record<string, unknown>;
		const labor = withRate(
			(engine.labor ?? {}) as Record<string, unknown>,
			rateKey,
			rate.proposed!
		);
		const next = { ...engine, labor };
		await tx
			.insert(estimatingSettings)
			.values({ id: 1, engine: next })
			.onConflictDoUpdate({ target: estimatingSettings.id, set: { engine: next } });
		await tx.insert(laborRateChanges).values({
			id: newId(),
			rateKey,
			fromHours: rate.current,
			toHours: rate.proposed!,
			ratio: rate.ratio!,
			jobsCount: rate.jobs,
			confirmedBy: user.id
		});
	});
	return { from: rate.current, to: rate.proposed };
}

/** The settings changed from finished jobs, newest first. */
export async function rateChanges(limit = 20) {
	return db
		.select({
			id: laborRateChanges.id,
			rateKey: laborRateChanges.rateKey,
			fromHours: laborRateChanges.fromHours,
			toHours: laborRateChanges.toHours,
			ratio: laborRateChanges.ratio,
			jobsCount: laborRateChanges.jobsCount,
			by: users.name,
			at: laborRateChanges.createdAt
		})
		.from(laborRateChanges)
		.leftJoin(users, eq(users.id, laborRateChanges.confirmedBy))
		.orderBy(desc(laborRateChanges.createdAt))
		.limit(limit);
}
