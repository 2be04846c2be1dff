// Sign-in throttling after the OWASP Authentication Cheat Sheet's "device cookies": guessing is
// slowed, nobody is locked out. A browser that signed in before keeps signing in during an attack;
// others wait a delay that doubles per failure and never passes a minute; a reset clears it.
import { beforeEach, describe, expect, it } from 'vitest';
import { db } from '$lib/server/platform/db';
import { signInThrottles } from '$lib/server/platform/db/schema';
import { attemptSignIn } from '$lib/server/auth/signin';
import { deviceCookieValue } from '$lib/server/auth/device';
import { accountKey, delayAfter, THROTTLE, waitFor } from '$lib/server/auth/throttle';
import { completePasswordReset } from '$lib/server/auth/team';
import { newId, newToken, sha256 } from '$lib/server/platform/crypto';
import { passwordResets } from '$lib/server/platform/db/schema';
import { resetDatabase } from '../support/database';
import { makeUser, PASSWORD, seedFirm } from './fixtures';

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
});

/** `n` wrong passwords, each sent once the previous delay has passed; returns the clock after. */
async function attack(email: string, ip: string, n: number, start: number): Promise<number> {
	let now = start;
	for (let i = 0; i < n; i++) {
		now += THROTTLE.maxDelayMs + 1;
		expect(await attemptSignIn(email, `wrong guess ${i}`, ip, undefined, now)).toEqual({
			ok: false,
			reason: 'mismatch'
		});
	}
	return now;
}

describe('sign-in throttling without lock-out', () => {
	it('after 30 wrong passwords from one address, the right one from the known device succeeds at once', async () => {
		const user = await makeUser('owner');
		const device = deviceCookieValue(user.id);
		const now = await attack(user.email, '203.0.113.9', 30, Date.now());
		expect(await attemptSignIn(user.email, PASSWORD, '198.51.100.7', device, now + 1)).toEqual({
			ok: true,
			userId: user.id
		});
		// From the attacker's own network too (an office behind one address).
		expect(await attemptSignIn(user.email, PASSWORD, '203.0.113.9', device, now + 2)).toEqual({
			ok: true,
			userId: user.id
		});
	});

	it('the right password from a new device after the attack is delayed by at most a minute, not refused for a quarter hour', async () => {
		const user = await makeUser('sales');
		const now = await attack(user.email, '203.0.113.9', 30, Date.now());
		const first = await attemptSignIn(user.email, PASSWORD, '198.51.100.7', undefined, now + 1);
		expect(first).toMatchObject({ ok: false, reason: 'throttled' });
		if (!first.ok && first.reason === 'throttled') {
			expect(first.seconds).toBeGreaterThan(0);
			expect(first.seconds).toBeLessThanOrEqual(60);
		}
		expect(
			await attemptSignIn(user.email, PASSWORD, '198.51.100.7', undefined, now + 60_001)
		).toEqual({ ok: true, userId: user.id });
	});

	it('unknown devices wait 1 s after the 3rd failure of an account, doubling to at most 60 s', async () => {
		// The schedule itself (common practice, no source: OWASP asks for growing delays).
		expect([2, 3, 4, 5, 8, 9, 20].map((n) => delayAfter(n, THROTTLE.perAccount))).toEqual([
			0, 1000, 2000, 4000, 32_000, 60_000, 60_000
		]);
		const user = await makeUser('crew');
		const t0 = Date.now();
		for (let i = 0; i < 3; i++) {
			await attemptSignIn(user.email, 'nope', `10.5.0.${i}`, undefined, t0 + i);
		}
		// Three addresses, one account: the account's count holds them all back.
		expect(await attemptSignIn(user.email, PASSWORD, '10.5.0.9', undefined, t0 + 10)).toMatchObject(
			{ reason: 'throttled', seconds: 1 }
		);
		expect(await attemptSignIn(user.email, PASSWORD, '10.5.0.9', undefined, t0 + 1010)).toEqual({
			ok: true,
			userId: user.id
		});
	});

	it('wrong passwords sent all at once get no more password checks than the free count', async () => {
		const user = await makeUser('crew');
		const t0 = Date.now();
		const results = await Promise.all(
			Array.from({ length: 12 }, (_, i) =>
				attemptSignIn(user.email, `parallel guess ${i}`, '10.8.0.1', undefined, t0)
			)
		);
		const answered = results.filter((r) => !r.ok && r.reason === 'mismatch');
		expect(answered.length).toBeLessThanOrEqual(THROTTLE.perAccount);
		expect(results.filter((r) => !r.ok && r.reason === 'throttled')).toHaveLength(
			12 - answered.length
		);
		// The right password right after is told to wait too, not checked.
		expect(await attemptSignIn(user.email, PASSWORD, '10.8.0.2', undefined, t0 + 1)).toMatchObject({
			reason: 'throttled'
		});
	});

	it('a right password from an unknown device does not count as a failure', async () => {
		const user = await makeUser('crew');
		const t0 = Date.now();
		for (let i = 0; i < 5; i++) {
			expect(await attemptSignIn(user.email, PASSWORD, '10.9.0.1', undefined, t0 + i)).toEqual({
				ok: true,
				userId: user.id
			});
		}
		expect(await waitFor({ email: user.email, ip: '10.9.0.1' }, t0 + 5)).toBe(0);
	});

	it('attempts refused during a delay do not add to it', async () => {
		const user = await makeUser('crew');
		const t0 = Date.now();
		for (let i = 0; i < 3; i++) await attemptSignIn(user.email, 'nope', '10.6.0.1', undefined, t0);
		for (let i = 0; i < 50; i++) {
			expect((await attemptSignIn(user.email, 'nope', '10.6.0.1', undefined, t0 + 10)).ok).toBe(
				false
			);
		}
		expect(await waitFor({ email: user.email, ip: '10.6.0.1' }, t0 + 10)).toBe(990);
	});

	it('one address failing across many accounts waits after 10 failures; other addresses do not', async () => {
		const user = await makeUser('owner');
		const t0 = Date.now();
		for (let i = 0; i < THROTTLE.perAddress; i++) {
			await attemptSignIn(`guess${i}@test.example`, 'guess', '10.4.0.1', undefined, t0);
		}
		expect(await attemptSignIn(user.email, PASSWORD, '10.4.0.1', undefined, t0 + 1)).toMatchObject({
			reason: 'throttled'
		});
		expect(await attemptSignIn(user.email, PASSWORD, '10.4.0.2', undefined, t0 + 1)).toMatchObject({
			ok: true
		});
	});

	it('unknown e-mails are slowed the same way, giving no hint that they do not exist', async () => {
		const t0 = Date.now();
		for (let i = 0; i < 3; i++) {
			await attemptSignIn('ghost@test.example', 'guess', `10.3.0.${i}`, undefined, t0);
		}
		expect(
			await attemptSignIn('ghost@test.example', 'guess', '10.3.0.50', undefined, t0 + 1)
		).toMatchObject({ reason: 'throttled', seconds: 1 });
	});

	it("a forged cookie, or another account's, earns no exemption", async () => {
		const user = await makeUser('owner');
		const other = await makeUser('sales');
		const now = await attack(user.email, '203.0.113.9', 5, Date.now());
		const genuine = deviceCookieValue(user.id);
		const forged = genuine.slice(0, -2) + (genuine.endsWith('AA') ? 'BB' : 'AA');
		for (const cookie of [forged, deviceCookieValue(other.id), 'garbage', '']) {
			expect(
				await attemptSignIn(user.email, PASSWORD, '198.51.100.7', cookie, now + 1)
			).toMatchObject({ reason: 'throttled' });
		}
	});

	it('a known device that itself keeps failing is slowed too, by its own count', async () => {
		const user = await makeUser('owner');
		const device = deviceCookieValue(user.id);
		const t0 = Date.now();
		for (let i = 0; i < THROTTLE.perDevice; i++) {
			await attemptSignIn(user.email, 'typo', '10.7.0.1', device, t0);
		}
		expect(await attemptSignIn(user.email, PASSWORD, '10.7.0.1', device, t0 + 1)).toMatchObject({
			reason: 'throttled'
		});
		// Its failures did not hold up the account for other devices.
		expect(await attemptSignIn(user.email, PASSWORD, '10.7.0.2', undefined, t0 + 1)).toMatchObject({
			ok: true
		});
	});

	it("a completed password reset clears the account's delay", async () => {
		const user = await makeUser('owner');
		const now = await attack(user.email, '203.0.113.9', 12, Date.now());
		expect(await waitFor({ email: user.email, ip: '198.51.100.7' }, now + 1)).toBeGreaterThan(0);
		const token = newToken();
		await db.insert(passwordResets).values({
			id: newId(),
			tokenHash: sha256(token),
			userId: user.id,
			expiresAt: new Date(Date.now() + 3_600_000)
		});
		expect(await completePasswordReset(token, 'a fresh long password')).toBe(true);
		const keys = (await db.select().from(signInThrottles)).map((r) => r.key);
		expect(keys).not.toContain(accountKey(user.email));
		expect(
			await attemptSignIn(user.email, 'a fresh long password', '198.51.100.7', undefined, now + 1)
		).toEqual({ ok: true, userId: user.id });
	});
});
