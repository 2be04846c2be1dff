// The plan offer: an e-mail with the property's private care link, sent by staff from the
// property page or in place of the old seasonal reminder for homeowners without a plan.
import { db } from '../db';
import { newId } from '../crypto';
import { origin } from '../env';
import { writeMail } from '../outbox';
import { firmOn } from '../payments/mail';
import { dispatchAll } from '../payments/ledger';
import { FEATURE_LABELS, type FeatureKind } from '$lib/care/kinds';
import { CareError, type Tx } from './db';
import { addressOf, featuresOf, propertyRecord } from './features';
import { newCareLink } from './links';
import { build } from './mail';

/** Writes the offer in the caller's transaction; returns the outbox id (null when already sent). */
export async function writePlanOffer(
	tx: Tx,
	propertyId: string,
	dedupeKey: string,
	intro?: string
): Promise<string | null> {
	const record = await propertyRecord(propertyId, tx);
	if (!record.contact.email)
		throw new CareError('invalid', 'The homeowner has no e-mail address on file.');
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
