// Which task-hours setting an estimate's labor task was priced from, told from the task's name as
// the engine writes it (src/lib/estimating/labor.ts and features.ts), and the learned ratio of
// actual to estimated hours for each setting over finished jobs. Pure: runs anywhere.
import { HANDLING_METHODS } from '$lib/estimating/stones';

export const RATE_KEYS = [
	'basinHours',
	'outletHours',
	...HANDLING_METHODS.map((m) => `stoneHours.${m}` as const),
	'fixtureHours',
	'cableHoursPerFt',
	'toppingHoursPerFt2',
	'wallHoursPerUnit',
	'pondHoursPerFt2',
	'streamHoursPerFt',
	'fallHours',
	'reservoirHours'
] as const;
export type RateKey = (typeof RATE_KEYS)[number];

export const RATE_LABELS: Record<RateKey, { label: string; per: string }> = {
	basinHours: { label: 'Dig and set a basin', per: 'basin' },
	outletHours: { label: 'Plumb an outlet', per: 'outlet' },
	'stoneHours.one-person': { label: 'Set a stone one person can lift', per: 'stone' },
	'stoneHours.team-lift': { label: 'Set a stone by a team lift', per: 'stone' },
	'stoneHours.cart': { label: 'Set a stone with a cart', per: 'stone' },
	'stoneHours.hoist': { label: 'Set a stone with a hoist', per: 'stone' },
	'stoneHours.compact-loader': { label: 'Set a stone with a compact loader', per: 'stone' },
	'stoneHours.larger-machine': { label: 'Set a stone with a larger machine', per: 'stone' },
	fixtureHours: { label: 'Set a lighting fixture', per: 'fixture' },
	cableHoursPerFt: { label: 'Lay lighting cable', per: 'ft' },
	toppingHoursPerFt2: { label: 'Spread topping or gravel', per: 'ft2' },
	wallHoursPerUnit: { label: 'Lay a wall unit', per: 'wall unit' },
	pondHoursPerFt2: { label: 'Dig, shape and line a pond', per: 'ft2' },
	streamHoursPerFt: { label: 'Dig and line a stream', per: 'ft' },
	fallHours: { label: 'Build a fall', per: 'fall' },
	reservoirHours: { label: 'Dig and set a reservoir', per: 'reservoir' }
};

const STONE = new RegExp(`^Set .+ \\((${HANDLING_METHODS.join('|')})\\)$`);

/**
 * The setting a task's hours were computed from, or null for hours typed by hand (extra labor,
 * site conditions), which no single setting explains. Order matters: "Build the falls: …" before
 * "Build …" (a wall), "Spread stream gravel: …" is topping hours as any spread is.
 */
export function rateKeyOf(task: string): RateKey | null {
	if (task === 'Dig and set basin') return 'basinHours';
	if (task === 'Plumb outlets') return 'outletHours';
	if (task === 'Set lighting fixtures') return 'fixtureHours';
	if (task === 'Lay lighting cable') return 'cableHoursPerFt';
	// Half a basin's hours, by the engine's own rule.
	if (task.startsWith('Set skimmer, filter and pump: ')) return 'basinHours';
	if (task.startsWith('Dig, shape and line ')) return 'pondHoursPerFt2';
	if (task.startsWith('Dig and set reservoir: ')) return 'reservoirHours';
	if (task.startsWith('Dig and line ')) return 'streamHoursPerFt';
	if (task.startsWith('Build the falls: ')) return 'fallHours';
	const stone = STONE.exec(task);
	if (stone) return `stoneHours.${stone[1]}` as RateKey;
	if (task.startsWith('Spread ')) return 'toppingHoursPerFt2';
	if (task.startsWith('Build ')) return 'wallHoursPerUnit';
	return null;
}

/** A setting's current value from the engine's labor settings object. */
export function rateValue(labor: Record<string, unknown>, key: RateKey): number | null {
	const [head, tail] = key.split('.');
	const v = tail ? (labor[head] as Record<string, unknown> | undefined)?.[tail] : labor[head];
	return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

/** The labor settings with one setting replaced (a copy; the input is not changed). */
export function withRate(
	labor: Record<string, unknown>,
	key: RateKey,
	hours: number
): Record<string, unknown> {
	const [head, tail] = key.split('.');
	if (!tail) return { ...labor, [head]: hours };
	return { ...labor, [head]: { ...(labor[head] as Record<string, unknown>), [tail]: hours } };
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
