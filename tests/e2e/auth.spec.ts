import { expect, request, test } from '@playwright/test';
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

test('an e-mail typed while the page is still loading is kept once its script starts', async ({
	page
}) => {
	// Hold the app's scripts back, type, then let them run: hydration must not empty the field.
	let release = () => {};
	const held = new Promise<void>((resolve) => (release = resolve));
	await page.route('**/_app/immutable/**/*.js', async (route) => {
		await held;
		await route.continue();
	});
	await page.goto('/sign-in', { waitUntil: 'domcontentloaded' });
	await page.getByLabel('E-mail').fill(demoUser('crew').email);
	release();
	await page.waitForLoadState('networkidle');
	await page.evaluate(() => new Promise((resolve) => requestAnimationFrame(resolve)));
	await expect(page.getByLabel('E-mail')).toHaveValue(demoUser('crew').email);
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

test('the session cookie is HttpOnly, SameSite=Lax and Path=/, with a long random token', async ({
	baseURL
}) => {
	const user = demoUser('crew');
	const ctx = await request.newContext({
		baseURL,
		extraHTTPHeaders: { origin: baseURL!, accept: 'text/html' }
	});
	const res = await ctx.post('/sign-in', {
		form: { email: user.email, password: user.password },
		maxRedirects: 0
	});
	expect(res.status()).toBe(303);
	const header = res
		.headersArray()
		.filter((h) => h.name.toLowerCase() === 'set-cookie')
		.map((h) => h.value)
		.find((v) => v.startsWith('rs_session='))!;
	const attributes = header.split(';').map((a) => a.trim().toLowerCase());
	expect(attributes).toContain('httponly');
	expect(attributes).toContain('samesite=lax');
	expect(attributes).toContain('path=/');
	// ORIGIN is http here, so no Secure (tests/integration/auth.test.ts covers https).
	expect(new URL(baseURL!).protocol).toBe('http:');
	expect(attributes).not.toContain('secure');
	// The token is long and random: at least 120 bits.
	expect(header.split(';')[0].slice('rs_session='.length).length).toBeGreaterThanOrEqual(20);
	await ctx.dispose();
});

test('a session cookie planted before sign-in is never adopted (no session fixation)', async ({
	browser,
	baseURL
}) => {
	// The attacker signs in with their own account and plants that token in the victim's browser.
	const attacker = await browser.newContext();
	await signIn(await attacker.newPage(), 'crew');
	const planted = (await attacker.cookies()).find((c) => c.name === 'rs_session')!;

	// The victim's browser sends its credentials with the planted cookie still in the jar.
	const victim = await browser.newContext();
	await victim.addCookies([planted]);
	const owner = demoUser('owner');
	const res = await victim.request.post('/sign-in', {
		form: { email: owner.email, password: owner.password },
		headers: { origin: baseURL!, accept: 'text/html' },
		maxRedirects: 0
	});
	expect(res.status()).toBe(303);
	const issued = (await victim.cookies()).find((c) => c.name === 'rs_session')!;
	expect(issued.value).not.toBe(planted.value);
	const page = await victim.newPage();
	await page.goto('/office');
	await expect(page.getByText('Mara Quill · Owner').first()).toBeVisible();

	// The planted token was ended by that sign-in: it opens nothing, least of all the owner's office.
	const attackerPage = await attacker.newPage();
	await attackerPage.goto('/office/team');
	await expect(attackerPage).toHaveURL(/\/sign-in/);

	// A made-up value is cleared at once and never becomes a session either.
	const guess = await browser.newContext();
	await guess.addCookies([{ ...planted, value: 'attacker-chosen-value-0123456789' }]);
	const guessPage = await guess.newPage();
	await guessPage.goto('/office');
	await expect(guessPage).toHaveURL(/\/sign-in/);
	expect((await guess.cookies()).find((c) => c.name === 'rs_session')?.value ?? '').toBe('');
	await signIn(guessPage, 'sales');
	const fresh = (await guess.cookies()).find((c) => c.name === 'rs_session')!;
	expect(fresh.value).not.toBe('attacker-chosen-value-0123456789');

	for (const c of [attacker, victim, guess]) await c.close();
});

test('a form posted from another site is refused, even with a valid session (CSRF)', async ({
	baseURL
}) => {
	const user = demoUser('owner');
	const foreign = await request.newContext({
		baseURL,
		extraHTTPHeaders: { origin: 'http://evil.example', accept: 'text/html' }
	});
	const signInRes = await foreign.post('/sign-in', {
		form: { email: user.email, password: user.password },
		maxRedirects: 0
	});
	expect(signInRes.status()).toBe(403);

	// Signed in for real, then a cross-site post carrying that cookie changes nothing.
	const ctx = await request.newContext({
		baseURL,
		extraHTTPHeaders: { origin: baseURL!, accept: 'text/html' }
	});
	expect(
		(
			await ctx.post('/sign-in', {
				form: { email: user.email, password: user.password },
				maxRedirects: 0
			})
		).status()
	).toBe(303);
	const before = await (await ctx.get('/office/team')).text();
	const forged = await ctx.post('/office/team?/invite', {
		form: { name: 'Mallory Forge', email: `forged-${Date.now()}@evil.example`, role: 'owner' },
		headers: { origin: 'http://evil.example' },
		maxRedirects: 0
	});
	expect(forged.status()).toBe(403);
	const after = await (await ctx.get('/office/team')).text();
	expect(before).not.toContain('Mallory Forge');
	expect(after).not.toContain('Mallory Forge');
	await foreign.dispose();
	await ctx.dispose();
});
