// The crew days a season's visits are put in: added for a crew lead over a run of dates (weekdays
// only if asked), removed (its visits undated again), and read for a window.
import { and, asc, eq, gte, inArray, isNull, lte } from 'drizzle-orm';
import { db } from '../platform/db';
import { careCrewDays, serviceVisits, users } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { CareError, type Tx } from './db';
import { addDays, weekdayOf } from '$lib/scheduling/zone';

export interface CrewDaysInput {
	from: string;
	to: string;
	crewLeadId: string;
	startMinute: number;
	endMinute: number;
	weekdaysOnly: boolean;
}

export async function addCrewDays(input: CrewDaysInput): Promise<number> {
	const [lead] = await db
		.select({ id: users.id })
		.from(users)
		.where(and(eq(users.id, input.crewLeadId), eq(users.role, 'crew'), isNull(users.disabledAt)));
	if (!lead) throw new CareError('invalid', 'Pick a crew lead.');
	const rows = [];
	for (let day = input.from; day <= input.to; day = addDays(day, 1)) {
		const weekday = weekdayOf(day);
		if (input.weekdaysOnly && (weekday === 0 || weekday === 6)) continue;
		rows.push({
			id: newId(),
			day,
			crewLeadId: input.crewLeadId,
			startMinute: input.startMinute,
			endMinute: input.endMinute
		});
	}
	if (rows.length > 120) throw new CareError('invalid', 'At most 120 days at a time.');
	if (!rows.length) return 0;
	const added = await db
		.insert(careCrewDays)
		.values(rows)
		.onConflictDoNothing()
		.returning({ id: careCrewDays.id });
	return added.length;
}

export async function removeCrewDay(id: string): Promise<void> {
	await db.transaction(async (tx) => {
		await tx
			.update(serviceVisits)
			.set({ day: null, crewDayId: null, crewLeadId: null, routeOrder: null, status: 'due' })
			.where(and(eq(serviceVisits.crewDayId, id), inArray(serviceVisits.status, ['due', 'dated'])));
		await tx.delete(careCrewDays).where(eq(careCrewDays.id, id));
	});
}

export async function crewDaysBetween(start: string, end: string, tx: Tx | typeof db = db) {
	return tx
		.select({ d: careCrewDays, leadName: users.name })
		.from(careCrewDays)
		.innerJoin(users, eq(users.id, careCrewDays.crewLeadId))
		.where(and(gte(careCrewDays.day, start), lte(careCrewDays.day, end)))
		.orderBy(asc(careCrewDays.day), asc(users.name));
}
