import type { photos } from '../platform/db/schema';
import { signedUrl } from '../platform/storage';

/** Stored photos as staff see them: size, name and short-lived signed links (never bare keys). */
export function photoLinks(rows: (typeof photos.$inferSelect)[], seconds?: number) {
	return Promise.all(
		rows.map(async (p) => ({
			id: p.id,
			originalName: p.originalName,
			width: p.width,
			height: p.height,
			thumbUrl: await signedUrl(p.thumbKey, seconds),
			displayUrl: await signedUrl(p.displayKey, seconds)
		}))
	);
}
