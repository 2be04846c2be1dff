// "Today" and "the date of this instant" come from zone.ts only: a date cut out of an ISO string
// is the UTC date, which is already tomorrow in the firm's evening.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { calendarDate, isDate, latestDateOnEarth, todayIn } from './zone';

const FORBIDDEN = [/toISOString\(\)\s*\.slice\(\s*0\s*,\s*10\s*\)/, /new Date\(\)\s*\.getDate\(\)/];
const ALLOWED = new Set(['src/lib/scheduling/zone.ts', 'src/lib/scheduling/zone-usage.spec.ts']);

function sources(dir: string, out: string[] = []): string[] {
	for (const entry of readdirSync(dir)) {
		const path = join(dir, entry);
		if (statSync(path).isDirectory()) sources(path, out);
		else if (/\.(ts|js|svelte)$/.test(entry)) out.push(path);
	}
	return out;
}

describe('firm dates come from one helper', () => {
	it('no source outside zone.ts takes a date from toISOString() or new Date().getDate()', () => {
		const offenders: string[] = [];
		for (const file of [...sources('src'), ...sources('scripts')]) {
			const rel = relative('.', file).replaceAll('\\', '/');
			if (ALLOWED.has(rel)) continue;
			// The whole file at once: a call chain split over several lines counts too.
			const text = readFileSync(file, 'utf8');
			for (const re of FORBIDDEN) {
				for (const m of text.matchAll(new RegExp(re.source, 'g'))) {
					offenders.push(`${rel}:${text.slice(0, m.index).split('\n').length}`);
				}
			}
		}
		expect(offenders).toEqual([]);
	});

	it('the search itself finds the pattern', () => {
		expect(FORBIDDEN[0].test('x.toISOString().slice(0, 10)')).toBe(true);
		expect(FORBIDDEN[1].test('new Date().getDate()')).toBe(true);
		// Split over lines, as a formatter leaves a long chain.
		expect(FORBIDDEN[0].test('new Date(t)\n\t\t.toISOString()\n\t\t.slice(0, 10)')).toBe(true);
	});
});

describe('calendar dates at 23:30 firm time', () => {
	// 2027-03-10 23:30 in Denver is 2027-03-11 06:30 UTC (MST, UTC−7: IANA tz database).
	const evening = Date.UTC(2027, 2, 11, 6, 30);

	it('is still the 10th in Denver while UTC has reached the 11th', () => {
		expect(todayIn('America/Denver', evening)).toBe('2027-03-10');
		expect(calendarDate(evening, 'UTC')).toBe('2027-03-11');
	});

	it('follows daylight saving time (MDT, UTC−6, in July)', () => {
		// 2027-07-04 23:30 MDT = 2027-07-05 05:30 UTC.
		expect(todayIn('America/Denver', Date.UTC(2027, 6, 5, 5, 30))).toBe('2027-07-04');
		expect(todayIn('America/Denver', Date.UTC(2027, 6, 5, 6, 0))).toBe('2027-07-05');
	});

	// UTC+14 is the offset of Pacific/Kiritimati (Line Islands, Kiribati) in the IANA tz database,
	// the furthest ahead of any zone in it.
	it('the latest date on earth is the date in UTC+14 (Pacific/Kiritimati)', () => {
		expect(calendarDate(Date.UTC(2027, 2, 10, 10, 0), 'Pacific/Kiritimati')).toBe('2027-03-11');
		expect(latestDateOnEarth(Date.UTC(2027, 2, 10, 10, 0))).toBe('2027-03-11');
		expect(latestDateOnEarth(Date.UTC(2027, 2, 10, 9, 59))).toBe('2027-03-10');
	});

	it('refuses dates that are not on the calendar', () => {
		for (const bad of ['2027-02-30', '2027-13-01', '0000-00-00', '2027-2-3', '2027-02-29']) {
			expect(isDate(bad), bad).toBe(false);
		}
		expect(isDate('2028-02-29')).toBe(true);
	});
});
