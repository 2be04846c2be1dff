// Seasonal care against the real database: season generation run twice, the nearest-neighbour
// route on known coordinates, the visit invoice (plan price plus parts) with the report mail,
// and a cancelled plan that stops its visits and mails.
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { and, asc, eq, like, sql } from 'drizzle-orm';
import sharp from 'sharp';
import { db } from '$lib/server/platform/db';
import {
	jobs,
	outbox,
	priceListItems,
	propertyFeatures,
	serviceVisits
} from '$lib/server/platform/db/schema';
import { sendCareReminder } from '$lib/server/care/reminders';
import { convertAcceptedEstimate } from '$lib/server/jobs/conversion';
import { setStage } from '$lib/server/jobs/stage';
import { planSchema } from '$lib/schema/care';
import { addFeature, setPin } from '$lib/server/care/features';
import { saveSeasonSettings, savePlan } from '$lib/server/care/plans';
import { cancelPlan, signUp } from '$lib/server/care/subscriptions';
import { sendRenewalReminder } from '$lib/server/care/renewal';
import { generateSeason } from '$lib/server/care/season';
import { addCrewDays } from '$lib/server/care/crew-days';
import { moveVisit, proposeSchedule } from '$lib/server/care/season-routes';
import { sendDates } from '$lib/server/care/season-mail';
import { storeCarePhoto } from '$lib/server/care/photos';
import {
	addPart,
	completeServiceVisit,
	tickChecklist,
	visitInvoice
} from '$lib/server/care/service';
import { SEASON_DEFAULTS } from '$lib/care/seasons';
import type { SessionUser } from '$lib/server/auth/sessions';
import { stopQueue } from '$lib/server/platform/queue';
import { resetDatabase } from '../support/database';
import { makeEstimate, makeLead, makeUser, seedFirm } from './fixtures';

let crew: SessionUser;

const DEPOT = { lat: 40, lng: -105 };

async function plan(visits: string[]) {
	const form: Record<string, unknown> = {
		name: 'Four seasons',
		summary: '',
		terms: 'We come in each window; cancel any time from your link.',
		payYearly: true,
		payPerVisit: true,
		active: true,
		visits: visits.map((kind) => ({
			kind,
			minutes: '60',
			checklist: ['Drain the lines', 'Store the pump']
		})),
		prices: {
			fountain: { small: '', medium: '150.00', large: '' },
			pond: {},
			stream: {},
			lighting: { small: '60', medium: '', large: '' }
		}
	};
	return savePlan(null, planSchema.parse(form));
}

/** A homeowner with a medium fountain (and small lights when asked) at a pinned place. */
async function homeowner(planId: string, at: { lat: number; lng: number }, lights = false) {
	const lead = await makeLead();
	const base = { pump: '', lights: 0, notes: '', builtBy: 'others' as const };
	await addFeature(lead.propertyId!, { ...base, kind: 'fountain', size: 'medium' }, null);
	if (lights) {
		await addFeature(
			lead.propertyId!,
			{ ...base, kind: 'lighting', size: 'small', lights: 4 },
			null
		);
	}
	await setPin(lead.propertyId!, at.lat, at.lng);
	const s = await signUp(lead.propertyId!, {
		planId,
		billing: 'visit',
		typedName: 'Test Person',
		ipAddress: null
	});
	return { propertyId: lead.propertyId!, subscriptionId: s.id };
}

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
	crew = await makeUser('crew', 'rosa@test.example', 'Rosa');
	await saveSeasonSettings({
		...SEASON_DEFAULTS,
		firstFrost: '10-15',
		shutdownDays: 42,
		depotLat: DEPOT.lat,
		depotLng: DEPOT.lng,
		speedKmh: 40
	});
});

afterAll(async () => {
	await stopQueue();
});

describe('season generation', () => {
	it('makes one visit per plan, feature and season, however often it runs', async () => {
		const planId = await plan(['startup', 'shutdown', 'lighting']);
		await homeowner(planId, { lat: 40.01, lng: -105 }, true);
		await homeowner(planId, { lat: 40.02, lng: -105 }, true);
		const first = await generateSeason('autumn-2027');
		// Autumn holds the shut-down (fountain) and the lighting check (lights): 2 per property.
		expect(first).toEqual({ created: 4, total: 4 });
		const again = await Promise.all([generateSeason('autumn-2027'), generateSeason('autumn-2027')]);
		expect(again.map((r) => r.created)).toEqual([0, 0]);
		const groups = await db
			.select({ n: sql<number>`count(*)::int` })
			.from(serviceVisits)
			.groupBy(
				serviceVisits.subscriptionId,
				serviceVisits.featureId,
				serviceVisits.season,
				serviceVisits.kind
			);
		expect(groups).toHaveLength(4);
		expect(groups.every((g) => g.n === 1)).toBe(true);
		const [v] = await db
			.select()
			.from(serviceVisits)
			.where(eq(serviceVisits.kind, 'shutdown'))
			.limit(1);
		// The window closes the day before the first frost.
		expect([v.windowStart, v.windowEnd]).toEqual(['2027-09-03', '2027-10-14']);
	});
});

describe('route', () => {
	it('orders a crew day as a nearest-neighbour route over known coordinates, and re-routes on a move', async () => {
		const planId = await plan(['shutdown']);
		// Distances hand-computed with the haversine formula (R = 6371 km), from the yard at 40.00 N,
		// 105.00 W: A 5.6 km, B 8.5, C 13.3, D 9.5 → A. From A: D 6.9, C 7.8, B 10.2 → D.
		// From D: B 6.9, C 9.5 → B. Then C. So A, D, B, C — though by distance from the yard alone
		// it would be A, B, D, C.
		const a = await homeowner(planId, { lat: 40.05, lng: -105 });
		const b = await homeowner(planId, { lat: 40.0, lng: -105.1 });
		const c = await homeowner(planId, { lat: 40.12, lng: -105 });
		const d = await homeowner(planId, { lat: 40.06, lng: -105.08 });
		const name = new Map([a, b, c, d].map((h, i) => [h.propertyId, 'ABCD'[i]]));
		await generateSeason('autumn-2027');
		await addCrewDays({
			from: '2027-09-06',
			to: '2027-09-07',
			crewLeadId: crew.id,
			startMinute: 480,
			endMinute: 1020,
			weekdaysOnly: true
		});
		const r = await proposeSchedule('autumn-2027');
		expect(r).toEqual({ placed: 4, unplaced: 0, unlocated: 0 });
		const order = async (day: string) =>
			(
				await db
					.select()
					.from(serviceVisits)
					.where(eq(serviceVisits.day, day))
					.orderBy(asc(serviceVisits.routeOrder))
			).map((v) => name.get(v.propertyId));
		expect(await order('2027-09-06')).toEqual(['A', 'D', 'B', 'C']);

		const [visitC] = await db
			.select()
			.from(serviceVisits)
			.where(eq(serviceVisits.propertyId, c.propertyId));
		const [secondDay] = await db.execute<{ id: string }>(
			sql`select id from care_crew_days where day = '2027-09-07'`
		);
		await moveVisit(visitC.id, secondDay.id);
		expect(await order('2027-09-06')).toEqual(['A', 'D', 'B']);
		expect(await order('2027-09-07')).toEqual(['C']);
	});
});

describe('a done visit', () => {
	it('invoices the plan price plus the parts, and mails the report with the photo', async () => {
		await db.insert(priceListItems).values({
			sku: 'IMPELLER-S',
			name: 'Pump impeller, small',
			category: 'pump',
			unit: 'each',
			unitCostCents: 700,
			unitPriceCents: 1250
		});
		const planId = await plan(['shutdown']);
		await homeowner(planId, { lat: 40.05, lng: -105 });
		await generateSeason('autumn-2027');
		await addCrewDays({
			from: '2027-09-06',
			to: '2027-09-06',
			crewLeadId: crew.id,
			startMinute: 480,
			endMinute: 1020,
			weekdaysOnly: false
		});
		await proposeSchedule('autumn-2027');
		expect(await sendDates('autumn-2027')).toBe(1);
		const [v] = await db.select().from(serviceVisits);
		expect(v.status).toBe('dated');

		await addPart(crew, v.id, 'IMPELLER-S', 2);
		const jpeg = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#4a7' } })
			.jpeg()
			.toBuffer();
		await storeCarePhoto(
			{ serviceVisitId: v.id },
			new File([new Uint8Array(jpeg)], 'pump.jpg', { type: 'image/jpeg' }),
			crew.id
		);
		await expect(completeServiceVisit(crew, v.id)).rejects.toThrow(
			/2 checklist items are not ticked/
		);
		await tickChecklist(crew, v.id, 0, true);
		await tickChecklist(crew, v.id, 1, true);
		await completeServiceVisit(crew, v.id);

		const invoice = await visitInvoice(v.id);
		// The plan's price for a medium fountain (150.00) plus 2 × 12.50.
		expect(invoice.totalCents).toBe(15000 + 2 * 1250);
		const [report] = await db
			.select()
			.from(outbox)
			.where(eq(outbox.dedupeKey, `care-report:${v.id}`));
		expect(report.text).toContain('$175.00');
		expect(report.text).toMatch(/\/care\/visit\/[A-Za-z0-9_-]+/);
		expect(report.attachments).toHaveLength(1);
		expect(report.attachments[0]).toMatchObject({ contentType: 'image/webp', encoding: 'base64' });
		// Done twice is refused, and no second report is written.
		await expect(completeServiceVisit(crew, v.id)).rejects.toThrow(/done/);
		expect(
			await db.select().from(outbox).where(like(outbox.dedupeKey, 'care-report:%'))
		).toHaveLength(1);
	});
});

describe('a cancelled plan', () => {
	it('stops its future visits and every plan mail', async () => {
		const planId = await plan(['startup', 'shutdown']);
		const h = await homeowner(planId, { lat: 40.05, lng: -105 });
		await generateSeason('autumn-2027');
		await addCrewDays({
			from: '2027-09-06',
			to: '2027-09-06',
			crewLeadId: crew.id,
			startMinute: 480,
			endMinute: 1020,
			weekdaysOnly: false
		});
		await proposeSchedule('autumn-2027');

		expect(await cancelPlan(h.propertyId)).toBe(true);
		const visits = await db
			.select()
			.from(serviceVisits)
			.where(eq(serviceVisits.subscriptionId, h.subscriptionId));
		expect(visits.map((v) => v.status)).toEqual(['cancelled']);
		expect(await sendDates('autumn-2027')).toBe(0);
		expect(await generateSeason('spring-2028')).toEqual({ created: 0, total: 0 });
		const [s] = await db.execute<{ renews_on: string }>(
			sql`select renews_on::text from care_subscriptions`
		);
		expect(await sendRenewalReminder(h.subscriptionId, s.renews_on)).toBe(false);
		const careMail = await db
			.select({ key: outbox.dedupeKey })
			.from(outbox)
			.where(
				and(like(outbox.dedupeKey, 'care-%'), sql`${outbox.dedupeKey} not like 'care-welcome:%'`)
			);
		expect(careMail).toEqual([]);
	});
});

describe('the seasonal reminder of a finished job', () => {
	async function jobAtHome() {
		const { estimateId, email } = await makeEstimate({ accepted: true });
		const { jobId } = await convertAcceptedEstimate(estimateId);
		const [job] = await db.select().from(jobs).where(eq(jobs.id, jobId));
		const base = { pump: '', lights: 0, notes: '', builtBy: 'us' as const };
		await addFeature(job.propertyId!, { ...base, kind: 'fountain', size: 'medium' }, null);
		await setPin(job.propertyId!, 40.05, -105);
		return { jobId, email, propertyId: job.propertyId! };
	}
	const reminderOf = async (jobId: string, season: string) =>
		(
			await db
				.select()
				.from(outbox)
				.where(eq(outbox.dedupeKey, `care:${jobId}:${season}`))
		)[0];

	it('offers a plan, with the private link, to a homeowner without one', async () => {
		await plan(['startup', 'shutdown']);
		const { jobId } = await jobAtHome();
		expect(await sendCareReminder(jobId, 'shutdown-2027', { chain: false })).toBe('sent');
		const mail = await reminderOf(jobId, 'shutdown-2027');
		expect(mail.text).toMatch(/a care plan covers the spring start-up and the autumn shut-down/);
		expect(mail.text).toMatch(/\/care\/[A-Za-z0-9_-]{20,}/);
		expect(mail.text).not.toMatch(/reply to this e-mail or call us to book/);
	});

	it('becomes the visit notice for a plan holder, and says nothing once the day was mailed', async () => {
		const planId = await plan(['startup', 'shutdown']);
		const { jobId, propertyId } = await jobAtHome();
		await signUp(propertyId, {
			planId,
			billing: 'visit',
			typedName: 'Ines Harrow',
			ipAddress: null
		});

		expect(await sendCareReminder(jobId, 'startup-2028', { chain: false })).toBe('sent');
		expect((await reminderOf(jobId, 'startup-2028')).text).toMatch(
			/Your care plan includes this visit: we come between Saturday, April 15, 2028 and/
		);

		await generateSeason('autumn-2027');
		await addCrewDays({
			from: '2027-09-06',
			to: '2027-09-06',
			crewLeadId: crew.id,
			startMinute: 480,
			endMinute: 1020,
			weekdaysOnly: false
		});
		await proposeSchedule('autumn-2027');
		expect(await sendDates('autumn-2027')).toBe(1);
		expect(await sendCareReminder(jobId, 'shutdown-2027', { chain: false })).toBe('covered');
		expect(await sendCareReminder(jobId, 'shutdown-2027', { chain: false })).toBe('already-sent');
		expect(await reminderOf(jobId, 'shutdown-2027')).toBeUndefined();
	});
});

describe('features on record', () => {
	it('come from a job when it is completed, once, beside those added by hand', async () => {
		const owner = await makeUser('owner');
		const { estimateId } = await makeEstimate({ accepted: true });
		const { jobId } = await convertAcceptedEstimate(estimateId);
		const [job] = await db.select().from(jobs).where(eq(jobs.id, jobId));
		await addFeature(
			job.propertyId!,
			{
				kind: 'pond',
				size: 'large',
				pump: '',
				lights: 0,
				notes: 'Dug by the last owner',
				builtBy: 'others'
			},
			null
		);
		await setStage(owner, jobId, 'underway');
		await setStage(owner, jobId, 'complete');
		const rows = await db
			.select()
			.from(propertyFeatures)
			.where(eq(propertyFeatures.propertyId, job.propertyId!));
		// The demo design: three outlets over a basin (a medium fountain) and three fixtures (small lighting).
		expect(rows.map((f) => [f.kind, f.size, f.builtBy, f.lights]).sort()).toEqual([
			['fountain', 'medium', 'us', 0],
			['lighting', 'small', 'us', 3],
			['pond', 'large', 'others', 0]
		]);
		expect(rows.find((f) => f.kind === 'fountain')!.jobId).toBe(jobId);
	});
});
