// Photos taken at a site visit (the visit notes): the intake photo pipeline (processPhoto:
// type from the bytes, pixel limit, orientation applied, metadata dropped, two sizes), stored in
// the private bucket and in `photos` with the visit, the visit's lead and context 'visit'.
import { and, asc, eq, inArray, or } from 'drizzle-orm';
import { db } from '../platform/db';
import { photos, siteVisits } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { processPhoto } from '../platform/images';
import { photoLinks, signPhotos } from './links';
import { recordingStored, storePhoto } from './store';
import { deleteObjects, StorageUnavailableError } from '../platform/storage';

export type VisitPhoto = typeof photos.$inferSelect;

/**
 * Processes and stores one photo for a visit. Returns null when there is no such visit.
 * Throws PhotoError for a file that is not a usable photo (nothing is stored then) and
 * StorageUnavailableError when the bucket is out of reach.
 */
export async function storeVisitPhoto(
	visitId: string,
	fileName: string,
	bytes: Uint8Array,
	uploadedBy: string
): Promise<VisitPhoto | null> {
	const [visit] = await db
		.select({ id: siteVisits.id, leadId: siteVisits.leadId })
		.from(siteVisits)
		.where(eq(siteVisits.id, visitId));
	if (!visit) return null;
	const stored = await storePhoto(await processPhoto(fileName, bytes), 'visits');
	const [row] = await recordingStored([stored], () =>
		db
			.insert(photos)
			.values({
				id: newId(),
				leadId: visit.leadId,
				visitId: visit.id,
				context: 'visit',
				...stored,
				uploadedBy
			})
			.returning()
	);
	return row;
}

/** The visit's own photos, oldest first, with short-lived signed links (never bare keys). */
export async function visitPhotoLinks(visitId: string) {
	const rows = await db
		.select()
		.from(photos)
		.where(and(eq(photos.visitId, visitId), eq(photos.context, 'visit')))
		.orderBy(asc(photos.createdAt));
	return photoLinks(rows);
}

/**
 * Deletes one of the visit's photos: its row and both objects. The objects go first, inside the
 * row's transaction, so a bucket out of reach leaves the photo as it was (StorageUnavailableError).
 * Returns false when the visit has no such photo.
 */
export async function deleteVisitPhoto(visitId: string, photoId: string): Promise<boolean> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.delete(photos)
			.where(and(eq(photos.id, photoId), eq(photos.visitId, visitId), eq(photos.context, 'visit')))
			.returning({ displayKey: photos.displayKey, thumbKey: photos.thumbKey });
		if (!row) return false;
		try {
			await deleteObjects([row.thumbKey, row.displayKey]);
		} catch (error) {
			throw new StorageUnavailableError(error);
		}
		return true;
	});
}

export interface Thumb {
	id: string;
	kind: 'intake' | 'visit';
	name: string;
	thumbUrl: string;
	displayUrl: string;
}

/** Short-lived links to the thumbnails an agenda card shows. */
const AGENDA_LINK_SECONDS = 300;

/**
 * For each visit, the photos its lead came with (intake) and those taken at the visit, oldest
 * first, with short-lived signed links. Keyed by visit id; a visit without photos has no entry.
 */
export async function agendaThumbs(
	visits: { id: string; leadId: string }[]
): Promise<Map<string, Thumb[]>> {
	const byVisit = new Map<string, Thumb[]>();
	if (visits.length === 0) return byVisit;
	const rows = await db
		.select()
		.from(photos)
		.where(
			or(
				and(
					inArray(
						photos.leadId,
						visits.map((v) => v.leadId)
					),
					eq(photos.context, 'intake')
				),
				and(
					inArray(
						photos.visitId,
						visits.map((v) => v.id)
					),
					eq(photos.context, 'visit')
				)
			)
		)
		.orderBy(asc(photos.createdAt));
	for (const visit of visits) {
		const mine = rows.filter((p) =>
			p.context === 'visit' ? p.visitId === visit.id : p.leadId === visit.leadId
		);
		if (mine.length === 0) continue;
		byVisit.set(
			visit.id,
			await signPhotos(
				mine.map((p) => ({
					id: p.id,
					kind: p.context === 'visit' ? ('visit' as const) : ('intake' as const),
					name: p.originalName,
					thumbKey: p.thumbKey,
					displayKey: p.displayKey
				})),
				AGENDA_LINK_SECONDS
			)
		);
	}
	return byVisit;
}
