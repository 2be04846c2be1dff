// Which of the firm's labor rates an estimate's labor task was timed from (the engine writes the
// rate's key on every task it times; hours typed into a design carry 'extra'), and the learned
// ratio of actual to estimated hours for each rate over finished jobs. Pure: runs anywhere.
import { LABOR_RATE_KEYS, LABOR_RATES, type LaborRateKey } from '$lib/estimating/labor-rates';

export const RATE_KEYS = LABOR_RATE_KEYS;
export type RateKey = LaborRateKey;

export const RATE_LABELS = Object.fromEntries(
	LABOR_RATES.map((r) => [
		r.key,
		{ label: r.label, per: r.unit === 'yd3' ? 'yd³' : r.unit === 'ft2' ? 'ft²' : r.unit }
	])
) as Record<RateKey, { label: string; per: string }>;

/**
 * The rate a stored task was timed from, or null for hours typed by hand ('extra') and for tasks
 * of estimates made before tasks carried their rate.
 */
export function rateKeyOf(task: { key?: unknown }): RateKey | null {
	return typeof task.key === 'string' && (RATE_KEYS as readonly string[]).includes(task.key)
		? (task.key as RateKey)
		: null;
}

/** A rate's current value from the engine's labor settings object (settings.labor). */
export function rateValue(labor: Record<string, unknown>, key: RateKey): number | null {
	const v = (labor.rates as Record<string, unknown> | undefined)?.[key];
	return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

/** The labor settings with one rate replaced (a copy; the input is not changed). */
export function withRate(
	labor: Record<string, unknown>,
	key: RateKey,
	value: number
): Record<string, unknown> {
	return { ...labor, rates: { ...(labor.rates as Record<string, unknown>), [key]: value } };
}

/** One finished job's hours on the tasks priced from one setting. */
export interface JobRateHours {
	jobId: string;
	rateKey: RateKey;
	estimatedHours: number;
	actualHours: number;
}

export interface LearnedRatio {
	rateKey: RateKey;
	/** Σ actual ÷ Σ estimated hours: the jobs weigh by their size, not one job one vote. */
	ratio: number;
	jobs: number;
	estimatedHours: number;
	actualHours: number;
}

/**
 * The ratio of actual to estimated hours for each setting, over the last `limit` finished jobs
 * that used it (rows newest job first). A job counts for a setting when its estimate used it
 * (estimated hours above zero) and the crew logged time on those tasks.
 */
export function learnedRatios(rows: readonly JobRateHours[], limit = Infinity): LearnedRatio[] {
	const by = new Map<RateKey, { est: number; act: number; jobs: Set<string> }>();
	for (const r of rows) {
		if (!(r.estimatedHours > 0) || !(r.actualHours > 0)) continue;
		const acc = by.get(r.rateKey) ?? { est: 0, act: 0, jobs: new Set<string>() };
		if (!acc.jobs.has(r.jobId) && acc.jobs.size >= limit) continue;
		acc.est += r.estimatedHours;
		acc.act += r.actualHours;
		acc.jobs.add(r.jobId);
		by.set(r.rateKey, acc);
	}
	return RATE_KEYS.flatMap((rateKey) => {
		const acc = by.get(rateKey);
		if (!acc) return [];
		return [
			{
				rateKey,
				ratio: acc.act / acc.est,
				jobs: acc.jobs.size,
				estimatedHours: acc.est,
				actualHours: acc.act
			}
		];
	});
}

/** The corrected setting: the current hours times the ratio, to the hundredth of an hour. */
export function proposedRate(current: number, ratio: number): number {
	return Math.round(current * ratio * 100) / 100;
}
