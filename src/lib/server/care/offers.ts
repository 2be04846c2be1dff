// The plan offer: an e-mail with the property's private care link, sent by staff from the
// property page or in place of the old seasonal reminder for homeowners without a plan.
import { and, eq } from 'drizzle-orm';
import { db } from '../platform/db';
import { carePlans, serviceVisits } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { origin } from '../platform/env';
import { writeMail } from '../platform/outbox';
import { firmOn } from '../payments/mail';
import { dispatchAll } from '../payments/ledger';
import { FEATURE_LABELS, quotePlan, type FeatureKind, type FeatureSize } from '$lib/care/kinds';
import { seasonKey, seasonWindow } from '$lib/care/seasons';
import { CareError, type Tx } from './db';
import { addressOf, featuresOf, propertyRecord } from './features';
import { newCareLink } from './links';
import { build, dayText } from './mail';
import { seasonSettings } from './plans';
import { currentSubscription } from './subscriptions';

/** Writes the offer in the caller's transaction; returns the outbox id (null when already sent). */
export async function writePlanOffer(
	tx: Tx,
	propertyId: string,
	dedupeKey: string,
	intro?: string
): Promise<string | null> {
	const record = await propertyRecord(propertyId, tx);
	if (!record.contact.email) {
		throw new CareError('invalid', 'The homeowner has no e-mail address on file.');
	}
	const features = await featuresOf(propertyId, tx);
	const firm = await firmOn(tx);
	const token = await newCareLink(propertyId, null, tx);
	const names = features.map((f) => FEATURE_LABELS[f.kind as FeatureKind]?.toLowerCase() ?? f.kind);
	const mail = build(
		firm,
		`Seasonal care for ${addressOf(record.property) || 'your water feature'}`,
		[
			`Hello ${record.contact.name},`,
			...(intro ? [intro] : []),
			`A care plan looks after your ${names.length ? names.join(' and ') : 'feature'} through the year: a spring start-up, a shut-down before the first hard frost, and the visits the plan includes. You see the price for your features and can sign up, pay by card or be invoiced after each visit, and cancel, all from the link below.`
		],
		{ label: 'See the care plans for your features', url: `${origin()}/care/${token}` }
	);
	return writeMail({ ...mail, to: record.contact.email, dedupeKey }, tx);
}

/** Staff send the offer from the property page (each send is a new message with a fresh link). */
export async function sendPlanOffer(propertyId: string): Promise<void> {
	const id = await db.transaction((tx) =>
		writePlanOffer(tx, propertyId, `care-offer:${propertyId}:${newId()}`)
	);
	if (id) await dispatchAll([id]);
}

/**
 * What the seasonal reminder of a finished job says about care: for a homeowner with a plan
 * that includes this season's visit, the visit notice (nothing at all once the day has been
 * mailed, so they are not told twice); without a plan, the offer with the private link.
 * Null: the plain reminder (no plan covers their features, or their plan skips this visit).
 */
export async function reminderCare(
	tx: Tx,
	propertyId: string,
	reminder: 'shutdown' | 'startup',
	year: number
): Promise<
	| { covered: true }
	| { covered: false; paragraph: string; action: { label: string; url: string } }
	| null
> {
	const key = seasonKey(reminder === 'shutdown' ? 'autumn' : 'spring', year);
	const subscription = await currentSubscription(propertyId, tx);
	if (subscription?.status === 'active') {
		const [plan] = await tx.select().from(carePlans).where(eq(carePlans.id, subscription.planId));
		if (!plan.visits.some((v) => v.kind === reminder)) return null;
		const visits = await tx
			.select()
			.from(serviceVisits)
			.where(and(eq(serviceVisits.subscriptionId, subscription.id), eq(serviceVisits.season, key)));
		if (visits.some((v) => v.notifiedDay !== null || v.status === 'done')) return { covered: true };
		const s = await seasonSettings(tx);
		const w = seasonWindow(reminder === 'shutdown' ? 'autumn' : 'spring', year, s);
		const token = await newCareLink(propertyId, null, tx);
		return {
			covered: false,
			paragraph: `Your care plan includes this visit: we come between ${dayText(w.start)} and ${dayText(w.end)} and e-mail you the day beforehand. Nothing to book.`,
			action: { label: 'Your care plan', url: `${origin()}/care/${token}` }
		};
	}
	if (subscription) return null;
	const features = await featuresOf(propertyId, tx);
	const plans = (await tx.select().from(carePlans).where(eq(carePlans.active, true))).filter(
		(p) =>
			quotePlan(
				p,
				features.map((f) => ({
					id: f.id,
					kind: f.kind as FeatureKind,
					size: f.size as FeatureSize
				}))
			).yearCents > 0
	);
	if (!plans.length) return null;
	const token = await newCareLink(propertyId, null, tx);
	return {
		covered: false,
		paragraph:
			'We can do it for you, every season: a care plan covers the spring start-up and the autumn shut-down before the first hard frost. See the price for your features, sign up and pay, or cancel, from the link below.',
		action: { label: 'See the care plans for your features', url: `${origin()}/care/${token}` }
	};
}
