import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { db } from '$lib/server/platform/db';
import { invitations, passwordResets, users } from '$lib/server/platform/db/schema';
import { createSession, validateSessionToken } from '$lib/server/auth/sessions';
import { attemptSignIn } from '$lib/server/auth/signin';
import {
	acceptInvitation,
	changeRole,
	completePasswordReset,
	findOpenInvitation,
	invite,
	requestPasswordReset,
	setDisabled,
	TeamError
} from '$lib/server/auth/team';
import { startWorkers, stopQueue } from '$lib/server/queue-workers';
import { outbox } from '$lib/server/platform/db/schema';
import { actions as forgotActions } from '../../src/routes/(auth)/forgot/+page.server';
import { resetDatabase } from '../support/database';
import { allMail, clearMail, linkIn, waitForMail } from '../support/mailbox';
import { makeUser, PASSWORD, seedFirm } from './fixtures';

const tokenOf = (url: string) => new URL(url).pathname.split('/').pop()!;

// Reset mails go through the outbox and the queue, as in the app.
beforeAll(async () => {
	await startWorkers();
});
afterAll(async () => {
	await stopQueue();
});

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
	await clearMail();
});

describe('invitations', () => {
	it('e-mails a single-use link that creates the member with the invited role', async () => {
		const owner = await makeUser('owner');
		await invite(owner.id, { email: 'new.crew@test.example', name: 'New Crew', role: 'crew' });
		const mail = await waitForMail('new.crew@test.example', /Join Test Firm/);
		expect(mail.html).toContain('Choose a password');
		const token = tokenOf(linkIn(mail, /^\/invitation\//));
		expect(await findOpenInvitation(token)).not.toBeNull();

		const userId = await acceptInvitation(token, 'a brand new password');
		expect(userId).toBeTruthy();
		const [created] = await db.select().from(users).where(eq(users.id, userId!));
		expect(created).toMatchObject({
			email: 'new.crew@test.example',
			role: 'crew',
			name: 'New Crew'
		});
		expect(
			await attemptSignIn('new.crew@test.example', 'a brand new password', '10.9.0.1')
		).toMatchObject({ ok: true });

		expect(await acceptInvitation(token, 'another password!!')).toBeNull();
		expect(await findOpenInvitation(token)).toBeNull();
	});

	it('refuses an expired invitation and changes nothing', async () => {
		const owner = await makeUser('owner');
		await invite(owner.id, { email: 'late@test.example', name: 'Late', role: 'sales' });
		const token = tokenOf(
			linkIn(await waitForMail('late@test.example', /Join/), /^\/invitation\//)
		);
		await db.update(invitations).set({ expiresAt: new Date(Date.now() - 1000) });
		expect(await acceptInvitation(token, 'a brand new password')).toBeNull();
		expect(await db.select().from(users).where(eq(users.email, 'late@test.example'))).toHaveLength(
			0
		);
	});

	it('stores only the hash of the invitation token', async () => {
		const owner = await makeUser('owner');
		await invite(owner.id, { email: 'hash@test.example', name: 'Hash', role: 'sales' });
		const token = tokenOf(
			linkIn(await waitForMail('hash@test.example', /Join/), /^\/invitation\//)
		);
		const [row] = await db.select().from(invitations);
		expect(row.tokenHash).not.toBe(token);
		expect(row.tokenHash).toMatch(/^[0-9a-f]{64}$/);
	});

	it('refuses to invite an address already on the team', async () => {
		const owner = await makeUser('owner');
		await expect(
			invite(owner.id, { email: owner.email, name: 'Again', role: 'sales' })
		).rejects.toThrow(TeamError);
	});
});

describe('roles', () => {
	it('changes a role and signs the member out so the new role applies', async () => {
		const owner = await makeUser('owner');
		const sales = await makeUser('sales');
		const { token } = await createSession(sales.id);
		await changeRole(owner.id, sales.id, 'crew');
		const [row] = await db.select().from(users).where(eq(users.id, sales.id));
		expect(row.role).toBe('crew');
		expect(await validateSessionToken(token)).toBeNull();
	});

	it('keeps at least one active owner', async () => {
		const owner = await makeUser('owner');
		await expect(changeRole(owner.id, owner.id, 'sales')).rejects.toThrow(
			/at least one active owner/
		);
		const other = await makeUser('owner', 'second@test.example');
		await expect(setDisabled(other.id, owner.id, true)).resolves.toBeUndefined();
		await expect(setDisabled(other.id, other.id, true)).rejects.toThrow(/your own account/);
	});
});

describe('password reset', () => {
	it('mails a one-hour single-use link that sets the password and ends every session', async () => {
		const user = await makeUser('sales');
		const { token: sessionToken } = await createSession(user.id);
		await requestPasswordReset(user.email);
		const token = tokenOf(
			linkIn(await waitForMail(user.email, /Reset your Rillstone password/), /^\/reset\//)
		);
		const [reset] = await db.select().from(passwordResets);
		expect(reset.expiresAt.getTime() - reset.createdAt.getTime()).toBeLessThanOrEqual(
			3600_000 + 1000
		);

		expect(await completePasswordReset(token, 'my new long password')).toBe(true);
		expect(await validateSessionToken(sessionToken)).toBeNull();
		expect(await attemptSignIn(user.email, 'my new long password', '10.8.0.1')).toMatchObject({
			ok: true
		});
		expect(await attemptSignIn(user.email, PASSWORD, '10.8.0.2')).toMatchObject({ ok: false });
		expect(await completePasswordReset(token, 'yet another password')).toBe(false);
	});

	it('sends nothing for an unknown address', async () => {
		await requestPasswordReset('nobody@test.example');
		await new Promise((r) => setTimeout(r, 500));
		expect(await allMail()).toHaveLength(0);
	});

	it('refuses an expired link and keeps the old password', async () => {
		const user = await makeUser('crew');
		await requestPasswordReset(user.email);
		const token = tokenOf(linkIn(await waitForMail(user.email, /Reset/), /^\/reset\//));
		await db.update(passwordResets).set({ expiresAt: new Date(Date.now() - 1000) });
		expect(await completePasswordReset(token, 'my new long password')).toBe(false);
		expect(await attemptSignIn(user.email, PASSWORD, '10.8.0.3')).toMatchObject({ ok: true });
	});

	it('five reset requests at once for a fresh account write one link and one mail', async () => {
		// First thing for this account, so the five race each other and not an earlier link.
		const user = await makeUser('sales');
		expect(await db.select().from(passwordResets)).toHaveLength(0);
		// Open enough pooled connections first, so the five really run side by side.
		await Promise.all([1, 2, 3, 4, 5, 6].map(() => db.execute(sql`select pg_sleep(0.05)`)));
		await Promise.all([1, 2, 3, 4, 5].map(() => requestPasswordReset(user.email)));
		expect(await db.select().from(passwordResets)).toHaveLength(1);
		expect(await db.select().from(outbox)).toHaveLength(1);
	});

	it('mails at most one link per account in five minutes, and /forgot answers the same either way', async () => {
		const user = await makeUser('owner');
		const ask = async (email: string) => {
			const body = new URLSearchParams({ email });
			const request = new Request('http://app.test/forgot', { method: 'POST', body });
			return forgotActions.default({ request } as never);
		};
		const answers = [];
		for (let i = 0; i < 5; i++) answers.push(await ask(user.email));
		answers.push(await ask('nobody@test.example'));
		for (const answer of answers) expect(answer).toEqual(answers[0]);
		expect(answers[0]).toMatchObject({ sent: true });
		expect(await db.select().from(passwordResets)).toHaveLength(1);
		expect(await db.select().from(outbox)).toHaveLength(1);
		await waitForMail(user.email, /Reset your Rillstone password/);
		await new Promise((r) => setTimeout(r, 1500));
		expect((await allMail()).filter((m) => m.subject.includes('Reset'))).toHaveLength(1);
		// Five minutes later a new link may go.
		await db.update(passwordResets).set({ createdAt: new Date(Date.now() - 5 * 60 * 1000 - 1000) });
		await ask(user.email);
		expect(await db.select().from(passwordResets)).toHaveLength(2);
	});
});
