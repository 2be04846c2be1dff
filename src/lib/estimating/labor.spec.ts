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
import { demoCatalog, demoDesign } from '../../../scripts/seed/demo-catalog';
import { estimate, type EstimateSuccess } from './index';
import { fountainIn } from '../../../tests/support/fountain';
import { designSchema, settingsSchema, siteSchema, type Design } from './schema';
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

describe('the demo fountain, worked by hand (rates: common practice, no source)', () => {
	const result = estimate(demoDesign(), demoCatalog());
	if (!result.ok) throw new Error('the demo prices');

	it('its crew-hours are people × hours summed by hand, task by task', () => {
		const yd3Basin = (6 * 4 * 2) / 27; // 48 ft³ = 1.778 yd³
		const yd3Pebble = (8 * 6 * (2 / 12)) / 27; // 8 ft³ = 0.296 yd³
		// Columns: basalt hex 12 in across flats (124.7 in²) × 24 / 36 / 48 in at 2.9 g/cm³ weigh
		// 142, 213 and 284 kg (313, 470 and 627 lb): a cart, a cart, a hoist (500 / 1000 lb limits).
		// The 14 × 10 × 8 in granite boulders (an ellipsoid, 25.5 kg) are past the four-person team's
		// 18.99 kg (NIOSH defaults, stones.spec.ts): a cart. Each with the team of 4.
		const byHand: [string, number, number][] = [
			['Dig the basin (by hand)', 2, yd3Basin * 3],
			['Set the basin, pump and vault', 2, 4],
			['Fill the basin with gravel', 2, yd3Basin * 2],
			['Plumb the branches', 2, 3 * 1.5],
			['Set Low basalt column (cart, 4 people)', 4, 4 * 0.5],
			['Set Middle basalt column (cart, 4 people)', 4, 4 * 0.5],
			['Set Tall basalt column (hoist, 4 people)', 4, 4 * 1],
			['Set Granite accent boulders (cart, 4 people)', 4, 4 * 0.5 * 4],
			['Spread River pebble topping', 2, yd3Pebble * 2.5],
			['Set and wire lighting fixtures', 2, 3 * 0.75],
			// A chain run: the trench goes out to the farthest fixture, 55 ft.
			['Trench and lay lighting cable', 2, 55 * 0.05]
		];
		const chosen = result.labor.tasks.filter((t) => ['base', 'topping-pebble'].includes(t.bucket));
		expect(chosen.map((t) => [t.task, t.people, t.hours])).toEqual(
			byHand.map(([task, people, hours]) => [task, people, expect.closeTo(hours, 9)])
		);
		for (const t of result.labor.tasks) expect(t.people * t.hoursEach).toBeCloseTo(t.hours, 9);
		const total = byHand.reduce((sum, [, , hours]) => sum + hours, 0);
		expect(total).toBeCloseTo(39.13, 2);
		expect(result.labor.summary.totalHours).toBeCloseTo(total, 9);
		// 39.13 crew-hours for a crew of 4 at 8 h a day = 1.22 days → a day and a half, 48 paid hours.
		expect(result.labor.summary).toMatchObject({ crewSize: 4, installDays: 1.5, onSiteHours: 48 });
		expect(
			result.pricing.base.laborHours + result.pricing.alternates[0].choices[0].totals.laborHours
		).toBeCloseTo(total, 9);
	});

	const withBasin = (
		lengthFt: number,
		widthFt: number,
		depthFt: number,
		dig: 'auto' | 'hand' | 'machine'
	) => {
		const design = demoDesign();
		const fountain = fountainIn(design);
		fountain.basin!.size = { shape: 'rectangle', lengthFt, widthFt, depthFt };
		design.site = { dig };
		const r = estimate(design, demoCatalog());
		if (!r.ok) throw new Error('prices');
		return r.labor.tasks
			.filter((t) => t.key.startsWith('dig-') && t.task.includes('basin'))
			.reduce((sum, t) => sum + t.hours, 0);
	};

	it('property: a bigger basin never takes fewer digging hours, dug by hand or by machine (fast-check)', () => {
		const side = fc.double({ min: 1, max: 12, noNaN: true });
		fc.assert(
			fc.property(
				side,
				side,
				fc.double({ min: 1, max: 5, noNaN: true }),
				fc.double({ min: 1, max: 1.5, noNaN: true }),
				fc.constantFrom('hand', 'machine') as fc.Arbitrary<'hand' | 'machine'>,
				(l, w, d, grow, dig) => {
					expect(withBasin(l * grow, w, d, dig)).toBeGreaterThanOrEqual(
						withBasin(l, w, d, dig) - 1e-9
					);
					expect(withBasin(l, w, d * grow, dig)).toBeGreaterThanOrEqual(
						withBasin(l, w, d, dig) - 1e-9
					);
				}
			),
			{ numRuns: 60 }
		);
	});

	it('chosen by volume, a bigger basin digs no faster until a machine comes, which then has its own line', () => {
		// By hand up to 3 bank yd³, by machine past it (common practice, no source).
		const sizes = [1, 1.5, 2, 2.5, 2.9].map((s) => withBasin(3 * s, 3, 3, 'auto'));
		for (let i = 1; i < sizes.length; i++) expect(sizes[i]).toBeGreaterThan(sizes[i - 1]);
		const design = demoDesign();
		fountainIn(design).basin!.size = { shape: 'rectangle', lengthFt: 10, widthFt: 6, depthFt: 3 };
		const r = estimate(design, demoCatalog());
		if (!r.ok) throw new Error('prices');
		expect(r.pricing.lines.map((l) => l.sku)).toContain('EQUIP-LOADER-DAY');
	});
});

describe('the design’s ground and digging choice (rates: the settings’ defaults, common practice, no source)', () => {
	const priced = (site: Design['site']) => {
		const design = demoDesign();
		design.site = site;
		const r = estimate(design, demoCatalog());
		if (!r.ok) throw new Error('prices');
		const dig = r.labor.tasks.filter((t) => t.key.startsWith('dig-') && t.task.includes('basin'));
		return { r, dig, hours: dig.reduce((sum, t) => sum + t.hours, 0) };
	};

	it('the same basin dug by machine takes fewer crew-hours than by hand, as the settings say', () => {
		// The demo basin, 6 × 4 × 2 ft = 48 ft³ = 1.778 bank yd³. By hand in loam at 3 person-hours a
		// yd³: 5.33 crew-hours; by machine at 0.35 machine-hours a yd³ with its crew of 2: 1.24.
		const hand = priced({ dig: 'hand' });
		const machine = priced({ dig: 'machine' });
		expect(hand.dig.map((t) => t.key)).toEqual(['dig-hand']);
		expect(machine.dig.map((t) => t.key)).toEqual(['dig-machine']);
		expect(hand.hours).toBeCloseTo((48 / 27) * 3, 9);
		expect(machine.hours).toBeCloseTo((48 / 27) * 0.35 * 2, 9);
		expect(machine.hours).toBeLessThan(hand.hours);
		// Dug by machine, the machine is priced; by hand, none is.
		expect(machine.r.pricing.lines.map((l) => l.sku)).toContain('EQUIP-LOADER-DAY');
		expect(hand.r.pricing.lines.map((l) => l.sku)).not.toContain('EQUIP-LOADER-DAY');
		// Clay by hand at 1.5 times the loam rate: 8 crew-hours.
		expect(priced({ dig: 'hand', soil: 'clay' }).hours).toBeCloseTo((48 / 27) * 3 * 1.5, 9);
	});

	it('dug soil kept on site gets no haul-off line; hauled, it is priced by the loose yd³', () => {
		const kept = priced({ haulSpoil: false });
		const hauled = priced({ haulSpoil: true });
		const haul = (r: EstimateSuccess) =>
			r.pricing.lines.filter((l) => l.sku === 'SPOIL-HAUL-YD3' && l.bucket === 'base');
		expect(kept.r.pricing.lines.filter((l) => l.sku === 'SPOIL-HAUL-YD3')).toEqual([]);
		expect(kept.r.siteWork.spoil.every((s) => !s.hauled)).toBe(true);
		// The basin: 1.778 bank yd³ of loam × 1.25 swell (US Army FM 5-434, table 1-2) = 2.22 loose
		// yd³ → 2.3 (the wall's footing, an option, has a line of its own).
		expect(haul(hauled.r).map((l) => l.quantity)).toEqual([2.3]);
		expect(kept.r.pricing.totalCents).toBeLessThan(hauled.r.pricing.totalCents);
	});

	it('a stored design from before the site fields reads as loam, chosen by volume, hauled away', () => {
		const design = demoDesign();
		delete design.site;
		const parsed = designSchema.parse(design);
		expect(parsed.site).toEqual({ soil: 'loam', dig: 'auto', haulSpoil: true });
		const old = estimate(design, demoCatalog());
		const explicit = estimate(
			{ ...demoDesign(), site: { soil: 'loam', dig: 'auto', haulSpoil: true } },
			demoCatalog()
		);
		expect(old.ok && old.pricing.totalCents).toBe(explicit.ok && explicit.pricing.totalCents);
	});
});
