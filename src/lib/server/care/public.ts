// The public care sign-up on the website: a homeowner the firm does not know yet lists their
// features, sees the price from the active plans, accepts the terms and pays or chooses to be
// invoiced. It writes the contact, the property and the features they described, then runs the
// same sign-up and checkout as the private link (the property's link is made here, and the
// payment returns to it).
//
// An e-mail address already on file is not signed up from the public page: anyone can type an
// address, and the private page shows the name and the features on record. That homeowner gets
// the property's private link by e-mail instead (the plan offer), and signs up from there.
import { eq } from 'drizzle-orm';
import { db } from '../platform/db';
import { contacts, propertyFeatures } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { dispatchAll } from '../payments/ledger';
import { quotePlan, type FeatureKind, type FeatureSize } from '$lib/care/kinds';
import type { CarePlan } from '../platform/db/schema';
import { CareError, type Tx } from './db';
import { featuresOf, locateByPostal } from './features';
import { newCareLink } from './links';
import { writePlanOffer } from './offers';
import { listPlans, planById } from './plans';
import { signUp } from './subscriptions';
import { findOrCreateProperty } from '../leads/intake/records';

export interface PublicSignUp {
	name: string;
	email: string;
	phone: string;
	street: string;
	town: string;
	postalCode: string;
	features: { kind: FeatureKind; size: FeatureSize }[];
	planId: string;
	billing: 'year' | 'visit';
	typedName: string;
}

/** What the public page shows of the active plans: everything a homeowner needs to choose. */
export async function publicPlans() {
	return (await listPlans({ activeOnly: true })).map((p) => ({
		id: p.id,
		name: p.name,
		summary: p.summary,
		terms: p.terms,
		visits: p.visits,
		prices: p.prices,
		payYearly: p.payYearly,
		payPerVisit: p.payPerVisit
	}));
}

/** Field-level refusals (the plan, how to pay) before anything is written. */
export class SignUpFieldError extends Error {
	constructor(
		readonly field: 'planId' | 'billing' | 'features',
		message: string
	) {
		super(message);
	}
}

async function offeredPlan(input: PublicSignUp): Promise<CarePlan> {
	let plan: CarePlan;
	try {
		plan = await planById(input.planId);
	} catch (e) {
		if (e instanceof CareError) throw new SignUpFieldError('planId', 'Pick one of the plans');
		throw e;
	}
	if (!plan.active) throw new SignUpFieldError('planId', 'This plan is no longer offered');
	if (input.billing === 'year' && !plan.payYearly) {
		throw new SignUpFieldError('billing', 'This plan is invoiced after each visit');
	}
	if (input.billing === 'visit' && !plan.payPerVisit) {
		throw new SignUpFieldError('billing', 'This plan is paid for the year ahead');
	}
	const listed = input.features.map((f, i) => ({ id: String(i), ...f }));
	if (quotePlan(plan, listed).yearCents === 0) {
		throw new SignUpFieldError('planId', 'This plan does not look after the features you listed');
	}
	return plan;
}

async function contactFor(tx: Tx, input: PublicSignUp): Promise<{ id: string; known: boolean }> {
	const email = input.email.toLowerCase();
	const [found] = await tx.select().from(contacts).where(eq(contacts.email, email)).limit(1);
	if (found) return { id: found.id, known: true };
	const phoneDigits = input.phone.replace(/\D/g, '');
	const [inserted] = await tx
		.insert(contacts)
		.values({
			id: newId(),
			name: input.name,
			email,
			phone: input.phone || null,
			phoneDigits: phoneDigits || null
		})
		.onConflictDoNothing({ target: contacts.email })
		.returning({ id: contacts.id });
	if (inserted) return { id: inserted.id, known: false };
	// The same address was written a moment ago by another request: treat it as known.
	const [again] = await tx.select().from(contacts).where(eq(contacts.email, email)).limit(1);
	return { id: again.id, known: true };
}

export type PublicOutcome =
	| { kind: 'signed'; propertyId: string; token: string; billing: 'year' | 'visit' }
	| { kind: 'mailed' };

/**
 * Records the homeowner, the property and the features they listed (staff correct them after the
 * first visit), then signs up as the private link does. A known e-mail gets the link by mail.
 */
export async function publicSignUp(
	input: PublicSignUp,
	ipAddress: string | null
): Promise<PublicOutcome> {
	const plan = await offeredPlan(input);
	const written = await db.transaction(async (tx) => {
		const contact = await contactFor(tx, input);
		const propertyId = await findOrCreateProperty(tx, contact.id, input);
		// Features already on record (staff saw them) stand; a new address takes what was listed.
		if ((await featuresOf(propertyId, tx)).length === 0) {
			await tx.insert(propertyFeatures).values(
				input.features.map((f) => ({
					id: newId(),
					propertyId,
					kind: f.kind,
					size: f.size,
					builtBy: 'others',
					notes: 'Described by the homeowner when signing up on the website.'
				}))
			);
		}
		await locateByPostal(propertyId, tx);
		if (contact.known) {
			const outboxId = await writePlanOffer(
				tx,
				propertyId,
				`care-public:${propertyId}:${newId()}`,
				`You asked about “${plan.name}” on our website. We already know your e-mail address, so to keep your details private we send the sign-up to it: the link below opens the plans for your address.`
			);
			return { propertyId, mail: outboxId, token: null };
		}
		return { propertyId, mail: null, token: await newCareLink(propertyId, null, tx) };
	});
	if (!written.token) {
		if (written.mail) await dispatchAll([written.mail]);
		return { kind: 'mailed' };
	}
	await signUp(written.propertyId, {
		planId: plan.id,
		billing: input.billing,
		typedName: input.typedName,
		ipAddress
	});
	return {
		kind: 'signed',
		propertyId: written.propertyId,
		token: written.token,
		billing: input.billing
	};
}
