import { db } from '../db';

export type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];
export type Db = Tx | typeof db;

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
	return new Intl.DateTimeFormat('en-CA', { timeZone }).format(at);
}

/** The same month and day a year later (29 February becomes 28 February). */
export function plusYear(day: string): string {
	const [y, m, d] = day.split('-').map(Number);
	const next = new Date(Date.UTC(y + 1, m - 1, d));
	if (next.getUTCMonth() !== m - 1) next.setUTCDate(0);
	return next.toISOString().slice(0, 10);
}
