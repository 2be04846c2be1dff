// The inquiry from a browser, with JavaScript (photos upload one by one with progress bars) and
// without it (one multipart post), to the thank-you page and both e-mails in the mail stand-in.
import { expect, test, type Page } from '@playwright/test';
import { waitForMail } from '../support/mailbox';
import { sidewaysGpsJpeg, yardJpeg } from '../fixtures/images/make';
import { demoUser } from './pages/staff';

const owner = demoUser('owner').email;
const MIN_FILL_MS = 3_200; // the form refuses a post sent sooner than 3 s after it was shown

async function photoFiles() {
	return [
		{ name: 'wide-shot.jpg', mimeType: 'image/jpeg', buffer: await yardJpeg(2400, 1600) },
		{ name: 'close-up.jpg', mimeType: 'image/jpeg', buffer: await sidewaysGpsJpeg() }
	];
}

async function fillForm(page: Page, email: string, opts: { services?: boolean } = {}) {
	await page.getByLabel('Your name').fill('Hazel Merriweather');
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByLabel('Phone (optional)').fill('555 010 4411');
	await page.getByLabel('Street address').fill('27 Larchmont Way');
	await page.getByLabel('Town').fill('Marten Springs');
	if (opts.services !== false) await page.getByLabel('Pond', { exact: true }).check();
	await page.getByLabel('Budget').selectOption('15k-30k');
	await page.getByLabel('When').selectOption('this-season');
	await page.getByLabel('Tell us about it (optional)').fill('A slate spillway by the back steps.');
	await page.getByRole('checkbox', { name: /may call or e-mail me/ }).check();
}

async function waitOutFillTime(page: Page, shownAt: number) {
	const left = MIN_FILL_MS - (Date.now() - shownAt);
	if (left > 0) await page.waitForTimeout(left);
}

async function expectThanksAndMails(page: Page, email: string, photos: number) {
	await expect(page).toHaveURL(/\/start\/thanks\?n=\d+/);
	const number = await page.getByText(/^R-\d+$/).textContent();
	expect(number).toMatch(/^R-\d{4,}$/);
	await expect(page.getByRole('heading', { name: 'What happens next' })).toBeVisible();
	await expect(page.getByRole('heading', { name: /811/ })).toBeVisible();
	const ack = await waitForMail(email, new RegExp(number!));
	expect(ack.text).toContain(`Photos: ${photos}`);
	expect(ack.text).toContain('Copperleaf Water & Stone');
	const alert = await waitForMail(owner, new RegExp(`New lead ${number}`));
	expect(alert.text).toContain('Hazel Merriweather');
}

test('with JavaScript: photos upload with progress bars, then the inquiry is sent', async ({
	page
}) => {
	const email = `hazel-js-${Date.now()}@example.test`;
	await page.goto('/start?ref=slate-spillway');
	const shownAt = Date.now();
	await expect(page.getByRole('heading', { name: 'Start a project' })).toBeVisible();
	await expect(page.getByText('You are asking about something like')).toBeVisible();
	await fillForm(page, email);
	await page.locator('input[name="photos"][multiple]').setInputFiles(await photoFiles());
	for (const name of ['wide-shot.jpg', 'close-up.jpg']) {
		await expect(page.getByRole('progressbar', { name: `Upload of ${name}` })).toBeVisible();
		await expect(page.getByRole('progressbar', { name: `Upload of ${name}` })).toHaveAttribute(
			'value',
			'100'
		);
	}
	await expect(page.getByText('Uploaded', { exact: true })).toHaveCount(2);
	// The files went through the upload API; the form now carries only their draft tokens.
	await expect(page.locator('input[name="photoToken"]')).toHaveCount(2);
	await waitOutFillTime(page, shownAt);
	await page.getByRole('button', { name: 'Send my inquiry' }).click();
	await expectThanksAndMails(page, email, 2);
});

test('with JavaScript: a HEIC photo is refused beside the picker, nothing uploaded', async ({
	page
}) => {
	await page.goto('/start');
	await page.locator('input[name="photos"][multiple]').setInputFiles({
		name: 'IMG_4410.HEIC',
		mimeType: 'image/heic',
		buffer: Buffer.from('\0\0\0\x18ftypheic\0\0\0\0mif1heic')
	});
	await expect(page.getByRole('alert')).toContainText('can send JPEG instead');
	await expect(page.locator('input[name="photoToken"]')).toHaveCount(0);
});

test('without JavaScript: one multipart post does the whole job, and an error keeps everything', async ({
	browser
}) => {
	const context = await browser.newContext({ javaScriptEnabled: false });
	const page = await context.newPage();
	const email = `hazel-nojs-${Date.now()}@example.test`;
	await page.goto('/start');
	const shownAt = Date.now();
	await fillForm(page, email, { services: false }); // forgets to pick what they want
	await page.locator('input[name="photos"][multiple]').setInputFiles(await photoFiles());
	await waitOutFillTime(page, shownAt);
	await page.getByRole('button', { name: 'Send my inquiry' }).click();

	await expect(page.getByText('Pick at least one thing you would like')).toBeVisible();
	await expect(page.getByLabel('Your name')).toHaveValue('Hazel Merriweather');
	await expect(page.getByLabel('E-mail', { exact: true })).toHaveValue(email);
	await expect(page.getByLabel('Town')).toHaveValue('Marten Springs');
	await expect(page.getByLabel('Budget')).toHaveValue('15k-30k');
	await expect(page.getByLabel('Tell us about it (optional)')).toHaveValue(
		'A slate spillway by the back steps.'
	);
	await expect(page.getByText(/Kept from your last try: .*wide-shot\.jpg/)).toBeVisible();

	const again = Date.now();
	await page.getByLabel('Pond', { exact: true }).check();
	await waitOutFillTime(page, again);
	await page.getByRole('button', { name: 'Send my inquiry' }).click();
	await expectThanksAndMails(page, email, 2);
	await context.close();
});

test('fits a phone: nothing wider than 360 px, thanks page too', async ({ browser }) => {
	const context = await browser.newContext({ viewport: { width: 360, height: 800 } });
	const page = await context.newPage();
	await page.goto('/start?ref=wildlife-pond');
	await page.locator('input[name="photos"][multiple]').setInputFiles(await photoFiles());
	await expect(page.getByText('Uploaded', { exact: true })).toHaveCount(2);
	const overflow = () =>
		page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
	expect(await overflow()).toBeLessThanOrEqual(0);
	await page.screenshot({ path: 'test-results/intake-start-360.png', fullPage: true });
	await page.goto('/start/thanks');
	expect(await overflow()).toBeLessThanOrEqual(0);
	await page.screenshot({ path: 'test-results/intake-thanks-360.png', fullPage: true });
	await context.close();
});
