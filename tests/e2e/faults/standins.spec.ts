// The storage (S3), mail (SMTP) and payment stand-ins stopped and started under the running
// production app: each outage gets a clear message, nothing is half-written, and queued work goes
// out once the service is back. The stand-ins are always started again, even when a test fails.
import postgres from 'postgres';
import { expect, test, type Page } from '@playwright/test';
import { yardJpeg } from '../../fixtures/images/make';
import { allMail, waitForMail } from '../../support/mailbox';
import { startStandIn, withStandInDown } from '../../support/standins';
import { seedAcceptedJob } from '../../support/accepted-job';

const sql = postgres(process.env.E2E_DATABASE_URL ?? process.env.DATABASE_URL!, {
	max: 1,
	onnotice: () => {}
});
test.afterAll(async () => {
	// Whatever happened above, later projects find every stand-in running.
	for (const name of ['s3', 'mail', 'payments'] as const) await startStandIn(name);
	await sql.end();
});

async function photoFiles() {
	return [
		{ name: 'by-the-steps.jpg', mimeType: 'image/jpeg', buffer: await yardJpeg(1200, 800) },
		{ name: 'from-the-patio.jpg', mimeType: 'image/jpeg', buffer: await yardJpeg(900, 600) }
	];
}

async function fillInquiry(page: Page, email: string) {
	await page.getByLabel('Your name').fill('Wren Halloway');
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByLabel('Street address').fill('4 Quarry Lane');
	await page.getByLabel('Town').fill('Linden Ford');
	await page.getByLabel('Pond', { exact: true }).check();
	await page.getByLabel('Budget').selectOption('15k-30k');
	await page.getByLabel('When').selectOption('this-season');
	await page.getByRole('checkbox', { name: /may call or e-mail me/ }).check();
}

async function send(page: Page, shownAt: number) {
	const left = 3_200 - (Date.now() - shownAt); // the form refuses a post sooner than 3 s
	if (left > 0) await page.waitForTimeout(left);
	await page.getByRole('button', { name: 'Send my inquiry' }).click();
	await expect(page).toHaveURL(/\/start\/thanks\?n=\d+/);
}

const countPhotos = async () => (await sql`select count(*)::int as n from photos`)[0].n as number;

test('photos sent while storage is down are refused clearly, nothing is kept, and they go once it is back', async ({
	page
}) => {
	test.setTimeout(120_000);
	const email = `wren-s3-${Date.now()}@example.test`;
	await page.goto('/start');
	const shownAt = Date.now();
	await fillInquiry(page, email);
	const before = await countPhotos();
	await withStandInDown('s3', async () => {
		await page.locator('input[name="photos"][multiple]').setInputFiles(await photoFiles());
		// Both uploads must have failed before storage returns (the SDK retries for a while).
		await expect(page.getByText(/photo storage is out of reach/)).toHaveCount(2, {
			timeout: 60_000
		});
		await expect(page.locator('input[name="photoToken"]')).toHaveCount(0);
		expect(await countPhotos(), 'no draft row for a photo that was not stored').toBe(before);
	});
	// Everything typed is still there; pick the photos again and send.
	await expect(page.getByLabel('Your name')).toHaveValue('Wren Halloway');
	await page.locator('input[name="photos"][multiple]').setInputFiles(await photoFiles());
	await expect(page.locator('input[name="photoToken"]')).toHaveCount(2, { timeout: 30_000 });
	await send(page, shownAt);
	const [lead] = await sql`select l.id from leads l join contacts c on c.id = l.contact_id
		where c.email = ${email}`;
	const stored = await sql`select display_key from photos where lead_id = ${lead.id}`;
	expect(stored).toHaveLength(2);
});

test('mail written while SMTP is down waits in the outbox and arrives once it is back', async ({
	browser
}) => {
	test.setTimeout(240_000);
	const context = await browser.newContext({ javaScriptEnabled: false });
	const page = await context.newPage();
	const email = `wren-smtp-${Date.now()}@example.test`;
	await withStandInDown('mail', async () => {
		await page.goto('/start');
		const shownAt = Date.now();
		await fillInquiry(page, email);
		await send(page, shownAt);
		// The lead is saved; its acknowledgement was tried, failed, and waits in the outbox.
		await expect(async () => {
			const queued =
				await sql`select sent_at, attempts, last_error from outbox where "to" = ${email}`;
			expect(queued).toHaveLength(1);
			expect(queued[0].sent_at).toBeNull();
			expect(queued[0].attempts).toBeGreaterThan(0);
			expect(queued[0].last_error).not.toBeNull();
		}).toPass({ timeout: 30_000 });
	});
	const number = (await page.getByText(/^R-\d+$/).textContent())!;
	// pg-boss retries with backoff (5 s doubling): allow for a few rounds.
	const ack = await waitForMail(email, new RegExp(number), 180_000);
	expect(ack.text).toContain('Copperleaf Water & Stone');
	const [sent] = await sql`select sent_at from outbox where "to" = ${email}`;
	expect(sent.sent_at).not.toBeNull();
	expect((await allMail()).filter((m) => m.to.some((t) => t.address === email))).toHaveLength(1);
	await context.close();
});

const seedOdileJob = () =>
	seedAcceptedJob(sql, {
		name: 'Odile Brandt',
		email: `odile.${Date.now()}@homeowner.example`,
		message: 'A stone column by the door',
		scope: 'Basalt column over a hidden basin',
		title: 'Basalt column',
		totalCents: 640000,
		depositCents: 192000
	});

test('a deposit tried while the payment service is down gets a clear error, charges nothing, and works after', async ({
	page
}) => {
	test.setTimeout(120_000);
	const { token, jobId } = await seedOdileJob();
	await page.goto(`/pay/${token}`);
	await withStandInDown('payments', async () => {
		await page.getByRole('button', { name: 'Pay $1,920.00 by card' }).click();
		await expect(
			page.getByText('The payment service did not answer. Nothing was charged')
		).toBeVisible({
			timeout: 60_000
		});
		const paid = await sql`select count(*)::int as n from payments where job_id = ${jobId}`;
		expect(paid[0].n).toBe(0);
	});
	await page.goto(`/pay/${token}`);
	await page.getByRole('button', { name: 'Pay $1,920.00 by card' }).click();
	await expect(page.getByText('Local test payment page')).toBeVisible();
	await page.getByRole('button', { name: 'Pay $1,920.00' }).click();
	await expect(page).toHaveURL(new RegExp(`/pay/${token}/receipt\\?session=cs_test_`));
	await expect(page.getByRole('heading', { name: 'Thank you: payment received' })).toBeVisible();
	// The provider's signed webhook records exactly one payment.
	await expect(async () => {
		const rows = await sql`select amount_cents from payments where job_id = ${jobId}`;
		expect(rows.map((r) => r.amount_cents)).toEqual([192000]);
	}).toPass({ timeout: 30_000 });
});
