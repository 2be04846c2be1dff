// When a visit's reminder goes out. A day before when there is time for it; a visit booked for
// later today or early tomorrow gets one three hours before; a visit only a few hours away gets
// none, because the invitation the booking has just sent stands in for it.
// The lead times are common practice for appointment reminders, no source.
import { addDays, wallTime } from './zone';

const MINUTE = 60_000;

/** Tried in order; the first whose send time leaves the gap below after the booking wins. */
export const REMINDER_LEADS_MINUTES = [24 * 60, 3 * 60] as const;

/** A reminder closer than this to the invitation would only repeat it. */
export const REMINDER_MIN_GAP_MINUTES = 2 * 60;

export interface ReminderPlan {
	/** When the reminder is sent. */
	at: Date;
	/** How long before the visit it is sent. */
	leadMinutes: number;
}

/** The reminder of a visit starting at `startsAt`, booked or moved at `now`; null for none. */
export function reminderPlan(startsAt: Date, now: Date): ReminderPlan | null {
	for (const leadMinutes of REMINDER_LEADS_MINUTES) {
		const at = new Date(startsAt.getTime() - leadMinutes * MINUTE);
		if (at.getTime() - now.getTime() >= REMINDER_MIN_GAP_MINUTES * MINUTE) {
			return { at, leadMinutes };
		}
	}
	return null;
}

/** 'today' or 'tomorrow' as seen at `now` in the zone, or null for a day further off. */
export function relativeDay(
	startsAt: Date,
	now: Date,
	timeZone: string
): 'today' | 'tomorrow' | null {
	const visitDay = wallTime(startsAt, timeZone).date;
	const today = wallTime(now, timeZone).date;
	if (visitDay === today) return 'today';
	if (visitDay === addDays(today, 1)) return 'tomorrow';
	return null;
}
