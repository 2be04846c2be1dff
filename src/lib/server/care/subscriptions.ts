// A homeowner's care plan: the offer for their features, sign-up with the terms accepted (name
// typed, time, address), payment by card for the year through the payment provider (as for
// deposits) or an invoice after each visit, the yearly renewal with its reminder, and cancel.
// Everything goes through the property's private link.
import { and, desc, eq, inArray, isNull } from 'drizzle-orm';
import type Stripe from 'stripe';
import { db } from '../platform/db';
import {
	careCheckouts,
	carePlans,
	careSubscriptions,
	serviceVisits,
	type CareSubscription
} from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { origin } from '../platform/env';
import { writeMail } from '../platform/outbox';
import { defineJob, enqueue } from '../platform/queue';
import { firmSettings } from '../platform/settings';
import { firmOn } from '../payments/mail';
import { CURRENCY, dispatchAll } from '../payments/ledger';
import { createCheckout, paymentsClient } from '../payments/provider';
import { quotePlan, VISIT_LABELS, type FeatureKind, type FeatureSize } from '$lib/care/kinds';
import { CareError, dayIn, plusYear, type Tx } from './db';
import { addressOf, featuresOf, propertyRecord } from './features';
import { listPlans, planById } from './plans';
import { careLink, newCareLink } from './links';
import { build, dayText } from './mail';
import { addDays } from '$lib/scheduling/zone';
import { formatCents } from '$lib/money';

const RENEWAL_JOB = 'care.renewal';
const RENEWAL_NOTICE_DAYS = 30;

export async function currentSubscription(propertyId: string, tx: Tx | typeof db = db) {
	const [row] = await tx
		.select()
		.from(careSubscriptions)
		.where(and(eq(careSubscriptions.propertyId, propertyId), isNull(careSubscriptions.cancelledAt)))
		.orderBy(desc(careSubscriptions.createdAt))
		.limit(1);
	return row ?? null;
}

const asFeatures = (rows: Awaited<ReturnType<typeof featuresOf>>) =>
	rows.map((f) => ({ ...f, kind: f.kind as FeatureKind, size: f.size as FeatureSize }));

/** What the homeowner's care page shows. */
export async function homeownerCare(propertyId: string) {
	const [record, features, plans, firm, subscription] = await Promise.all([
		propertyRecord(propertyId),
		featuresOf(propertyId),
		listPlans({ activeOnly: true }),
		firmSettings(),
		currentSubscription(propertyId)
	]);
	const typed = asFeatures(features);
	const offers = plans
		.map((plan) => ({ plan, quote: quotePlan(plan, typed) }))
		.filter((o) => o.quote.yearCents > 0);
	const current = subscription
		? {
				...subscription,
				plan: await planById(subscription.planId),
				visits: await db
					.select()
					.from(serviceVisits)
					.where(eq(serviceVisits.subscriptionId, subscription.id))
					.orderBy(serviceVisits.windowStart)
			}
		: null;
	const today = dayIn(firm.timeZone);
	return {
		firm: { name: firm.firmName, phone: firm.phone, email: firm.email },
		homeowner: record.contact.name,
		address: addressOf(record.property),
		features: typed,
		offers,
		current,
		today,
		renewalDue: current ? renewalDue(current, today) : false
	};
}

/** A yearly plan may be paid for the next year from 45 days before it renews. */
function renewalDue(s: CareSubscription, today: string): boolean {
	if (s.billing !== 'year' || s.status !== 'active') return false;
	const opens = addDays(s.renewsOn, -45);
	return today >= opens && (s.paidThrough ?? '') < s.renewsOn;
}

export interface SignUp {
	planId: string;
	billing: 'year' | 'visit';
	typedName: string;
	ipAddress: string | null;
}

/** Records the homeowner's sign-up; a per-visit plan is active at once, a yearly one once paid. */
export async function signUp(propertyId: string, input: SignUp): Promise<CareSubscription> {
	const firm = await firmSettings();
	const result = await db.transaction(async (tx) => {
		const record = await propertyRecord(propertyId, tx);
		const plan = await planById(input.planId, tx);
		if (!plan.active) throw new CareError('invalid', 'This plan is no longer offered.');
		if (input.billing === 'year' && !plan.payYearly) {
			throw new CareError('invalid', 'This plan is invoiced after each visit.');
		}
		if (input.billing === 'visit' && !plan.payPerVisit) {
			throw new CareError('invalid', 'This plan is paid for the year ahead.');
		}
		if (await currentSubscription(propertyId, tx)) {
			throw new CareError('conflict', 'This property already has a care plan.');
		}
		const features = asFeatures(await featuresOf(propertyId, tx));
		const quote = quotePlan(plan, features);
		if (quote.yearCents === 0) {
			throw new CareError('invalid', 'This plan does not cover any feature on record here.');
		}
		const startsOn = dayIn(firm.timeZone);
		const [row] = await tx
			.insert(careSubscriptions)
			.values({
				id: newId(),
				planId: plan.id,
				propertyId,
				contactId: record.contact.id,
				billing: input.billing,
				status: input.billing === 'visit' ? 'active' : 'pending',
				featureIds: [...new Set(quote.lines.map((l) => l.featureId))],
				yearCents: quote.yearCents,
				typedName: input.typedName,
				acceptedAt: new Date(),
				ipAddress: input.ipAddress,
				startsOn,
				renewsOn: plusYear(startsOn)
			})
			.onConflictDoNothing()
			.returning();
		if (!row) throw new CareError('conflict', 'This property already has a care plan.');
		const mails = row.status === 'active' ? await welcomeMail(tx, row) : [];
		return { row, mails };
	});
	await dispatchAll(result.mails);
	if (result.row.status === 'active') await queueRenewal(result.row);
	return result.row;
}

async function welcomeMail(tx: Tx, s: CareSubscription): Promise<string[]> {
	const firm = await firmOn(tx);
	const record = await propertyRecord(s.propertyId, tx);
	if (!record.contact.email) return [];
	const plan = await planById(s.planId, tx);
	const visits = plan.visits.map((v) => VISIT_LABELS[v.kind]).join(', ');
	// A fresh private link: a homeowner who signed up on the public page has had none by mail.
	const token = await newCareLink(s.propertyId, null, tx);
	const mail = build(
		firm,
		`Your care plan: ${plan.name}`,
		[
			`Hello ${record.contact.name},`,
			`Thank you: “${plan.name}” is in place for ${addressOf(record.property)} from ${dayText(s.startsOn)} to ${dayText(s.renewsOn)}. It includes: ${visits}.`,
			s.billing === 'year'
				? `The year is paid (${formatCents(s.yearCents)}). Parts we use are invoiced after the visit.`
				: `We invoice each visit after it is done (about ${formatCents(s.yearCents)} for the year), with any parts used.`,
			`We will e-mail you the date of each visit, with a link to ask for another. Your plan, its visits and cancelling are at the link below.`
		],
		{ label: 'Your care plan', url: `${origin()}/care/${token}` }
	);
	const id = await writeMail(
		{ ...mail, to: record.contact.email, dedupeKey: `care-welcome:${s.id}` },
		tx
	);
	return id ? [id] : [];
}

/** Starts (or reuses) the provider checkout for the year ahead: the first year, or the renewal. */
export async function startPlanCheckout(propertyId: string, token: string): Promise<string> {
	const s = await currentSubscription(propertyId);
	if (!s || s.billing !== 'year') throw new CareError('invalid', 'Nothing is due on this plan.');
	const firm = await firmSettings();
	const renewing = s.status === 'active';
	if (renewing && !renewalDue(s, dayIn(firm.timeZone))) {
		throw new CareError('invalid', 'This year is paid.');
	}
	const coversThrough = addDays(renewing ? plusYear(s.renewsOn) : s.renewsOn, -1);
	const [open] = await db
		.select()
		.from(careCheckouts)
		.where(
			and(
				eq(careCheckouts.subscriptionId, s.id),
				eq(careCheckouts.status, 'open'),
				eq(careCheckouts.coversThrough, coversThrough)
			)
		)
		.orderBy(desc(careCheckouts.createdAt))
		.limit(1);
	if (open && open.amountCents === s.yearCents) {
		const session = await paymentsClient().checkout.sessions.retrieve(open.providerSessionId);
		if (session.status === 'open' && session.url) return session.url;
	}
	const plan = await planById(s.planId);
	const record = await propertyRecord(propertyId);
	const base = `${origin()}/care/${encodeURIComponent(token)}`;
	const session = await createCheckout({
		amountCents: s.yearCents,
		currency: CURRENCY,
		description: `${plan.name}, a year of care to ${dayText(coversThrough)}`,
		reference: s.id,
		email: record.contact.email ?? undefined,
		successUrl: `${base}/paid?session={CHECKOUT_SESSION_ID}`,
		cancelUrl: `${base}?cancelled=1`,
		metadata: { careSubscriptionId: s.id }
	});
	await db.insert(careCheckouts).values({
		id: newId(),
		subscriptionId: s.id,
		coversThrough,
		amountCents: s.yearCents,
		currency: CURRENCY,
		providerSessionId: session.id,
		url: session.url
	});
	return session.url;
}

type PaidSession = Pick<
	Stripe.Checkout.Session,
	'id' | 'amount_total' | 'currency' | 'payment_status'
>;

/**
 * Records a paid care checkout once, in the webhook's (or the return page's) transaction.
 * Returns null when the checkout is not one of care's, so the job payments take it.
 */
export async function fulfilCareInTx(
	tx: Tx,
	session: PaidSession
): Promise<{ outcome: string; mails: string[]; after: (() => Promise<void>)[] } | null> {
	const [request] = await tx
		.select()
		.from(careCheckouts)
		.where(eq(careCheckouts.providerSessionId, session.id))
		.for('update');
	if (!request) return null;
	if (session.payment_status !== 'paid') return { outcome: 'not_paid', mails: [], after: [] };
	if (request.status === 'paid') return { outcome: 'duplicate_checkout', mails: [], after: [] };
	if (
		session.amount_total !== request.amountCents ||
		(session.currency ?? '').toLowerCase() !== request.currency
	) {
		await tx
			.update(careCheckouts)
			.set({ problem: `Asked ${request.amountCents}, provider reported ${session.amount_total}` })
			.where(eq(careCheckouts.id, request.id));
		return { outcome: 'amount_mismatch', mails: [], after: [] };
	}
	await tx
		.update(careCheckouts)
		.set({ status: 'paid', paidAt: new Date() })
		.where(eq(careCheckouts.id, request.id));
	if (request.serviceVisitId) {
		await tx
			.update(serviceVisits)
			.set({ paidAt: new Date() })
			.where(eq(serviceVisits.id, request.serviceVisitId));
		return { outcome: 'recorded', mails: [], after: [] };
	}
	const [s] = await tx
		.select()
		.from(careSubscriptions)
		.where(eq(careSubscriptions.id, request.subscriptionId!))
		.for('update');
	const wasPending = s.status === 'pending';
	const [updated] = await tx
		.update(careSubscriptions)
		.set({
			status: s.status === 'cancelled' ? 'cancelled' : 'active',
			paidThrough: request.coversThrough
		})
		.where(eq(careSubscriptions.id, s.id))
		.returning();
	const mails = wasPending ? await welcomeMail(tx, updated) : [];
	return {
		outcome: 'recorded',
		mails,
		after: wasPending ? [() => queueRenewal(updated)] : []
	};
}

/** The return page: asks the provider and records the payment if the webhook has not yet. */
export async function confirmCareReturn(
	sessionId: string,
	owner: { subscriptionId?: string; serviceVisitId?: string }
) {
	const [request] = await db
		.select()
		.from(careCheckouts)
		.where(
			and(
				eq(careCheckouts.providerSessionId, sessionId),
				owner.subscriptionId
					? eq(careCheckouts.subscriptionId, owner.subscriptionId)
					: eq(careCheckouts.serviceVisitId, owner.serviceVisitId ?? '')
			)
		);
	if (!request) return null;
	if (request.status === 'open') {
		const session = await paymentsClient().checkout.sessions.retrieve(sessionId);
		if (session.status === 'complete') {
			const done = await db.transaction((tx) => fulfilCareInTx(tx, session));
			if (done) {
				await dispatchAll(done.mails);
				for (const run of done.after) await run();
			}
		}
	}
	const [fresh] = await db.select().from(careCheckouts).where(eq(careCheckouts.id, request.id));
	return fresh;
}

/** Cancels the plan from the homeowner's link: no later visit is made and no more mail is sent. */
export async function cancelPlan(propertyId: string): Promise<boolean> {
	return db.transaction(async (tx) => {
		const s = await currentSubscription(propertyId, tx);
		if (!s) return false;
		await tx
			.update(careSubscriptions)
			.set({ status: 'cancelled', cancelledAt: new Date() })
			.where(eq(careSubscriptions.id, s.id));
		await tx
			.update(serviceVisits)
			.set({ status: 'cancelled' })
			.where(
				and(eq(serviceVisits.subscriptionId, s.id), inArray(serviceVisits.status, ['due', 'dated']))
			);
		return true;
	});
}

/** The subscription behind a property link, for the return page. */
export async function subscriptionForLink(token: string) {
	const link = await careLink(token);
	if (!link || link.serviceVisitId) return null;
	return { propertyId: link.propertyId, subscription: await currentSubscription(link.propertyId) };
}

// --- Renewal: a reminder 30 days before, then the plan rolls on for another year -------------

async function queueRenewal(s: CareSubscription): Promise<void> {
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

/** Active subscriptions whose visits are billed per visit in a season starting on `windowStart`. */
export function billedPerVisit(s: CareSubscription, windowStart: string): boolean {
	return s.billing === 'visit' || (s.paidThrough ?? '') < windowStart;
}

defineJob<{ subscriptionId: string; renewsOn: string; step: 'remind' | 'renew' }>(
	RENEWAL_JOB,
	async ({ subscriptionId, renewsOn, step }) => {
		if (step === 'remind') await sendRenewalReminder(subscriptionId, renewsOn);
		else await renewPlan(subscriptionId, renewsOn);
	}
);
