// A salesperson builds an estimate, sees the pump chart move when an outlet is added, and sends it;
// the homeowner opens the link on a phone, takes an option and accepts; the office sees it sold.
import { expect, test } from '@playwright/test';
import postgres from 'postgres';
import { randomBytes } from 'node:crypto';
import { formatCents } from '../../src/lib/components/estimates/money';
import { linkIn, waitForMail } from '../support/mailbox';
import { demoUser, signIn } from './pages/staff';

const sql = postgres(process.env.E2E_DATABASE_URL!, { max: 2, onnotice: () => {} });
test.afterAll(async () => {
	await sql.end();
});

async function makeLead() {
	const tag = randomBytes(4).toString('hex');
	const email = `fernhill-${tag}@homeowner.example`;
	const [sales] = await sql`select id from users where email = ${demoUser('sales').email}`;
	await sql`insert into contacts (id, name, email) values (${'c-' + tag}, ${'Ada Fernhill ' + tag}, ${email})`;
	await sql`insert into leads (id, contact_id, stage, message, assignee_id)
		values (${'l-' + tag}, ${'c-' + tag}, 'visit_booked', 'Three bubbling columns by the patio', ${sales.id})`;
	return { id: 'l-' + tag, email, name: `Ada Fernhill ${tag}` };
}

test('build, send, accept on a phone, sold in the office', async ({ page, browser }) => {
	const lead = await makeLead();
	await signIn(page, 'sales');
	await page.goto(`/office/leads/${lead.id}/estimate`);
	await page.getByRole('button', { name: 'Start the estimate' }).click();
	const chart = page.getByTestId('pump-chart');
	await expect(chart).toBeVisible();
	await expect(page.getByTestId('operating-point')).toBeVisible();
	const before = Number(await chart.getAttribute('data-operating-flow'));
	expect(before).toBeGreaterThan(0);
	const outlets = await page.getByTestId('outlet-row').count();
	const saved1 = page.waitForResponse(
		(r) => r.url().includes('/api/estimates/') && r.request().method() === 'PUT' && r.ok()
	);
	await page.getByRole('button', { name: 'Add an outlet' }).click();
	await expect(page.getByTestId('outlet-row')).toHaveCount(outlets + 1);
	await expect(chart).not.toHaveAttribute('data-operating-flow', String(before));
	const after = Number(await chart.getAttribute('data-operating-flow'));
	expect(after).toBeGreaterThan(before);
	await saved1;
	await expect(page.getByTestId('save-status')).toHaveText(/All changes saved/);

	// The builder, the print document and the stored totals agree to the cent.
	const [saved] =
		await sql`select e.id, total_cents, deposit_cents, design from estimates e where lead_id = ${lead.id}`;
	expect((saved.design as { outlets: unknown[] }).outlets).toHaveLength(outlets + 1);
	await expect(page.getByTestId('total')).toHaveText(formatCents(saved.total_cents));
	await expect(page.getByTestId('deposit')).toHaveText(formatCents(saved.deposit_cents));
	expect(await page.getByTestId('print-total').textContent()).toBe(formatCents(saved.total_cents));
	expect(await page.getByTestId('print-deposit').textContent()).toBe(
		formatCents(saved.deposit_cents)
	);

	await page.getByRole('button', { name: /^Send to/ }).click();
	await expect(page.getByTestId('estimate-status')).toHaveText('Sent');
	await expect(page.getByLabel('Outlet', { exact: true }).first()).toBeDisabled();
	const mail = await waitForMail(lead.email, /Your estimate from/);
	expect(mail.text).toContain(formatCents(saved.total_cents));
	const link = linkIn(mail, /^\/estimate\/[A-Za-z0-9_-]+$/);

	// The homeowner, on a phone.
	const phone = await browser.newContext({
		viewport: { width: 375, height: 740 },
		isMobile: true,
		hasTouch: true
	});
	const home = await phone.newPage();
	await home.goto(link);
	await expect(home.getByRole('heading', { name: /Your estimate/ })).toBeVisible();
	await expect(home.getByTestId('homeowner-total')).toHaveText(formatCents(saved.total_cents));
	// Mobile first: nothing runs wider than the phone.
	expect(await home.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375);
	const wall = home.getByRole('checkbox', { name: /Low retaining wall/ });
	await wall.check();
	await expect(home.getByTestId('homeowner-total')).not.toHaveText(formatCents(saved.total_cents));
	const chosenTotal = await home.getByTestId('homeowner-total').textContent();
	const chosenDeposit = await home.getByTestId('homeowner-deposit').textContent();
	await home.getByLabel('Your full name').fill(lead.name);
	await home.getByRole('checkbox', { name: /I accept this estimate/ }).check();
	await home.getByRole('button', { name: /^Accept for/ }).click();
	await expect(home.getByRole('heading', { name: 'Accepted: thank you' })).toBeVisible();
	const [acc] =
		await sql`select total_cents, deposit_cents, typed_name, options_chosen from estimate_acceptances where estimate_id = ${saved.id}`;
	expect(formatCents(acc.total_cents)).toBe(chosenTotal);
	expect(formatCents(acc.deposit_cents)).toBe(chosenDeposit);
	expect(acc.typed_name).toBe(lead.name);
	expect(acc.options_chosen.options).toEqual(['low-wall']);
	await expect(home.getByTestId('accepted-note')).toContainText(formatCents(acc.total_cents));
	const confirmation = await waitForMail(lead.email, /Your acceptance of estimate/);
	expect(confirmation.text).toContain(`Total: ${formatCents(acc.total_cents)}`);
	await phone.close();

	// The office sees it sold.
	const [row] = await sql`select stage from leads where id = ${lead.id}`;
	expect(row.stage).toBe('sold');
	await page.goto('/office/estimates?status=accepted');
	await expect(page.getByRole('link', { name: lead.name })).toBeVisible();
	await page.goto(`/office/leads/${lead.id}/estimate`);
	await expect(page.getByTestId('estimate-status')).toHaveText('Accepted');
	await expect(page.getByTestId('acceptance')).toContainText(lead.name);
	await waitForMail(demoUser('owner').email, /^Accepted:/);
});

test('a wrong link shows a plain page', async ({ page }) => {
	await page.goto('/estimate/not-a-real-token-0123456789');
	await expect(
		page.getByRole('heading', { name: 'This link does not open an estimate' })
	).toBeVisible();
	await expect(page.getByText(/R-\d+/)).toHaveCount(0);
});
