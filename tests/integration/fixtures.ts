import { db } from '$lib/server/db';
import { settings } from '$lib/server/db/schema';
import { createUser } from '$lib/server/team';
import type { Role } from '$lib/server/db/schema';

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

// --- leads (issue 5) ---------------------------------------------------------------------------
import * as leadSchema from '$lib/server/db/schema';
import { newId as newLeadId } from '$lib/server/crypto';

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
