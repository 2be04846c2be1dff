import { describe, expect, it } from 'vitest';
import { isMonthDay, parseSeasonKey, SEASON_DEFAULTS, seasonWindow } from './seasons';
import { quotePlan } from './kinds';

describe('seasonWindow', () => {
	it('ends the shut-downs the day before the first frost', () => {
		expect(
			seasonWindow('autumn', 2027, { ...SEASON_DEFAULTS, firstFrost: '10-15', shutdownDays: 42 })
		).toEqual({
			start: '2027-09-03',
			end: '2027-10-14'
		});
	});
	it('opens spring and summer on their dates for the number of days set', () => {
		expect(
			seasonWindow('spring', 2028, { ...SEASON_DEFAULTS, springStart: '04-15', springDays: 30 })
		).toEqual({
			start: '2028-04-15',
			end: '2028-05-14'
		});
	});
	it('reads month-days and season keys strictly', () => {
		expect(isMonthDay('02-30')).toBe(false);
		expect(isMonthDay('10-15')).toBe(true);
		expect(parseSeasonKey('autumn-2027')).toEqual({ season: 'autumn', year: 2027 });
		expect(parseSeasonKey('winter-2027')).toBeNull();
	});
});

describe('quotePlan', () => {
	it('prices each visit for each feature it serves by kind and size', () => {
		const plan = {
			visits: [
				{ kind: 'startup' as const, minutes: 60, checklist: [] },
				{ kind: 'shutdown' as const, minutes: 60, checklist: [] },
				{ kind: 'lighting' as const, minutes: 30, checklist: [] }
			],
			prices: { fountain: { small: 12000, medium: 15000 }, lighting: { small: 6000 } }
		};
		const q = quotePlan(plan, [
			{ id: 'f', kind: 'fountain', size: 'medium' },
			{ id: 'l', kind: 'lighting', size: 'small' },
			{ id: 'p', kind: 'pond', size: 'large' }
		]);
		// Start-up and shut-down for the fountain (2 × 150.00), the lighting check (60.00); no pond price.
		expect(q.yearCents).toBe(36000);
		expect(q.lines).toHaveLength(3);
	});
});
