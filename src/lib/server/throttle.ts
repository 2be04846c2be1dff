// Sign-in throttling per account and per address, kept in PostgreSQL so every app process
// sees the same counts. Limits: common practice, no source (OWASP asks for throttling, not numbers).
import { and, count, eq, gt } from 'drizzle-orm';
import { db } from './db';
import { signInAttempts } from './db/schema';

export const THROTTLE = {
	windowMs: 15 * 60 * 1000,
	perAccount: 5,
	perAddress: 20
} as const;

export function emailKey(email: string): string {
	return email.trim().toLowerCase();
}

/** Minutes until another attempt is allowed, or 0 when one is allowed now. */
export async function throttledFor(email: string, ip: string): Promise<number> {
	const since = new Date(Date.now() - THROTTLE.windowMs);
	const [byAccount] = await db
		.select({ n: count() })
		.from(signInAttempts)
		.where(
			and(
				eq(signInAttempts.emailKey, emailKey(email)),
				eq(signInAttempts.succeeded, false),
				gt(signInAttempts.createdAt, since)
			)
		);
	const [byAddress] = await db
		.select({ n: count() })
		.from(signInAttempts)
		.where(
			and(
				eq(signInAttempts.ipAddress, ip),
				eq(signInAttempts.succeeded, false),
				gt(signInAttempts.createdAt, since)
			)
		);
	if (byAccount.n >= THROTTLE.perAccount || byAddress.n >= THROTTLE.perAddress) {
		return Math.ceil(THROTTLE.windowMs / 60_000);
	}
	return 0;
}

export async function recordAttempt(email: string, ip: string, succeeded: boolean): Promise<void> {
	await db.insert(signInAttempts).values({ emailKey: emailKey(email), ipAddress: ip, succeeded });
}
