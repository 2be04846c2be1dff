// Photos taken at a site visit (issue 6, visit notes): the intake photo pipeline (processPhoto:
// type from the bytes, pixel limit, orientation applied, metadata dropped, two sizes), stored in
// the private bucket and in `photos` with the visit, the visit's lead and context 'visit'.
import { and, asc, eq } from 'drizzle-orm';
import { db } from './db';
import { photos, siteVisits } from './db/schema';
import { newId } from './crypto';
import { processPhoto } from './images';
import { putObject, randomKey, signedUrl } from './storage';

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
	const photo = await processPhoto(fileName, bytes);
	const displayKey = randomKey('visits', 'display.webp');
	const thumbKey = randomKey('visits', 'thumb.webp');
	await putObject(displayKey, photo.display, photo.contentType);
	await putObject(thumbKey, photo.thumb, photo.contentType);
	const [row] = await db
		.insert(photos)
		.values({
			id: newId(),
			leadId: visit.leadId,
			visitId: visit.id,
			context: 'visit',
			displayKey,
			thumbKey,
			width: photo.width,
			height: photo.height,
			bytes: photo.bytes,
			originalName: photo.originalName,
			uploadedBy
		})
		.returning();
	return row;
}

/** The visit's own photos, oldest first, with short-lived signed links (never bare keys). */
export async function visitPhotoLinks(visitId: string) {
	const rows = await db
		.select()
		.from(photos)
		.where(and(eq(photos.visitId, visitId), eq(photos.context, 'visit')))
		.orderBy(asc(photos.createdAt));
	return Promise.all(
		rows.map(async (p) => ({
			id: p.id,
			originalName: p.originalName,
			width: p.width,
			height: p.height,
			thumbUrl: await signedUrl(p.thumbKey),
			displayUrl: await signedUrl(p.displayKey)
		}))
	);
}
