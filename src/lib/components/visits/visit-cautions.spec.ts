import { describe, expect, it } from 'vitest';
import { visitCautions } from './visit-cautions';

const ids = (n: Parameters<typeof visitCautions>[0]) => visitCautions(n).map((c) => c.id);

describe('the cautions the visit notes call for', () => {
	it('always ends with local codes and licensed practice', () => {
		expect(ids({})).toEqual(['local-codes']);
		expect(visitCautions({}).at(-1)?.title).toBe('Local codes and licensed practice come first');
	});

	it('adds the wall-height caution for a moderate or steep slope only', () => {
		expect(ids({ slope: 'flat' })).toEqual(['local-codes']);
		expect(ids({ slope: 'gentle' })).toEqual(['local-codes']);
		expect(ids({ slope: 'moderate' })).toEqual(['wall-height', 'local-codes']);
		const [wall] = visitCautions({ slope: 'steep' });
		expect(wall.title).toBe('Retaining wall height: permit or engineered design');
		expect(wall.reason).toContain('A steep slope is levelled with a retaining wall');
		expect(wall.reference).toContain('IRC R404.4');
	});

	it('adds the heavy-stone caution with the access width once it is recorded', () => {
		expect(ids({ accessWidthIn: 36, slope: 'steep' })).toEqual([
			'wall-height',
			'heavy-lifting',
			'local-codes'
		]);
		const [stones] = visitCautions({ accessWidthIn: 36 });
		expect(stones.title).toBe('Heavy stones: lift safely');
		expect(stones.reason).toMatch(/^Stones and boulders brought in through the 36 in access weigh/);
		expect(stones.reference).toContain('NIOSH');
		expect(ids({ accessWidthIn: 0 })).toContain('heavy-lifting');
	});
});
