// When each season's visits must happen, from the firm's settings: spring start-ups and summer
// clean-outs in a window from a date, autumn shut-downs (and the lighting check) in the weeks
// before the first-frost date, so no water is left in pipes and pumps when it freezes.
import type { Season } from './kinds';
import { addDays } from '$lib/scheduling/zone';

export interface SeasonSettings {
	/** "MM-DD": the firm's first hard frost; shut-downs end the day before. */
	firstFrost: string;
	/** How many days before the first frost the shut-down window opens. */
	shutdownDays: number;
	springStart: string;
	springDays: number;
	summerStart: string;
	summerDays: number;
}

export const SEASON_DEFAULTS: SeasonSettings = {
	firstFrost: '10-15',
	shutdownDays: 42,
	springStart: '04-15',
	springDays: 45,
	summerStart: '06-15',
	summerDays: 60
};

const MONTH_DAY = /^(0[1-9]|1[0-2])-(0[1-9]|[12]\d|3[01])$/;

export function isMonthDay(value: string): boolean {
	const m = MONTH_DAY.exec(value);
	if (!m) return false;
	const d = new Date(Date.UTC(2027, Number(m[1]) - 1, Number(m[2])));
	return d.getUTCMonth() === Number(m[1]) - 1;
}

function on(year: number, monthDay: string, plusDays = 0): string {
	return addDays(`${year}-${monthDay}`, plusDays);
}

/** The first and last day (inclusive, "YYYY-MM-DD") a season's visits may be made. */
export function seasonWindow(
	season: Season,
	year: number,
	s: SeasonSettings
): { start: string; end: string } {
	if (season === 'autumn') {
		return { start: on(year, s.firstFrost, -s.shutdownDays), end: on(year, s.firstFrost, -1) };
	}
	const [from, days] =
		season === 'spring' ? [s.springStart, s.springDays] : [s.summerStart, s.summerDays];
	return { start: on(year, from), end: on(year, from, days - 1) };
}

export function seasonKey(season: Season, year: number): string {
	return `${season}-${year}`;
}

export function parseSeasonKey(key: string): { season: Season; year: number } | null {
	const m = /^(spring|summer|autumn)-(\d{4})$/.exec(key);
	return m ? { season: m[1] as Season, year: Number(m[2]) } : null;
}
