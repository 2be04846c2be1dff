// Reading estimates: a lead's versions, one estimate, its acceptance, and the office list.
import { desc, eq } from 'drizzle-orm';
import type { EstimateSuccess } from '$lib/estimating';
import type { PricedEstimate } from '$lib/estimating/overrides';
import { db } from '../platform/db';
import {
	contacts,
	estimateAcceptances,
	estimates,
	leads,
	type Estimate
} from '../platform/db/schema';

/** What the builder and the homeowner's page read back: the engine result plus the priced lines. */
export interface StoredResult {
	engine: EstimateSuccess;
	priced: PricedEstimate;
}

export const DAY_MS = 24 * 60 * 60 * 1000;

export async function leadWithContact(leadId: string) {
	const [row] = await db
		.select({ lead: leads, contact: contacts })
		.from(leads)
		.innerJoin(contacts, eq(contacts.id, leads.contactId))
		.where(eq(leads.id, leadId))
		.limit(1);
	return row ?? null;
}

export async function estimatesForLead(leadId: string) {
	return db
		.select()
		.from(estimates)
		.where(eq(estimates.leadId, leadId))
		.orderBy(desc(estimates.number));
}

export async function getEstimate(id: string): Promise<Estimate | null> {
	const [row] = await db.select().from(estimates).where(eq(estimates.id, id)).limit(1);
	return row ?? null;
}
export async function acceptanceFor(estimateId: string) {
	const [row] = await db
		.select()
		.from(estimateAcceptances)
		.where(eq(estimateAcceptances.estimateId, estimateId));
	return row ?? null;
}

/** The office list: every estimate's latest state with its lead and homeowner. */
export async function listEstimates() {
	return db
		.select({
			id: estimates.id,
			leadId: estimates.leadId,
			number: estimates.number,
			status: estimates.status,
			totalCents: estimates.totalCents,
			sentAt: estimates.sentAt,
			updatedAt: estimates.updatedAt,
			leadNumber: leads.number,
			homeowner: contacts.name
		})
		.from(estimates)
		.innerJoin(leads, eq(leads.id, estimates.leadId))
		.innerJoin(contacts, eq(contacts.id, leads.contactId))
		.orderBy(desc(estimates.updatedAt))
		.limit(300);
}
