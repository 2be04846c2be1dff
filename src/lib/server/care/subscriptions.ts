// A homeowner's care plan: the offer for their features, sign-up with the terms accepted (name
// typed, time, address), the welcome mail, and cancel. Payment by card for the year is in
// plan-checkout.ts, the yearly renewal with its reminder in renewal.ts. Everything goes through
// the property's private link.
import { and, desc, eq, inArray, isNull } from 'drizzle-orm';
import { db } from '../platform/db';
import { careSubscriptions, serviceVisits, type CareSubscription } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { origin } from '../platform/env';
import { writeMail } from '../platform/outbox';
import { firmSettings } from '../platform/settings';
import { firmOn } from '../payments/mail';
import { dispatchAll } from '../payments/ledger';
import { quotePlan, VISIT_LABELS, type FeatureKind, type FeatureSize } from '$lib/care/kinds';
import { CareError, dayIn, plusYear, type Tx } from './db';
import { addressOf, featuresOf, propertyRecord } from './features';
import { listPlans, planById } from './plans';
import { careLink, newCareLink } from './links';
import { build, dayText } from './mail';
import { addDays } from '$lib/scheduling/zone';
import { formatCents } from '$lib/money';
import { queueRenewal } from './renewal';

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
export function renewalDue(s: CareSubscription, today: string): boolean {
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

export async function welcomeMail(tx: Tx, s: CareSubscription): Promise<string[]> {
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

/** Active subscriptions whose visits are billed per visit in a season starting on `windowStart`. */
export function billedPerVisit(s: CareSubscription, windowStart: string): boolean {
	return s.billing === 'visit' || (s.paidThrough ?? '') < windowStart;
}
