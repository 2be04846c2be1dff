// Sign-in throttling that slows guessing without locking anyone out, after the "device cookies"
// technique of the OWASP Authentication Cheat Sheet: a browser that has signed in to an account
// before carries a signed cookie (device.ts) and is not slowed by failures that come from
// elsewhere; every other device faces a delay that doubles with each failure past a few, per
// account and per address, and never grows past a minute. Nothing is ever refused for longer.
// The counts live in PostgreSQL, so every app process sees the same ones.
// Numbers: common practice, no source (the cheat sheet asks for growing delays, not values).
import { inArray, sql } from 'drizzle-orm';
import { db } from './db';
import { signInAttempts, signInThrottles } from './db/schema';

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

/** Milliseconds until the next attempt is allowed, or 0 when one is allowed now. */
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
	let wait = 0;
	for (const row of rows) {
		const since = now - row.lastFailureAt.getTime();
		if (since > THROTTLE.forgetAfterMs) continue;
		const free = keys.find((k) => k.key === row.key)!.free;
		wait = Math.max(wait, delayAfter(row.failures, free) - since);
	}
	return Math.max(0, wait);
}

/** Counts a failure against every key of the scope (one statement per key, atomic). */
export async function recordFailure(scope: ThrottleScope, now = Date.now()): Promise<void> {
	const at = new Date(now);
	const stale = new Date(now - THROTTLE.forgetAfterMs).toISOString();
	for (const { key } of keysOf(scope)) {
		await db
			.insert(signInThrottles)
			.values({ key, failures: 1, lastFailureAt: at })
			.onConflictDoUpdate({
				target: signInThrottles.key,
				set: {
					failures: sql`case when ${signInThrottles.lastFailureAt} < ${stale}::timestamptz then 1 else ${signInThrottles.failures} + 1 end`,
					lastFailureAt: at
				}
			});
	}
}

/** Forgets the counts of a scope (a known device signed in; an account's password was reset). */
export async function clearThrottle(keys: string[]): Promise<void> {
	if (keys.length) await db.delete(signInThrottles).where(inArray(signInThrottles.key, keys));
}

/** The sign-in log: every attempt, for the record (the throttle reads its own counts). */
export async function recordAttempt(email: string, ip: string, succeeded: boolean): Promise<void> {
	await db.insert(signInAttempts).values({ emailKey: emailKey(email), ipAddress: ip, succeeded });
}
