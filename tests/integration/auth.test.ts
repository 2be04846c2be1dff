import { beforeEach, describe, expect, it, vi } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/platform/db';
import { sessions, users } from '$lib/server/platform/db/schema';
import {
	cookieForToken,
	createSession,
	endSession,
	validateSessionToken
} from '$lib/server/auth/sessions';
import { attemptSignIn } from '$lib/server/auth/signin';
import { changeRole, setDisabled } from '$lib/server/auth/team';
import { sha256 } from '$lib/server/platform/crypto';
import { resetDatabase } from '../support/database';
import { makeUser, PASSWORD, seedFirm } from './fixtures';

// A pass-through spy on the argon2 library (a dependency, not the module under test): every
// verification still runs for real, and the test can count them and see which hash each used.
const argon2Verify = vi.hoisted(() => ({ calls: [] as { hash: string; password: string }[] }));
vi.mock('@node-rs/argon2', async (importOriginal) => {
	const actual = await importOriginal<typeof import('@node-rs/argon2')>();
	return {
		...actual,
		verify: (hashed: string, password: string, ...rest: unknown[]) => {
			argon2Verify.calls.push({ hash: hashed, password });
			return (actual.verify as (...args: unknown[]) => Promise<boolean>)(hashed, password, ...rest);
		}
	};
});

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
});

describe('password storage', () => {
	it('stores argon2id with m=19456 KiB, t=2, p=1 (OWASP Password Storage Cheat Sheet minimum)', async () => {
		const user = await makeUser('owner');
		const [row] = await db.select().from(users).where(eq(users.id, user.id));
		expect(row.passwordHash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
		expect(row.passwordHash).not.toContain(PASSWORD);
	});
});

describe('sign-in', () => {
	it('accepts the right password and refuses a wrong one', async () => {
		const user = await makeUser('sales');
		expect(await attemptSignIn(user.email, PASSWORD, '10.0.0.1')).toEqual({
			ok: true,
			userId: user.id
		});
		expect(await attemptSignIn(user.email, 'wrong password here', '10.0.0.1')).toEqual({
			ok: false,
			reason: 'mismatch'
		});
	});

	it('answers an unknown e-mail exactly like a wrong password', async () => {
		await makeUser('sales');
		expect(await attemptSignIn('nobody@test.example', PASSWORD, '10.0.0.2')).toEqual({
			ok: false,
			reason: 'mismatch'
		});
	});

	it('spends the same hashing work on unknown e-mails as on known ones: one argon2id verification each', async () => {
		// The timing itself is measured by `npm run bench:signin`, not asserted here.
		const user = await makeUser('sales');
		const [row] = await db.select().from(users).where(eq(users.id, user.id));
		argon2Verify.calls.length = 0;
		await attemptSignIn(user.email, 'wrong-password-known', '10.1.0.1');
		expect(argon2Verify.calls).toEqual([
			{ hash: row.passwordHash, password: 'wrong-password-known' }
		]);

		argon2Verify.calls.length = 0;
		expect(
			await attemptSignIn('nobody@test.example', 'wrong-password-unknown', '10.1.0.2')
		).toEqual({ ok: false, reason: 'mismatch' });
		// Exactly one verification, against a dummy hash that is no member's, made with the same
		// argon2id parameters as a real one, so it costs the same work.
		expect(argon2Verify.calls).toHaveLength(1);
		const [dummy] = argon2Verify.calls;
		expect(dummy.password).toBe('wrong-password-unknown');
		expect(dummy.hash).not.toBe(row.passwordHash);
		expect(dummy.hash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
	});

	it('refuses a disabled member even with the right password', async () => {
		const owner = await makeUser('owner');
		const crew = await makeUser('crew');
		await setDisabled(owner.id, crew.id, true);
		expect(await attemptSignIn(crew.email, PASSWORD, '10.0.0.3')).toEqual({
			ok: false,
			reason: 'mismatch'
		});
	});
});

describe('sessions', () => {
	it('stores only the hash of the token', async () => {
		const user = await makeUser('owner');
		const { token } = await createSession(user.id);
		const rows = await db.select().from(sessions);
		expect(rows).toHaveLength(1);
		expect(rows[0].id).toBe(sha256(token));
		expect(rows[0].id).not.toContain(token);
		expect((await validateSessionToken(token))?.user.email).toBe(user.email);
	});

	it('sign-out ends the session on the server', async () => {
		const user = await makeUser('owner');
		const { token } = await createSession(user.id);
		await endSession(sha256(token));
		expect(await validateSessionToken(token)).toBeNull();
	});

	it('disabling a member ends all their sessions', async () => {
		const owner = await makeUser('owner');
		const sales = await makeUser('sales');
		const a = await createSession(sales.id);
		const b = await createSession(sales.id);
		await setDisabled(owner.id, sales.id, true);
		expect(await validateSessionToken(a.token)).toBeNull();
		expect(await validateSessionToken(b.token)).toBeNull();
		expect(await db.select().from(sessions).where(eq(sessions.userId, sales.id))).toHaveLength(0);
	});

	it('ends a session past its 12-hour absolute lifetime even while it is in use', async () => {
		const user = await makeUser('sales');
		const { token } = await createSession(user.id);
		const row = (await db.select().from(sessions))[0];
		expect(row.absoluteExpiresAt.getTime() - row.createdAt.getTime()).toBeGreaterThan(
			11.9 * 3600_000
		);
		expect(row.absoluteExpiresAt.getTime() - row.createdAt.getTime()).toBeLessThanOrEqual(
			12 * 3600_000 + 1000
		);
		await db.update(sessions).set({
			absoluteExpiresAt: new Date(Date.now() - 1000),
			expiresAt: new Date(Date.now() + 3600_000)
		});
		expect(await validateSessionToken(token)).toBeNull();
	});

	it('a session checked a moment ago still ends at once: sign-out, disabling, a role change', async () => {
		// validateSessionToken keeps recent answers for a few seconds; none of these may wait for it.
		const first = await makeUser('owner', 'first@test.example');
		const second = await makeUser('owner', 'second@test.example');
		const a = await createSession(first.id);
		const b = await createSession(first.id);
		expect((await validateSessionToken(a.token))?.user.role).toBe('owner');
		await endSession(sha256(a.token));
		expect(await validateSessionToken(a.token)).toBeNull();

		expect((await validateSessionToken(b.token))?.user.role).toBe('owner');
		await changeRole(first.id, first.id, 'sales'); // one's own role: the session stays
		expect((await validateSessionToken(b.token))?.user.role).toBe('sales');

		const c = await createSession(second.id);
		expect(await validateSessionToken(c.token)).not.toBeNull();
		await changeRole(first.id, first.id, 'owner');
		await setDisabled(first.id, second.id, true);
		expect(await validateSessionToken(c.token)).toBeNull();
	});

	it('ends a session left idle past its expiry', async () => {
		const user = await makeUser('sales');
		const { token } = await createSession(user.id);
		await db.update(sessions).set({ expiresAt: new Date(Date.now() - 1000) });
		expect(await validateSessionToken(token)).toBeNull();
	});
});

describe('the session cookie', () => {
	it('is HttpOnly, SameSite=Lax and Path=/, and not Secure on an http ORIGIN (local use)', () => {
		expect(process.env.PUBLIC_ORIGIN ?? process.env.ORIGIN ?? 'http:').toMatch(/^http:/);
		expect(cookieForToken('token-value').attributes).toMatchObject({
			httpOnly: true,
			sameSite: 'lax',
			path: '/',
			secure: false
		});
	});

	it('is Secure whenever ORIGIN is an https address', async () => {
		const saved = { ORIGIN: process.env.ORIGIN, PUBLIC_ORIGIN: process.env.PUBLIC_ORIGIN };
		process.env.ORIGIN = 'https://copperleaf.example';
		delete process.env.PUBLIC_ORIGIN;
		vi.resetModules();
		try {
			const fresh = await import('$lib/server/auth/sessions');
			expect(fresh.cookieForToken('token-value').attributes).toMatchObject({
				secure: true,
				httpOnly: true,
				sameSite: 'lax',
				path: '/'
			});
		} finally {
			for (const [k, v] of Object.entries(saved)) {
				if (v === undefined) delete process.env[k];
				else process.env[k] = v;
			}
			vi.resetModules();
		}
	});
});
