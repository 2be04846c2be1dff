import { describe, expect, it } from 'vitest';
import { estimate } from '$lib/estimating';
import { yardDesign } from '$lib/estimating/bench';
import { demoCatalog, demoDesign } from '$lib/estimating/demo';
import { starterDesign } from '$lib/estimating/prefill';
import type { Design } from '$lib/estimating/schema';
import { catalogSchema } from '$lib/estimating/schema';
import { learnedRatios, proposedRate, rateKeyOf, rateValue, withRate, RATE_KEYS } from './rates';

const catalog = demoCatalog();

function tasksOf(design: Design) {
	const r = estimate(design, catalog);
	if (!r.ok) throw new Error('the design no longer estimates');
	return r.labor.tasks;
}

describe('which setting a task was priced from', () => {
	it('names a setting for every task the engine writes, except hours typed by hand', () => {
		const designs: Design[] = [
			demoDesign(),
			yardDesign(),
			starterDesign('x', null, undefined, catalog, ['pond', 'stream', 'water-feature'])
		];
		const typed = new Set(designs.flatMap((d) => (d.extraLabor ?? []).map((e) => e.task)));
		const tasks = designs.flatMap(tasksOf);
		expect(tasks.length).toBeGreaterThan(10);
		for (const t of tasks) {
			if (typed.has(t.task)) expect(rateKeyOf(t.task)).toBeNull();
			else expect({ task: t.task, key: rateKeyOf(t.task) }).not.toMatchObject({ key: null });
		}
		// Each fixed name to its own setting; a fall is not a wall, stream gravel is topping.
		expect(rateKeyOf('Dig and set basin')).toBe('basinHours');
		expect(rateKeyOf('Build the falls: Upper stream')).toBe('fallHours');
		expect(rateKeyOf('Build Low retaining wall')).toBe('wallHoursPerUnit');
		expect(rateKeyOf('Spread stream gravel: Upper stream')).toBe('toppingHoursPerFt2');
		expect(rateKeyOf('Set Tall column (compact-loader)')).toBe('stoneHours.compact-loader');
		expect(rateKeyOf('Haul spoil')).toBeNull();
	});

	it('the hours an engine task took are its setting times its quantity (the demo basin and outlets)', () => {
		const settings = catalogSchema.parse(catalog).settings.labor as unknown as Record<
			string,
			unknown
		>;
		const tasks = tasksOf(demoDesign());
		expect(tasks.find((t) => t.task === 'Dig and set basin')?.hours).toBe(
			rateValue(settings, 'basinHours')
		);
		expect(tasks.find((t) => t.task === 'Plumb outlets')?.hours).toBe(
			3 * rateValue(settings, 'outletHours')!
		);
	});

	it('reads and replaces nested settings without changing the original', () => {
		const labor = { basinHours: 6, stoneHours: { cart: 1, hoist: 2 } };
		expect(rateValue(labor, 'stoneHours.cart')).toBe(1);
		const next = withRate(labor, 'stoneHours.cart', 1.25);
		expect(next).toEqual({ basinHours: 6, stoneHours: { cart: 1.25, hoist: 2 } });
		expect(labor.stoneHours.cart).toBe(1);
		expect(RATE_KEYS).toContain('reservoirHours');
	});
});

describe('learned ratios', () => {
	it('weighs jobs by their hours and counts jobs that used the setting', () => {
		// Hand-worked: basin hours 6 + 6 + 3 = 15 estimated, 7.5 + 6 + 4.5 = 18 actual → 1.2 over 3 jobs.
		const r = learnedRatios([
			{ jobId: 'a', rateKey: 'basinHours', estimatedHours: 6, actualHours: 7.5 },
			{ jobId: 'b', rateKey: 'basinHours', estimatedHours: 6, actualHours: 6 },
			{ jobId: 'c', rateKey: 'basinHours', estimatedHours: 3, actualHours: 4.5 },
			{ jobId: 'c', rateKey: 'outletHours', estimatedHours: 4.5, actualHours: 0 },
			{ jobId: 'a', rateKey: 'fixtureHours', estimatedHours: 0, actualHours: 2 }
		]);
		expect(r).toEqual([
			{ rateKey: 'basinHours', ratio: 1.2, jobs: 3, estimatedHours: 15, actualHours: 18 }
		]);
		expect(proposedRate(6, 1.2)).toBe(7.2);
		// Only the last two jobs that used it (rows newest first): a and b → 13.5 / 12 = 1.125.
		const lastTwo = learnedRatios(
			[
				{ jobId: 'a', rateKey: 'basinHours', estimatedHours: 6, actualHours: 7.5 },
				{ jobId: 'b', rateKey: 'basinHours', estimatedHours: 6, actualHours: 6 },
				{ jobId: 'c', rateKey: 'basinHours', estimatedHours: 3, actualHours: 4.5 }
			],
			2
		);
		expect(lastTwo[0]).toMatchObject({ ratio: 1.125, jobs: 2 });
		expect(proposedRate(0.02, 1.37)).toBe(0.03);
	});
});
