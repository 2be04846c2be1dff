// A care plan's yearly renewal: a reminder 30 days before (with the pay link for a yearly plan),
// then the plan rolls on for another year. Both are queued jobs, keyed to the renewal date so a
// plan renewed or cancelled meanwhile is left alone.
import { and, eq } from 'drizzle-orm';
import { db } from '../platform/db';
import { carePlans, careSubscriptions, type CareSubscription } from '../platform/db/schema';
import { origin } from '../platform/env';
import { writeMail } from '../platform/outbox';
import { defineJob, enqueue } from '../platform/queue';
import { firmOn } from '../payments/mail';
import { dispatchAll } from '../payments/ledger';
import { plusYear } from './db';
import { addressOf, propertyRecord } from './features';
import { newCareLink } from './links';
import { build, dayText } from './mail';
import { formatCents } from '$lib/money';

const RENEWAL_JOB = 'care.renewal';
const RENEWAL_NOTICE_DAYS = 30;

export async function queueRenewal(s: CareSubscription): Promise<void> {
	const notice = new Date(Date.parse(`${s.renewsOn}T16:00:00Z`) - RENEWAL_NOTICE_DAYS * 86_400_000);
	await enqueue(
		RENEWAL_JOB,
		{ subscriptionId: s.id, renewsOn: s.renewsOn, step: 'remind' },
		{ startAfter: notice, singletonKey: `${s.id}:${s.renewsOn}:remind` }
	);
	await enqueue(
		RENEWAL_JOB,
		{ subscriptionId: s.id, renewsOn: s.renewsOn, step: 'renew' },
		{ startAfter: new Date(`${s.renewsOn}T12:00:00Z`), singletonKey: `${s.id}:${s.renewsOn}:renew` }
	);
}

/** Sends the renewal reminder once (dedupe key per renewal date); nothing for a cancelled plan. */
export async function sendRenewalReminder(
	subscriptionId: string,
	renewsOn: string
): Promise<boolean> {
	const ids = await db.transaction(async (tx) => {
		const [s] = await tx
			.select()
			.from(careSubscriptions)
			.where(eq(careSubscriptions.id, subscriptionId));
		if (!s || s.status !== 'active' || s.renewsOn !== renewsOn) return [];
		const record = await propertyRecord(s.propertyId, tx);
		if (!record.contact.email) return [];
		const firm = await firmOn(tx);
		const [plan] = await tx.select().from(carePlans).where(eq(carePlans.id, s.planId));
		const token = await newCareLink(s.propertyId, null, tx);
		const mail = build(
			firm,
			`Your care plan renews on ${dayText(renewsOn)}`,
			[
				`Hello ${record.contact.name},`,
				`“${plan.name}” for ${addressOf(record.property)} renews on ${dayText(renewsOn)} for another year.`,
				s.billing === 'year'
					? `You can pay the next year (${formatCents(s.yearCents)}) from the link below. Until it is paid, visits of the new year are invoiced one by one.`
					: `Nothing to do: we keep invoicing each visit after it is done.`,
				`To stop the plan, open the same link and cancel.`
			],
			{ label: 'Your care plan', url: `${origin()}/care/${token}` }
		);
		const id = await writeMail(
			{ ...mail, to: record.contact.email, dedupeKey: `care-renewal:${s.id}:${renewsOn}` },
			tx
		);
		return id ? [id] : [];
	});
	await dispatchAll(ids);
	return ids.length > 0;
}

/** On the renewal date the plan rolls on a year (once: only when the date still matches). */
export async function renewPlan(subscriptionId: string, renewsOn: string): Promise<boolean> {
	const [row] = await db
		.update(careSubscriptions)
		.set({ renewsOn: plusYear(renewsOn) })
		.where(
			and(
				eq(careSubscriptions.id, subscriptionId),
				eq(careSubscriptions.renewsOn, renewsOn),
				eq(careSubscriptions.status, 'active')
			)
		)
		.returning();
	if (row) await queueRenewal(row);
	return Boolean(row);
}

defineJob<{ subscriptionId: string; renewsOn: string; step: 'remind' | 'renew' }>(
	RENEWAL_JOB,
	async ({ subscriptionId, renewsOn, step }) => {
		if (step === 'remind') await sendRenewalReminder(subscriptionId, renewsOn);
		else await renewPlan(subscriptionId, renewsOn);
	}
);
