// Jobs for the payments tests, made with direct inserts (an accepted estimate with a link and
// its job), so these tests need neither the estimate builder nor the conversion code.
import { db } from '$lib/server/platform/db';
import { changeOrders, estimates, jobs } from '$lib/server/platform/db/schema';
import { newId, newToken, sha256 } from '$lib/server/platform/crypto';
import { makeVisitLead } from './fixtures';
import { frozenEstimate } from '../support/accepted-job';

export async function makePaymentJob(
	over: { contractCents?: number; depositCents?: number; taxCents?: number } = {}
) {
	const contractCents = over.contractCents ?? 1_240_000;
	const depositCents = over.depositCents ?? 372_000;
	const lead = await makeVisitLead();
	const token = newToken();
	const estimateId = newId();
	await db.insert(estimates).values({
		id: estimateId,
		leadId: lead.id,
		number: 1,
		status: 'accepted',
		design: {},
		scope: 'Drilled granite boulder over a hidden basin',
		totalCents: contractCents,
		depositCents,
		tokenHash: sha256(token),
		expiresAt: new Date(Date.now() + 30 * 86_400_000)
	});
	const frozen = frozenEstimate({
		estimateId,
		scope: 'Drilled granite boulder over a hidden basin',
		typedName: 'Test Homeowner',
		totalCents: contractCents,
		depositCents,
		taxCents: over.taxCents ?? 61_000
	});
	const [job] = await db
		.insert(jobs)
		.values({
			id: newId(),
			estimateId,
			leadId: lead.id,
			contactId: lead.contactId,
			propertyId: lead.propertyId,
			title: 'Drilled granite boulder',
			frozen,
			contractCents,
			depositDueCents: depositCents
		})
		.returning();
	return { job, token, email: lead.email! };
}

export async function approveChangeOrder(jobId: string, number: number, cents: number) {
	await db.insert(changeOrders).values({
		id: newId(),
		jobId,
		number,
		status: 'approved',
		title: `Change ${number}`,
		lines: [],
		totalCents: cents,
		acceptedTotalCents: cents,
		decidedAt: new Date()
	});
}
