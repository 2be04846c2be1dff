import { hash, verify } from '@node-rs/argon2';

// OWASP Password Storage Cheat Sheet, argon2id minimum: m=19456 KiB (19 MiB), t=2, p=1.
export const ARGON2_PARAMS = {
	algorithm: 2, // Algorithm.Argon2id (a const enum in @node-rs/argon2's types)
	memoryCost: 19456,
	timeCost: 2,
	parallelism: 1,
	outputLen: 32
} as const;

export function hashPassword(password: string): Promise<string> {
	return hash(password, ARGON2_PARAMS);
}

export async function verifyPassword(storedHash: string, password: string): Promise<boolean> {
	try {
		return await verify(storedHash, password);
	} catch {
		return false;
	}
}

// Verified against when the e-mail is unknown, so both answers take the same time.
let dummyHash: Promise<string> | null = null;
export async function verifyAgainstDummy(password: string): Promise<false> {
	dummyHash ??= hashPassword('not-a-real-password-for-timing');
	await verifyPassword(await dummyHash, password);
	return false;
}
