// Wall-clock time in a named time zone, with the platform's own time-zone data (Intl) and no
// library: the slot module runs in the browser and on the server alike. Checked in the unit tests
// against @date-fns/tz, a general-purpose time-zone library.

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatter(timeZone: string): Intl.DateTimeFormat {
	let f = formatters.get(timeZone);
	if (!f) {
		f = new Intl.DateTimeFormat('en-US', {
			timeZone,
			hourCycle: 'h23',
			year: 'numeric',
			month: '2-digit',
			day: '2-digit',
			hour: '2-digit',
			minute: '2-digit',
			second: '2-digit',
			weekday: 'short'
		});
		formatters.set(timeZone, f);
	}
	return f;
}

export function isTimeZone(value: string): boolean {
	if (!value || value.length > 64) return false;
	try {
		formatter(value);
		return true;
	} catch {
		return false;
	}
}

export interface WallTime {
	/** YYYY-MM-DD */
	date: string;
	/** Minutes since local midnight. */
	minutes: number;
	/** 0 = Sunday. */
	weekday: number;
}

const WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'];

export function wallTime(instant: Date, timeZone: string): WallTime {
	const parts: Record<string, string> = {};
	for (const p of formatter(timeZone).formatToParts(instant)) parts[p.type] = p.value;
	return {
		date: `${parts.year}-${parts.month}-${parts.day}`,
		minutes: Number(parts.hour) * 60 + Number(parts.minute),
		weekday: WEEKDAYS.indexOf(parts.weekday)
	};
}

/** The zone's offset from UTC at an instant, in minutes (Denver in winter: -420). */
export function offsetMinutes(instant: Date, timeZone: string): number {
	const parts: Record<string, string> = {};
	for (const p of formatter(timeZone).formatToParts(instant)) parts[p.type] = p.value;
	const asUtc = Date.UTC(
		Number(parts.year),
		Number(parts.month) - 1,
		Number(parts.day),
		Number(parts.hour),
		Number(parts.minute),
		Number(parts.second)
	);
	return Math.round((asUtc - Math.floor(instant.getTime() / 1000) * 1000) / 60_000);
}

const DATE_RE = /^(\d{4})-(\d{2})-(\d{2})$/;

/**
 * The calendar date (YYYY-MM-DD) of an instant on the wall calendar of a zone. This module is the
 * one place that turns instants into dates: a date taken from an instant in UTC is already
 * tomorrow in the firm's evening (zone-usage.spec.ts searches the source for the pattern).
 */
export function calendarDate(instant: Date | number | string, timeZone: string): string {
	return wallTime(new Date(instant), timeZone).date;
}

/** Today's date in a zone. */
export function todayIn(timeZone: string, now: Date | number = Date.now()): string {
	return calendarDate(now, timeZone);
}

/** The latest calendar date anywhere on earth right now (UTC+14): "not in the future" bound. */
export function latestDateOnEarth(now: Date | number = Date.now()): string {
	return calendarDate(now, 'Etc/GMT-14');
}

/** The date part of a UTC instant (for dates stored as UTC midnights, never for "today"). */
function utcDate(d: Date): string {
	return d.toISOString().slice(0, 10);
}

export function isDate(value: string): boolean {
	const m = DATE_RE.exec(value);
	if (!m) return false;
	const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
	return Number(m[1]) >= 1000 && utcDate(d) === value;
}

export function addDays(date: string, days: number): string {
	const m = DATE_RE.exec(date);
	if (!m) throw new Error(`Not a date: ${date}`);
	const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]) + days));
	return utcDate(d);
}

export function weekdayOf(date: string): number {
	return new Date(`${date}T00:00:00Z`).getUTCDay();
}

export function daysBetween(from: string, to: string): number {
	return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000);
}

/**
 * The instant of a wall-clock time. A time that happens twice (the hour repeated when clocks go
 * back) gives the earlier instant; a time that never happens (the hour skipped when clocks go
 * forward) is read with the offset before the change, so 02:30 becomes 03:30. This is what
 * RFC 5545 and Temporal's "compatible" disambiguation do.
 */
export function zonedInstant(date: string, minutes: number, timeZone: string): Date {
	const guess = Date.parse(`${date}T00:00:00Z`) + minutes * 60_000;
	const before = offsetMinutes(new Date(guess - 86_400_000), timeZone);
	const after = offsetMinutes(new Date(guess + 86_400_000), timeZone);
	const matches: number[] = [];
	for (const offset of new Set([before, after])) {
		const t = guess - offset * 60_000;
		const w = wallTime(new Date(t), timeZone);
		if (w.date === date && w.minutes === minutes) matches.push(t);
	}
	if (matches.length) return new Date(Math.min(...matches));
	return new Date(guess - before * 60_000);
}

/** "HH:MM" → minutes; "24:00" is the end of the day. */
export function parseClock(value: string): number | null {
	const m = /^([01]\d|2[0-4]):([0-5]\d)$/.exec(value);
	if (!m) return null;
	const minutes = Number(m[1]) * 60 + Number(m[2]);
	return minutes > 24 * 60 ? null : minutes;
}

export function formatClock(minutes: number): string {
	return `${String(Math.floor(minutes / 60)).padStart(2, '0')}:${String(minutes % 60).padStart(2, '0')}`;
}
