import { beforeEach, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '$lib/server/platform/db';
import {
	activities,
	changeOrders,
	contacts,
	jobMaterials,
	jobs,
	leads,
	outbox,
	testimonials
} from '$lib/server/platform/db/schema';
import { addPunchItem, setPunchDone } from '$lib/server/jobs/checklists';
import { convertAcceptedEstimate, recordSaleByHand } from '$lib/server/jobs/conversion';
import { crewConflicts, crewJobView, jobFor } from '$lib/server/jobs/read';
import { jobBalance } from '$lib/server/payments/balance';
import { JobError } from '$lib/server/jobs/errors';
import { scheduleJob } from '$lib/server/jobs/schedule';
import { setStage } from '$lib/server/jobs/stage';
import {
	createChangeOrder,
	decideChangeOrder,
	sendChangeOrder
} from '$lib/server/jobs/change-orders';
import { nextCareDate, sendCareReminder, unsubscribeCare } from '$lib/server/care/reminders';
import { deliverOutboxMessage } from '$lib/server/platform/outbox';
import type { SessionUser } from '$lib/server/auth/sessions';
import { resetDatabase } from '../support/database';
import { allMail, clearMail, linkIn, waitForMail } from '../support/mailbox';
import { demoDesign } from '../../scripts/seed/demo-catalog';
import { makeEstimate, makeUser, seedFirm } from './fixtures';
import { actions as jobPageActions } from '../../src/routes/office/jobs/[id]/+page.server';
import { load as jobsListLoad } from '../../src/routes/office/jobs/+page.server';

let owner: SessionUser;
let crewA: SessionUser;
let crewB: SessionUser;

beforeEach(async () => {
	await resetDatabase();
	await clearMail();
	await seedFirm();
	owner = await makeUser('owner');
	crewA = await makeUser('crew', 'rosa@test.example', 'Crew A');
	crewB = await makeUser('crew', 'other@test.example', 'Crew B');
});

async function refusal(run: () => Promise<unknown>): Promise<JobError> {
	try {
		await run();
	} catch (error) {
		if (error instanceof JobError) return error;
		throw error;
	}
	throw new Error('expected a refusal');
}

/** Every key anywhere in a value, nested. */
function keysOf(value: unknown, out: string[] = []): string[] {
	if (Array.isArray(value)) value.forEach((v) => keysOf(v, out));
	else if (value && typeof value === 'object') {
		for (const [k, v] of Object.entries(value)) {
			out.push(k);
			keysOf(v, out);
		}
	}
	return out;
}

describe('converting a sold estimate', () => {
	it('makes exactly one job when ten conversions race', async () => {
		const { estimateId, contactId, leadId } = await makeEstimate({ accepted: true });
		const outcomes = await Promise.allSettled(
			Array.from({ length: 10 }, () => convertAcceptedEstimate(estimateId))
		);
		const made = outcomes.filter((o) => o.status === 'fulfilled');
		expect(made).toHaveLength(1);
		const reasons = outcomes
			.filter((o): o is PromiseRejectedResult => o.status === 'rejected')
			.map((o) => (o.reason as JobError).code);
		expect(reasons).toEqual(Array(9).fill('already_converted'));
		const rows = await db.select().from(jobs).where(eq(jobs.estimateId, estimateId));
		expect(rows).toHaveLength(1);
		const materials = await db
			.select()
			.from(jobMaterials)
			.where(eq(jobMaterials.jobId, rows[0].id));
		// The demo takeoff: 19 base lines + the pebble topping chosen; not the wall, not the slate.
		expect(materials.map((m) => m.sku)).toContain('AGG-PEBBLE-RIVER');
		expect(materials.map((m) => m.sku)).not.toContain('AGG-SLATE-CHIP');
		expect(materials.map((m) => m.sku)).not.toContain('WALL-UNIT-16');
		expect(materials.find((m) => m.sku === 'STONE-BASALT-COL')).toMatchObject({
			category: 'stone',
			unit: 'ton',
			quantity: 0.8
		});
		expect(materials.find((m) => m.sku.startsWith('pump:'))?.category).toBe('pump');
		const [contact] = await db.select().from(contacts).where(eq(contacts.id, contactId));
		expect(contact.isCustomer).toBe(true);
		const [lead] = await db.select().from(leads).where(eq(leads.id, leadId));
		expect(lead.stage).toBe('sold');
		const timeline = await db
			.select()
			.from(activities)
			.where(and(eq(activities.leadId, leadId), eq(activities.kind, 'job.created')));
		expect(timeline).toHaveLength(1);
		expect(rows[0].crewNeeded).toBe(4);
		// 30% of the demo's $8,082.91 (base + pebble). Worked by hand: base materials $3,414.20
		// taxable + $126.50 haul-off + $140.00 delivery, labor 38.389 crew-hours × $85 = $3,263.06:
		// subtotal $6,943.76, markup 10% $694.38, tax 7.25% of $3,414.20 × 1.1 = $272.28, so
		// $7,910.42; the pebble $87.50 + 0.741 h × $85 = $62.96, markup $15.05, tax $6.98: $172.49.
		expect(rows[0].depositDueCents).toBe(242487);
		expect(rows[0].frozen.choices.alternates.topping).toBe('topping-pebble');
		// The job is named after the design, not after the first line of the scope text.
		expect(rows[0].title).toBe(demoDesign().name);
	});

	it('refuses an estimate that is not accepted, and one already converted, with the reason', async () => {
		const sent = await makeEstimate({ accepted: false });
		const notAccepted = await refusal(() => convertAcceptedEstimate(sent.estimateId));
		expect(notAccepted.code).toBe('not_accepted');
		expect(notAccepted.message).toMatch(/is sent, not accepted/);
		const sold = await makeEstimate({ accepted: true });
		const { number } = await convertAcceptedEstimate(sold.estimateId);
		const again = await refusal(() => convertAcceptedEstimate(sold.estimateId));
		expect(again.code).toBe('already_converted');
		expect(again.message).toContain(`J-${number}`);
		const missing = await refusal(() => convertAcceptedEstimate('nope'));
		expect(missing.code).toBe('not_found');
	});

	it('records a paper acceptance by hand and runs the same conversion once', async () => {
		const sent = await makeEstimate({ accepted: false });
		const first = recordSaleByHand(
			sent.estimateId,
			{ typedName: 'Ines Harrow', method: 'paper', acceptedOn: new Date('2027-05-02') },
			owner
		);
		const second = recordSaleByHand(
			sent.estimateId,
			{ typedName: 'Ines Harrow', method: 'paper', acceptedOn: new Date('2027-05-02') },
			owner
		);
		const settled = await Promise.allSettled([first, second]);
		expect(settled.filter((s) => s.status === 'fulfilled')).toHaveLength(1);
		const [job] = await db.select().from(jobs).where(eq(jobs.estimateId, sent.estimateId));
		expect(job.frozen.acceptance).toMatchObject({ method: 'paper', recordedBy: owner.id });
		expect(job.contractCents).toBe(sent.result.pricing.totalCents);
	});
});

describe('a job', () => {
	async function soldJob() {
		const fixture = await makeEstimate({ accepted: true });
		const { jobId } = await convertAcceptedEstimate(fixture.estimateId);
		return { ...fixture, jobId };
	}

	it('adds approved change orders to the total, and ignores drafts and declined ones', async () => {
		const { jobId, email } = await soldJob();
		const [job] = await db.select().from(jobs).where(eq(jobs.id, jobId));
		const lines = [
			{
				description: 'Third uplight',
				category: 'lighting',
				unit: 'each',
				quantity: 1,
				unitPriceCents: 14_950
			},
			{
				description: 'Path light left out',
				category: 'lighting',
				unit: 'each',
				quantity: -1,
				unitPriceCents: 9_900
			}
		];
		const approvedId = await createChangeOrder(
			jobId,
			{ title: 'Swap a light', note: '', lines },
			owner
		);
		const declinedId = await createChangeOrder(
			jobId,
			{ title: 'Boulders instead of a wall', note: '', lines: [{ ...lines[0], quantity: 3 }] },
			owner
		);
		await createChangeOrder(jobId, { title: 'Still a draft', note: '', lines }, owner);
		const { url } = await sendChangeOrder(jobId, approvedId, owner);
		const declined = await sendChangeOrder(jobId, declinedId, owner);
		const token = (u: string) => new URL(u).pathname.split('/').pop()!;
		const meta = { ipAddress: '203.0.113.9', userAgent: 'phone browser' };
		expect(
			await decideChangeOrder(token(url), { decision: 'approve', typedName: 'Ines Harrow' }, meta)
		).toBe('approved');
		expect(
			await decideChangeOrder(
				token(declined.url),
				{ decision: 'decline', typedName: 'Ines Harrow', reason: 'Later' },
				meta
			)
		).toBe('declined');
		await expect(
			decideChangeOrder(token(url), { decision: 'approve', typedName: 'Ines Harrow' }, meta)
		).rejects.toThrow(/already approved/);
		const balance = await jobBalance(jobId);
		expect(balance.changeOrdersCents).toBe(14_950 - 9_900);
		expect(balance.totalCents).toBe(job.contractCents + 5_050);
		expect(balance.balanceCents).toBe(balance.totalCents);
		const [co] = await db.select().from(changeOrders).where(eq(changeOrders.id, approvedId));
		expect(co).toMatchObject({
			typedName: 'Ines Harrow',
			ipAddress: '203.0.113.9',
			acceptedTotalCents: 5_050
		});
		const added = await db
			.select()
			.from(jobMaterials)
			.where(eq(jobMaterials.changeOrderId, approvedId));
		expect(added.map((m) => m.quantity).sort()).toEqual([-1, 1]);
		const sentToHome = await db.select().from(outbox).where(eq(outbox.to, email));
		expect(sentToHome).toHaveLength(2);
		for (const row of sentToHome) await deliverOutboxMessage(row.id);
		const mail = await waitForMail(email, /CO-1/);
		expect(linkIn(mail, /^\/change-order\//)).toBe(url);
	});

	it("the job page keeps a refused draft as typed with each message beside its line, and sends no other job's change order", async () => {
		const { jobId } = await soldJob();
		const other = await soldJob();
		const post = async (action: 'changeOrder' | 'sendChangeOrder', id: string, body: FormData) => {
			const url = `http://127.0.0.1/office/jobs/${id}?/${action}`;
			try {
				return (await jobPageActions[action]({
					params: { id },
					locals: { user: owner },
					url: new URL(url),
					request: new Request(url, { method: 'POST', body })
				} as never)) as {
					status?: number;
					data?: {
						message?: string;
						errors?: Record<string, string>;
						values?: Record<string, string>;
					};
				};
			} catch (e) {
				return {
					status: (e as { status: number }).status,
					data: { message: (e as { body: { message: string } }).body.message }
				};
			}
		};
		const draft = new FormData();
		draft.set('title', 'Two more uplights');
		draft.set('note', '');
		for (const [i, [description, quantity, unitPrice]] of [
			['', '', ''],
			['Uplight by the maple', 'two', '149.50'],
			['Stone step', '1', 'lots']
		].entries()) {
			draft.set(`lines.${i}.description`, description);
			draft.set(`lines.${i}.category`, 'lighting');
			draft.set(`lines.${i}.unit`, 'each');
			draft.set(`lines.${i}.quantity`, quantity);
			draft.set(`lines.${i}.unitPrice`, unitPrice);
		}
		const refused = await post('changeOrder', jobId, draft);
		expect(refused.status).toBe(400);
		expect(refused.data?.errors).toEqual({
			'lines.1.quantity': 'Enter a quantity such as 2 or -1',
			'lines.2.unitPrice': 'Enter a price such as 120.50'
		});
		expect(refused.data?.message).toBe('Not saved: check the fields marked.');
		expect(refused.data?.values?.title).toBe('Two more uplights');
		expect([0, 1, 2].map((i) => refused.data?.values?.[`lines.${i}.quantity`])).toEqual([
			'',
			'two',
			'1'
		]);
		expect(refused.data?.values?.['lines.2.unitPrice']).toBe('lots');
		expect(await db.select().from(changeOrders)).toHaveLength(0);

		const coId = await createChangeOrder(
			other.jobId,
			{
				title: 'Other job',
				note: '',
				lines: [
					{ description: 'x', category: 'other', unit: 'each', quantity: 1, unitPriceCents: 100 }
				]
			},
			owner
		);
		const send = new FormData();
		send.set('changeOrderId', coId);
		const wrongJob = await post('sendChangeOrder', jobId, send);
		expect(wrongJob.status).toBe(404);
		expect(wrongJob.data?.message).toBe('There is no such change order.');
		const [stillDraft] = await db.select().from(changeOrders).where(eq(changeOrders.id, coId));
		expect(stillDraft.status).toBe('draft');
		const none = await post('sendChangeOrder', jobId, new FormData());
		expect(none).toMatchObject({ status: 400, data: { message: 'Pick a change order' } });
	});

	it('refuses a change order on a paid job', async () => {
		const { jobId } = await soldJob();
		await db.update(jobs).set({ stage: 'paid' }).where(eq(jobs.id, jobId));
		const refused = await refusal(() =>
			createChangeOrder(
				jobId,
				{
					title: 'Late idea',
					note: '',
					lines: [
						{ description: 'x', category: 'other', unit: 'each', quantity: 1, unitPriceCents: 100 }
					]
				},
				owner
			)
		);
		expect(refused.code).toBe('job_paid');
	});

	it("keeps a crew lead out of another crew's job and gives crew no prices", async () => {
		const { jobId } = await soldJob();
		await scheduleJob(
			jobId,
			{ days: ['2027-06-07', '2027-06-08'], crewLeadId: crewA.id, crewSize: 4 },
			owner
		);
		expect((await jobFor(crewA, jobId)).id).toBe(jobId);
		expect((await refusal(() => jobFor(crewB, jobId))).code).toBe('forbidden');
		expect((await refusal(() => addPunchItem(crewB, jobId, 'not mine'))).code).toBe('forbidden');
		const view = await crewJobView(await jobFor(crewA, jobId));
		expect(view.materials.length).toBeGreaterThan(10);
		const keys = keysOf(view);
		expect(keys.filter((k) => /cent|price|cost|margin|total/i.test(k))).toEqual([]);
		expect(JSON.stringify(view)).not.toMatch(/Cents|unitPrice/);
	});

	it('warns when a crew lead is booked on two jobs the same day', async () => {
		const one = await soldJob();
		const two = await soldJob();
		await scheduleJob(
			one.jobId,
			{ days: ['2027-06-07', '2027-06-08'], crewLeadId: crewA.id, crewSize: 4 },
			owner
		);
		const conflicts = await scheduleJob(
			two.jobId,
			{ days: ['2027-06-08'], crewLeadId: crewA.id, crewSize: 3 },
			owner
		);
		expect(conflicts.map((c) => [c.day, c.jobId])).toEqual([['2027-06-08', one.jobId]]);
		await scheduleJob(
			two.jobId,
			{ days: ['2027-06-09'], crewLeadId: crewA.id, crewSize: 3 },
			owner
		);
		expect(await crewConflicts(two.jobId)).toEqual([]);
	});

	it('completes only with an empty punch list, fixes the balance and asks for a testimonial once', async () => {
		const { jobId, email } = await soldJob();
		await scheduleJob(jobId, { days: ['2027-06-07'], crewLeadId: crewA.id, crewSize: 4 }, owner);
		await setStage(crewA, jobId, 'underway');
		await addPunchItem(crewA, jobId, 'Reset the wobbly accent stone');
		await setStage(crewA, jobId, 'punch_list');
		const refused = await refusal(() => setStage(crewA, jobId, 'complete'));
		expect(refused.code).toBe('open_punch_items');
		const view = await crewJobView(await jobFor(crewA, jobId));
		await setPunchDone(crewA, jobId, view.punch[0].id, true);
		await setStage(crewA, jobId, 'complete');
		const [job] = await db.select().from(jobs).where(eq(jobs.id, jobId));
		expect(job.stage).toBe('complete');
		expect(job.finalBalanceCents).toBe(job.contractCents);
		expect(await db.select().from(testimonials).where(eq(testimonials.jobId, jobId))).toHaveLength(
			1
		);
		const [request] = await db
			.select()
			.from(outbox)
			.where(eq(outbox.dedupeKey, `testimonial:${jobId}`));
		expect(request.to).toBe(email);
		expect(request.text).toMatch(/\/testimonial\/[\w-]{20,}/);
		expect((await refusal(() => setStage(crewA, jobId, 'underway'))).code).toBe('bad_stage');
	});
});

describe('seasonal care', () => {
	it('picks the 1st of the next care month at 09:00 in the firm time zone', () => {
		const months = { shutdownMonth: 10, startupMonth: 4 };
		expect(nextCareDate(new Date('2027-06-15T12:00:00Z'), months, 'America/Denver')).toEqual({
			kind: 'shutdown',
			season: 'shutdown-2027',
			at: new Date('2027-10-01T15:00:00Z')
		});
		expect(nextCareDate(new Date('2027-10-02T12:00:00Z'), months, 'America/Denver')).toEqual({
			kind: 'startup',
			season: 'startup-2028',
			at: new Date('2028-04-01T15:00:00Z')
		});
		// January in Denver is MST (UTC−7).
		expect(
			nextCareDate(
				new Date('2027-12-01T00:00:00Z'),
				{ shutdownMonth: 11, startupMonth: 1 },
				'America/Denver'
			).at
		).toEqual(new Date('2028-01-01T16:00:00Z'));
	});

	it('sends a season reminder once even when its job runs twice, and the unsubscribe link stops the next', async () => {
		const { estimateId, email } = await makeEstimate({ accepted: true });
		const { jobId } = await convertAcceptedEstimate(estimateId);
		expect(await sendCareReminder(jobId, 'shutdown-2027', { chain: false })).toBe('sent');
		expect(await sendCareReminder(jobId, 'shutdown-2027', { chain: false })).toBe('already-sent');
		const rows = await db
			.select()
			.from(outbox)
			.where(eq(outbox.dedupeKey, `care:${jobId}:shutdown-2027`));
		expect(rows).toHaveLength(1);
		expect(await deliverOutboxMessage(rows[0].id)).not.toBe('missing');
		const mail = await waitForMail(email, /autumn shut-down/);
		expect(mail.text).toMatch(/GFCI/);
		await new Promise((r) => setTimeout(r, 300));
		expect((await allMail()).filter((m) => /autumn shut-down/.test(m.subject))).toHaveLength(1);
		const token = linkIn(mail, /^\/care\/unsubscribe\//)
			.split('/')
			.pop()!;
		expect(await unsubscribeCare(token)).toBe(true);
		expect(await unsubscribeCare('not-a-token')).toBe(false);
		expect(await sendCareReminder(jobId, 'startup-2028', { chain: false })).toBe('opted-out');
	});
});

describe('the jobs list', () => {
	const calendarFrom = async (from: string) => {
		const url = new URL(`http://127.0.0.1/office/jobs?from=${encodeURIComponent(from)}`);
		const page = (await jobsListLoad({ url, locals: { user: owner } } as never)) as {
			calendar: { start: string; end: string };
			today: string;
		};
		return { ...page.calendar, today: page.today };
	};

	it('starts from the Monday of the week asked for, and from today for a date that is not real', async () => {
		expect(await calendarFrom('2027-05-14')).toMatchObject({
			start: '2027-05-10',
			end: '2027-05-30'
		});
		for (const bad of ['2027-13-01', '2027-02-30', 'soon']) {
			const cal = await calendarFrom(bad);
			const today = new Date(`${cal.today}T00:00:00Z`);
			const monday = new Date(today.getTime() - ((today.getUTCDay() + 6) % 7) * 86_400_000);
			expect(cal.start, bad).toBe(monday.toISOString().slice(0, 10));
		}
	});
});
