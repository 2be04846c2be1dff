import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	crewTask,
	digTasks,
	laborSummary,
	laborTasks,
	planMachines,
	rateTask,
	type Dig,
	type LaborParts
} from './labor';
import { LABOR_RATES, SOILS } from './labor-rates';
import { settingsSchema, siteSchema } from './schema';
import type { StoneResult } from './stones';
import { toSI } from './units';

// Every rate below is one of the rate list's starting defaults (labor-rates.ts): common practice,
// no source. The literals are written out so that a changed default fails here.
const settings = settingsSchema.parse({});
const site = siteSchema.parse({});
const yd3 = (x: number) => toSI(x, 'volume', 'yd3');

const stone = (
	name: string,
	method: StoneResult['handling']['method'],
	people: number,
	count = 1,
	optionId?: string
): StoneResult => ({
	id: name,
	name,
	count,
	rock: 'basalt',
	densityKgM3: 2900,
	volumeM3: 0.01,
	weightKg: 29,
	totalWeightKg: 29 * count,
	surfaceM2: 0.3,
	topM2: 0.05,
	wetted: false,
	handling: { method, people },
	optionId
});

const parts = (overrides: Partial<LaborParts> = {}): LaborParts => ({
	features: [],
	stones: [],
	aggregates: [],
	walls: [],
	extra: [],
	...overrides
});

describe('every task is people × hours (rates: common practice, no source)', () => {
	it('a person rate gives the crew-hours whoever does them; a team rate counts every person', () => {
		const plumb = rateTask(settings, 'branch', {
			bucket: 'base',
			task: 'Plumb',
			quantity: 3,
			people: 2
		});
		// 3 branches × 1.5 person-h = 4.5 crew-hours, 2.25 h each for 2 people.
		expect(plumb).toMatchObject({ key: 'branch', people: 2, hoursEach: 2.25, hours: 4.5 });
		const hoist = rateTask(settings, 'stone-hoist', {
			bucket: 'base',
			task: 'Set',
			quantity: 2,
			people: 4
		});
		// 2 stones × 1 h on the clock, for 4 people: 8 crew-hours.
		expect(hoist).toMatchObject({ key: 'stone-hoist', people: 4, hoursEach: 2, hours: 8 });
		expect(hoist.basis).toBe('2 stone × 1 h a stone × 4 people');
	});

	it('stones are set by the people their handling plan names', () => {
		const tasks = laborTasks(
			parts({ stones: [stone('Column', 'hoist', 4), stone('Accent', 'team-lift', 2, 4)] }),
			settings
		);
		const byName = Object.fromEntries(tasks.map((t) => [t.task, t]));
		// Hoist 1 h × 4 people; team lift 0.5 h a stone × 4 stones × 2 people.
		expect(byName['Set Column (hoist, 4 people)']).toMatchObject({ people: 4, hours: 4 });
		expect(byName['Set Accent (team-lift, 2 people)']).toMatchObject({ people: 2, hours: 4 });
	});

	it('hours typed into the design stay as typed, for one person', () => {
		const [extra] = laborTasks(parts({ extra: [{ task: 'Haul debris', hours: 3 }] }), settings);
		expect(extra).toMatchObject({ key: 'extra', people: 1, hoursEach: 3, hours: 3 });
	});

	it('property: people × hours each = crew-hours, all finite and not negative (fast-check)', () => {
		const keys = LABOR_RATES.map((r) => r.key);
		fc.assert(
			fc.property(
				fc.constantFrom(...keys),
				fc.double({ min: 0, max: 1e4, noNaN: true }),
				fc.integer({ min: 1, max: 12 }),
				(key, quantity, people) => {
					const t = rateTask(settings, key, { bucket: 'base', task: 'x', quantity, people });
					expect(Number.isFinite(t.hours) && t.hours >= 0).toBe(true);
					expect(t.people * t.hoursEach).toBeCloseTo(t.hours, 6);
				}
			)
		);
	});
});

describe('digging from the dug volume and the soil (rates: common practice, no source)', () => {
	const hole = (m3: number, bucket = 'base'): Dig => ({ bucket, what: 'the basin', volumeM3: m3 });

	it('by hand in loam: 1.8 yd³ × 3 person-h; clay digs at 1.5 times the loam rate', () => {
		const machines = planMachines([hole(yd3(1.8))], [], site, settings);
		const [loam] = digTasks([hole(yd3(1.8))], machines, site, settings);
		expect(loam.key).toBe('dig-hand');
		expect(loam.hours).toBeCloseTo(5.4, 9);
		const clay = { ...site, soil: 'clay' as const };
		const [inClay] = digTasks([hole(yd3(1.8))], machines, clay, settings);
		expect(inClay.hours).toBeCloseTo(5.4 * SOILS.clay.handFactor, 9);
	});

	it('past 3 yd³ a machine digs, 0.35 machine-hours a yd³ with its crew of 2', () => {
		const dig = [hole(yd3(12.7))];
		const machines = planMachines(dig, [], site, settings);
		expect(machines.lineBuckets).toEqual(new Set(['base']));
		const [task] = digTasks(dig, machines, site, settings);
		expect(task).toMatchObject({ key: 'dig-machine', people: 2 });
		// 12.7 × 0.35 = 4.445 h on the clock, × 2 people.
		expect(task.hours).toBeCloseTo(8.89, 9);
		// The firm can insist on digging by hand.
		const byHand = { ...site, dig: 'hand' as const };
		const none = planMachines(dig, [], byHand, settings);
		expect(digTasks(dig, none, byHand, settings)[0].key).toBe('dig-hand');
	});

	it('a stone set by a loader brings the machine, which then digs too', () => {
		const dig = [hole(yd3(1))];
		const machines = planMachines(dig, [stone('Boulder', 'compact-loader', 4)], site, settings);
		expect(digTasks(dig, machines, site, settings)[0].key).toBe('dig-machine');
	});

	it('a machine in the base serves an option: the option brings no machine of its own', () => {
		const digs = [hole(yd3(5)), hole(yd3(5), 'pond')];
		const machines = planMachines(digs, [], site, settings);
		expect(machines.lineBuckets).toEqual(new Set(['base']));
		expect(machines.buckets.has('pond')).toBe(true);
	});

	it('property: a bigger hole never takes fewer digging hours, in any soil (fast-check)', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0, max: 200, noNaN: true }),
				fc.double({ min: 0, max: 200, noNaN: true }),
				fc.constantFrom('sand', 'loam', 'clay', 'rocky') as fc.Arbitrary<keyof typeof SOILS>,
				(a, b, soil) => {
					const [small, big] = [Math.min(a, b), Math.max(a, b)];
					const s = { ...site, soil };
					const hours = (yd: number) => {
						const digs = [hole(yd3(yd))];
						const tasks = digTasks(digs, planMachines(digs, [], s, settings), s, settings);
						return tasks.reduce((sum, t) => sum + t.hours, 0);
					};
					expect(hours(big)).toBeGreaterThanOrEqual(hours(small) - 1e-9);
				}
			)
		);
	});
});

describe('topping by volume, walls by face and courses', () => {
	it('topping: 100 ft² at 2 in = 0.617 yd³ × 2.5 person-h', () => {
		const [task] = laborTasks(
			parts({
				aggregates: [
					{
						id: 'a',
						name: 'Pebble',
						sku: 'P',
						areaM2: toSI(100, 'area', 'ft2'),
						depthM: toSI(2, 'length', 'in'),
						netVolumeM3: toSI(100 * (2 / 12), 'volume', 'ft3'),
						wastePercent: 0,
						volumeM3: 0,
						optionId: 'alt-a'
					}
				]
			}),
			settings
		);
		expect(task.bucket).toBe('alt-a');
		expect(task.hours).toBeCloseTo(((100 * 2) / 12 / 27) * 2.5, 9);
	});
});

describe('crew and days (8 h day and half-day rounding: common practice, no source)', () => {
	const t = (people: number, hours: number, bucket = 'base') =>
		crewTask({ bucket, key: 'extra', task: 'x', people, hours, basis: '' });

	it('the crew is the base crew or the most people any included task needs', () => {
		const tasks = [t(2, 20), t(4, 8), t(6, 6, 'opt')];
		const without = laborSummary(tasks, new Set(['base']), settings);
		// 28 crew-hours over 4 people × 8 h = 0.875 day → 1 day; 4 × 8 paid hours on site.
		expect(without).toEqual({ totalHours: 28, crewSize: 4, installDays: 1, onSiteHours: 32 });
		const withOption = laborSummary(tasks, new Set(['base', 'opt']), settings);
		expect(withOption.crewSize).toBe(6);
		// 34 / (6 × 8) = 0.71 → 1 day.
		expect(withOption.installDays).toBe(1);
	});

	it('excluded options add no hours', () => {
		const tasks = laborTasks(parts({ stones: [stone('Extra', 'cart', 4, 10, 'opt')] }), settings);
		const without = laborSummary(tasks, new Set(['base']), settings);
		const withOption = laborSummary(tasks, new Set(['base', 'opt']), settings);
		// 10 stones × 0.5 h by cart × 4 people.
		expect(withOption.totalHours - without.totalHours).toBeCloseTo(20, 9);
		expect(without.crewSize).toBe(2);
	});
});
