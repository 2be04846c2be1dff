import { and, eq, gt, inArray, or } from 'drizzle-orm';
import { db } from '../platform/db';
import { activities, siteVisitLinks, siteVisits } from '../platform/db/schema';
import { sha256 } from '../platform/crypto';
import { dispatchMail, writeMail } from '../platform/outbox';
import { partyFor, whenShort } from './party';
import { cancelVisit } from './booking';

// ---------------------------------------------------------------------------------------------
// The homeowner's private page

export async function visitByToken(token: string, now = new Date()) {
	if (!token || token.length > 64) return null;
	const hash = sha256(token);
	const laterLink = db
		.select({ visitId: siteVisitLinks.visitId })
		.from(siteVisitLinks)
		.where(eq(siteVisitLinks.tokenHash, hash));
	const [visit] = await db
		.select()
		.from(siteVisits)
		.where(
			and(
				or(eq(siteVisits.tokenHash, hash), inArray(siteVisits.id, laterLink)),
				gt(siteVisits.tokenExpiresAt, now)
			)
		);
	if (!visit) return null;
	return partyFor(db, visit);
}

export async function confirmByHomeowner(token: string): Promise<boolean> {
	const party = await visitByToken(token);
	if (!party || party.visit.status !== 'booked') return false;
	if (party.visit.confirmedAt) return true;
	await db.transaction(async (tx) => {
		await tx
			.update(siteVisits)
			.set({ confirmedAt: new Date() })
			.where(eq(siteVisits.id, party.visit.id));
		await tx.insert(activities).values({
			leadId: party.visit.leadId,
			kind: 'visit',
			body: `The homeowner confirmed the site visit of ${whenShort(party.visit)}`,
			data: { visitId: party.visit.id, action: 'confirmed' }
		});
	});
	return true;
}

export async function requestOtherTime(token: string, message: string): Promise<boolean> {
	const party = await visitByToken(token);
	if (!party || party.visit.status !== 'booked') return false;
	let mailId: string | null = null;
	await db.transaction(async (tx) => {
		await tx
			.update(siteVisits)
			.set({ changeRequest: message, changeRequestedAt: new Date() })
			.where(eq(siteVisits.id, party.visit.id));
		await tx.insert(activities).values({
			leadId: party.visit.leadId,
			kind: 'visit',
			body: `The homeowner asked for another time: ${message}`,
			data: { visitId: party.visit.id, action: 'change_requested' }
		});
		mailId = await writeMail(
			{
				dedupeKey: `visit:${party.visit.id}:${party.visit.sequence}:change-request:${sha256(message).slice(0, 12)}`,
				to: party.salesperson.email,
				subject: `R-${party.leadNumber}: ${party.homeowner.name} asks for another visit time`,
				text: `${party.homeowner.name} asks to move the site visit of ${whenShort(party.visit)}:\n\n${message}`,
				html: `<p>${escape(party.homeowner.name)} asks to move the site visit of ${escape(whenShort(party.visit))}:</p><blockquote>${escape(message)}</blockquote>`,
				leadId: party.visit.leadId
			},
			tx
		);
	});
	if (mailId) await dispatchMail(mailId);
	return true;
}

function escape(value: string): string {
	return value.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

export async function cancelByHomeowner(token: string, reason: string): Promise<boolean> {
	const party = await visitByToken(token);
	if (!party || party.visit.status !== 'booked') return false;
	await cancelVisit(party.visit.id, { reason, actorId: null, by: 'homeowner' });
	return true;
}
