import { db } from '$lib/server/platform/db';
import { settings } from '$lib/server/platform/db/schema';
import { createUser } from '$lib/server/auth/team';
import type { Role } from '$lib/server/platform/db/schema';

export const PASSWORD = 'correct horse battery';

export async function seedFirm(): Promise<void> {
	await db.insert(settings).values({
		id: 1,
		firmName: 'Test Firm',
		email: 'office@test.example',
		phone: '(555) 010-0000'
	});
}

export async function makeUser(role: Role, email = `${role}@test.example`, name = `Test ${role}`) {
	const id = await createUser({ email, name, role, password: PASSWORD });
	return { id, email, name, role };
}

// --- leads ---------------------------------------------------------------------------
import * as leadSchema from '$lib/server/platform/db/schema';
import { newId as newLeadId } from '$lib/server/platform/crypto';

export interface LeadFixture {
	name?: string;
	email?: string | null;
	phone?: string | null;
	town?: string;
	street?: string;
	message?: string;
	stage?: leadSchema.LeadStage;
	services?: string[];
	budget?: string;
	source?: string;
	createdAt?: Date;
	firstReplyAt?: Date | null;
	assigneeId?: string | null;
	priority?: 'low' | 'normal' | 'high';
	closeReason?: leadSchema.Lead['closeReason'];
}

let leadSeq = 0;

/** A contact, their property and a lead, written straight to the database. */
export async function makeLead(f: LeadFixture = {}) {
	leadSeq += 1;
	const contactId = newLeadId();
	const propertyId = newLeadId();
	const id = newLeadId();
	const phone = f.phone === undefined ? `(555) 010-${String(1000 + leadSeq).slice(-4)}` : f.phone;
	await db.insert(leadSchema.contacts).values({
		id: contactId,
		name: f.name ?? `Test Person ${leadSeq}`,
		email:
			f.email === undefined ? `person${leadSeq}.${contactId.slice(0, 6)}@test.example` : f.email,
		phone,
		phoneDigits: phone ? phone.replace(/\D/g, '') : null
	});
	await db.insert(leadSchema.properties).values({
		id: propertyId,
		contactId,
		street: f.street ?? `${leadSeq} Test Lane`,
		town: f.town ?? 'Linden Ford'
	});
	const createdAt = f.createdAt ?? new Date();
	const [lead] = await db
		.insert(leads)
		.values({
			id,
			contactId,
			propertyId,
			stage: f.stage ?? 'new',
			services: f.services ?? ['water-feature'],
			budget: f.budget ?? 'unsure',
			message: f.message ?? '',
			source: f.source ?? 'website',
			createdAt,
			lastTouchAt: createdAt,
			firstReplyAt: f.firstReplyAt ?? null,
			assigneeId: f.assigneeId ?? null,
			priority: f.priority ?? 'normal',
			closeReason: f.closeReason ?? null
		})
		.returning();
	await db
		.insert(leadSchema.activities)
		.values({ leadId: id, kind: 'inquiry', body: f.message ?? '', createdAt });
	return lead;
}

// ---------------------------------------------------------------------------------------------
// Jobs: a lead with a real engine estimate, optionally accepted by the homeowner.
// Direct inserts, so these tests do not depend on the estimates module's API.

export async function makeEstimate(
	options: { accepted?: boolean; email?: string; name?: string } = {}
) {
	const { db } = await import('$lib/server/platform/db');
	const schema = await import('$lib/server/platform/db/schema');
	const { newId } = await import('$lib/server/platform/crypto');
	const { estimate } = await import('$lib/estimating');
	const { demoCatalog, demoDesign } = await import('../../scripts/seed/demo-catalog');
	const design = demoDesign();
	const catalog = demoCatalog();
	const result = estimate(design, catalog);
	if (!result.ok) throw new Error('the demo design no longer estimates');
	const contactId = newId();
	const email = options.email ?? `home-${contactId}@test.example`;
	await db.insert(schema.contacts).values({
		id: contactId,
		name: options.name ?? 'Ines Harrow',
		email,
		phone: '(555) 010-7788'
	});
	const propertyId = newId();
	await db.insert(schema.properties).values({
		id: propertyId,
		contactId,
		street: '7 Quarry Road',
		town: 'Alder Crossing',
		postalCode: '80998',
		siteNotes: 'Gate on the north side; septic lid by the lilac.'
	});
	const leadId = newId();
	await db.insert(schema.leads).values({
		id: leadId,
		contactId,
		propertyId,
		stage: options.accepted ? 'estimate_sent' : 'estimating',
		services: ['water-feature']
	});
	const estimateId = newId();
	// The shapes the estimates module writes: { engine, priced } on the estimate, and the
	// choices, totals and priced lines on the acceptance.
	const { priceWithOverrides } = await import('$lib/estimating/overrides');
	const priced = priceWithOverrides(result, design, catalog, []);
	const stored = JSON.parse(JSON.stringify({ engine: result, priced })) as Record<string, unknown>;
	const accepted = JSON.parse(
		JSON.stringify({
			choices: { options: [], alternates: { topping: 'topping-pebble' } },
			totals: { totalCents: result.pricing.totalCents, depositCents: result.pricing.depositCents },
			pricing: priced.pricing,
			lines: priced.lines
		})
	) as Record<string, unknown>;
	await db.insert(schema.estimates).values({
		id: estimateId,
		leadId,
		number: 1,
		status: options.accepted ? 'accepted' : 'sent',
		design: design as unknown as Record<string, unknown>,
		result: stored,
		catalog: catalog as unknown as Record<string, unknown>,
		scope: 'Basalt column over a hidden basin, with two uplights',
		totalCents: result.pricing.totalCents,
		taxCents: 0,
		depositCents: result.pricing.depositCents,
		sentAt: new Date()
	});
	if (options.accepted) {
		await db.insert(schema.estimateAcceptances).values({
			id: newId(),
			estimateId,
			estimateNumber: 1,
			typedName: options.name ?? 'Ines Harrow',
			ipAddress: '127.0.0.1',
			userAgent: 'vitest',
			revision: 1,
			optionsChosen: { options: [], alternates: { topping: 'topping-pebble' } },
			totalCents: result.pricing.totalCents,
			depositCents: result.pricing.depositCents,
			result: accepted
		});
	}
	return { contactId, propertyId, leadId, estimateId, email, result };
}

// ---------------------------------------------------------------------------------------------
// Site visits: leads made with direct inserts, so these tests need no intake code.
import { availability, contacts, leads, properties } from '$lib/server/platform/db/schema';
import { newId } from '$lib/server/platform/crypto';

let leadSerial = 0;

/** A contact, a property and a lead in stage "contacted" (or the stage given). */
export async function makeVisitLead(
	over: { email?: string | null; stage?: 'new' | 'contacted' | 'closed'; name?: string } = {}
) {
	leadSerial++;
	const contactId = newId();
	const propertyId = newId();
	const email = over.email === undefined ? `homeowner${leadSerial}@test.example` : over.email;
	await db.insert(contacts).values({
		id: contactId,
		name: over.name ?? `Homeowner ${leadSerial}`,
		email,
		phone: `(555) 010-${String(1000 + leadSerial).slice(-4)}`
	});
	await db.insert(properties).values({
		id: propertyId,
		contactId,
		street: `${leadSerial} Spillway Road`,
		town: 'Test Town',
		postalCode: '80999'
	});
	const [lead] = await db
		.insert(leads)
		.values({
			id: newId(),
			contactId,
			propertyId,
			stage: over.stage ?? 'contacted',
			services: ['bubbler'],
			message: 'A bubbling boulder by the patio'
		})
		.returning();
	return { ...lead, email };
}

/** Weekly hours for a salesperson: every day of the week, 08:00–17:00 unless told. */
export async function setHours(
	userId: string,
	hours: Record<string, { start: string; end: string }[]> = Object.fromEntries(
		['0', '1', '2', '3', '4', '5', '6'].map((d) => [d, [{ start: '08:00', end: '17:00' }]])
	),
	over: Partial<{
		visitMinutes: number;
		bufferMinutes: number;
		noticeMinutes: number;
		daysAhead: number;
	}> = {}
) {
	await db
		.insert(availability)
		.values({ userId, weeklyHours: hours, daysAhead: 400, ...over })
		.onConflictDoUpdate({ target: availability.userId, set: { weeklyHours: hours, ...over } });
}
