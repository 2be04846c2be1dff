// Site visits against the real database: the exclusion constraint, twenty bookings racing for
// one slot, refusals with their reasons, the invitations (.ics read back with ical.js), the
// reminders, the API's 400s, and an SMTP outage that delays mail without losing the booking.
import ICAL from 'ical.js';
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { db } from '$lib/server/platform/db';
import { activities, leads, outbox, siteVisits, timeOff } from '$lib/server/platform/db/schema';
import { deliverOutboxMessage } from '$lib/server/platform/outbox';
import { stopQueue } from '$lib/server/platform/queue';
import { zonedInstant } from '$lib/scheduling/zone';
import { VisitError } from '$lib/server/visits/errors';
import { bookVisit, cancelVisit, rescheduleVisit } from '$lib/server/visits/booking';
import { sendVisitReminder } from '$lib/server/visits/reminders';
import { saveNotes } from '$lib/server/visits/notes';
import { visitByToken } from '$lib/server/visits/homeowner';
import { actions as visitPageActions } from '../../src/routes/office/visits/[id]/+page.server';
import { actions as leadVisitActions } from '../../src/routes/office/leads/[id]/visit/+page.server';
import {
	actions as homeownerActions,
	load as homeownerLoad
} from '../../src/routes/(homeowner)/visit/[token]/+page.server';
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

/** A new lead with a visit booked by the test's salesperson, at a day and hour in the firm's zone. */
async function bookedBySales(day: string, hour: number) {
	const lead = await makeVisitLead();
	const visit = await bookVisit({
		leadId: lead.id,
		salespersonId: sales.id,
		startsAt: at(day, hour),
		noteForHomeowner: '',
		actorId: sales.id
	});
	return { lead, visit };
}

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
		const { visit } = await bookedBySales('2027-03-15', 9);
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

/** The reminder jobs queued in pg-boss for a visit: [sequence, when it may run]. */
async function reminderJobs(visitId: string) {
	const rows = await db.execute<{ data: { sequence: number }; start_after: Date }>(
		sql`select data, start_after from pgboss.job
			where name = 'visit.reminder' and data->>'visitId' = ${visitId} order by start_after`
	);
	return rows.map((r) => [r.data.sequence, new Date(r.start_after).toISOString()]);
}

describe('reminders for a visit booked at short notice', () => {
	const book = (leadId: string, startsAt: Date, now: Date) =>
		bookVisit({
			leadId,
			salespersonId: sales.id,
			startsAt,
			noteForHomeowner: '',
			actorId: sales.id,
			now
		});

	it('queues a day-before reminder, a three-hours-before one inside a day, none a few hours ahead', async () => {
		const now = at('2027-03-15', 8);
		const far = await book((await makeVisitLead()).id, at('2027-03-18', 10), now);
		const today = await book((await makeVisitLead()).id, at('2027-03-15', 15), now);
		const soon = await book((await makeVisitLead()).id, at('2027-03-15', 11), now);
		expect(await reminderJobs(far.id)).toEqual([[0, at('2027-03-17', 10).toISOString()]]);
		expect(await reminderJobs(today.id)).toEqual([[0, at('2027-03-15', 12).toISOString()]]);
		expect(await reminderJobs(soon.id)).toEqual([]);
		// The invitation stands in for it: the homeowner of the 11:00 visit got it, with the link.
		const soonMail = (await mailsOf(soon.id)).filter((m) => m.dedupeKey.includes(':booked:'));
		expect(soonMail).toHaveLength(2);
	});

	it('sends the same-day reminder once, says today, and nothing stale after a move', async () => {
		const lead = await makeVisitLead();
		const now = at('2027-03-15', 8);
		const visit = await book(lead.id, at('2027-03-15', 15), now);
		const noon = at('2027-03-15', 12);
		expect(await sendVisitReminder({ visitId: visit.id, sequence: 0 }, noon)).toBe('sent');
		expect(await sendVisitReminder({ visitId: visit.id, sequence: 0 }, noon)).toBe('sent');
		const reminders = (await mailsOf(visit.id)).filter((m) => m.dedupeKey.includes(':reminder:'));
		expect(reminders).toHaveLength(2);
		const home = reminders.find((m) => m.to === lead.email)!;
		expect(home.subject).toMatch(/^Reminder: site visit today, Monday, March 15, 2027, 3:00/);
		expect(home.text).toContain('811');

		// Moved at 12:30 to 16:00 the same day: too close for another reminder, and the old job is stale.
		const moved = await rescheduleVisit(visit.id, {
			salespersonId: sales.id,
			startsAt: at('2027-03-15', 16),
			actorId: sales.id,
			now: at('2027-03-15', 12, 30)
		});
		expect(await reminderJobs(visit.id)).toEqual([[0, noon.toISOString()]]);
		expect(await sendVisitReminder({ visitId: visit.id, sequence: 0 }, noon)).toBe('stale');
		// Moved again to the next morning: a reminder for the new sequence, three hours before.
		const again = await rescheduleVisit(visit.id, {
			salespersonId: sales.id,
			startsAt: at('2027-03-16', 10),
			actorId: sales.id,
			now: at('2027-03-15', 13)
		});
		expect(again.sequence).toBe(moved.sequence + 1);
		expect((await reminderJobs(visit.id)).at(-1)).toEqual([2, at('2027-03-16', 7).toISOString()]);
		await cancelVisit(visit.id, { reason: '', actorId: sales.id, by: 'staff' });
		expect(await sendVisitReminder({ visitId: visit.id, sequence: 2 }, at('2027-03-16', 7))).toBe(
			'stale'
		);
		const after = (await mailsOf(visit.id)).filter((m) => m.dedupeKey.includes(':reminder:'));
		expect(after).toHaveLength(2);
	});
});

describe("the homeowner's link", () => {
	const tokenIn = (text: string) => /\/visit\/([A-Za-z0-9_-]+)/.exec(text)![1];
	const homeownerMail = async (visitId: string, kind: string) =>
		(await mailsOf(visitId)).find((m) => m.dedupeKey.endsWith(`${kind}:homeowner`))!;

	it('keeps the first link working after a move, at the new time, until after the new visit', async () => {
		const { visit } = await bookedBySales('2027-03-15', 9);
		const first = tokenIn((await homeownerMail(visit.id, '0:booked')).text);
		const moved = await rescheduleVisit(visit.id, {
			salespersonId: sales.id,
			startsAt: at('2027-03-22', 14),
			actorId: sales.id
		});
		const second = tokenIn((await homeownerMail(visit.id, '1:rescheduled')).text);
		expect(second).not.toBe(first);
		for (const token of [first, second]) {
			const party = await visitByToken(token);
			expect(party?.visit.startsAt.toISOString()).toBe(at('2027-03-22', 14).toISOString());
		}
		// The old expiry (a day after the first time) no longer ends it; a day after the new one does.
		const dayAfterFirst = new Date(visit.endsAt.getTime() + 86_400_000 + 60_000);
		expect((await visitByToken(first, dayAfterFirst))?.visit.id).toBe(visit.id);
		expect(await visitByToken(first, new Date(moved.endsAt.getTime() + 2 * 86_400_000))).toBeNull();
		const page = (await homeownerLoad({ params: { token: first } } as never)) as {
			when: string;
			status: string;
		};
		expect(page.status).toBe('booked');
		expect(page.when).toContain('Monday, March 22, 2027');
		expect(await homeownerActions.confirm({ params: { token: first } } as never)).toEqual({
			done: 'Thank you: the visit is confirmed.'
		});
		const [stored] = await db.select().from(siteVisits).where(eq(siteVisits.id, visit.id));
		expect(stored.confirmedAt).not.toBeNull();
	});

	it('refuses a cancel reason over 500 characters beside the field, keeps it and the visit', async () => {
		const { visit } = await bookedBySales('2027-03-15', 9);
		const token = tokenIn((await homeownerMail(visit.id, '0:booked')).text);
		const cancel = (reason: string) => {
			const body = new FormData();
			body.set('reason', reason);
			const url = `http://127.0.0.1/visit/${token}?/cancel`;
			return homeownerActions.cancel({
				params: { token },
				request: new Request(url, { method: 'POST', body })
			} as never);
		};
		const tooLong = 'We are moving away. '.repeat(26);
		const refused = (await cancel(tooLong)) as {
			status: number;
			data: { values: { reason: string }; errors: { reason: string } };
		};
		expect(refused.status).toBe(400);
		expect(refused.data.errors.reason).toBe('Keep the reason under 500 characters');
		expect(refused.data.values.reason).toBe(tooLong);
		const still = async () =>
			(await db.select().from(siteVisits).where(eq(siteVisits.id, visit.id)))[0];
		expect((await still()).status).toBe('booked');
		expect(await cancel('  We are moving away.  ')).toEqual({
			done: 'The visit is cancelled. Call us any time to book again.'
		});
		expect(await still()).toMatchObject({
			status: 'cancelled',
			cancelReason: 'We are moving away.'
		});
	});

	it('shows a cancelled visit as cancelled through every link, and refuses to confirm it', async () => {
		const { visit } = await bookedBySales('2027-03-15', 9);
		const first = tokenIn((await homeownerMail(visit.id, '0:booked')).text);
		await rescheduleVisit(visit.id, {
			salespersonId: sales.id,
			startsAt: at('2027-03-16', 9),
			actorId: sales.id
		});
		const cancelledAt = at('2027-03-10', 12);
		await cancelVisit(visit.id, {
			reason: 'Plans changed',
			actorId: sales.id,
			by: 'staff',
			now: cancelledAt
		});
		const page = (await homeownerLoad({ params: { token: first } } as never)) as {
			status: string;
			cancelledBy: string;
		};
		expect(page).toMatchObject({ status: 'cancelled', cancelledBy: 'staff' });
		const refused = (await homeownerActions.confirm({ params: { token: first } } as never)) as {
			status: number;
		};
		expect(refused.status).toBe(410);
		// A week after the cancel it still says "cancelled" (past the day after the visit), then expires.
		expect((await visitByToken(first, at('2027-03-17', 11)))?.visit.status).toBe('cancelled');
		expect(await visitByToken(first, at('2027-03-17', 13))).toBeNull();
	});
});

describe('an SMTP outage', () => {
	it('keeps the booking and sends the invitations when mail is back', async () => {
		relay.down = true;
		const { lead, visit } = await bookedBySales('2027-03-15', 13);
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

describe("a visit's notes", () => {
	const postNotes = async (visitId: string, user: { id: string; role: string }, notes: string) => {
		const body = new FormData();
		body.set('notes', notes);
		const url = `http://127.0.0.1/office/visits/${visitId}?/notes`;
		try {
			return await visitPageActions.notes({
				params: { id: visitId },
				locals: { user: { email: 'x@test.example', name: 'X', ...user } },
				url: new URL(url),
				request: new Request(url, { method: 'POST', body })
			} as never);
		} catch (e) {
			return { status: (e as { status: number }).status };
		}
	};

	it("refuses another salesperson's closed visit and keeps its notes; its own salesperson and the owner may save; too long a note comes back with its message and the text", async () => {
		const other = await makeUser('sales', 'una@test.example', 'Una Test');
		const owner = await makeUser('owner', 'olive@test.example', 'Olive Test');
		const { visit } = await bookedBySales('2027-03-15', 9);
		await saveNotes(
			visit.id,
			{ notes: 'Big cottonwood roots by the fence', powerLocation: '' },
			sales.id
		);
		await cancelVisit(visit.id, { reason: '', actorId: sales.id, by: 'staff' });

		expect(await postNotes(visit.id, other, 'Overwritten')).toEqual({ status: 403 });
		const notesNow = async () =>
			(await db.select().from(siteVisits).where(eq(siteVisits.id, visit.id)))[0].notes;
		await expect(notesNow()).resolves.toMatchObject({
			notes: 'Big cottonwood roots by the fence'
		});

		expect(await postNotes(visit.id, sales, 'Roots by the fence, north side')).toEqual({
			saved: true
		});
		expect(
			await postNotes(visit.id, owner, 'Roots by the fence, north side; owner checked')
		).toEqual({ saved: true });
		await expect(notesNow()).resolves.toMatchObject({
			notes: 'Roots by the fence, north side; owner checked'
		});
		expect(await postNotes('no-such-visit', owner, 'x')).toEqual({ status: 404 });
		const tooLong = (await postNotes(visit.id, sales, 'y'.repeat(2001))) as {
			status: number;
			data: { values: Record<string, string>; errors: Record<string, string> };
		};
		expect(tooLong.status).toBe(400);
		expect(tooLong.data.errors.notes).toBe('Keep this under 2000 characters');
		expect(tooLong.data.values.notes).toHaveLength(2001);
	});
});

describe("a lead's visit page", () => {
	const post = async (
		action: 'reschedule' | 'cancel',
		leadId: string,
		fields: Record<string, string>
	) => {
		const body = new FormData();
		for (const [k, v] of Object.entries(fields)) body.set(k, v);
		const url = `http://127.0.0.1/office/leads/${leadId}/visit?/${action}`;
		return (await leadVisitActions[action]({
			params: { id: leadId },
			locals: { user: { ...sales } },
			url: new URL(url),
			request: new Request(url, { method: 'POST', body })
		} as never)) as { status: number; data: { message?: string; errors?: Record<string, string> } };
	};

	it("refuses to move or cancel a visit of another lead through this lead's page", async () => {
		const lead = await makeVisitLead();
		const other = await makeVisitLead();
		const visit = await bookVisit({
			leadId: lead.id,
			salespersonId: sales.id,
			startsAt: at('2027-03-15', 9),
			noteForHomeowner: '',
			actorId: sales.id
		});
		const moveTo = at('2027-03-16', 10).toISOString();
		const moved = await post('reschedule', other.id, {
			visitId: visit.id,
			salespersonId: sales.id,
			startsAt: moveTo
		});
		expect(moved.status).toBe(404);
		expect(moved.data.message).toBe('That visit is not one of this lead’s visits.');
		const cancelled = await post('cancel', other.id, { visitId: visit.id, reason: 'x' });
		expect(cancelled.status).toBe(404);
		const missing = await post('cancel', lead.id, { reason: 'x' });
		expect(missing.status).toBe(400);
		expect(missing.data.errors?.visitId).toBe('Pick the visit to change');
		const [stored] = await db.select().from(siteVisits).where(eq(siteVisits.id, visit.id));
		expect(stored.status).toBe('booked');
		expect(stored.startsAt.toISOString()).toBe(at('2027-03-15', 9).toISOString());

		// Through its own lead's page it moves.
		expect(
			await post('reschedule', lead.id, {
				visitId: visit.id,
				salespersonId: sales.id,
				startsAt: moveTo
			})
		).toEqual({ done: 'Visit moved. Updated invitations are on their way.' });
	});
});
