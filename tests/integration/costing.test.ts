import { beforeEach, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/platform/db';
import { jobTasks, payments, timeEntries } from '$lib/server/platform/db/schema';
import { newId } from '$lib/server/platform/crypto';
import type { SessionUser } from '$lib/server/auth/sessions';
import { recordTimeEntries } from '$lib/server/costing/time';
import {
	costingOf,
	saveCostingConfig,
	DEFAULT_COSTING_SETTINGS,
	completedJobs
} from '$lib/server/costing/report';
import { addJobCost, saveUsage } from '$lib/server/costing/materials';
import { jobFor } from '$lib/server/jobs/read';
import { resetDatabase } from '../support/database';
import { makeUser, seedFirm } from './fixtures';
import { approveChangeOrder } from './payments-fixtures';
import { makeHandJob } from './costing-fixtures';
import { confirmRate, learnedRates, RateChangeError } from '$lib/server/costing/learning';
import { estimatingConfig } from '$lib/server/pricelist/catalog';
import { laborRateChanges } from '$lib/server/platform/db/schema';
import { POST as timeApi } from '../../src/routes/api/jobs/[id]/time/+server';
import { GET as marginsCsv } from '../../src/routes/office/costing/export.csv/+server';

let owner: SessionUser;
let rosa: SessionUser;
let other: SessionUser;

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
	owner = await makeUser('owner');
	rosa = await makeUser('crew', 'rosa@test.example', 'Rosa');
	other = await makeUser('crew', 'other@test.example', 'Other crew');
});

const key = () => `entry-${newId().replace(/_/g, '-')}`;

async function taskId(jobId: string, name: string) {
	const rows = await db.select().from(jobTasks).where(eq(jobTasks.jobId, jobId));
	const t = rows.find((r) => r.name === name);
	if (!t) throw new Error(`no task ${name}`);
	return t.id;
}

function entry(over: Record<string, unknown>) {
	return {
		clientKey: key(),
		taskId: null,
		newTask: null,
		person: 'Rosa',
		workDate: '2027-05-14',
		minutes: 60,
		note: '',
		...over
	};
}

describe('time entries from the phone', () => {
	it('stores entries replayed twice (and a third time at once) exactly once', async () => {
		const { job } = await makeHandJob({ crewLeadId: rosa.id });
		await costingOf(job); // writes the job's tasks from the estimate
		const basin = await taskId(job.id, 'Dig and set basin');
		const batch = [
			entry({ taskId: basin, minutes: 240 }),
			entry({ taskId: basin, person: 'Ben', minutes: 210 }),
			entry({ newTask: 'Haul spoil', minutes: 90 })
		];
		const first = await recordTimeEntries(rosa, job.id, batch);
		expect(first.stored.map((s) => s.duplicate)).toEqual([false, false, false]);
		// The answer was lost on the way back: the phone sends the same entries again, twice at once.
		const [again, andAgain] = await Promise.all([
			recordTimeEntries(rosa, job.id, batch),
			recordTimeEntries(rosa, job.id, batch)
		]);
		expect(again.stored.map((s) => s.duplicate)).toEqual([true, true, true]);
		expect(andAgain.stored.map((s) => s.id)).toEqual(first.stored.map((s) => s.id));
		const rows = await db.select().from(timeEntries).where(eq(timeEntries.jobId, job.id));
		expect(rows).toHaveLength(3);
		expect(rows.reduce((s, r) => s + r.minutes, 0)).toBe(540);
		// The task named on site exists once, with no estimated hours.
		const spoil = (await db.select().from(jobTasks).where(eq(jobTasks.jobId, job.id))).filter(
			(t) => t.name === 'Haul spoil'
		);
		expect(spoil).toHaveLength(1);
		expect(spoil[0].estimatedHours).toBe(0);
	});

	it('takes entries through the API, stores a replay once, refuses a bad entry with its reason and another crew', async () => {
		const { job } = await makeHandJob({ crewLeadId: rosa.id });
		await costingOf(job);
		const basin = await taskId(job.id, 'Dig and set basin');
		const good = entry({ taskId: basin, minutes: 450 });
		const bad = entry({ taskId: basin, minutes: 0 });
		const post = async (user: SessionUser, body: unknown) => {
			const url = `http://127.0.0.1/api/jobs/${job.id}/time`;
			try {
				const res = await timeApi({
					params: { id: job.id },
					locals: { user },
					url: new URL(url),
					request: new Request(url, { method: 'POST', body: JSON.stringify(body) })
				} as never);
				return { status: res.status, body: await res.json() };
			} catch (e) {
				return { status: (e as { status: number }).status, body: null };
			}
		};
		const one = await post(rosa, { entries: [good, bad] });
		expect(one.status).toBe(200);
		expect(one.body.stored).toHaveLength(1);
		expect(one.body.refused).toEqual([
			{ clientKey: bad.clientKey, message: 'Enter the hours, such as 7.5' }
		]);
		const two = await post(rosa, { entries: [good] });
		expect(two.body.stored[0].duplicate).toBe(true);
		expect(await db.select().from(timeEntries).where(eq(timeEntries.jobId, job.id))).toHaveLength(
			1
		);
		// Another crew lead's job: 403, nothing stored.
		expect((await post(other, { entries: [entry({ taskId: basin })] })).status).toBe(403);
		expect((await post(rosa, { entries: [] })).status).toBe(400);
		expect(await db.select().from(timeEntries).where(eq(timeEntries.jobId, job.id))).toHaveLength(
			1
		);
	});
});

describe('job costing', () => {
	it('works out profit and margin in integer cents as the hand-worked job does', async () => {
		// The job, worked by hand (common practice, no source: revenue without the tax collected,
		// cost at the firm's cost an hour; the rounding rule is the estimate engine's, half up once):
		//   contract $3,000.00 incl. $150.00 tax, approved change order +$200.00
		//   revenue = 300000 − 15000 + 20000 = 305000 ¢
		//   estimated hours 6 + 4.5 + 3 = 13.5 h (the wall option was not bought)
		//   logged: basin 240 + 210 = 450 min, outlets 315 min, stone 120 min, "Haul spoil" 90 min
		//   = 975 min; at 3850 ¢/h: 975 × 3850 / 60 = 62562.5 → 62563 ¢ (estimate 13.5 × 3850 = 51975)
		//   callback 45 min → 2887.5 → 2888 ¢
		//   materials: column invoiced 51250; pebble 2 picked 0.5 back → 1.5 × 9000 / 2 = 6750;
		//   pump untouched at its estimate 29000 → 87000 ¢ (estimate 48000 + 9000 + 29000 = 86000)
		//   equipment 18500, dump fee 4200
		//   cost = 62563 + 2888 + 87000 + 18500 + 4200 = 175151 ¢
		//   profit = 305000 − 175151 = 129849 ¢; margin = 129849 / 305000 = 42.5734 % → 4257 bp
		//   estimated profit = 305000 − (51975 + 86000) = 167025 ¢ → 5476.2 → 5476 bp
		//   payments: deposit 90000 → still owed 300000 + 20000 − 90000 = 230000 ¢
		const { job, materials } = await makeHandJob({ crewLeadId: rosa.id });
		await costingOf(job);
		const t = (name: string) => taskId(job.id, name);
		await recordTimeEntries(rosa, job.id, [
			entry({ taskId: await t('Dig and set basin'), minutes: 240 }),
			entry({ taskId: await t('Dig and set basin'), person: 'Ben', minutes: 210 }),
			entry({ taskId: await t('Plumb outlets'), minutes: 315 }),
			entry({ taskId: await t('Set Low basalt column (cart)'), minutes: 120 }),
			entry({ newTask: 'Haul spoil', minutes: 90 })
		]);
		await db.insert(timeEntries).values({
			id: newId(),
			jobId: job.id,
			taskId: await t('Dig and set basin'),
			person: 'Rosa',
			workDate: '2027-08-02',
			minutes: 45,
			clientKey: key(),
			callbackId: 'callback-hours'
		});
		const m = (sku: string) => materials.find((x) => x.sku === sku)!.id;
		await saveUsage(owner, job.id, {
			materialId: m('STONE-BASALT-COL'),
			picked: 0.8,
			returned: 0,
			invoiceCost: 51_250,
			invoiceReference: 'QS-2291'
		});
		await saveUsage(owner, job.id, {
			materialId: m('AGG-PEBBLE-RIVER'),
			picked: 2,
			returned: 0.5,
			invoiceCost: null,
			invoiceReference: ''
		});
		await addJobCost(owner, job.id, {
			kind: 'equipment',
			description: 'Compact loader, one day',
			amount: 18_500,
			incurredOn: '2027-05-14'
		});
		await addJobCost(owner, job.id, {
			kind: 'other',
			description: 'Dump fee',
			amount: 4_200,
			incurredOn: '2027-05-15'
		});
		await approveChangeOrder(job.id, 1, 20_000);
		await db.insert(payments).values({
			id: newId(),
			jobId: job.id,
			kind: 'deposit',
			method: 'cheque',
			amountCents: 90_000,
			reference: '1041',
			receivedOn: '2027-05-01'
		});

		const { costing } = await costingOf(await jobFor(owner, job.id));
		expect(costing.revenueCents).toBe(305_000);
		expect(costing.labor.estimatedHours).toBe(13.5);
		expect(costing.labor.actualHours).toBe(16.25);
		expect(costing.labor.estimatedCents).toBe(51_975);
		expect(costing.labor.actualCents).toBe(62_563);
		expect(costing.labor.callbackCents).toBe(2_888);
		expect(costing.materials.estimatedCents).toBe(86_000);
		expect(costing.materials.actualCents).toBe(87_000);
		expect(costing.materials.rows.map((r) => r.basis)).toEqual(['invoice', 'used', 'estimate']);
		expect(costing.equipmentCents).toBe(18_500);
		expect(costing.otherCents).toBe(4_200);
		expect(costing.actualCostCents).toBe(175_151);
		expect(costing.profitCents).toBe(129_849);
		expect(costing.marginBasisPoints).toBe(4257);
		expect(costing.estimatedProfitCents).toBe(167_025);
		expect(costing.estimatedMarginBasisPoints).toBe(5476);
		expect(costing.paymentsCents).toBe(90_000);
		expect(costing.outstandingCents).toBe(230_000);
		// Basin +25 % and outlets +16.7 % are over 15 %; the stone ran under; the new task has no estimate.
		expect(costing.tasks.filter((x) => x.standsOut).map((x) => x.name)).toEqual([
			'Dig and set basin',
			'Plumb outlets'
		]);
		await saveCostingConfig({ ...DEFAULT_COSTING_SETTINGS, overrunPercent: 20 });
		const stricter = await costingOf(job);
		expect(stricter.costing.tasks.filter((x) => x.standsOut).map((x) => x.name)).toEqual([
			'Dig and set basin'
		]);
		expect(stricter.costing.tasks.find((x) => x.name === 'Haul spoil')?.overPercent).toBeNull();
	});

	it('lists completed jobs with their margins and exports them as CSV', async () => {
		const done = await makeHandJob({ completedAt: new Date('2027-06-01T18:00:00Z') });
		await makeHandJob(); // underway: not in the list
		const rows = await completedJobs();
		expect(rows.map((r) => r.id)).toEqual([done.job.id]);
		// Nothing logged: labor 0, materials at the estimate 86000; revenue 285000 → profit 199000.
		expect(rows[0].profitCents).toBe(199_000);
		expect(rows[0].marginBasisPoints).toBe(6982); // 199000 / 285000 = 69.824 %
		const url = 'http://127.0.0.1/office/costing/export.csv';
		const res = await marginsCsv({
			locals: { user: owner },
			url: new URL(url),
			request: new Request(url)
		} as never);
		const text = await res.text();
		expect(text.split('\r\n')[0]).toBe(
			'job,title,homeowner,completed_on,revenue,cost,profit,margin_percent,estimated_hours,actual_hours'
		);
		expect(text).toContain(`J-${done.job.number},Hand-worked job,`);
		expect(text).toContain(',2850.00,860.00,1990.00,69.82,13.50,0.00');
	});
});

describe('estimates that learn', () => {
	async function finished(
		completedAt: string | null,
		tasks: { task: string; hours: number; key: string }[],
		logged: Record<string, number[]>
	) {
		const { job } = await makeHandJob({
			tasks,
			crewLeadId: rosa.id,
			completedAt: completedAt ? new Date(completedAt) : null
		});
		await costingOf(job);
		for (const [name, minutes] of Object.entries(logged)) {
			const id = await taskId(job.id, name);
			await recordTimeEntries(
				rosa,
				job.id,
				minutes.map((m) => entry({ taskId: id, minutes: m }))
			);
		}
		return job;
	}

	it('gives each rate the ratio of actual to estimated hours over the last finished jobs, and records the confirmed change', async () => {
		// The hand-worked set (the engine's default rates: a basin 4 h, a branch 1.5 h):
		//   job A (newest): basin est 6, logged 450 min = 7.5 h; outlets est 4.5, logged 4.5 h
		//                   (and 120 callback minutes on the basin, not counted)
		//   job B:          basin est 6, logged 6.5 h; outlets est 3, logged 3.75 h
		//   job C (oldest): basin est 6, logged 8 h; outlets est 3, nothing logged (not counted)
		//   job D underway: basin est 6, logged 20 h (not finished: not counted)
		//   over 10 jobs: basin (7.5 + 6.5 + 8) / 18 = 22 / 18 = 1.2222 over 3 jobs → 4 × 1.2222 = 4.89 h
		//                 branches (4.5 + 3.75) / 7.5 = 1.1 over 2 jobs → 1.5 × 1.1 = 1.65 h
		//   over the last 2: basin (7.5 + 6.5) / 12 = 1.1667 over 2 jobs → 4.67 h
		const a = await finished(
			'2027-06-20T20:00:00Z',
			[
				{ task: 'Dig and set basin', hours: 6, key: 'basin' },
				{ task: 'Plumb outlets', hours: 4.5, key: 'branch' }
			],
			{ 'Dig and set basin': [240, 210], 'Plumb outlets': [270] }
		);
		await db.insert(timeEntries).values({
			id: newId(),
			jobId: a.id,
			taskId: await taskId(a.id, 'Dig and set basin'),
			person: 'Rosa',
			workDate: '2027-07-20',
			minutes: 120,
			clientKey: key(),
			callbackId: 'callback-hours'
		});
		await finished(
			'2027-06-10T20:00:00Z',
			[
				{ task: 'Dig and set basin', hours: 6, key: 'basin' },
				{ task: 'Plumb outlets', hours: 3, key: 'branch' }
			],
			{ 'Dig and set basin': [390], 'Plumb outlets': [225] }
		);
		await finished(
			'2027-05-30T20:00:00Z',
			[
				{ task: 'Dig and set basin', hours: 6, key: 'basin' },
				{ task: 'Plumb outlets', hours: 3, key: 'branch' }
			],
			{ 'Dig and set basin': [480] }
		);
		await finished(null, [{ task: 'Dig and set basin', hours: 6, key: 'basin' }], {
			'Dig and set basin': [600, 600]
		});

		const all = await learnedRates();
		const basin = all.find((r) => r.rateKey === 'basin')!;
		expect(basin.current).toBe(4);
		expect(basin.ratio).toBeCloseTo(22 / 18, 10);
		expect(basin.jobs).toBe(3);
		expect(basin.proposed).toBe(4.89);
		expect(all.find((r) => r.rateKey === 'branch')).toMatchObject({ jobs: 2, proposed: 1.65 });
		expect(all.find((r) => r.rateKey === 'branch')!.ratio).toBeCloseTo(1.1, 10);
		expect(all.find((r) => r.rateKey === 'fall')).toMatchObject({
			ratio: null,
			jobs: 0,
			proposed: null
		});

		await saveCostingConfig({ ...DEFAULT_COSTING_SETTINGS, learnFromJobs: 2 });
		const lastTwo = (await learnedRates()).find((r) => r.rateKey === 'basin')!;
		expect(lastTwo).toMatchObject({ jobs: 2, proposed: 4.67 });
		expect(lastTwo.ratio).toBeCloseTo(14 / 12, 10);

		// A stale proposal is refused; the one on the page is taken and recorded.
		await expect(confirmRate(owner, 'basin', 4.89)).rejects.toThrow(RateChangeError);
		expect(await confirmRate(owner, 'basin', 4.67)).toEqual({ from: 4, to: 4.67 });
		const config = await estimatingConfig();
		const labor = config.engine.labor as { rates: Record<string, number> };
		expect(labor.rates.basin).toBe(4.67);
		const changes = await db.select().from(laborRateChanges);
		expect(changes).toHaveLength(1);
		expect(changes[0]).toMatchObject({
			rateKey: 'basin',
			fromHours: 4,
			toHours: 4.67,
			jobsCount: 2,
			confirmedBy: owner.id
		});
		expect(changes[0].ratio).toBeCloseTo(14 / 12, 10);
		// The finished jobs still say the same ratio, now of the new setting.
		// 4.67 × 1.1667 = 5.448 → 5.45
		expect((await learnedRates()).find((r) => r.rateKey === 'basin')).toMatchObject({
			current: 4.67,
			proposed: 5.45
		});
	});
});
