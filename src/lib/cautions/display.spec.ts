import { describe, expect, it } from 'vitest';
import {
	changeOrderCautions,
	CREW_LOCAL_CODES_ITEM,
	CREW_WALL_ITEM,
	crewCautions,
	visitCautions
} from './display';

const visitIds = (n: Parameters<typeof visitCautions>[0]) => visitCautions(n).map((c) => c.id);

describe('the cautions the visit notes call for', () => {
	it('always ends with local codes and licensed practice', () => {
		expect(visitIds({})).toEqual(['local-codes']);
		expect(visitCautions({}).at(-1)?.title).toBe('Local codes and licensed practice come first');
	});

	it('adds the wall-height caution for a moderate or steep slope only', () => {
		expect(visitIds({ slope: 'flat' })).toEqual(['local-codes']);
		expect(visitIds({ slope: 'gentle' })).toEqual(['local-codes']);
		expect(visitIds({ slope: 'moderate' })).toEqual(['wall-height', 'local-codes']);
		const [wall] = visitCautions({ slope: 'steep' });
		expect(wall.title).toBe('Retaining wall height: permit or engineered design');
		expect(wall.reason).toContain('A steep slope is levelled with a retaining wall');
		expect(wall.reference).toContain('IRC R404.4');
	});

	it('adds the heavy-stone caution with the access width once it is recorded', () => {
		expect(visitIds({ accessWidthIn: 36, slope: 'steep' })).toEqual([
			'wall-height',
			'heavy-lifting',
			'local-codes'
		]);
		const [stones] = visitCautions({ accessWidthIn: 36 });
		expect(stones.title).toBe('Heavy stones: lift safely');
		expect(stones.reason).toMatch(/^Stones and boulders brought in through the 36 in access weigh/);
		expect(stones.reference).toContain('NIOSH');
		expect(visitIds({ accessWidthIn: 0 })).toContain('heavy-lifting');
	});
});

const changeIds = (lines: { category: string; quantity: number }[]) =>
	changeOrderCautions(lines).map((c) => c.id);

describe('cautions of a change order', () => {
	it('gives only the local-codes line for stone or labor', () => {
		expect(
			changeIds([
				{ category: 'stone', quantity: 2 },
				{ category: 'labor', quantity: 4 }
			])
		).toEqual(['local-codes']);
	});

	it('adds GFCI and electrician for an added light, pump or electrical line, not a removed one', () => {
		for (const category of ['lighting', 'electrical', 'pump', 'Lighting']) {
			expect(changeIds([{ category, quantity: 1 }])).toEqual([
				'ground-fault-protection',
				'licensed-electrician',
				'local-codes'
			]);
		}
		expect(changeIds([{ category: 'lighting', quantity: -1 }])).toEqual(['local-codes']);
	});

	it('adds the wall-height caution for an added wall', () => {
		const list = changeOrderCautions([
			{ category: 'wall', quantity: 12 },
			{ category: 'lighting', quantity: 1 }
		]);
		expect(list.map((c) => c.id)).toEqual([
			'ground-fault-protection',
			'licensed-electrician',
			'wall-height',
			'local-codes'
		]);
		expect(list[2].title).toBe('Retaining wall height: permit or engineered design');
		expect(list[2].reference).toContain('IRC R105.2');
	});
});

describe("the crew's fixed cautions", () => {
	it('name the engineer and permit for walls, and local codes first', () => {
		expect(CREW_WALL_ITEM).toContain("built to the engineer's drawings and the permit");
		expect(CREW_LOCAL_CODES_ITEM).toMatch(/^Local codes and licensed practice come first\./);
	});

	it("list each topic once: the estimate's own caution replaces the fixed line on its topic", () => {
		const frozen = [
			'Locate buried utilities before digging: Basins, trenches…',
			'Ground-fault protection for pumps and lights near water: A pump sits…',
			'Mains wiring by a licensed electrician: New circuits…',
			'Heavy stones: lift safely: Column A weighs…',
			'Open water and children: The basin holds about 14 in…',
			'Local codes and licensed practice come first: These figures…'
		];
		const list = crewCautions(frozen);
		expect(list).toEqual([...frozen.slice(0, 5), CREW_WALL_ITEM, CREW_LOCAL_CODES_ITEM]);
		expect(new Set(list).size).toBe(list.length);
	});

	it('keep the fixed lines when the estimate froze no cautions, and keep cautions of other topics', () => {
		const list = crewCautions(['Something new: a reason']);
		expect(list).toHaveLength(8);
		expect(list[0]).toMatch(/^Utility locates \(811\)/);
		expect(list).toContain('Something new: a reason');
		expect(list.at(-1)).toBe(CREW_LOCAL_CODES_ITEM);
	});
});
