import type { Cookies } from '@sveltejs/kit';
import { createSession, endSession, findUserByEmail } from './auth';
import { verifyAgainstDummy, verifyPassword } from './passwords';
import { recordAttempt, throttledFor } from './throttle';

export type SignInResult =
	| { ok: true; userId: string }
	| { ok: false; reason: 'throttled'; minutes: number }
	| { ok: false; reason: 'mismatch' };

/** Checks the password with the same work whether or not the e-mail exists. */
export async function attemptSignIn(
	email: string,
	password: string,
	ip: string
): Promise<SignInResult> {
	const minutes = await throttledFor(email, ip);
	if (minutes) return { ok: false, reason: 'throttled', minutes };
	const user = await findUserByEmail(email);
	const matches = user
		? await verifyPassword(user.passwordHash, password)
		: await verifyAgainstDummy(password);
	const ok = matches && !!user && !user.disabledAt;
	await recordAttempt(email, ip, ok);
	return ok ? { ok: true, userId: user.id } : { ok: false, reason: 'mismatch' };
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
