import { createHash, randomBytes } from 'node:crypto';

/** A random token of 160 bits, URL-safe. */
export function newToken(): string {
	return randomBytes(20).toString('base64url');
}

export function sha256(value: string): string {
	return createHash('sha256').update(value).digest('hex');
}

export function newId(): string {
	return randomBytes(12).toString('base64url');
}
