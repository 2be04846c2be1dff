// The lead's timeline (activities): the one writer every domain uses.
import type { Db } from '../platform/db';
import { activities } from '../platform/db/schema';

export async function addActivity(
	tx: Db,
	leadId: string,
	kind: string,
	body: string,
	actorId: string | null,
	data: Record<string, unknown> = {}
): Promise<void> {
	await tx.insert(activities).values({ leadId, kind, body, actorId, data });
}
