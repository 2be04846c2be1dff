// Photos of a construction job, taken by the crew or the office: processed and stored as every
// photo is (store.ts), then recorded on the job.
import { db } from '../platform/db';
import { photos } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { processPhoto } from '../platform/images';
import type { SessionUser } from '../auth/sessions';
import { jobFor } from '../jobs/read';
import { recordingStored, storePhoto } from './store';

/** Adds a photo to a job the user may open; throws PhotoError or StorageUnavailableError. */
export async function addJobPhoto(user: SessionUser, jobId: string, file: File): Promise<void> {
	const job = await jobFor(user, jobId);
	const processed = await processPhoto(file.name, new Uint8Array(await file.arrayBuffer()));
	const stored = await storePhoto(processed, 'jobs');
	await recordingStored([stored], () =>
		db.insert(photos).values({
			id: newId(),
			jobId: job.id,
			context: 'job',
			...stored,
			uploadedBy: user.id
		})
	);
}
