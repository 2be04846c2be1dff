// The yard photos the homeowner sent with the inquiry, for their estimate page: short-lived
// signed links to the private bucket, as the lead page uses for staff.
import { and, asc, eq } from 'drizzle-orm';
import { db } from '../platform/db';
import { photos } from '../platform/db/schema';
import { galleryLinks } from './links';

/** Ten minutes: enough to read the page; the page is never cached, so a reload signs fresh ones. */
export const HOMEOWNER_PHOTO_SECONDS = 600;
const MOST = 12;

export interface YardPhoto {
	id: string;
	width: number;
	height: number;
	thumbUrl: string;
	fullUrl: string;
}

export async function yardPhotos(leadId: string): Promise<YardPhoto[]> {
	const rows = await db
		.select()
		.from(photos)
		.where(and(eq(photos.leadId, leadId), eq(photos.context, 'intake')))
		.orderBy(asc(photos.createdAt))
		.limit(MOST);
	return galleryLinks(
		rows.map(({ id, width, height, thumbKey, displayKey }) => ({
			id,
			width,
			height,
			thumbKey,
			displayKey
		})),
		HOMEOWNER_PHOTO_SECONDS
	);
}
