// One way to keep a processed photo (platform/images.ts: checked from its bytes, oriented, no
// metadata, two sizes): both sizes under random keys in the private bucket. A second upload that
// fails takes the first with it, and a caller whose database write fails discards both, so a
// failure leaves nothing behind.
import type { ProcessedPhoto } from '../platform/images';
import { deleteObjects, putObject, randomKey } from '../platform/storage';

export interface StoredPhoto {
	displayKey: string;
	thumbKey: string;
	width: number;
	height: number;
	bytes: number;
	originalName: string;
}

/** Stores both sizes under `folder`; throws StorageUnavailableError, having stored nothing. */
export async function storePhoto(p: ProcessedPhoto, folder: string): Promise<StoredPhoto> {
	const displayKey = randomKey(folder, 'display.webp');
	const thumbKey = randomKey(folder, 'thumb.webp');
	await putObject(displayKey, p.display, p.contentType);
	try {
		await putObject(thumbKey, p.thumb, p.contentType);
	} catch (error) {
		await discardKeys([displayKey]);
		throw error;
	}
	return {
		displayKey,
		thumbKey,
		width: p.width,
		height: p.height,
		bytes: p.bytes,
		originalName: p.originalName
	};
}

export async function discardKeys(keys: string[]): Promise<void> {
	try {
		await deleteObjects(keys);
	} catch (error) {
		// Left for nobody to find: log it, the bucket's own lifecycle rules are the last line.
		console.error('[photos] could not delete stored photos', keys, (error as Error).message);
	}
}

export async function discardStored(stored: StoredPhoto[]): Promise<void> {
	await discardKeys(stored.flatMap((s) => [s.displayKey, s.thumbKey]));
}

/** Runs the database write that records stored photos; on failure the objects go too. */
export async function recordingStored<T>(stored: StoredPhoto[], write: () => Promise<T>) {
	try {
		return await write();
	} catch (error) {
		await discardStored(stored);
		throw error;
	}
}
