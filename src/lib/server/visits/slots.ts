// The bookable slots of a salesperson.
import { and, eq, gt, lt, ne, sql } from 'drizzle-orm';
import { freeSlots, type Busy, type Rules, type Slot } from '$lib/scheduling/slots';
import { addDays, zonedInstant } from '$lib/scheduling/zone';
import { db, type Tx } from '../platform/db';
import { siteVisits, timeOff, users } from '../platform/db/schema';
import { firmSettings } from '../platform/settings';
import { rulesFor } from './availability';
import { settingsIn } from './party';

// ---------------------------------------------------------------------------------------------
// Slots

interface Facts extends Rules {
	timeZone: string;
	booked: Busy[];
	timeOff: Busy[];
}

export async function factsFor(
	userId: string,
	from: Date,
	to: Date,
	excludeVisitId: string | undefined,
	tx: Tx | typeof db = db
): Promise<Facts> {
	const [{ timeZone }, rules, booked, off] = await Promise.all([
		settingsIn(tx),
		rulesFor(userId, tx),
		tx
			.select({
				start: siteVisits.startsAt,
				ends: siteVisits.endsAt,
				buffer: siteVisits.bufferMinutes
			})
			.from(siteVisits)
			.where(
				and(
					eq(siteVisits.salespersonId, userId),
					eq(siteVisits.status, 'booked'),
					lt(siteVisits.startsAt, to),
					sql`${siteVisits.endsAt} + make_interval(mins => ${siteVisits.bufferMinutes}) > ${from.toISOString()}::timestamptz`,
					excludeVisitId ? ne(siteVisits.id, excludeVisitId) : undefined
				)
			),
		tx
			.select({ start: timeOff.startsAt, end: timeOff.endsAt })
			.from(timeOff)
			.where(and(eq(timeOff.userId, userId), lt(timeOff.startsAt, to), gt(timeOff.endsAt, from)))
	]);
	return {
		...rules,
		timeZone,
		booked: booked.map((b) => ({
			start: b.start,
			end: new Date(b.ends.getTime() + b.buffer * 60_000)
		})),
		timeOff: off
	};
}

export async function slotsFor(
	userId: string,
	from: string,
	to: string,
	options: { now?: Date; excludeVisitId?: string } = {}
): Promise<{ timeZone: string; slots: Slot[]; rules: Rules } | null> {
	const [person] = await db
		.select({ role: users.role, disabledAt: users.disabledAt })
		.from(users)
		.where(eq(users.id, userId));
	if (!person || person.disabledAt || person.role === 'crew') return null;
	const { timeZone } = await firmSettings();
	const wideFrom = zonedInstant(addDays(from, -2), 0, timeZone);
	const wideTo = zonedInstant(addDays(to, 2), 0, timeZone);
	const facts = await factsFor(userId, wideFrom, wideTo, options.excludeVisitId);
	const slots = freeSlots({ ...facts, from, to, now: options.now ?? new Date() });
	return { timeZone, slots, rules: facts };
}
