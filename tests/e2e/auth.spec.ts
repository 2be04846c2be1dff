import { expect, test } from '@playwright/test';
import { clearMail, linkIn, waitForMail } from '../support/mailbox';
import { demoUser, signIn } from './pages/staff';

test('a wrong password gets a clear message and keeps the e-mail typed', async ({ page }) => {
	await page.goto('/sign-in');
	await page.getByLabel('E-mail').fill(demoUser('sales').email);
	await page.getByLabel('Password').fill('not the right password');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('alert')).toHaveText(
		'That e-mail and password do not match an active account.'
	);
	await expect(page.getByLabel('E-mail')).toHaveValue(demoUser('sales').email);
});

test('an unknown e-mail gets the very same message', async ({ page }) => {
	await page.goto('/sign-in');
	await page.getByLabel('E-mail').fill('nobody@copperleaf.example');
	await page.getByLabel('Password').fill('not the right password');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('alert')).toHaveText(
		'That e-mail and password do not match an active account.'
	);
});

test('a malformed e-mail is flagged beside its field', async ({ page }) => {
	await page.goto('/sign-in');
	await page.getByLabel('E-mail').fill('not-an-address');
	await page.getByLabel('Password').fill('whatever password');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByText('Enter a valid e-mail address, like name@example.com')).toBeVisible();
});

test('the office sends an anonymous visitor to sign-in and back to the page asked for', async ({
	page
}) => {
	await page.goto('/office/team');
	await expect(page).toHaveURL(/\/sign-in\?next=%2Foffice%2Fteam/);
	const owner = demoUser('owner');
	await page.getByLabel('E-mail').fill(owner.email);
	await page.getByLabel('Password').fill(owner.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/office\/team$/);
	await expect(page.getByRole('heading', { name: 'Team' })).toBeVisible();
});

test('each role sees only its own sections, and sign-out ends the session', async ({
	page,
	context
}) => {
	await signIn(page, 'crew');
	const nav = page.getByRole('navigation', { name: 'Office sections' });
	await expect(nav.getByRole('link', { name: 'Today' })).toBeVisible();
	await expect(nav.getByRole('link', { name: 'Team' })).toHaveCount(0);
	const response = await page.goto('/office/team');
	expect(response?.status()).toBe(403);
	await expect(
		page.getByRole('heading', { name: 'Your role does not allow this page' })
	).toBeVisible();

	await page.goto('/office');
	const cookie = (await context.cookies()).find((c) => c.name === 'rs_session')!;
	expect(cookie.httpOnly).toBe(true);
	expect(cookie.sameSite).toBe('Lax');
	await page.getByRole('button', { name: 'Sign out' }).first().click();
	await expect(page).toHaveURL(/\/sign-in/);
	// The old cookie no longer opens anything, even when sent again by hand.
	await context.addCookies([cookie]);
	await page.goto('/office');
	await expect(page).toHaveURL(/\/sign-in/);
});

test('signing in again gives a new session token', async ({ page, context }) => {
	await signIn(page, 'sales');
	const first = (await context.cookies()).find((c) => c.name === 'rs_session')!.value;
	await page.getByRole('button', { name: 'Sign out' }).first().click();
	await signIn(page, 'sales');
	const second = (await context.cookies()).find((c) => c.name === 'rs_session')!.value;
	expect(second).not.toBe(first);
});

test('the owner invites a crew lead, who joins through the e-mailed link', async ({
	page,
	browser
}) => {
	await clearMail();
	const email = `invitee-${Date.now()}@copperleaf.example`;
	await signIn(page, 'owner');
	await page.goto('/office/team');
	const form = page.locator('form[action="?/invite"]');
	await form.getByLabel('Name').fill('Ida Fernsby');
	await form.getByLabel('E-mail').fill(email);
	await form.getByLabel('Role').selectOption('crew');
	await form.getByRole('button', { name: 'Send the invitation' }).click();
	await expect(page.getByText(`Invitation sent to ${email}`)).toBeVisible();

	const link = linkIn(await waitForMail(email, /Join Copperleaf/), /^\/invitation\//);
	const invitee = await browser.newPage();
	await invitee.goto(link);
	await expect(invitee.getByRole('heading', { name: 'Welcome, Ida Fernsby' })).toBeVisible();
	await invitee.getByLabel('New password').fill('short');
	await invitee.getByLabel('The same password again').fill('short');
	await invitee.getByRole('button', { name: 'Join and sign in' }).click();
	await expect(invitee.getByText('Use at least 12 characters')).toBeVisible();
	await invitee.getByLabel('New password').fill('ida joins the crew today');
	await invitee.getByLabel('The same password again').fill('ida joins the crew today');
	await invitee.getByRole('button', { name: 'Join and sign in' }).click();
	await expect(invitee).toHaveURL(/\/office$/);
	await expect(invitee.getByText('Ida Fernsby · Crew lead').first()).toBeVisible();

	await invitee.context().clearCookies();
	await invitee.goto(link);
	await expect(invitee.getByRole('heading', { name: 'This link no longer works' })).toBeVisible();
	await invitee.close();
});

test('a forgotten password is reset through the e-mailed link', async ({ page }) => {
	await clearMail();
	// A throwaway member, so the demo passwords stay as they are for other tests.
	await signIn(page, 'owner');
	await page.goto('/office/team');
	const email = `resetter-${Date.now()}@copperleaf.example`;
	const form = page.locator('form[action="?/invite"]');
	await form.getByLabel('Name').fill('Reset Tester');
	await form.getByLabel('E-mail').fill(email);
	await form.getByRole('button', { name: 'Send the invitation' }).click();
	await page.goto(linkIn(await waitForMail(email, /Join/), /^\/invitation\//));
	await page.getByLabel('New password').fill('first password of mine');
	await page.getByLabel('The same password again').fill('first password of mine');
	await page.getByRole('button', { name: 'Join and sign in' }).click();
	await expect(page).toHaveURL(/\/office$/);
	await page.getByRole('button', { name: 'Sign out' }).first().click();

	await page.goto('/forgot');
	await page.getByLabel('E-mail').fill(email);
	await page.getByRole('button', { name: 'Send the link' }).click();
	await expect(page.getByText('If that address belongs to an active account')).toBeVisible();
	const link = linkIn(await waitForMail(email, /Reset your Rillstone password/), /^\/reset\//);
	await page.goto(link);
	await page.getByLabel('New password').fill('second password of mine');
	await page.getByLabel('The same password again').fill('second password of mine');
	await page.getByRole('button', { name: 'Save the new password' }).click();
	await expect(page).toHaveURL(/\/sign-in\?reset=1/);
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill('second password of mine');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/office$/);
	await page.goto(link);
	await expect(page.getByRole('heading', { name: 'This link no longer works' })).toBeVisible();
});
