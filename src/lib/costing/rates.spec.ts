import { describe, expect, it } from 'vitest';
import { estimate } from '$lib/estimating';
import { yardDesign } from '../../../scripts/bench/designs';
import { demoCatalog, demoDesign } from '../../../scripts/seed/demo-catalog';
import { starterDesign } from '$lib/estimating/prefill';
import { catalogSchema, type Design } from '$lib/estimating/schema';
import { learnedRatios, proposedRate, rateKeyOf, rateValue, withRate, RATE_KEYS } from './rates';

const catalog = demoCatalog();

function tasksOf(design: Design) {
	const r = estimate(design, catalog);
	if (!r.ok) throw new Error('the design no longer estimates');
	return r.labor.tasks;
}

describe('which rate a task was timed from', () => {
	it('names a rate for every task the engine times, and none for hours typed by hand', () => {
		const designs: Design[] = [
			demoDesign(),
			yardDesign(),
			starterDesign('x', null, undefined, catalog, ['pond', 'stream', 'water-feature'])
		];
		const tasks = designs.flatMap(tasksOf);
		expect(tasks.length).toBeGreaterThan(10);
		for (const t of tasks) {
			if (t.key === 'extra') expect(rateKeyOf(t)).toBeNull();
			else expect({ task: t.task, key: rateKeyOf(t) }).toEqual({ task: t.task, key: t.key });
		}
		expect(rateKeyOf({ key: 'basin' })).toBe('basin');
		expect(rateKeyOf({})).toBeNull();
		expect(rateKeyOf({ key: 'mowing' })).toBeNull();
	});

	it('the demo basin and branches took their rate times their count', () => {
		const labor = catalogSchema.parse(catalog).settings.labor as unknown as Record<string, unknown>;
		const tasks = tasksOf(demoDesign());
		expect(tasks.find((t) => t.key === 'basin')?.hours).toBe(rateValue(labor, 'basin'));
		expect(tasks.find((t) => t.key === 'branch')?.hours).toBe(3 * rateValue(labor, 'branch')!);
	});

	it('reads and replaces a rate without changing the original', () => {
		const labor = { hoursPerDay: 8, rates: { basin: 4, fall: 2 } };
		expect(rateValue(labor, 'fall')).toBe(2);
		const next = withRate(labor, 'basin', 4.5);
		expect(next).toEqual({ hoursPerDay: 8, rates: { basin: 4.5, fall: 2 } });
		expect(labor.rates.basin).toBe(4);
		expect(RATE_KEYS).toContain('stone-cart');
	});
});

describe('learned ratios', () => {
	it('weighs jobs by their hours and counts jobs that used the rate', () => {
		// Hand-worked: basin hours 6 + 6 + 3 = 15 estimated, 7.5 + 6 + 4.5 = 18 actual → 1.2 over 3 jobs.
		const r = learnedRatios([
			{ jobId: 'a', rateKey: 'basin', estimatedHours: 6, actualHours: 7.5 },
			{ jobId: 'b', rateKey: 'basin', estimatedHours: 6, actualHours: 6 },
			{ jobId: 'c', rateKey: 'basin', estimatedHours: 3, actualHours: 4.5 },
			{ jobId: 'c', rateKey: 'branch', estimatedHours: 4.5, actualHours: 0 },
			{ jobId: 'a', rateKey: 'fixture', estimatedHours: 0, actualHours: 2 }
		]);
		expect(r).toEqual([
			{ rateKey: 'basin', ratio: 1.2, jobs: 3, estimatedHours: 15, actualHours: 18 }
		]);
		expect(proposedRate(6, 1.2)).toBe(7.2);
		expect(proposedRate(0.02, 1.37)).toBe(0.03);
		// Only the last two jobs that used it (rows newest first): a and b → 13.5 / 12 = 1.125.
		const lastTwo = learnedRatios(
			[
				{ jobId: 'a', rateKey: 'basin', estimatedHours: 6, actualHours: 7.5 },
				{ jobId: 'b', rateKey: 'basin', estimatedHours: 6, actualHours: 6 },
				{ jobId: 'c', rateKey: 'basin', estimatedHours: 3, actualHours: 4.5 }
			],
			2
		);
		expect(lastTwo[0]).toMatchObject({ ratio: 1.125, jobs: 2 });
	});
});
