// What the intake refuses, and the messages shown when storage or the database is down.

export class IntakeError extends Error {
	constructor(
		readonly field: string,
		message: string,
		readonly status = 400
	) {
		super(message);
	}
}

export const STORAGE_DOWN =
	'Our photo storage is out of reach for a moment, so nothing was sent. Everything you typed is still here: please try again in a minute.';
export const DATABASE_DOWN =
	'Our records are out of reach for a moment, so nothing was sent. Everything you typed is still here: please try again in a minute.';
