// The homeowner pays the deposit on the provider's (stand-in's) page and comes back to the
// receipt; the office then sees the job ready to schedule. So that payments are tested alone, the
// accepted estimate and its job are seeded straight into the e2e database below, and the homeowner opens the pay page with
// the estimate's own link token (what the estimate page's "Pay the deposit" button links to).
import { randomBytes } from 'node:crypto';
import postgres from 'postgres';
import { expect, test } from '@playwright/test';
import { seedAcceptedJob } from '../support/accepted-job';
import { signIn } from './pages/staff';

async function seedJuniperJob() {
	const sql = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
	try {
		const tag = randomBytes(4).toString('hex');
		return await seedAcceptedJob(sql, {
			name: 'Juniper Okafor',
			email: `juniper.${tag}@homeowner.example`,
			message: 'A drilled boulder by the patio',
			scope: 'Drilled granite boulder over a hidden basin',
			title: 'Drilled granite boulder',
			totalCents: 980000,
			depositCents: 294000,
			taxCents: 48_000
		});
	} finally {
		await sql.end();
	}
}

test('the homeowner pays the deposit and the office sees the job ready to schedule', async ({
	page,
	browser
}) => {
	const { token, jobId } = await seedJuniperJob();

	await page.goto(`/pay/${token}`);
	await expect(page.getByRole('heading', { name: 'Deposit to book your install' })).toBeVisible();
	await page.getByRole('button', { name: 'Pay $2,940.00 by card' }).click();

	// The provider's hosted page (the stand-in): pay.
	await expect(page.getByText('Local test payment page')).toBeVisible();
	await page.getByRole('button', { name: 'Pay $2,940.00' }).click();

	await expect(page).toHaveURL(new RegExp(`/pay/${token}/receipt\\?session=cs_test_`));
	await expect(page.getByRole('heading', { name: 'Thank you: payment received' })).toBeVisible();
	await expect(page.getByText('Balance still to pay: $6,860.00')).toBeVisible();

	const office = await browser.newPage();
	await signIn(office, 'owner');
	await office.goto(`/office/payments/${jobId}`);
	await expect(office.getByTestId('schedule-state')).toHaveText(
		'Deposit received: ready to schedule.'
	);
	await expect(office.getByText('$2,940.00').first()).toBeVisible();
	await office.goto('/office/payments');
	await expect(office.getByRole('heading', { name: 'Open balances, overdue first' })).toBeVisible();
	await office.close();
});

test('a homeowner who goes back without paying is told nothing was charged', async ({ page }) => {
	const { token } = await seedJuniperJob();
	await page.goto(`/pay/${token}`);
	await page.getByRole('button', { name: /by card/ }).click();
	await page.getByRole('button', { name: 'Use a card that is declined' }).click();
	await expect(page.getByRole('alert')).toHaveText('Your card was declined. Try another card.');
	await page.getByRole('button', { name: 'Go back without paying' }).click();
	await expect(page).toHaveURL(new RegExp(`/pay/${token}\\?cancelled=1$`));
	await expect(page.getByText('You went back without paying. Nothing was charged.')).toBeVisible();
	await expect(page.getByRole('heading', { name: 'Deposit to book your install' })).toBeVisible();
});
