// The device cookie of the OWASP Authentication Cheat Sheet ("device cookies"): issued when a
// browser signs in successfully, it names the account and a random nonce, signed with an HMAC
// under FORM_SECRET. A later sign-in to the same account from that browser is not slowed by
// failures from elsewhere (throttle.ts); failures from the device itself count against its nonce.
import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Cookies } from '@sveltejs/kit';
import { env, origin, requireSecret } from '../platform/env';

export const DEVICE_COOKIE = 'rs_device';
const MAX_AGE_S = 365 * 24 * 60 * 60;

function sign(body: string): string {
	return createHmac('sha256', requireSecret('FORM_SECRET', env))
		.update(`device-cookie:${body}`)
		.digest('base64url');
}

/** A new signed value for an account. */
export function deviceCookieValue(userId: string, nonce = randomBytes(16).toString('base64url')) {
	const body = `${Buffer.from(userId).toString('base64url')}.${nonce}`;
	return `${body}.${sign(body)}`;
}

/** The nonce of a genuine cookie of this account, or null (forged, another account, garbage). */
export function knownDevice(value: string | undefined, userId: string | null): string | null {
	if (!value || !userId || value.length > 300) return null;
	const parts = value.split('.');
	if (parts.length !== 3) return null;
	const [who, nonce, mac] = parts;
	const expected = Buffer.from(sign(`${who}.${nonce}`));
	const given = Buffer.from(mac);
	if (expected.length !== given.length || !timingSafeEqual(expected, given)) return null;
	if (Buffer.from(who, 'base64url').toString() !== userId) return null;
	return nonce;
}

export function setDeviceCookie(cookies: Cookies, userId: string): void {
	cookies.set(DEVICE_COOKIE, deviceCookieValue(userId), {
		path: '/sign-in',
		httpOnly: true,
		sameSite: 'lax',
		secure: origin().startsWith('https:') || env.COOKIE_SECURE === 'true',
		maxAge: MAX_AGE_S
	});
}
