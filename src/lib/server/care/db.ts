import { isDate, todayIn } from '$lib/scheduling/zone';

export type { Db, Tx } from '../platform/db';

export class CareError extends Error {
	constructor(
		readonly code: 'not_found' | 'forbidden' | 'invalid' | 'conflict',
		message: string
	) {
		super(message);
	}
}

/** Today's date ("YYYY-MM-DD") in the firm's time zone. */
export function dayIn(timeZone: string, at = new Date()): string {
	return todayIn(timeZone, at);
}

/** The same month and day a year later (29 February becomes 28 February). */
export function plusYear(day: string): string {
	const year = String(Number(day.slice(0, 4)) + 1).padStart(4, '0');
	const sameDay = `${year}${day.slice(4)}`;
	// Only 29 February has no twin a year later.
	return isDate(sameDay) ? sameDay : `${year}-02-28`;
}
