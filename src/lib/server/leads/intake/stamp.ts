import { createHmac, timingSafeEqual } from 'node:crypto';

import { env, requireSecret } from '../../platform/env';
import { DRAFT_TTL_MS } from './drafts';

// ---------------------------------------------------------------------------------------------
// Abuse limits that need no state: a honeypot and a signed "form opened at" stamp

export const HONEYPOT = 'website';

function secret(): string {
	return requireSecret('FORM_SECRET');
}

const sign = (value: string) => createHmac('sha256', secret()).update(value).digest('base64url');

/** A stamp of when the form was shown, signed so a bot cannot make up an earlier time. */
export function formStamp(now = Date.now()): string {
	const value = String(now);
	return `${value}.${sign(value)}`;
}

export function minFillMs(): number {
	return Number(env.INTAKE_MIN_FILL_SECONDS ?? 3) * 1000;
}

/** Null when the stamp is genuine and old enough, else the reason to refuse. */
export function checkStamp(stamp: string, now = Date.now()): string | null {
	const [value, mac] = stamp.split('.');
	const expected = value ? sign(value) : '';
	const ok =
		mac &&
		mac.length === expected.length &&
		timingSafeEqual(Buffer.from(mac), Buffer.from(expected));
	const at = Number(value);
	if (!ok || !Number.isFinite(at)) {
		return 'This form has expired. Please check it and send it again.';
	}
	if (now - at < minFillMs()) {
		return 'That was very quick. Please check your details and send the form again.';
	}
	if (now - at > 7 * DRAFT_TTL_MS) {
		return 'This form was open for a long time. Please send it again.';
	}
	return null;
}

/** The signed thank-you link: the page shows the number only when the link is genuine. */
export function thanksPath(number: number): string {
	return `/start/thanks?n=${number}&s=${sign(`thanks:${number}`).slice(0, 16)}`;
}
export function verifyThanks(n: string | null, s: string | null): number | null {
	if (!n || !s || !/^\d{1,9}$/.test(n)) return null;
	return sign(`thanks:${n}`).slice(0, 16) === s ? Number(n) : null;
}
