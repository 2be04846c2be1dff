// Care around finished jobs, against the real database: a job with two ponds records two
// features (once, however often completion runs); staff edit a recorded feature through the
// page action; the completion mail offers a plan through a private link that opens the plan; a
// lighting-only job gets its autumn lighting check, queued at completion and sent once.
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { and, eq, sql } from 'drizzle-orm';
import { db } from '$lib/server/platform/db';
import { jobs, outbox, propertyFeatures } from '$lib/server/platform/db/schema';
import { sendCareReminder } from '$lib/server/care/reminders';
import { recordFeaturesOfJob } from '$lib/server/care/features';
import { convertAcceptedEstimate } from '$lib/server/jobs/conversion';
import { setStage } from '$lib/server/jobs/stage';
import { planSchema } from '$lib/schema/care';
import { savePlan } from '$lib/server/care/plans';
import { stopQueue } from '$lib/server/platform/queue';
import { actions as propertyActions } from '../../src/routes/office/care/properties/[id]/+page.server';
import { load as careLoad } from '../../src/routes/(homeowner)/care/[token]/+page.server';
import { resetDatabase } from '../support/database';
import { makeEstimate, makeUser, seedFirm } from './fixtures';

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
});

afterAll(async () => {
	await stopQueue();
});

/** An active plan: spring start-up, autumn shut-down and the lighting check, priced per visit. */
async function plan() {
	return savePlan(
		null,
		planSchema.parse({
			name: 'Through the year',
			summary: '',
			terms: 'We come once in each window; cancel any time from your link.',
			payYearly: true,
			payPerVisit: true,
			active: true,
			visits: ['startup', 'shutdown', 'lighting'].map((kind) => ({
				kind,
				minutes: '60',
				checklist: ['Look it over']
			})),
			prices: {
				fountain: { small: '110', medium: '145.00', large: '190' },
				pond: { small: '150', medium: '200', large: '260' },
				stream: {},
				lighting: { small: '60', medium: '80', large: '' }
			}
		})
	);
}

/** A sold job; `design` replaces what it was sold as (the demo fountain with three lights). */
async function job(design?: Record<string, unknown>, waterFeature = true) {
	const { estimateId, email } = await makeEstimate({ accepted: true });
	const { jobId } = await convertAcceptedEstimate(estimateId);
	if (design) {
		await db.execute(
			sql`update jobs set frozen = jsonb_set(frozen, '{design}', ${JSON.stringify(design)}::jsonb),
				is_water_feature = ${waterFeature} where id = ${jobId}`
		);
	}
	const [row] = await db.select().from(jobs).where(eq(jobs.id, jobId));
	return { job: row, email, propertyId: row.propertyId! };
}

async function complete(jobId: string) {
	const owner = await makeUser('owner', `owner-${jobId}@test.example`);
	await setStage(owner, jobId, 'underway');
	await setStage(owner, jobId, 'complete');
	return owner;
}

const featuresAt = (propertyId: string) =>
	db.select().from(propertyFeatures).where(eq(propertyFeatures.propertyId, propertyId));

describe('features from a completed job', () => {
	it('records each of two ponds on one job, and nothing more when recorded again', async () => {
		const { job: j, propertyId } = await job({
			features: [
				{ id: 'pond-1', kind: 'pond', name: 'Upper pond', zones: [{}, {}] },
				{ id: 'pond-2', kind: 'pond', name: 'Lower pond', zones: [{}] }
			]
		});
		await complete(j.id);
		const rows = await featuresAt(propertyId);
		// Sizes by depth zones: two zones medium, one small (common practice, no source).
		expect(rows.map((f) => [f.kind, f.size, f.jobId]).sort()).toEqual([
			['pond', 'medium', j.id],
			['pond', 'small', j.id]
		]);
		const [fresh] = await db.select().from(jobs).where(eq(jobs.id, j.id));
		await db.transaction((tx) => recordFeaturesOfJob(tx, fresh));
		expect(await featuresAt(propertyId)).toHaveLength(2);
	});
});

describe('editing a feature on record', () => {
	async function post(user: { id: string; role: string }, propertyId: string, fields: object) {
		const body = new FormData();
		for (const [k, v] of Object.entries(fields)) body.append(k, String(v));
		const url = `http://127.0.0.1/office/care/properties/${propertyId}?/editFeature`;
		return (await propertyActions.editFeature({
			params: { id: propertyId },
			locals: { user: { ...user, email: `${user.role}@test.example`, name: user.role } },
			url: new URL(url),
			request: new Request(url, { method: 'POST', body })
		} as never)) as Record<string, unknown> & { status?: number; data?: Record<string, unknown> };
	}

	it('saves the changes, and refuses a bad value beside its field without saving', async () => {
		const { job: j, propertyId } = await job();
		const owner = await complete(j.id);
		const fountain = (await featuresAt(propertyId)).find((f) => f.kind === 'fountain')!;
		const changed = {
			featureId: fountain.id,
			kind: 'fountain',
			size: 'large',
			pump: 'Basin pump 2400',
			lights: '2',
			notes: 'Fourth column added by the homeowner',
			builtBy: 'us'
		};
		expect(await post(owner, propertyId, changed)).toEqual({
			form: 'edit',
			featureId: fountain.id,
			saved: true
		});
		const [saved] = await db
			.select()
			.from(propertyFeatures)
			.where(eq(propertyFeatures.id, fountain.id));
		expect([saved.size, saved.pump, saved.lights, saved.notes]).toEqual([
			'large',
			'Basin pump 2400',
			2,
			'Fourth column added by the homeowner'
		]);

		const refused = await post(owner, propertyId, { ...changed, size: 'small', lights: '-1' });
		expect(refused.status).toBe(400);
		expect(refused.data).toMatchObject({ form: 'edit', featureId: fountain.id });
		expect(Object.keys(refused.data!.errors as object)).toEqual(['lights']);
		const [kept] = await db
			.select()
			.from(propertyFeatures)
			.where(eq(propertyFeatures.id, fountain.id));
		expect(kept.size).toBe('large');
	});

	it('answers 404 for a feature of another property', async () => {
		const first = await job();
		const owner = await complete(first.job.id);
		const other = await job();
		await complete(other.job.id);
		const [theirs] = await featuresAt(other.propertyId);
		await expect(
			post(owner, first.propertyId, {
				featureId: theirs.id,
				kind: 'pond',
				size: 'small',
				lights: '0'
			})
		).rejects.toMatchObject({ status: 404 });
		const [unchanged] = await db
			.select()
			.from(propertyFeatures)
			.where(eq(propertyFeatures.id, theirs.id));
		expect(unchanged.kind).toBe(theirs.kind);
	});
});

describe('the completion mail', () => {
	const completionMail = async (jobId: string) =>
		(
			await db
				.select()
				.from(outbox)
				.where(eq(outbox.dedupeKey, `testimonial:${jobId}`))
		)[0];

	it('offers the care plan through a private link that opens the plan priced for the job', async () => {
		await plan();
		const { job: j } = await job();
		await complete(j.id);
		const mail = await completionMail(j.id);
		expect(mail.text).toMatch(/the link below shows the care plans priced for it/);
		const token = /\/care\/([A-Za-z0-9_-]{20,})/.exec(mail.text)?.[1];
		expect(token).toBeTruthy();
		expect(mail.html).toContain(`/care/${token}`);

		const page = (await careLoad({
			params: { token: token! },
			url: new URL(`http://127.0.0.1/care/${token}`)
		} as never)) as {
			care: { offers: { plan: { name: string }; quote: { yearCents: number } }[] };
		};
		// The demo job: a medium fountain (start-up and shut-down at 145.00) and three lights
		// (a small lighting check at 60.00).
		expect(page.care.offers.map((o) => [o.plan.name, o.quote.yearCents])).toEqual([
			['Through the year', 35000]
		]);
	});

	it('says nothing of care when no plan covers the feature', async () => {
		const { job: j } = await job();
		await complete(j.id);
		const mail = await completionMail(j.id);
		expect(mail.text).toMatch(/would you tell us in a few sentences/);
		expect(mail.text).not.toMatch(/\/care\//);
	});
});

describe('a lighting-only job', () => {
	const lightsOnly = { features: [], lighting: { fixtures: [{}, {}, {}, {}, {}, {}] } };

	it('queues its autumn lighting check at completion, and no water reminder', async () => {
		const { job: j, propertyId } = await job(lightsOnly, false);
		await complete(j.id);
		expect((await featuresAt(propertyId)).map((f) => [f.kind, f.size, f.lights])).toEqual([
			['lighting', 'medium', 6]
		]);
		const queued = await db.execute<{ key: string }>(
			sql`select singleton_key as key from pgboss.job
				where name = 'care.remind' and data->>'jobId' = ${j.id}`
		);
		expect(queued.map((q) => q.key)).toEqual([expect.stringMatching(`^${j.id}:lighting-\\d{4}$`)]);
	});

	it('gets the lighting check once, with the plan offer and the electrical caution', async () => {
		await plan();
		const { job: j, email } = await job(lightsOnly, false);
		await complete(j.id);
		const first = await sendCareReminder(j.id, 'lighting-2027', { chain: false });
		const again = await sendCareReminder(j.id, 'lighting-2027', { chain: false });
		expect([first, again]).toEqual(['sent', 'already-sent']);
		const mails = await db
			.select()
			.from(outbox)
			.where(and(eq(outbox.to, email), eq(outbox.dedupeKey, `care:${j.id}:lighting-2027`)));
		expect(mails).toHaveLength(1);
		expect(mails[0].subject).toBe('Time for the autumn check of your garden lighting');
		expect(mails[0].text).toMatch(/ground-fault \(GFCI\) outlet/);
		expect(mails[0].text).toMatch(/a care plan includes the autumn lighting check/);
		expect(mails[0].text).toMatch(/\/care\/[A-Za-z0-9_-]{20,}/);
	});
});
