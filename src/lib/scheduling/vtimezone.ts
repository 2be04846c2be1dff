// An RFC 5545 VTIMEZONE for a named zone, built from the platform's time-zone data: one
// STANDARD or DAYLIGHT part per offset change in the years asked for. ical-generator takes this
// as its time-zone generator, so calendar programs read TZID=America/Denver times correctly.
import { offsetMinutes } from './zone';

const HOUR = 3_600_000;

function offsetText(minutes: number): string {
	const sign = minutes < 0 ? '-' : '+';
	const abs = Math.abs(minutes);
	return `${sign}${String(Math.floor(abs / 60)).padStart(2, '0')}${String(abs % 60).padStart(2, '0')}`;
}

/** Local wall time (in the offset before the change) as an iCalendar DATE-TIME without zone. */
function localStamp(instant: number, offset: number): string {
	return new Date(instant + offset * 60_000)
		.toISOString()
		.replace(/[-:]/g, '')
		.replace(/\.\d{3}Z$/, '');
}

/** Instants where the offset changes, found hour by hour and narrowed to the minute. */
export function offsetChanges(
	timeZone: string,
	fromYear: number,
	toYear: number
): { at: number; from: number; to: number }[] {
	const out: { at: number; from: number; to: number }[] = [];
	let t = Date.UTC(fromYear, 0, 1);
	const end = Date.UTC(toYear + 1, 0, 1);
	let previous = offsetMinutes(new Date(t), timeZone);
	for (; t < end; t += HOUR) {
		const next = offsetMinutes(new Date(t + HOUR), timeZone);
		if (next === previous) continue;
		let lo = t;
		let hi = t + HOUR;
		while (hi - lo > 60_000) {
			const mid = lo + Math.floor((hi - lo) / 2 / 60_000) * 60_000;
			if (offsetMinutes(new Date(mid), timeZone) === previous) lo = mid;
			else hi = mid;
		}
		out.push({ at: hi, from: previous, to: next });
		previous = next;
	}
	return out;
}

export function vtimezone(timeZone: string, aroundYear: number): string {
	const changes = offsetChanges(timeZone, aroundYear - 1, aroundYear + 1);
	const lines = ['BEGIN:VTIMEZONE', `TZID:${timeZone}`];
	if (changes.length === 0) {
		const offset = offsetText(offsetMinutes(new Date(Date.UTC(aroundYear, 0, 1)), timeZone));
		lines.push(
			'BEGIN:STANDARD',
			'DTSTART:19700101T000000',
			`TZOFFSETFROM:${offset}`,
			`TZOFFSETTO:${offset}`,
			'END:STANDARD'
		);
	}
	for (const c of changes) {
		const kind = c.to > c.from ? 'DAYLIGHT' : 'STANDARD';
		lines.push(
			`BEGIN:${kind}`,
			`DTSTART:${localStamp(c.at, c.from)}`,
			`TZOFFSETFROM:${offsetText(c.from)}`,
			`TZOFFSETTO:${offsetText(c.to)}`,
			`END:${kind}`
		);
	}
	lines.push('END:VTIMEZONE');
	return lines.join('\r\n');
}
