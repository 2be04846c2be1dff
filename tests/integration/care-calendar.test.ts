// The staff calendar feeds, read back with a general-purpose iCalendar parser (ical.js): each
// person sees their own site visits (timed, in the firm's zone), install days and service
// visits (all-day); a new address stops the old one.
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import ICAL from 'ical.js';
import { sql } from 'drizzle-orm';
import { db } from '$lib/server/platform/db';
import { serviceVisits } from '$lib/server/platform/db/schema';
import { newId } from '$lib/server/platform/crypto';
import { calendarFeed, resetFeed } from '$lib/server/care/calendar';
import { addFeature, setPin } from '$lib/server/care/features';
import { savePlan, saveSeasonSettings } from '$lib/server/care/plans';
import { generateSeason } from '$lib/server/care/season';
import { addCrewDays } from '$lib/server/care/crew-days';
import { proposeSchedule } from '$lib/server/care/season-routes';
import { sendDates } from '$lib/server/care/season-mail';
import { signUp } from '$lib/server/care/subscriptions';
import { convertAcceptedEstimate } from '$lib/server/jobs/conversion';
import { scheduleJob } from '$lib/server/jobs/schedule';
import { stopQueue } from '$lib/server/platform/queue';
import { planSchema } from '$lib/schema/care';
import { SEASON_DEFAULTS } from '$lib/care/seasons';
import { resetDatabase } from '../support/database';
import { makeEstimate, makeLead, makeUser, seedFirm } from './fixtures';

const TZ = 'America/Denver';
const NOW = new Date('2027-06-01T12:00:00Z');

function events(text: string) {
	const cal = new ICAL.Component(ICAL.parse(text));
	for (const tz of cal.getAllSubcomponents('vtimezone')) {
		ICAL.TimezoneService.register(new ICAL.Timezone(tz));
	}
	return cal.getAllSubcomponents('vevent').map((c) => new ICAL.Event(c));
}

const tokenOf = (url: string) => url.split('/calendar/')[1];

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
});
afterAll(async () => {
	await stopQueue();
});

describe('calendar feeds', () => {
	it('gives each person their own visits, install days and service visits, in the firm zone', async () => {
		const owner = await makeUser('owner');
		const sales = await makeUser('sales');
		const crew = await makeUser('crew', 'rosa@test.example', 'Rosa');

		// A site visit for the salesperson: Monday 2027-09-13 10:00–11:00 MDT (16:00–17:00 UTC).
		const lead = await makeLead({ name: 'Wren Ashby' });
		await db.execute(sql`
			insert into site_visits (id, lead_id, salesperson_id, starts_at, ends_at, buffer_minutes,
				blocked, time_zone, token_hash, token_expires_at)
			values (${newId()}, ${lead.id}, ${sales.id}, '2027-09-13T16:00:00Z', '2027-09-13T17:00:00Z', 30,
				'[2027-09-13T16:00:00Z,2027-09-13T17:30:00Z)', ${TZ}, ${newId()}, '2027-09-14T17:00:00Z')`);

		// An install day for the crew lead.
		const { estimateId } = await makeEstimate({ accepted: true });
		const job = await convertAcceptedEstimate(estimateId);
		await scheduleJob(job.jobId, { days: ['2027-09-08'], crewLeadId: crew.id, crewSize: 2 }, owner);

		// A dated service visit for the crew lead.
		await saveSeasonSettings({ ...SEASON_DEFAULTS, depotLat: 40, depotLng: -105, speedKmh: 40 });
		const planId = await savePlan(
			null,
			planSchema.parse({
				name: 'Autumn only',
				terms: 'Terms.',
				payYearly: false,
				payPerVisit: true,
				active: true,
				visits: [{ kind: 'shutdown', minutes: '60', checklist: ['Drain'] }],
				prices: { fountain: { medium: '120' }, pond: {}, stream: {}, lighting: {} }
			})
		);
		const home = await makeLead({ name: 'Ivo Marsh' });
		await addFeature(
			home.propertyId!,
			{ kind: 'fountain', size: 'medium', pump: '', lights: 0, notes: '', builtBy: 'others' },
			null
		);
		await setPin(home.propertyId!, 40.02, -105);
		await signUp(home.propertyId!, {
			planId,
			billing: 'visit',
			typedName: 'Ivo Marsh',
			ipAddress: null
		});
		await generateSeason('autumn-2027');
		await addCrewDays({
			from: '2027-09-06',
			to: '2027-09-06',
			crewLeadId: crew.id,
			startMinute: 480,
			endMinute: 960,
			weekdaysOnly: false
		});
		await proposeSchedule('autumn-2027');
		await sendDates('autumn-2027');

		const salesFeed = events((await calendarFeed(tokenOf(await resetFeed(sales.id)), NOW))!);
		expect(salesFeed).toHaveLength(1);
		expect(salesFeed[0].summary).toMatch(/^Site visit: Wren Ashby/);
		expect(salesFeed[0].startDate.zone.tzid).toBe(TZ);
		expect(salesFeed[0].startDate.toString()).toBe('2027-09-13T10:00:00');
		expect(salesFeed[0].startDate.toJSDate().toISOString()).toBe('2027-09-13T16:00:00.000Z');

		const crewFeed = events((await calendarFeed(tokenOf(await resetFeed(crew.id)), NOW))!);
		const byStart = crewFeed.map((e) => [e.startDate.toString(), e.startDate.isDate, e.summary]);
		expect(byStart).toEqual(
			expect.arrayContaining([
				['2027-09-08', true, expect.stringMatching(/^Install: J-\d+ /)],
				['2027-09-06', true, '1. Autumn shut-down: Ivo Marsh']
			])
		);
		expect(crewFeed).toHaveLength(2);
		const [visit] = await db.select().from(serviceVisits);
		expect(crewFeed.map((e) => e.uid)).toContain(`service-visit-${visit.id}@rillstone`);
	});

	it('stops the old address when a new one is made, and answers nothing for a stranger', async () => {
		const crew = await makeUser('crew');
		const first = tokenOf(await resetFeed(crew.id));
		expect(await calendarFeed(first, NOW)).toContain('BEGIN:VCALENDAR');
		const second = tokenOf(await resetFeed(crew.id));
		expect(await calendarFeed(first, NOW)).toBeNull();
		expect(events((await calendarFeed(second, NOW))!)).toEqual([]);
		expect(await calendarFeed('not-a-token', NOW)).toBeNull();
	});
});
