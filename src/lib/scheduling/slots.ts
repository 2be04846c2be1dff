// Bookable start times of one salesperson: weekly hours in the firm's time zone, minus time off,
// minus booked visits and the travel buffer after each, no sooner than the notice and no later
// than the days ahead. Pure: the caller passes every fact, including "now".
import { addDays, daysBetween, parseClock, wallTime, weekdayOf, zonedInstant } from './zone';

export interface Interval {
	start: string;
	end: string;
}

/** Keyed by weekday, "0" = Sunday … "6" = Saturday. */
export type WeeklyHours = Partial<Record<string, Interval[]>>;

export interface Rules {
	weeklyHours: WeeklyHours;
	visitMinutes: number;
	bufferMinutes: number;
	noticeMinutes: number;
	daysAhead: number;
}

export interface Busy {
	start: Date;
	/** For a booked visit: its end plus its travel buffer. */
	end: Date;
}

export interface SlotQuery extends Rules {
	timeZone: string;
	/** First and last local date (YYYY-MM-DD, inclusive) whose start times are wanted. */
	from: string;
	to: string;
	now: Date;
	booked: Busy[];
	timeOff: Busy[];
	/** Distance between offered start times; 30 minutes unless told. */
	stepMinutes?: number;
}

export interface Slot {
	start: Date;
	end: Date;
	/** Local date and time of the start, for grouping and labels. */
	date: string;
	minutes: number;
}

export type Refusal = 'past' | 'too_soon' | 'too_far' | 'outside_hours' | 'time_off' | 'taken';

export const REFUSALS: Record<Refusal, string> = {
	past: 'That time has already passed.',
	too_soon: 'That is sooner than the shortest notice allows.',
	too_far: 'That is further ahead than visits are offered.',
	outside_hours: 'That time is outside the working hours.',
	time_off: 'That time falls in time off.',
	taken: 'That time was just taken.'
};

const MINUTE = 60_000;

/** Working intervals as instants, for local dates from … to, merged where one ends as the next begins. */
export function workingIntervals(
	weeklyHours: WeeklyHours,
	timeZone: string,
	from: string,
	to: string
): Busy[] {
	const out: Busy[] = [];
	const days = daysBetween(from, to);
	for (let i = 0; i <= days; i++) {
		const date = addDays(from, i);
		const list = [...(weeklyHours[String(weekdayOf(date))] ?? [])];
		list.sort((a, b) => (parseClock(a.start) ?? 0) - (parseClock(b.start) ?? 0));
		for (const interval of list) {
			const s = parseClock(interval.start);
			const e = parseClock(interval.end);
			if (s === null || e === null || e <= s) continue;
			const start = zonedInstant(date, s, timeZone);
			const end =
				e === 24 * 60
					? zonedInstant(addDays(date, 1), 0, timeZone)
					: zonedInstant(date, e, timeZone);
			if (end <= start) continue; // an interval wholly inside a skipped hour
			const last = out.at(-1);
			if (last && start.getTime() <= last.end.getTime()) {
				if (end > last.end) last.end = end;
			} else {
				out.push({ start, end });
			}
		}
	}
	return out;
}

function overlaps(aStart: number, aEnd: number, list: Busy[]): boolean {
	return list.some((b) => aStart < b.end.getTime() && b.start.getTime() < aEnd);
}

/** Why a start time cannot be booked, or null when it can (the database still has the last word). */
export function refusal(start: Date, q: Omit<SlotQuery, 'from' | 'to'>): Refusal | null {
	const s = start.getTime();
	const e = s + q.visitMinutes * MINUTE;
	if (s <= q.now.getTime()) return 'past';
	if (s < q.now.getTime() + q.noticeMinutes * MINUTE) return 'too_soon';
	const today = wallTime(q.now, q.timeZone).date;
	const day = wallTime(start, q.timeZone).date;
	if (daysBetween(today, day) > q.daysAhead) return 'too_far';
	// Hours of the day before count too: a visit may run on from an interval that ends at midnight.
	const hours = workingIntervals(q.weeklyHours, q.timeZone, addDays(day, -1), addDays(day, 1));
	if (!hours.some((h) => h.start.getTime() <= s && e <= h.end.getTime())) return 'outside_hours';
	if (overlaps(s, e, q.timeOff)) return 'time_off';
	if (overlaps(s, e + q.bufferMinutes * MINUTE, q.booked)) return 'taken';
	// A visit already booked must keep its own buffer before this one starts: booked.end covers it.
	return null;
}

/** Every free start time whose local date lies in from … to. */
export function freeSlots(q: SlotQuery): Slot[] {
	const step = (q.stepMinutes ?? 30) * MINUTE;
	const length = q.visitMinutes * MINUTE;
	const out: Slot[] = [];
	const hours = workingIntervals(q.weeklyHours, q.timeZone, addDays(q.from, -1), addDays(q.to, 1));
	for (const h of hours) {
		for (let s = h.start.getTime(); s + length <= h.end.getTime(); s += step) {
			const start = new Date(s);
			const local = wallTime(start, q.timeZone);
			if (local.date < q.from || local.date > q.to) continue;
			if (refusal(start, q) !== null) continue;
			out.push({ start, end: new Date(s + length), date: local.date, minutes: local.minutes });
		}
	}
	return out;
}

/** The span a booked visit blocks: from its start to its end plus the travel buffer. */
export function blockedSpan(start: Date, visitMinutes: number, bufferMinutes: number): Busy {
	return { start, end: new Date(start.getTime() + (visitMinutes + bufferMinutes) * MINUTE) };
}
