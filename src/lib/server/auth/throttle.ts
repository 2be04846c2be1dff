// Sign-in throttling that slows guessing without locking anyone out, after the "device cookies"
// technique of the OWASP Authentication Cheat Sheet: a browser that has signed in to an account
// before carries a signed cookie (device.ts) and is not slowed by failures that come from
// elsewhere; every other device faces a delay that doubles with each failure past a few, per
// account and per address, and never grows past a minute. Nothing is ever refused for longer.
// The counts live in PostgreSQL, so every app process sees the same ones.
// Numbers: common practice, no source (the cheat sheet asks for growing delays, not values).
import { eq, inArray, sql } from 'drizzle-orm';
import { db } from '../platform/db';
import { signInAttempts, signInThrottles } from '../platform/db/schema';

export const THROTTLE = {
	/** Failures of an account from unknown devices before the delay starts. */
	perAccount: 3,
	/** Failures from one address (any account) before the delay starts. */
	perAddress: 10,
	/** Failures from one known device before it, too, is slowed. */
	perDevice: 10,
	/** The longest delay. */
	maxDelayMs: 60_000,
	/** A count whose last failure is older than this starts again. */
	forgetAfterMs: 24 * 60 * 60 * 1000
} as const;

export function emailKey(email: string): string {
	return email.trim().toLowerCase();
}

export const accountKey = (email: string) => `account:${emailKey(email)}`;
export const addressKey = (ip: string) => `address:${ip}`;
export const deviceKey = (nonce: string) => `device:${nonce}`;

/** The delay after `failures` failures where `free` are allowed: 1 s, 2 s, 4 s … at most a minute. */
export function delayAfter(failures: number, free: number): number {
	if (failures < free) return 0;
	return Math.min(THROTTLE.maxDelayMs, 1000 * 2 ** Math.min(failures - free, 16));
}

/** Which counts apply to an attempt: a known device's own, or the account's and the address's. */
export type ThrottleScope = { device: string } | { email: string; ip: string };

function keysOf(scope: ThrottleScope): { key: string; free: number }[] {
	if ('device' in scope) return [{ key: deviceKey(scope.device), free: THROTTLE.perDevice }];
	return [
		{ key: accountKey(scope.email), free: THROTTLE.perAccount },
		{ key: addressKey(scope.ip), free: THROTTLE.perAddress }
	];
}

/**
 * Milliseconds until the next attempt is allowed, or 0 when one is allowed now. Reads only;
 * the sign-in itself uses `claimAttempt`, which checks and counts in one step.
 */
export async function waitFor(scope: ThrottleScope, now = Date.now()): Promise<number> {
	const keys = keysOf(scope);
	const rows = await db
		.select()
		.from(signInThrottles)
		.where(
			inArray(
				signInThrottles.key,
				keys.map((k) => k.key)
			)
		);
	return waitOf(rows, keys, now);
}

function waitOf(
	rows: { key: string; failures: number; lastFailureAt: Date }[],
	keys: { key: string; free: number }[],
	now: number
): number {
	let wait = 0;
	for (const row of rows) {
		const since = now - row.lastFailureAt.getTime();
		if (since > THROTTLE.forgetAfterMs) continue;
		const free = keys.find((k) => k.key === row.key)!.free;
		wait = Math.max(wait, delayAfter(row.failures, free) - since);
	}
	return Math.max(0, wait);
}

/**
 * Checks the delay and counts the attempt as a failure in one transaction, before the password is
 * checked: the scope's rows are locked, so attempts sent at once are counted one after another
 * and only as many as the free count allows get a password check; the rest are told to wait.
 * Returns the wait in milliseconds (nothing counted), or 0 when the attempt may go on (counted;
 * `refundAttempt` takes the count back when the password was right).
 */
export async function claimAttempt(scope: ThrottleScope, now = Date.now()): Promise<number> {
	// Always the same order, so two scopes that share a key (one address, two accounts) can't
	// lock each other's rows crosswise.
	const keys = keysOf(scope).sort((a, b) => (a.key < b.key ? -1 : 1));
	const at = new Date(now);
	return db.transaction(async (tx) => {
		await tx
			.insert(signInThrottles)
			.values(keys.map(({ key }) => ({ key, failures: 0, lastFailureAt: new Date(0) })))
			.onConflictDoNothing();
		const rows = await tx
			.select()
			.from(signInThrottles)
			.where(
				inArray(
					signInThrottles.key,
					keys.map((k) => k.key)
				)
			)
			.orderBy(signInThrottles.key)
			.for('update');
		const wait = waitOf(rows, keys, now);
		if (wait > 0) return wait;
		for (const row of rows) {
			const stale = now - row.lastFailureAt.getTime() > THROTTLE.forgetAfterMs;
			await tx
				.update(signInThrottles)
				.set({ failures: stale ? 1 : row.failures + 1, lastFailureAt: at })
				.where(eq(signInThrottles.key, row.key));
		}
		return 0;
	});
}

/** Takes back the failure `claimAttempt` counted, for an attempt whose password was right. */
export async function refundAttempt(scope: ThrottleScope): Promise<void> {
	await db
		.update(signInThrottles)
		.set({ failures: sql`greatest(${signInThrottles.failures} - 1, 0)` })
		.where(
			inArray(
				signInThrottles.key,
				keysOf(scope).map((k) => k.key)
			)
		);
}

/** Forgets the counts of a scope (a known device signed in; an account's password was reset). */
export async function clearThrottle(keys: string[]): Promise<void> {
	if (keys.length) await db.delete(signInThrottles).where(inArray(signInThrottles.key, keys));
}

/** The sign-in log: every attempt, for the record (the throttle reads its own counts). */
export async function recordAttempt(email: string, ip: string, succeeded: boolean): Promise<void> {
	await db.insert(signInAttempts).values({ emailKey: emailKey(email), ipAddress: ip, succeeded });
}
