// Each salesperson's weekly hours, booking rules and time off.
import { and, asc, eq, gt, inArray, isNull } from 'drizzle-orm';
import type { Rules } from '$lib/scheduling/slots';
import { zonedInstant } from '$lib/scheduling/zone';
import type { AvailabilityInput } from '$lib/schema/visits';
import { db, type Tx } from '../platform/db';
import { availability, timeOff, users } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { firmSettings } from '../platform/settings';

export const DEFAULT_RULES: Rules = {
	weeklyHours: Object.fromEntries(
		['1', '2', '3', '4', '5'].map((d) => [d, [{ start: '08:00', end: '17:00' }]])
	),
	visitMinutes: 60,
	bufferMinutes: 30,
	noticeMinutes: 120,
	daysAhead: 21
};
// ---------------------------------------------------------------------------------------------
// Availability and time off

export async function salespeople() {
	return db
		.select({ id: users.id, name: users.name, role: users.role })
		.from(users)
		.where(and(inArray(users.role, ['owner', 'sales']), isNull(users.disabledAt)))
		.orderBy(asc(users.name));
}

export async function rulesFor(userId: string, tx: Tx | typeof db = db): Promise<Rules> {
	const [row] = await tx.select().from(availability).where(eq(availability.userId, userId));
	if (!row) return DEFAULT_RULES;
	return {
		weeklyHours: row.weeklyHours,
		visitMinutes: row.visitMinutes,
		bufferMinutes: row.bufferMinutes,
		noticeMinutes: row.noticeMinutes,
		daysAhead: row.daysAhead
	};
}

export async function saveAvailability(
	userId: string,
	input: AvailabilityInput,
	actorId: string
): Promise<void> {
	const values = { ...input, updatedBy: actorId };
	await db
		.insert(availability)
		.values({ userId, ...values })
		.onConflictDoUpdate({ target: availability.userId, set: values });
}

export async function listTimeOff(userId: string, from = new Date()) {
	return db
		.select()
		.from(timeOff)
		.where(and(eq(timeOff.userId, userId), gt(timeOff.endsAt, from)))
		.orderBy(asc(timeOff.startsAt));
}

export async function addTimeOff(
	userId: string,
	input: { startDate: string; startTime: string; endDate: string; endTime: string; reason: string }
): Promise<void> {
	const { timeZone } = await firmSettings();
	const toMinutes = (t: string) => Number(t.slice(0, 2)) * 60 + Number(t.slice(3));
	await db.insert(timeOff).values({
		id: newId(),
		userId,
		startsAt: zonedInstant(input.startDate, toMinutes(input.startTime), timeZone),
		endsAt: zonedInstant(input.endDate, toMinutes(input.endTime), timeZone),
		reason: input.reason
	});
}

export async function removeTimeOff(userId: string, id: string): Promise<void> {
	await db.delete(timeOff).where(and(eq(timeOff.id, id), eq(timeOff.userId, userId)));
}
