// The homeowner's private care links: 160-bit tokens, only their SHA-256 stored. A property
// link opens the care page (offer, sign-up, payment, cancel); a visit link opens one visit.
import { eq } from 'drizzle-orm';
import { db } from '../platform/db';
import { careLinks } from '../platform/db/schema';
import { newToken, sha256 } from '../platform/crypto';
import type { Db } from './db';

export async function newCareLink(
	propertyId: string,
	serviceVisitId: string | null = null,
	tx: Db = db
): Promise<string> {
	const token = newToken();
	await tx.insert(careLinks).values({ tokenHash: sha256(token), propertyId, serviceVisitId });
	return token;
}

export async function careLink(token: string) {
	if (!token || token.length > 200) return null;
	const [row] = await db
		.select()
		.from(careLinks)
		.where(eq(careLinks.tokenHash, sha256(token)));
	return row ?? null;
}
