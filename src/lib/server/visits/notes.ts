// The visit notes: what the lead page shows of them, and saving them.
import { eq } from 'drizzle-orm';
import type { VisitNotes } from '$lib/schema/visits';
import { db } from '../platform/db';
import { activities, siteVisits } from '../platform/db/schema';
import { visitPhotoLinks } from '../photos/visit-photos';
import { visitsOfLead } from './agenda';

/**
 * What the lead page shows of its visits' notes: every visit with notes or photos, and a booked
 * one still waiting for them; newest first, each with its photos' short-lived links.
 */
export async function visitNotesOfLead(leadId: string) {
	const visits = await visitsOfLead(leadId);
	const withPhotos = await Promise.all(
		visits.map(async (v) => ({ ...v, photos: await visitPhotoLinks(v.id) }))
	);
	return withPhotos
		.filter((v) => v.notes !== null || v.photos.length > 0 || v.status === 'booked')
		.map((v) => ({
			id: v.id,
			status: v.status,
			startsAt: v.startsAt,
			timeZone: v.timeZone,
			salespersonName: v.salespersonName,
			notes: v.notes as Partial<VisitNotes> | null,
			photos: v.photos
		}));
}

export async function saveNotes(
	visitId: string,
	notes: VisitNotes,
	actorId: string
): Promise<boolean> {
	const rows = await db
		.update(siteVisits)
		.set({ notes, notesUpdatedAt: new Date(), notesUpdatedBy: actorId })
		.where(eq(siteVisits.id, visitId))
		.returning({ leadId: siteVisits.leadId });
	if (!rows.length) return false;
	await db.insert(activities).values({
		leadId: rows[0].leadId,
		kind: 'visit',
		actorId,
		body: 'Visit notes saved',
		data: { visitId, action: 'notes' }
	});
	return true;
}
