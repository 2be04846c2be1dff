import type { Cookies } from '@sveltejs/kit';
import { createSession, endSession, findUserByEmail } from './sessions';
import { knownDevice } from './device';
import { verifyAgainstDummy, verifyPassword } from './passwords';
import { claimAttempt, clearThrottle, deviceKey, recordAttempt, refundAttempt } from './throttle';

export type SignInResult =
	| { ok: true; userId: string }
	| { ok: false; reason: 'throttled'; seconds: number }
	| { ok: false; reason: 'mismatch' };

/**
 * Checks the password with the same work whether or not the e-mail exists. `deviceCookie` is the
 * browser's rs_device cookie: a genuine one of this account exempts the attempt from the delays
 * that failures from other devices and addresses have built up.
 */
export async function attemptSignIn(
	email: string,
	password: string,
	ip: string,
	deviceCookie?: string,
	now = Date.now()
): Promise<SignInResult> {
	const user = await findUserByEmail(email);
	const device = knownDevice(deviceCookie, user?.id ?? null);
	const scope = device ? { device } : { email, ip };
	// Counted before the (slow) password check, so attempts sent in parallel can't all pass.
	const wait = await claimAttempt(scope, now);
	if (wait > 0) return { ok: false, reason: 'throttled', seconds: Math.ceil(wait / 1000) };
	const matches = user
		? await verifyPassword(user.passwordHash, password)
		: await verifyAgainstDummy(password);
	const ok = matches && !!user && !user.disabledAt;
	await recordAttempt(email, ip, ok);
	if (!ok) return { ok: false, reason: 'mismatch' };
	if (device) await clearThrottle([deviceKey(device)]);
	else await refundAttempt(scope);
	return { ok: true, userId: user.id };
}

/** Ends any session the browser had and starts a new one (no session fixation). */
export async function startSession(
	cookies: Cookies,
	userId: string,
	previousSessionId: string | undefined,
	meta: { ipAddress: string; userAgent?: string }
): Promise<void> {
	if (previousSessionId) await endSession(previousSessionId);
	const { cookie } = await createSession(userId, meta);
	cookies.set(cookie.name, cookie.value, { ...cookie.attributes, path: '/' });
}
