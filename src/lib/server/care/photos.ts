// Photos of care: of a feature on record, or taken on a service visit. The intake pipeline
// checks and re-encodes them (type from the bytes, pixel limit, orientation, no metadata, two
// sizes); the photos table holds them (context 'feature' or 'service') and a join row ties
// each to its feature or visit.
import { asc, eq, inArray } from 'drizzle-orm';
import { db } from '../platform/db';
import { featurePhotos, photos, serviceVisitPhotos } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { processPhoto } from '../platform/images';
import { photoLinks } from '../photos/links';
import { recordingStored, storePhoto } from '../photos/store';
import { getObject } from '../platform/storage';

/** Processes and stores one photo; throws PhotoError or StorageUnavailableError. */
export async function storeCarePhoto(
	to: { featureId: string } | { serviceVisitId: string },
	file: File,
	uploadedBy: string
): Promise<string> {
	const processed = await processPhoto(file.name, new Uint8Array(await file.arrayBuffer()));
	const stored = await storePhoto(processed, 'care');
	const id = newId();
	await recordingStored([stored], () =>
		db.transaction(async (tx) => {
			await tx.insert(photos).values({
				id,
				context: 'featureId' in to ? 'feature' : 'service',
				...stored,
				uploadedBy
			});
			if ('featureId' in to) {
				await tx.insert(featurePhotos).values({ featureId: to.featureId, photoId: id });
			} else {
				await tx
					.insert(serviceVisitPhotos)
					.values({ serviceVisitId: to.serviceVisitId, photoId: id });
			}
		})
	);
	return id;
}

/** Photos of these features, by feature id, with five-minute signed links. */
export async function featurePhotoLinks(featureIds: string[]) {
	if (!featureIds.length) return {};
	const rows = await db
		.select({ featureId: featurePhotos.featureId, photo: photos })
		.from(featurePhotos)
		.innerJoin(photos, eq(photos.id, featurePhotos.photoId))
		.where(inArray(featurePhotos.featureId, featureIds))
		.orderBy(asc(photos.createdAt));
	const out: Record<string, Awaited<ReturnType<typeof photoLinks>>> = {};
	for (const id of featureIds) {
		out[id] = await photoLinks(rows.filter((r) => r.featureId === id).map((r) => r.photo));
	}
	return out;
}

async function visitPhotoRows(serviceVisitId: string) {
	const rows = await db
		.select({ photo: photos })
		.from(serviceVisitPhotos)
		.innerJoin(photos, eq(photos.id, serviceVisitPhotos.photoId))
		.where(eq(serviceVisitPhotos.serviceVisitId, serviceVisitId))
		.orderBy(asc(photos.createdAt));
	return rows.map((r) => r.photo);
}

export async function serviceVisitPhotoLinks(serviceVisitId: string) {
	return photoLinks(await visitPhotoRows(serviceVisitId));
}

/** The visit's photos as small attachments for the report mail (the 480 px thumbnails). */
export async function serviceVisitPhotoAttachments(serviceVisitId: string) {
	const rows = await visitPhotoRows(serviceVisitId);
	return Promise.all(
		rows.map(async (p, i) => ({
			filename: `photo-${i + 1}.webp`,
			content: (await getObject(p.thumbKey)).toString('base64'),
			contentType: 'image/webp',
			encoding: 'base64' as const
		}))
	);
}
