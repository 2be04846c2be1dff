// The public care sign-up on a phone: a homeowner the firm does not know yet finds the plans
// from the seasonal care service page, lists a fountain, sees the price, and pays the year on the
// provider's (stand-in's) page, or chooses to be invoiced; the owner then finds the plan in the
// office. The plan is written straight to the e2e database (as in care.spec.ts).
import { randomBytes } from 'node:crypto';
import AxeBuilder from '@axe-core/playwright';
import postgres from 'postgres';
import { expect, test, type Page } from '@playwright/test';
import { waitForMail } from '../support/mailbox';
import { signIn } from './pages/staff';

const PHONE = { width: 390, height: 844 };

async function ensurePlan() {
	const sql = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
	try {
		const [plan] = await sql`select id from care_plans where name = 'Frost-proof care'`;
		if (plan) {
			await sql`update care_plans set active = true, pay_yearly = true, pay_per_visit = true
				where id = ${plan.id}`;
			return;
		}
		await sql`
			insert into care_plans (id, name, summary, terms, visits, prices, pay_yearly, pay_per_visit)
			values (${randomBytes(12).toString('base64url')}, 'Frost-proof care',
				'Start-up in spring, shut-down before the frost.',
				'We come once in each window. Cancel any time from your link.',
				${sql.json([
					{ kind: 'startup', minutes: 60, checklist: ['Set the pump', 'Check every outlet'] },
					{
						kind: 'shutdown',
						minutes: 60,
						checklist: ['Drain the lines', 'Store the pump indoors']
					}
				])},
				${sql.json({ fountain: { small: 11000, medium: 14500, large: 19000 } })}, true, true)`;
	} finally {
		await sql.end();
	}
}

async function noSideways(page: Page) {
	const [scroll, client] = await page.evaluate(() => [
		document.documentElement.scrollWidth,
		document.documentElement.clientWidth
	]);
	expect(scroll).toBeLessThanOrEqual(client);
}

/** From the service page to a filled sign-up form for one medium fountain. */
async function fillSignUp(page: Page, who: { name: string; email: string; street: string }) {
	await page.goto('/services/seasonal-care');
	await page.getByRole('link', { name: /See the care plans, priced for your features/ }).click();
	await expect(page).toHaveURL(/\/care$/);
	await expect(page.getByRole('heading', { name: 'Seasonal care plans' })).toBeVisible();
	const axe = await new AxeBuilder({ page })
		.withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'])
		.analyze();
	expect(
		axe.violations
			.filter((v) => v.impact === 'serious' || v.impact === 'critical')
			.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)
	).toEqual([]);

	// Nothing filled in: every message shows beside its field, and nothing is sent.
	await page.getByRole('button', { name: 'Sign up' }).click();
	await expect(page.getByText('Tell us about at least one feature')).toBeVisible();
	await expect(page.getByText('Tick the box to accept the terms')).toBeVisible();
	await expect(page.getByText('Enter your e-mail address')).toBeVisible();

	await page.getByLabel('Fountain or bubbling stone', { exact: true }).fill('1');
	await page.getByLabel('Size: fountain or bubbling stone').selectOption('medium');
	const plan = page.getByTestId('plan-Frost-proof care');
	// A medium fountain: start-up and shut-down at 145.00 each.
	await expect(plan.getByTestId('plan-price')).toHaveText('For a year: $290.00');
	await plan.getByLabel('Frost-proof care').check();
	await page.getByLabel('Your name').fill(who.name);
	await page.getByLabel('E-mail').fill(who.email);
	await page.getByLabel('Street address').fill(who.street);
	await page.getByLabel('Town').fill('Linden Ford');
	await page.getByLabel('Postal code').fill('80302');
	await page.getByLabel('I have read the terms of the plan I chose and accept them').check();
	await page.getByLabel('Your full name, as your signature').fill(who.name);
	await noSideways(page);
}

function homeowner(first: string) {
	const tag = randomBytes(4).toString('hex');
	return {
		name: `${first} Vantongeren`,
		email: `${first.toLowerCase()}.${tag}@homeowner.example`,
		street: `${tag} Sorrel Court`
	};
}

async function planInOffice(page: Page, who: { email: string; name: string }) {
	await signIn(page, 'owner');
	await page.goto(`/office/care?q=${encodeURIComponent(who.email)}`);
	const row = page.locator('li', { has: page.getByRole('link', { name: who.name }) });
	await expect(row).toContainText('1 feature · Frost-proof care');
}

test.beforeAll(ensurePlan);

test('a homeowner signs up on the public page on a phone and pays the year by card', async ({
	browser
}, testInfo) => {
	const who = homeowner('Edda');
	const context = await browser.newContext({ viewport: PHONE });
	const page = await context.newPage();
	await fillSignUp(page, who);
	await page.screenshot({ path: testInfo.outputPath('care-public-390.png'), fullPage: true });
	await page.getByLabel('Pay the year now by card').check();
	await page.getByRole('button', { name: 'Sign up' }).click();

	await expect(page.getByText('Local test payment page')).toBeVisible();
	await page.getByRole('button', { name: 'Pay $290.00' }).click();
	await expect(page).toHaveURL(/\/care\/[A-Za-z0-9_-]{20,}\/paid\?session=cs_test_/);
	await expect(page.getByRole('heading', { name: 'Thank you: payment received' })).toBeVisible();
	await page.getByRole('link', { name: 'Back to your care plan' }).click();
	await expect(page.getByTestId('plan-state')).toContainText('Paid by the year ($290.00)');
	const welcome = await waitForMail(who.email, /Your care plan: Frost-proof care/);
	expect(welcome.text).toContain('The year is paid ($290.00)');
	expect(welcome.text).toMatch(/Your care plan: http:\/\/[^ ]+\/care\/[A-Za-z0-9_-]{20,}/);
	await context.close();

	const owner = await browser.newPage();
	await planInOffice(owner, who);
	await owner.close();
});

test('a homeowner signs up on the public page on a phone and chooses to be invoiced', async ({
	browser
}) => {
	const who = homeowner('Bram');
	const context = await browser.newContext({ viewport: PHONE });
	const page = await context.newPage();
	await fillSignUp(page, who);
	await page.getByLabel('Invoice me after each visit').check();
	await page.getByRole('button', { name: 'Sign up' }).click();
	await expect(page).toHaveURL(/\/care\/[A-Za-z0-9_-]{20,}\?welcome=1$/);
	await expect(page.getByText('Thank you: you are signed up.')).toBeVisible();
	await expect(page.getByTestId('plan-state')).toContainText('Invoiced after each visit.');
	await noSideways(page);
	await context.close();

	const owner = await browser.newPage();
	await planInOffice(owner, who);
	// After the first visit the owner corrects the size the homeowner gave.
	await owner.getByRole('link', { name: who.name }).click();
	await expect(owner.getByText('Fountain or bubbling stone, medium')).toBeVisible();
	await owner.getByText('Edit this feature').click();
	const edit = owner.locator('form[action="?/editFeature"]');
	await edit.getByLabel('Size').selectOption('large');
	await edit.getByLabel('Notes').fill('Four outlets, seen on the first visit.');
	await edit.getByRole('button', { name: 'Save the feature' }).click();
	await expect(owner.getByText('Fountain or bubbling stone, large')).toBeVisible();
	await owner.reload();
	await expect(
		owner.getByRole('paragraph').filter({ hasText: 'Four outlets, seen on the first visit.' })
	).toBeVisible();
	await owner.close();
});
