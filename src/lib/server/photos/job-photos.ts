import { db } from '../platform/db';
import { photos } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import type { SessionUser } from '../auth/sessions';
import { jobFor } from '../jobs/read';

export async function attachJobPhoto(
	user: SessionUser,
	jobId: string,
	photo: { displayKey: string; thumbKey: string; width: number; height: number; bytes: number },
	originalName: string
): Promise<void> {
	const job = await jobFor(user, jobId);
	await db.insert(photos).values({
		id: newId(),
		jobId: job.id,
		context: 'job',
		...photo,
		originalName,
		uploadedBy: user.id
	});
}
