// Stored photos become short-lived signed links to the private bucket, never bare keys: the one
// place that maps photo rows to what a page may show.
import type { photos } from '../platform/db/schema';
import { signedUrl } from '../platform/storage';

interface StoredKeys {
	thumbKey: string;
	displayKey: string;
}

/** Each row with its two keys swapped for signed links (`thumbUrl`, `displayUrl`). */
export function signPhotos<T extends StoredKeys>(rows: T[], seconds?: number) {
	return Promise.all(
		rows.map(async ({ thumbKey, displayKey, ...rest }) => ({
			...rest,
			thumbUrl: await signedUrl(thumbKey, seconds),
			displayUrl: await signedUrl(displayKey, seconds)
		}))
	);
}

/** Stored photos as staff see them: size, name and signed links. */
export function photoLinks(rows: (typeof photos.$inferSelect)[], seconds?: number) {
	return signPhotos(
		rows.map((p) => ({
			id: p.id,
			originalName: p.originalName,
			width: p.width,
			height: p.height,
			thumbKey: p.thumbKey,
			displayKey: p.displayKey
		})),
		seconds
	);
}

/** For a gallery that opens the large picture: its link as `fullUrl`. */
export async function galleryLinks<T extends StoredKeys>(rows: T[], seconds?: number) {
	return (await signPhotos(rows, seconds)).map(({ displayUrl, ...p }) => ({
		...p,
		fullUrl: displayUrl
	}));
}
