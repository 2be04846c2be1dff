// Site visits against the real database: the exclusion constraint, twenty bookings racing for
// one slot, refusals with their reasons, the invitations (.ics read back with ical.js), the
// reminders, the API's 400s, and an SMTP outage that delays mail without losing the booking.
import ICAL from 'ical.js';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { activities, leads, outbox, siteVisits, timeOff } from '$lib/server/db/schema';
import { deliverOutboxMessage } from '$lib/server/outbox';
import { stopQueue } from '$lib/server/queue';
import { zonedInstant } from '$lib/scheduling/zone';
import {
	VisitError,
	bookVisit,
	cancelVisit,
	rescheduleVisit,
	sendVisitReminder,
	visitByToken
} from '$lib/server/visits';
import { GET as slotsGET } from '../../src/routes/api/visits/slots/+server';
import { resetDatabase } from '../support/database';
import { smtpRelay } from '../support/smtp-relay';
import { clearMail, waitForMail } from '../support/mailbox';
import { makeUser, makeVisitLead, seedFirm, setHours } from './fixtures';

// Mail goes through a switchable relay in front of the SMTP stand-in, so a test can take it down.
const relay = smtpRelay();
beforeAll(() => relay.start());

afterAll(async () => {
	relay.stop();
	await stopQueue();
});

const TZ = 'America/Denver';
const at = (date: string, hh: number, mm = 0) => zonedInstant(date, hh * 60 + mm, TZ);
let sales: Awaited<ReturnType<typeof makeUser>>;

beforeEach(async () => {
	await resetDatabase();
	await clearMail();
	relay.down = false;
	await seedFirm();
	sales = await makeUser('sales', 'teo@test.example', 'Teo Test');
	await setHours(sales.id);
});

async function mailsOf(visitId: string) {
	const rows = await db.select().from(outbox);
	return rows.filter((r) => r.dedupeKey.startsWith(`visit:${visitId}:`));
}

function parseIcs(text: string) {
	const cal = new ICAL.Component(ICAL.parse(text));
	for (const tz of cal.getAllSubcomponents('vtimezone')) {
		ICAL.TimezoneService.register(new ICAL.Timezone(tz));
	}
	const vevent = cal.getFirstSubcomponent('vevent')!;
	const event = new ICAL.Event(vevent);
	return { cal, event, vevent };
}

describe('the exclusion constraint', () => {
	it('refuses an overlapping booked visit of one person, buffers included, but not a cancelled one', async () => {
		const a = await makeVisitLead();
		const b = await makeVisitLead();
		const row = (
			leadId: string,
			from: string,
			until: string,
			status: 'booked' | 'cancelled' = 'booked'
		) => ({
			id: `${leadId}-${from}`,
			leadId,
			salespersonId: sales.id,
			status,
			startsAt: new Date(from),
			endsAt: new Date(Date.parse(from) + 3_600_000),
			bufferMinutes: 30,
			blocked: `[${from},${until})`,
			timeZone: TZ,
			tokenHash: `${leadId}-${from}`,
			tokenExpiresAt: new Date(until)
		});
		await db.insert(siteVisits).values(row(a.id, '2027-03-15T16:00:00Z', '2027-03-15T17:30:00Z'));
		// Starts in the first one's travel buffer.
		const error = await db
			.insert(siteVisits)
			.values(row(b.id, '2027-03-15T17:15:00Z', '2027-03-15T18:45:00Z'))
			.catch((e: { cause?: { code?: string } }) => e);
		expect((error as { cause?: { code?: string } }).cause?.code).toBe('23P01');
		// Right after the buffer is fine; so is a cancelled visit on top of it.
		await db.insert(siteVisits).values(row(b.id, '2027-03-15T17:30:00Z', '2027-03-15T19:00:00Z'));
		const c = await makeVisitLead();
		await db
			.insert(siteVisits)
			.values(row(c.id, '2027-03-15T16:00:00Z', '2027-03-15T17:30:00Z', 'cancelled'));
		expect(await db.select().from(siteVisits)).toHaveLength(3);
	});
});

describe('booking', () => {
	it('lets exactly one of 20 concurrent bookings of one slot through; the rest hear it was just taken', async () => {
		const leadsList = await Promise.all(Array.from({ length: 20 }, () => makeVisitLead()));
		const start = at('2027-03-15', 10);
		const results = await Promise.allSettled(
			leadsList.map((l) =>
				bookVisit({
					leadId: l.id,
					salespersonId: sales.id,
					startsAt: start,
					noteForHomeowner: '',
					actorId: sales.id
				})
			)
		);
		const ok = results.filter((r) => r.status === 'fulfilled');
		const refused = results.filter((r) => r.status === 'rejected') as PromiseRejectedResult[];
		expect(ok).toHaveLength(1);
		expect(refused).toHaveLength(19);
		for (const r of refused) {
			expect(r.reason).toBeInstanceOf(VisitError);
			expect((r.reason as VisitError).code).toBe('taken');
			expect((r.reason as Error).message).toBe('That time was just taken.');
		}
		const booked = await db.select().from(siteVisits).where(eq(siteVisits.status, 'booked'));
		expect(booked).toHaveLength(1);
	});

	it('moves the lead to visit booked, writes the timeline and both invitations with .ics', async () => {
		const lead = await makeVisitLead();
		const visit = await bookVisit({
			leadId: lead.id,
			salespersonId: sales.id,
			startsAt: at('2027-03-15', 9),
			noteForHomeowner: 'I will bring a measuring wheel.',
			actorId: sales.id
		});
		const [after] = await db.select().from(leads).where(eq(leads.id, lead.id));
		expect(after.stage).toBe('visit_booked');
		expect(after.version).toBe(lead.version + 1);
		const timeline = await db.select().from(activities).where(eq(activities.leadId, lead.id));
		expect(timeline.map((a) => a.kind)).toEqual(['visit']);
		expect(timeline[0].data).toMatchObject({ visitId: visit.id, action: 'booked' });
		expect(visit.endsAt.getTime() - visit.startsAt.getTime()).toBe(3_600_000);
		expect(visit.tokenHash).toMatch(/^[0-9a-f]{64}$/);
		const mails = await mailsOf(visit.id);
		expect(mails.map((m) => m.to).sort()).toEqual([lead.email, 'teo@test.example'].sort());
		for (const m of mails) expect(m.attachments[0].contentType).toContain('text/calendar');
		const home = mails.find((m) => m.to === lead.email)!;
		expect(home.text).toContain('811');
		const token = /\/visit\/([A-Za-z0-9_-]+)/.exec(home.text)![1];
		expect((await visitByToken(token))?.visit.id).toBe(visit.id);
		expect(await visitByToken(token, new Date(visit.endsAt.getTime() + 2 * 86_400_000))).toBeNull();
	});

	it('refuses times outside the hours, in the past, too soon and in time off, with the reason', async () => {
		const lead = await makeVisitLead();
		const book = (startsAt: Date, now?: Date) =>
			bookVisit({
				leadId: lead.id,
				salespersonId: sales.id,
				startsAt,
				noteForHomeowner: '',
				actorId: sales.id,
				now
			}).then(
				() => 'booked',
				(e: VisitError) => `${e.code}: ${e.message}`
			);
		expect(await book(at('2027-03-15', 17))).toBe(
			'outside_hours: That time is outside the working hours.'
		);
		expect(await book(at('2027-03-15', 6, 30))).toMatch(/^outside_hours/);
		expect(await book(new Date(Date.now() - 3_600_000))).toBe(
			'past: That time has already passed.'
		);
		expect(await book(at('2027-03-15', 9), new Date(at('2027-03-15', 8).getTime()))).toMatch(
			/^too_soon/
		);
		await db.insert(timeOff).values({
			id: 'off1',
			userId: sales.id,
			startsAt: at('2027-03-16', 0),
			endsAt: at('2027-03-17', 0),
			reason: 'Day off'
		});
		expect(await book(at('2027-03-16', 10))).toBe('time_off: That time falls in time off.');
		expect(await db.select().from(siteVisits)).toHaveLength(0);
	});
});

describe('invitations read back with ical.js', () => {
	it('keeps the UID, bumps SEQUENCE on reschedule and sends METHOD:CANCEL on cancel, in America/Denver', async () => {
		const lead = await makeVisitLead();
		const first = await bookVisit({
			leadId: lead.id,
			salespersonId: sales.id,
			startsAt: at('2027-03-12', 15),
			noteForHomeowner: '',
			actorId: sales.id
		});
		const moved = await rescheduleVisit(first.id, {
			salespersonId: sales.id,
			startsAt: at('2027-03-15', 11, 30),
			actorId: sales.id
		});
		const gone = await cancelVisit(first.id, {
			reason: 'Homeowner away',
			actorId: sales.id,
			by: 'staff'
		});
		expect([first.sequence, moved.sequence, gone.sequence]).toEqual([0, 1, 2]);

		const rows = await mailsOf(first.id);
		const ics = (kind: string) =>
			rows.find((r) => r.dedupeKey.endsWith(`${kind}:homeowner`))!.attachments[0].content;

		const booked = parseIcs(ics('0:booked'));
		expect(booked.cal.getFirstPropertyValue('method')).toBe('REQUEST');
		expect(booked.event.uid).toBe(`site-visit-${first.id}@rillstone`);
		expect(booked.event.sequence).toBe(0);
		expect(booked.vevent.getFirstProperty('dtstart')!.getParameter('tzid')).toBe(TZ);
		expect(booked.event.startDate.zone.tzid).toBe(TZ);
		// Friday 2027-03-12 15:00 MST is 22:00 UTC; after the change Monday 11:30 MDT is 17:30 UTC.
		expect(booked.event.startDate.toJSDate().toISOString()).toBe('2027-03-12T22:00:00.000Z');
		expect(booked.event.endDate.toJSDate().toISOString()).toBe('2027-03-12T23:00:00.000Z');
		expect(booked.event.location).toContain('Spillway Road');

		const rescheduled = parseIcs(ics('1:rescheduled'));
		expect(rescheduled.event.uid).toBe(booked.event.uid);
		expect(rescheduled.event.sequence).toBe(1);
		expect(rescheduled.event.startDate.toString()).toBe('2027-03-15T11:30:00');
		expect(rescheduled.event.startDate.toJSDate().toISOString()).toBe('2027-03-15T17:30:00.000Z');

		const cancelled = parseIcs(ics('2:cancelled'));
		expect(cancelled.cal.getFirstPropertyValue('method')).toBe('CANCEL');
		expect(cancelled.event.uid).toBe(booked.event.uid);
		expect(cancelled.event.sequence).toBe(2);
		expect(cancelled.vevent.getFirstPropertyValue('status')).toBe('CANCELLED');
		const [after] = await db.select().from(leads).where(eq(leads.id, lead.id));
		expect(after.stage).toBe('contacted');
	});
});

describe('reminders', () => {
	it('sends once per sequence and nothing for a rescheduled or cancelled visit', async () => {
		const lead = await makeVisitLead();
		const visit = await bookVisit({
			leadId: lead.id,
			salespersonId: sales.id,
			startsAt: at('2027-03-15', 9),
			noteForHomeowner: '',
			actorId: sales.id
		});
		const dayBefore = new Date(visit.startsAt.getTime() - 86_400_000);
		expect(await sendVisitReminder({ visitId: visit.id, sequence: 0 }, dayBefore)).toBe('sent');
		expect(await sendVisitReminder({ visitId: visit.id, sequence: 0 }, dayBefore)).toBe('sent');
		const reminders = (await mailsOf(visit.id)).filter((m) => m.dedupeKey.includes(':reminder:'));
		expect(reminders).toHaveLength(2); // one to the homeowner, one to the salesperson
		for (const r of reminders) expect(await deliverOutboxMessage(r.id)).toBe('sent');
		for (const r of reminders) expect(await deliverOutboxMessage(r.id)).toBe('already-sent');

		await rescheduleVisit(visit.id, {
			salespersonId: sales.id,
			startsAt: at('2027-03-16', 9),
			actorId: sales.id
		});
		expect(await sendVisitReminder({ visitId: visit.id, sequence: 0 }, dayBefore)).toBe('stale');
		await cancelVisit(visit.id, { reason: '', actorId: sales.id, by: 'staff' });
		expect(await sendVisitReminder({ visitId: visit.id, sequence: 1 }, dayBefore)).toBe('stale');
		const after = (await mailsOf(visit.id)).filter((m) => m.dedupeKey.includes(':reminder:'));
		expect(after).toHaveLength(2);
	});
});

describe('an SMTP outage', () => {
	it('keeps the booking and sends the invitations when mail is back', async () => {
		relay.down = true;
		const lead = await makeVisitLead();
		const visit = await bookVisit({
			leadId: lead.id,
			salespersonId: sales.id,
			startsAt: at('2027-03-15', 13),
			noteForHomeowner: '',
			actorId: sales.id
		});
		const mails = await mailsOf(visit.id);
		expect(mails).toHaveLength(2);
		for (const m of mails) await expect(deliverOutboxMessage(m.id)).rejects.toThrow();
		const [stored] = await db.select().from(siteVisits).where(eq(siteVisits.id, visit.id));
		expect(stored.status).toBe('booked');
		const unsent = await mailsOf(visit.id);
		expect(unsent.every((m) => m.sentAt === null && m.attempts === 1 && m.lastError)).toBe(true);

		relay.down = false;
		for (const m of mails) expect(await deliverOutboxMessage(m.id)).toBe('sent');
		const caught = await waitForMail(lead.email!, /Site visit booked/);
		expect(caught.attachments?.map((a) => a.contentType)).toEqual([
			expect.stringContaining('text/calendar')
		]);
	});
});

describe('GET /api/visits/slots', () => {
	const call = async (query: string, role: 'sales' | 'crew' = 'sales') => {
		const url = new URL(`http://x/api/visits/slots?${query}`);
		const user = { id: sales.id, email: sales.email, name: sales.name, role };
		try {
			const res = await slotsGET({ url, locals: { user } } as never);
			return { status: res.status, body: await res.json() };
		} catch (e) {
			return { status: (e as { status: number }).status, body: null };
		}
	};

	it('answers 400 to bad dates and time zones, 403 to crew, and slots in the zone asked for', async () => {
		expect((await call(`salespersonId=${sales.id}&from=2027-02-30&to=2027-03-02`)).status).toBe(
			400
		);
		expect((await call(`salespersonId=${sales.id}&from=yesterday&to=2027-03-02`)).status).toBe(400);
		expect((await call(`salespersonId=${sales.id}&from=2027-03-02&to=2027-03-01`)).status).toBe(
			400
		);
		const badZone = await call(
			`salespersonId=${sales.id}&from=2027-03-01&to=2027-03-02&timeZone=Mars/Base`
		);
		expect(badZone.status).toBe(400);
		expect(badZone.body.errors.timeZone).toMatch(/time zone/);
		expect((await call(`salespersonId=nobody&from=2027-03-01&to=2027-03-01`)).status).toBe(404);
		expect(
			(await call(`salespersonId=${sales.id}&from=2027-03-01&to=2027-03-01`, 'crew')).status
		).toBe(403);
		const ok = await call(
			`salespersonId=${sales.id}&from=2027-03-15&to=2027-03-15&timeZone=America/New_York`
		);
		expect(ok.status).toBe(200);
		expect(ok.body.timeZone).toBe(TZ);
		expect(ok.body.slots[0]).toMatchObject({
			start: '2027-03-15T14:00:00.000Z',
			date: '2027-03-15',
			label: '10:00 AM EDT'
		});
		expect(ok.body.slots).toHaveLength(17);
	});
});
