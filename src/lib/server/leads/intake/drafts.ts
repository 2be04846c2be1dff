// Inquiry photos: stored in S3, then recorded as a draft (the upload API, one photo at a time) or
// straight onto the lead; drafts never claimed by an inquiry are swept hourly by a queued job.
import { and, eq, inArray, isNull, lt } from 'drizzle-orm';
import { db } from '../../platform/db';
import { photos } from '../../platform/db/schema';
import { newId, newToken } from '../../platform/crypto';
import {
	PhotoError,
	checkPhotoSize,
	processPhoto,
	type ProcessedPhoto
} from '../../platform/images';
import { isDatabaseUnavailable } from '../../platform/outage';
import { defineJob, enqueue, queue } from '../../platform/queue';
import { StorageUnavailableError, deleteObjects } from '../../platform/storage';
import { STORAGE_DOWN, DATABASE_DOWN } from './errors';
import { discardKeys, discardStored, storePhoto, type StoredPhoto } from '../../photos/store';

/** Unclaimed drafts older than this are swept away. */
export const DRAFT_TTL_MS = 24 * 60 * 60 * 1000;
// ---------------------------------------------------------------------------------------------
// Photos: stored in S3, then recorded either as a draft or straight onto the lead

export interface Draft {
	token: string;
	name: string;
}

export async function saveDrafts(stored: StoredPhoto[]): Promise<Draft[]> {
	const rows = stored.map((s) => ({
		id: newId(),
		draftToken: newToken(),
		context: 'intake',
		...s
	}));
	if (!rows.length) return [];
	await db.insert(photos).values(rows);
	void ensureSweepScheduled();
	return rows.map((r) => ({ token: r.draftToken, name: r.originalName }));
}

export type UploadResult =
	| { ok: true; draft: Draft & { width: number; height: number } }
	| { ok: false; status: number; message: string };

/** The upload API: one photo, processed and stored as a draft the form refers to later. */
export async function uploadDraft(file: File | null): Promise<UploadResult> {
	if (!file || typeof file === 'string') {
		return { ok: false, status: 400, message: 'Send one photo in the field “file”.' };
	}
	let processed: ProcessedPhoto;
	try {
		checkPhotoSize(file.name, file.size);
		processed = await processPhoto(file.name, new Uint8Array(await file.arrayBuffer()));
	} catch (error) {
		if (error instanceof PhotoError) {
			return { ok: false, status: statusOf(error), message: error.message };
		}
		throw error;
	}
	let stored: StoredPhoto;
	try {
		stored = await storePhoto(processed, 'intake');
	} catch (error) {
		if (error instanceof StorageUnavailableError) {
			return { ok: false, status: 503, message: STORAGE_DOWN };
		}
		throw error;
	}
	try {
		const [draft] = await saveDrafts([stored]);
		return { ok: true, draft: { ...draft, width: stored.width, height: stored.height } };
	} catch (error) {
		await discardStored([stored]);
		if (isDatabaseUnavailable(error)) return { ok: false, status: 503, message: DATABASE_DOWN };
		throw error;
	}
}

/** Removes a draft its uploader no longer wants (only the uploader knows the token). */
export async function deleteDraft(token: string): Promise<boolean> {
	const [row] = await db
		.delete(photos)
		.where(and(eq(photos.draftToken, token), isNull(photos.leadId)))
		.returning();
	if (!row) return false;
	await discardKeys([row.displayKey, row.thumbKey]);
	return true;
}

export function statusOf(error: PhotoError): number {
	if (/at most \d+ MB|megapixels/.test(error.message)) return 413;
	if (/not a JPEG|HEIC/.test(error.message)) return 415;
	return 422;
}

// ---------------------------------------------------------------------------------------------
// The sweep of drafts never claimed by an inquiry

export const SWEEP_JOB = 'intake.sweep-drafts';

/** Deletes unclaimed draft photos older than the cut-off from S3 and the table. Idempotent. */
export async function sweepDrafts(
	olderThan = new Date(Date.now() - DRAFT_TTL_MS)
): Promise<number> {
	let removed = 0;
	for (;;) {
		const batch = await db
			.select({ id: photos.id, displayKey: photos.displayKey, thumbKey: photos.thumbKey })
			.from(photos)
			.where(and(isNull(photos.leadId), lt(photos.createdAt, olderThan)))
			.limit(200);
		if (!batch.length) return removed;
		await deleteObjects(batch.flatMap((p) => [p.displayKey, p.thumbKey]));
		await db.delete(photos).where(
			and(
				inArray(
					photos.id,
					batch.map((p) => p.id)
				),
				isNull(photos.leadId)
			)
		);
		removed += batch.length;
	}
}

defineJob(SWEEP_JOB, async () => {
	await sweepDrafts();
});

let scheduled: Promise<void> | null = null;

/** Registers the hourly sweep with pg-boss once per process (the schedule itself is shared). */
export function ensureSweepScheduled(): Promise<void> {
	scheduled ??= (async () => {
		const q = await queue();
		await q.createQueue(SWEEP_JOB);
		await q.schedule(SWEEP_JOB, '17 * * * *', {}, { tz: 'UTC' });
	})().catch((error) => {
		scheduled = null;
		console.error('[intake] sweep not scheduled yet:', (error as Error).message);
	});
	return scheduled;
}

/** Runs a sweep now through the queue (used by the seed and by tests). */
export async function enqueueSweep(): Promise<void> {
	await enqueue(SWEEP_JOB, {});
}
