import { describe, expect, it } from 'vitest';
import { demoCatalog, demoDesign } from '../../../scripts/seed/demo-catalog';
import { siteWork, type SiteWorkInput } from './equipment';
import { estimate } from './index';
import { digTasks, planMachines, rateTask, type Dig } from './labor';
import { SOILS } from './labor-rates';
import { catalogSchema, designSchema, siteSchema, type Design } from './schema';
import type { StoneResult } from './stones';
import { fromSI, toSI } from './units';
import { priceLine } from './pricing';
import { wallTakeoff } from './walls';

const catalog = catalogSchema.parse(demoCatalog());
const settings = catalog.settings;
const site = siteSchema.parse({});
const yd3 = (x: number) => toSI(x, 'volume', 'yd3');
const hole = (yd: number, bucket = 'base'): Dig => ({ bucket, what: 'a hole', volumeM3: yd3(yd) });

const loaderStone: StoneResult = {
	id: 'b',
	name: 'Boulder',
	count: 1,
	rock: 'granite',
	densityKgM3: 2650,
	volumeM3: 0.25,
	weightKg: 660,
	totalWeightKg: 660,
	surfaceM2: 2,
	topM2: 0.5,
	wetted: false,
	handling: { method: 'compact-loader', people: 4 }
};

function work(digs: Dig[], stones: StoneResult[] = [], extra: Partial<SiteWorkInput> = {}) {
	const machines = planMachines(digs, stones, site, settings);
	const tasks = [
		...digTasks(digs, machines, site, settings),
		...stones.map((s) =>
			rateTask(settings, 'stone-compact-loader', {
				bucket: s.optionId ?? 'base',
				task: 'Set',
				quantity: s.count,
				people: s.handling.people
			})
		)
	];
	return siteWork({ digs, machines, tasks, stones: [], lines: [], site, ...extra }, catalog);
}

describe('spoil from the dug volume (US Army FM 5-434, Earthmoving Operations, table 1-2)', () => {
	it('the table’s own example: 100 yd³ of sand in place is 111 yd³ loose (and 95 yd³ compacted)', () => {
		const sand = { ...site, soil: 'sand' as const };
		const digs = [hole(100)];
		const machines = planMachines(digs, [], sand, settings);
		const r = siteWork({ digs, machines, tasks: [], stones: [], lines: [], site: sand }, catalog);
		expect(fromSI(r.result.spoil[0].looseM3, 'volume', 'yd3')).toBeCloseTo(111, 9);
		expect(100 * SOILS.sand.compaction).toBeCloseTo(95, 9);
	});

	it('loam swells 25% and clay 43% (same table): the haul-off line is priced on the loose yards', () => {
		expect(SOILS.loam.swell).toBe(1.25);
		expect(SOILS.clay.swell).toBe(1.43);
		const r = work([hole(2)]);
		const haul = r.lines.find((l) => l.sku === 'SPOIL-HAUL-YD3')!;
		// 2 yd³ bank × 1.25 = 2.5 loose yd³ at the demo's $55.00 a yd³.
		expect(haul.quantity).toBe(2.5);
		expect(haul.extendedCents).toBe(13750);
	});

	it('spoil that stays on site is not hauled', () => {
		const keep = { ...site, haulSpoil: false };
		const digs = [hole(2)];
		const machines = planMachines(digs, [], keep, settings);
		const r = siteWork({ digs, machines, tasks: [], stones: [], lines: [], site: keep }, catalog);
		expect(r.lines.some((l) => l.sku === 'SPOIL-HAUL-YD3')).toBe(false);
		expect(r.result.spoil[0].hauled).toBe(false);
	});
});

describe('machines by the day, with delivery (threshold and rates: common practice, no source)', () => {
	it('no machine for a 1.8 yd³ basin dug by hand', () => {
		const r = work([hole(1.8)]);
		expect(r.result.machines).toEqual([]);
		expect(r.lines.some((l) => l.sku.startsWith('EQUIP-'))).toBe(false);
	});

	it('a 12.7 yd³ reservoir brings a compact loader for a day, delivered and picked up', () => {
		const r = work([hole(12.7)]);
		// 12.7 yd³ × 0.35 machine-h = 4.4 h: less than the 8 h day, so one day.
		expect(r.result.machines).toEqual([
			{ bucket: 'base', kind: 'compact', hours: expect.closeTo(4.445, 9), days: 1, delivered: true }
		]);
		expect(r.lines.map((l) => [l.sku, l.quantity])).toEqual(
			expect.arrayContaining([
				['EQUIP-LOADER-DAY', 1],
				['EQUIP-DELIVERY', 1]
			])
		);
	});

	it('a loader stone brings the machine even with little to dig', () => {
		const r = work([hole(0.5)], [loaderStone]);
		expect(r.result.machines.map((m) => m.bucket)).toEqual(['base']);
	});

	it('an option dug with the base’s machine adds days only past the rented day', () => {
		// Base 12.7 yd³ (4.4 h) + option 20 yd³ (7 h) = 11.4 h: a second day for the option.
		const r = work([hole(12.7), hole(20, 'pond')]);
		const option = r.result.machines.find((m) => m.bucket === 'pond')!;
		expect(option).toMatchObject({ days: 1, delivered: false });
		expect(r.lines.filter((l) => l.bucket === 'pond').map((l) => l.sku)).toEqual([
			'EQUIP-LOADER-DAY',
			'SPOIL-HAUL-YD3'
		]);
		// A small option fits in the base's day.
		const small = work([hole(12.7), hole(4, 'pond')]);
		expect(small.result.machines.find((m) => m.bucket === 'pond')?.days).toBe(0);
		expect(small.lines.some((l) => l.bucket === 'pond' && l.sku === 'EQUIP-LOADER-DAY')).toBe(
			false
		);
	});

	it('a missing price-list item leaves the line out with a warning', () => {
		const bare = catalogSchema.parse({ ...demoCatalog(), items: [] });
		const digs = [hole(12.7)];
		const machines = planMachines(digs, [], site, bare.settings);
		const r = siteWork({ digs, machines, tasks: [], stones: [], lines: [], site }, bare);
		expect(r.lines).toEqual([]);
		expect(r.warnings).toContain(
			'No price-list item “EQUIP-LOADER-DAY” for the machine: not priced'
		);
	});
});

describe('truckloads from weight and the truck’s payload (10 t, 1 t by trailer: common practice, no source)', () => {
	const gravel = catalog.items.find((i) => i.sku === 'AGG-GRAVEL-WASHED')!;
	const line = (tons: number, bucket = 'base') =>
		priceLine({ bucket, sku: gravel.sku, description: 'Gravel', measure: {} }, gravel, tons);

	it('23 t of gravel is three 10 t loads; 0.8 t comes on the trailer', () => {
		const r = work([], [], { lines: [line(23)] });
		expect(r.result.deliveries).toEqual([
			{ bucket: 'base', massKg: expect.closeTo(toSI(23, 'mass', 'ton'), 6), loads: 3 }
		]);
		expect(r.lines.find((l) => l.sku === 'DELIVERY-LOAD')?.quantity).toBe(3);
		expect(work([], [], { lines: [line(0.8)] }).result.deliveries).toEqual([]);
	});

	it('wall units and caps count by their weight: 126 blocks and 30 caps add 5.8 t to 5 t of gravel', () => {
		const input = designSchema.parse(demoDesign()).walls[0];
		const wall = wallTakeoff({ ...input, lengthFt: 40, optionId: undefined }, settings);
		const unit = catalog.items.find((i) => i.sku === input.unitSku)!;
		const cap = catalog.items.find((i) => i.sku === input.capSku)!;
		const lines = [
			line(5),
			priceLine({ bucket: 'base', sku: unit.sku, description: 'Units', measure: {} }, unit, 126),
			priceLine({ bucket: 'base', sku: cap.sku, description: 'Caps', measure: {} }, cap, 30)
		];
		const walls = [{ result: wall, unitSku: unit.sku, capSku: cap.sku }];
		// 126 × 83.33 lb + 30 × 55.56 lb = 12,167 lb = 6.08 t (125 lb/ft³, see walls.spec.ts), and
		// 5 t of gravel: 11.08 t, two 10 t loads; without the blocks it was one.
		const r = work([], [], { lines, walls });
		expect(wall.units).toBe(126);
		expect(fromSI(r.result.deliveries[0].massKg, 'mass', 'ton')).toBeCloseTo(11.083, 2);
		expect(r.result.deliveries[0].loads).toBe(2);
		expect(r.lines.find((l) => l.sku === 'DELIVERY-LOAD')?.description).toMatch(
			/stone, aggregate and wall units: 11\.1 tons in 2 loads/
		);
		expect(work([], [], { lines: [line(5)] }).result.deliveries[0].loads).toBe(1);
	});
});

describe('the demo design', () => {
	it('hauls the basin’s soil and delivers its stone and gravel, with no machine', () => {
		const r = estimate(demoDesign(), demoCatalog());
		if (!r.ok) throw new Error('the demo prices');
		const base = r.pricing.lines.filter((l) => l.bucket === 'base');
		// 6 × 4 × 2 ft = 48 ft³ = 1.78 yd³ bank × 1.25 = 2.22 → 2.3 loose yd³.
		expect(base.find((l) => l.sku === 'SPOIL-HAUL-YD3')?.quantity).toBe(2.3);
		// 2.4 t gravel + 0.8 t of columns + four 25.5 kg boulders = 3.3 t: one load.
		expect(base.find((l) => l.sku === 'DELIVERY-LOAD')?.quantity).toBe(1);
		expect(r.siteWork.machines).toEqual([]);
		expect(r.cautions.map((c) => c.id)).not.toContain('machines');
	});

	it('a boulder for a loader brings the machine and its caution', () => {
		const design: Design = {
			...demoDesign(),
			stones: [
				{
					id: 'big',
					name: 'Feature boulder',
					size: { shape: 'boulder', lengthIn: 36, widthIn: 30, heightIn: 24 },
					rock: 'granite',
					sku: 'STONE-GRANITE-ACCENT'
				}
			]
		};
		const r = estimate(design, demoCatalog());
		if (!r.ok) throw new Error('prices');
		expect(r.pricing.lines.map((l) => l.sku)).toEqual(
			expect.arrayContaining(['EQUIP-LOADER-DAY', 'EQUIP-DELIVERY'])
		);
		expect(r.cautions.map((c) => c.id)).toContain('machines');
	});
});
