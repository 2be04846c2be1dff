import { beforeEach, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/platform/db';
import { callbackPhotos, callbacks, jobs, outbox, photos } from '$lib/server/platform/db/schema';
import type { SessionUser } from '$lib/server/auth/sessions';
import { convertAcceptedEstimate } from '$lib/server/jobs/conversion';
import { JobError } from '$lib/server/jobs/errors';
import { scheduleJob } from '$lib/server/jobs/schedule';
import { setStage } from '$lib/server/jobs/stage';
import {
	callbackFor,
	callbackPage,
	closeCallback,
	logCallbackHours,
	reportProblem,
	scheduleCallback
} from '$lib/server/callbacks/callbacks';
import { costingOf, DEFAULT_COSTING_SETTINGS, saveCostingConfig } from '$lib/server/costing/report';
import { newToken } from '$lib/server/platform/crypto';
import { resetDatabase } from '../support/database';
import { yardJpeg } from '../fixtures/images/make';
import { makeEstimate, makeUser, seedFirm } from './fixtures';
import { firmToday } from '$lib/server/platform/settings';
import { load as todayLoad } from '../../src/routes/office/+page.server';

type TodayData = {
	crew: {
		callbacks: { id: string; job: string; address: string; description: string }[];
	} | null;
};

/** The Today page's data as the given staff member sees it. */
async function todayOf(user: SessionUser) {
	const event = { locals: { user }, url: new URL('http://localhost/office') };
	return (await todayLoad(event as never)) as unknown as TodayData;
}

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

/** A sold job taken to completion the way the office does it; returns the link in its mail. */
async function completedJob() {
	const fixture = await makeEstimate({ accepted: true });
	const { jobId } = await convertAcceptedEstimate(fixture.estimateId);
	await scheduleJob(jobId, { days: ['2027-05-14'], crewLeadId: rosa.id, crewSize: 2 }, owner);
	await setStage(owner, jobId, 'underway');
	await setStage(owner, jobId, 'complete');
	const [mail] = await db.select().from(outbox).where(eq(outbox.to, fixture.email));
	const link = /\/callback\/([A-Za-z0-9_-]+)/.exec(mail.text);
	if (!link) throw new Error('the completion mail has no problem-report link');
	return { jobId, token: link[1], mail };
}

const photo = async () =>
	new File([new Uint8Array(await yardJpeg(800, 600))], 'leak by the basin.jpg', {
		type: 'image/jpeg'
	});

describe('warranty callbacks', () => {
	it('takes a report with a photo through the completion mail link, inside the warranty', async () => {
		const { jobId, token, mail } = await completedJob();
		expect(mail.text).toContain('If anything is ever not right with it');
		expect(await callbackPage(token)).toMatchObject({ reported: [] });
		expect(await callbackPage(newToken())).toBeNull();
		const done = await reportProblem(
			token,
			'The lowest column has stopped bubbling since the storm.',
			[await photo()]
		);
		expect(done).toMatchObject({ inWarranty: true });
		const [cb] = await db.select().from(callbacks).where(eq(callbacks.jobId, jobId));
		expect(cb).toMatchObject({ status: 'reported', inWarranty: true });
		const pics = await db.select().from(callbackPhotos).where(eq(callbackPhotos.callbackId, cb.id));
		expect(pics).toHaveLength(1);
		const [stored] = await db.select().from(photos).where(eq(photos.id, pics[0].photoId));
		// The inquiry's pipeline: a display and a thumbnail in WebP, the name kept as text only.
		expect(stored).toMatchObject({
			context: 'callback',
			jobId,
			originalName: 'leak by the basin.jpg'
		});
		expect(stored.displayKey).toMatch(/\.webp$/);
		// The office hears of it.
		const alert = await db
			.select()
			.from(outbox)
			.where(eq(outbox.dedupeKey, `callback:${cb.id}:reported`));
		expect(alert).toHaveLength(1);
	});

	it('marks a callback reported after the warranty period as outside it', async () => {
		const { jobId, token } = await completedJob();
		// Completed two years before today's report, with a twelve-month warranty.
		await db
			.update(jobs)
			.set({ completedAt: new Date(Date.now() - 2 * 365 * 86_400_000) })
			.where(eq(jobs.id, jobId));
		const late = await reportProblem(token, 'The stream liner is leaking at the second fall.', []);
		expect(late).toMatchObject({ inWarranty: false });
		const [cb] = await db.select().from(callbacks).where(eq(callbacks.id, late!.id));
		expect(cb.inWarranty).toBe(false);
		expect(cb.warrantyEndsOn! < cb.reportedOn).toBe(true);
		// A longer warranty set later does not rewrite the callback already reported, but covers
		// the next report.
		await saveCostingConfig({ ...DEFAULT_COSTING_SETTINGS, warrantyMonths: 36 });
		const next = await reportProblem(token, 'A light by the columns has gone out again.', []);
		expect(next).toMatchObject({ inWarranty: true });
		const [again] = await db.select().from(callbacks).where(eq(callbacks.id, late!.id));
		expect(again.inWarranty).toBe(false);
	});

	it('is scheduled for a crew lead, its hours count against the margin, and it closes with notes', async () => {
		const { jobId, token } = await completedJob();
		const { id } = (await reportProblem(token, 'Water level drops an inch a day.', []))!;
		const [job] = await db.select().from(jobs).where(eq(jobs.id, jobId));
		const before = (await costingOf(job)).costing;
		await expect(callbackFor(rosa, id)).rejects.toThrow(JobError);
		await scheduleCallback(id, { assignedTo: rosa.id, scheduledOn: '2027-08-03' });
		expect((await callbackFor(rosa, id)).status).toBe('scheduled');
		await expect(callbackFor(other, id)).rejects.toThrow('assigned to someone else');
		const key = newToken();
		await logCallbackHours(rosa, id, {
			person: 'Rosa',
			workDate: '2027-08-03',
			minutes: 90,
			clientKey: key
		});
		// The same form sent twice stores the hours once.
		await logCallbackHours(rosa, id, {
			person: 'Rosa',
			workDate: '2027-08-03',
			minutes: 90,
			clientKey: key
		});
		const after = (await costingOf(job)).costing;
		// The demo estimate's labor rate: installer at 3800 ¢ an hour (cost) → 1.5 h = 5700 ¢.
		expect(after.labor.callbackHours).toBe(1.5);
		expect(after.labor.callbackCents).toBe(5_700);
		expect(before.profitCents - after.profitCents).toBe(5_700);
		// Callback hours are apart from the install's own hours per task.
		expect(after.labor.actualHours).toBe(before.labor.actualHours);
		await closeCallback(rosa, id, 'Reset the autofill float; no leak found.');
		expect(await callbackFor(owner, id)).toMatchObject({
			status: 'fixed',
			closingNotes: 'Reset the autofill float; no leak found.'
		});
		await expect(closeCallback(owner, id, 'again')).rejects.toThrow('already closed');
	});

	it("shows a callback dated today on its crew lead's Today page, and on no other crew lead's", async () => {
		const { token } = await completedJob();
		const description = 'The pump hums but no water comes over the spillway.';
		const { id } = (await reportProblem(token, description, []))!;
		expect((await todayOf(rosa)).crew!.callbacks).toEqual([]);
		await scheduleCallback(id, { assignedTo: rosa.id, scheduledOn: await firmToday() });
		const [shown] = (await todayOf(rosa)).crew!.callbacks;
		expect(shown).toMatchObject({ id, description });
		expect(shown.job).toMatch(/^J-\d+ /);
		expect(shown.address).not.toBe('');
		// The link on the Today page opens for the crew lead it is assigned to.
		expect((await callbackFor(rosa, id)).id).toBe(id);
		expect((await todayOf(other)).crew!.callbacks).toEqual([]);
	});
});
