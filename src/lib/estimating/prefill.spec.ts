import { describe, expect, it } from 'vitest';
import { fountainIn } from '../../../tests/support/fountain';
import { estimate } from './index';
import { demoCatalog, demoDesign } from '../../../scripts/seed/demo-catalog';
import { settingsSchema, type Design } from './schema';
import { narrowAccessLabor, scopeFromNotes, starterDesign } from './prefill';

const settings = settingsSchema.parse({});

function run(design: Design) {
	const result = estimate(design, demoCatalog());
	if (!result.ok) throw new Error(JSON.stringify(result.errors));
	return result;
}

const spot = { spotLengthFt: 10, spotWidthFt: 8, depthAvailableIn: 30, toHouseFt: 40 };

// Every rule checked here is a trade rule of thumb written in prefill.ts: common practice, no source.
// Hours come from the schema's defaults (invented defaults, no source).
describe('starting design from the visit notes (common practice, no source; see prefill.ts)', () => {
	it('is the standard feature named for the lead without notes, and a stored design wins', () => {
		const plain = starterDesign('Ada — water feature', null);
		expect(plain).toEqual({ ...demoDesign(), name: 'Ada — water feature' });
		const stored = { name: 'Drawn on site', features: [] };
		expect(starterDesign('x', { design: stored, slope: 'steep' })).toBe(stored);
		// A design stored before features existed comes back as one fountain, nothing else changed.
		const old = { name: 'Drawn on site', outlets: [] };
		expect(starterDesign('x', { design: old })).toEqual({
			name: 'Drawn on site',
			features: [{ id: 'fountain-1', kind: 'fountain', name: 'Fountain', outlets: [] }]
		});
	});

	it('sizes the basin to the spot and the cable run to the house', () => {
		const design = starterDesign('x', {
			spotLengthFt: 9,
			spotWidthFt: 7,
			depthAvailableIn: 18,
			toHouseFt: 40
		});
		// The basin is the spot less 1 ft of stone edge each side: 9 − 2 = 7, 7 − 2 = 5; 18 in deep
		// (common practice, no source).
		expect(fountainIn(design).basin?.size).toMatchObject({ lengthFt: 7, widthFt: 5, depthFt: 1.5 });
		// The demo run's fixture spacing (invented, no source), shifted so the first sits at the
		// 40 ft to the house.
		expect(design.lighting?.runs[0].fixtures.map((f) => f.distanceFt)).toEqual([40, 46, 65]);
		expect(design.extraLabor).toEqual([]);
	});

	it('digs at the soil’s rate: slower in clay, slower still in rock; fill and unknown dig as loam', () => {
		const hours = (soil: string) =>
			run(starterDesign('x', { ...spot, soil })).labor.summary.totalHours;
		const rocky = starterDesign('x', { ...spot, soil: 'rocky' });
		expect(rocky.site?.soil).toBe('rocky');
		expect(rocky.extraLabor).toEqual([]);
		expect(starterDesign('x', { ...spot, soil: 'fill' }).site?.soil).toBe('loam');
		expect(hours('loam')).toBe(hours('unknown'));
		expect(hours('fill')).toBe(hours('loam'));
		expect(hours('clay')).toBeGreaterThan(hours('loam'));
		expect(hours('rocky')).toBeGreaterThan(hours('clay'));
		expect(hours('sand')).toBeLessThan(hours('loam'));
	});

	it('puts a retaining wall as tall as the fall into the base work on a moderate or steep slope', () => {
		const flat = starterDesign('x', { ...spot, slope: 'gentle' });
		expect(flat.walls?.[0]).toMatchObject({ optionId: 'low-wall', exposedHeightIn: 18 });
		expect(flat.extraLabor).toEqual([]);

		const steep = starterDesign('x', { ...spot, slope: 'steep' });
		const wall = steep.walls![0];
		// Steep = a 25% grade and 2 ft returns (common practice, no source): 25% across 10 ft falls
		// 30 in, five 6 in courses; 8 ft wide plus two 2 ft returns = 12 ft. Levelling the pad takes
		// half the 4 person-hours of setting a basin (common practice, no source).
		expect(wall).toMatchObject({
			exposedHeightIn: 30,
			lengthFt: 12,
			name: 'Retaining wall on the uphill side'
		});
		expect(wall.optionId).toBeUndefined();
		expect(steep.options?.map((o) => o.id)).toEqual([]);
		expect(steep.extraLabor).toEqual([
			{ task: 'Cut and level the pad on a steep slope', hours: 2 }
		]);

		const moderate = starterDesign('x', { ...spot, slope: 'moderate' });
		expect(moderate.walls![0].exposedHeightIn).toBe(18);
		const priced = run(steep);
		expect(priced.walls[0].units).toBeGreaterThan(0);
		expect(priced.labor.tasks).toContainEqual(
			expect.objectContaining({
				bucket: 'base',
				key: 'wall-face',
				task: 'Retaining wall on the uphill side: lay 6 courses'
			})
		);
		expect(priced.pricing.totalCents).toBeGreaterThan(run(flat).pricing.totalCents);
	});

	it('moves stones in by hand when the access is narrower than the cart or loader they need', () => {
		// Gear widths: stone cart 24 in, compact loader 36 in (from memory; common practice, no
		// source). Moving a stone in by hand takes its set crew-hours once more (common practice, no
		// source): 0.5 h a stone by cart or 1 h by hoist, for the 4 people each needs. The demo's
		// columns ride a stone cart (24 in) or come in for a hoist, and its four 56 lb accent
		// boulders, past a four-person team lift at the setting-a-stone NIOSH limit, ride a cart too.
		const narrow = starterDesign('x', { ...spot, accessWidthIn: 20 });
		expect(narrow.extraLabor).toEqual([
			{
				task: 'Move Low basalt column in by hand: the 20 in access is narrower than a stone cart (24 in)',
				hours: 2
			},
			{
				task: 'Move Middle basalt column in by hand: the 20 in access is narrower than a stone cart (24 in)',
				hours: 2
			},
			{
				task: 'Move Tall basalt column in by hand: the 20 in access is narrower than a stone cart (24 in)',
				hours: 4
			},
			{
				task: 'Move Granite accent boulders in by hand: the 20 in access is narrower than a stone cart (24 in)',
				hours: 8
			}
		]);
		expect(starterDesign('x', { ...spot, accessWidthIn: 36 }).extraLabor).toEqual([]);
		expect(run(narrow).labor.summary.totalHours).toBeGreaterThan(
			run(starterDesign('x', spot)).labor.summary.totalHours
		);
	});

	it('counts a loader boulder behind a 30 in gate, with the firm’s own set hours and its option (36 in loader width: from memory, no source)', () => {
		const design: Design = {
			stones: [
				{
					id: 'big',
					name: 'Feature boulder',
					size: { shape: 'boulder', lengthIn: 36, widthIn: 30, heightIn: 24 },
					rock: 'granite',
					optionId: 'boulder'
				}
			],
			options: [{ id: 'boulder', name: 'Feature boulder' }]
		};
		const firm = settingsSchema.parse({ labor: { rates: { 'stone-compact-loader': 2.5 } } });
		expect(run(design).stones.stones[0].handling.method).toBe('compact-loader');
		expect(narrowAccessLabor(design, 30, firm)).toEqual([
			{
				task: 'Move Feature boulder in by hand: the 30 in access is narrower than a compact loader (36 in)',
				// 2.5 h on the clock for the 4 people a loader stone needs.
				hours: 10,
				optionId: 'boulder'
			}
		]);
		expect(narrowAccessLabor(design, 40, settings)).toEqual([]);
	});

	it('ignores values the notes schema would not hold', () => {
		const odd = starterDesign('x', { ...spot, slope: 'cliff', soil: 5, accessWidthIn: '-3' });
		expect(odd).toEqual(starterDesign('x', spot));
	});

	it('gives the engine a design it can price for every slope, soil and access together', () => {
		for (const slope of ['flat', 'gentle', 'moderate', 'steep']) {
			for (const soil of ['loam', 'clay', 'sand', 'rocky', 'fill', 'unknown']) {
				const design = starterDesign('x', { ...spot, slope, soil, accessWidthIn: 18 });
				expect(estimate(design, demoCatalog()).ok).toBe(true);
			}
		}
	});
});

describe('scope from the visit notes', () => {
	it('keeps the salesperson’s words and the power, adds the site, or falls back to the lead', () => {
		expect(
			scopeFromNotes({ notes: 'Gate is 34 in wide', powerLocation: 'GFCI by the back door' }, 'msg')
		).toBe('Gate is 34 in wide\nPower: GFCI by the back door');
		expect(
			scopeFromNotes(
				{ notes: 'By the patio', slope: 'moderate', soil: 'clay', accessWidthIn: 30 },
				'msg'
			)
		).toBe('By the patio\nSite: moderate slope, clay soil, access 30 in wide');
		expect(scopeFromNotes({ soil: 'unknown' }, 'Bubbling columns')).toBe('Bubbling columns');
		expect(scopeFromNotes(null, 'Bubbling columns')).toBe('Bubbling columns');
	});
});
