// Demo site visits: weekly hours for salesperson Teo Baptiste and owner Mara Quill, a
// day of time off for Teo, and a booked visit for each of the two demo leads that the intake seed
// leaves at "visit booked" (Marisol Quenby, Declan Ashgrove). The start times are taken from the
// slot module itself (the same rules the booking screen offers), a few days from now in the firm's
// time zone, one after the other with the travel buffer between them, so the rows satisfy the
// exclusion constraint site_visits_no_overlap. No invitations are sent for demo rows. Safe to run
// twice: nothing is written for a lead that already has a visit.
import { and, eq, inArray } from 'drizzle-orm';
import { blockedSpan, freeSlots, type Busy, type Rules } from '../../src/lib/scheduling/slots';
import { addDays, wallTime, zonedInstant } from '../../src/lib/scheduling/zone';
import {
	activities,
	availability,
	contacts,
	leads,
	settings,
	siteVisits,
	timeOff,
	users
} from '../../src/lib/server/platform/db/schema';
import { newId, newToken, sha256 } from '../../src/lib/server/platform/crypto';
import type { Db } from './shared';

const WEEKDAY_HOURS = { start: '08:00', end: '17:00' };

const TEO_RULES: Rules = {
	// Monday to Friday, with a lunch break; Saturday mornings in the busy season.
	weeklyHours: {
		'1': [
			{ start: '08:00', end: '12:00' },
			{ start: '13:00', end: '17:00' }
		],
		'2': [WEEKDAY_HOURS],
		'3': [WEEKDAY_HOURS],
		'4': [WEEKDAY_HOURS],
		'5': [{ start: '08:00', end: '15:00' }],
		'6': [{ start: '09:00', end: '12:00' }]
	},
	visitMinutes: 60,
	bufferMinutes: 30,
	noticeMinutes: 120,
	daysAhead: 21
};

const MARA_RULES: Rules = {
	weeklyHours: { '2': [{ start: '13:00', end: '17:00' }], '4': [{ start: '13:00', end: '17:00' }] },
	visitMinutes: 90,
	bufferMinutes: 45,
	noticeMinutes: 24 * 60,
	daysAhead: 30
};

const VISITS = [
	{
		email: 'marisol.quenby@example.test',
		note: 'I will bring a tape and flags to mark where the pond could go. Please keep the dog in.'
	},
	{
		email: 'declan.ashgrove@example.test',
		note: 'We will look at the front walk and how a small loader reaches it.'
	}
];

export async function seedVisits(db: Db, now = new Date()): Promise<void> {
	const [firm] = await db.select().from(settings).where(eq(settings.id, 1));
	const staff = await db.select().from(users);
	const teo = staff.find((u) => u.email === 'teo@copperleaf.example');
	const mara = staff.find((u) => u.email === 'mara@copperleaf.example');
	if (!firm || !teo || !mara) return;
	const timeZone = firm.timeZone;

	for (const [person, rules] of [
		[teo, TEO_RULES],
		[mara, MARA_RULES]
	] as const) {
		await db
			.insert(availability)
			.values({ userId: person.id, ...rules, updatedBy: mara.id })
			.onConflictDoNothing();
	}

	const today = wallTime(now, timeZone).date;
	// Teo is away the day after tomorrow (a stone-yard trip): the slots skip it.
	const awayDay = addDays(today, 2);
	const [hasTimeOff] = await db.select().from(timeOff).where(eq(timeOff.userId, teo.id)).limit(1);
	if (!hasTimeOff) {
		await db.insert(timeOff).values({
			id: newId(),
			userId: teo.id,
			startsAt: zonedInstant(awayDay, 0, timeZone),
			endsAt: zonedInstant(addDays(awayDay, 1), 0, timeZone),
			reason: 'Stone yard: picking boulders for the Pembleton pond'
		});
	}

	const targets = await db
		.select({ leadId: leads.id, email: contacts.email, number: leads.number })
		.from(leads)
		.innerJoin(contacts, eq(contacts.id, leads.contactId))
		.where(
			inArray(
				contacts.email,
				VISITS.map((v) => v.email)
			)
		);
	const off: Busy[] = (await db.select().from(timeOff).where(eq(timeOff.userId, teo.id))).map(
		(t) => ({ start: t.startsAt, end: t.endsAt })
	);
	const booked: Busy[] = (
		await db
			.select()
			.from(siteVisits)
			.where(and(eq(siteVisits.salespersonId, teo.id), eq(siteVisits.status, 'booked')))
	).map((v) => ({
		start: v.startsAt,
		end: new Date(v.endsAt.getTime() + v.bufferMinutes * 60_000)
	}));

	for (const demo of VISITS) {
		const target = targets.find((t) => t.email === demo.email);
		if (!target) continue;
		const [existing] = await db
			.select({ id: siteVisits.id })
			.from(siteVisits)
			.where(eq(siteVisits.leadId, target.leadId))
			.limit(1);
		if (existing) continue;
		// The first free mid-morning-or-later start from tomorrow on (never the day off).
		const slot = freeSlots({
			...TEO_RULES,
			timeZone,
			from: addDays(today, 1),
			to: addDays(today, 10),
			now,
			booked,
			timeOff: off
		}).find((s) => s.minutes >= 10 * 60);
		if (!slot) continue;
		const span = blockedSpan(slot.start, TEO_RULES.visitMinutes, TEO_RULES.bufferMinutes);
		booked.push(span);
		const visitId = newId();
		await db.insert(siteVisits).values({
			id: visitId,
			leadId: target.leadId,
			salespersonId: teo.id,
			startsAt: slot.start,
			endsAt: slot.end,
			bufferMinutes: TEO_RULES.bufferMinutes,
			blocked: `[${span.start.toISOString()},${span.end.toISOString()})`,
			timeZone,
			noteForHomeowner: demo.note,
			// A demo visit's homeowner link is never mailed: the token is thrown away.
			tokenHash: sha256(newToken()),
			tokenExpiresAt: new Date(slot.end.getTime() + 86_400_000),
			bookedBy: teo.id
		});
		const label = new Intl.DateTimeFormat('en-US', {
			timeZone,
			weekday: 'short',
			month: 'short',
			day: 'numeric',
			hour: 'numeric',
			minute: '2-digit',
			timeZoneName: 'short'
		}).format(slot.start);
		await db.insert(activities).values({
			leadId: target.leadId,
			kind: 'visit',
			actorId: teo.id,
			body: `Site visit booked with ${teo.name}: ${label}`,
			data: { visitId, action: 'booked', startsAt: slot.start.toISOString() }
		});
	}
}
