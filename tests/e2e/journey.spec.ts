// The whole job in one run: a prospect browses a project and starts an inquiry
// from it with two photos; the owner sees it on Today and assigns it to Teo; Teo logs a call,
// books a visit (the invitation with its .ics reaches the mail stand-in) and types the visit notes
// on a phone; the estimate is built (pump match, an option) and sent; the homeowner takes the
// option, accepts and pays the deposit on the payment stand-in; the owner gives the job to crew
// lead Rosa, who picks materials and completes it; the owner records the balance by hand; the
// testimonial request arrives. Every step leaves a screenshot in the test's output folder.
import { randomBytes } from 'node:crypto';
import sharp from 'sharp';
import { expect, test, type Page } from '@playwright/test';
import { linkIn, waitForMail } from '../support/mailbox';
import { demoUser, signIn } from './pages/staff';

const MIN_FILL_MS = 3_200; // the inquiry form refuses a post sent sooner than 3 s after it was shown
const tag = randomBytes(4).toString('hex');
const HOMEOWNER = { name: `Nell Brookmere ${tag}`, email: `nell.${tag}@homeowner.example` };

type Attached = { fileName?: string; generatedFileName?: string; contentType: string };
function hasIcs(mail: { attachments?: Attached[] }): boolean {
	return (mail.attachments ?? []).some(
		(a) =>
			/\.ics$/.test(a.fileName ?? a.generatedFileName ?? '') &&
			a.contentType.startsWith('text/calendar')
	);
}

async function jpeg(background: string): Promise<Buffer> {
	return sharp({ create: { width: 640, height: 480, channels: 3, background } })
		.jpeg({ quality: 80 })
		.toBuffer();
}

function firmDay(offset: number): string {
	return new Intl.DateTimeFormat('en-CA', {
		timeZone: 'America/Denver',
		year: 'numeric',
		month: '2-digit',
		day: '2-digit'
	}).format(new Date(Date.now() + offset * 86_400_000));
}

let shots = 0;
async function shot(page: Page, name: string) {
	shots += 1;
	const path = test.info().outputPath(`${String(shots).padStart(2, '0')}-${name}.png`);
	// The pictures document the run; they are not checks. A full-page capture has hung in a
	// loaded headless Chromium, so one that does not finish is noted and the journey goes on.
	await page.screenshot({ path, fullPage: true, timeout: 20_000 }).catch((error: Error) => {
		test
			.info()
			.annotations.push({ type: 'screenshot skipped', description: `${name}: ${error.message}` });
	});
}

test('the journey: inquiry to testimonial request', async ({ browser }) => {
	test.setTimeout(300_000);
	const teo = demoUser('sales');
	const prospectContext = await browser.newContext();
	const prospect = await prospectContext.newPage();
	const ownerContext = await browser.newContext();
	const owner = await ownerContext.newPage();
	const salesContext = await browser.newContext();
	const sales = await salesContext.newPage();
	let leadUrl = '';
	let estimateLink = '';
	let jobUrl = '';

	await test.step('the prospect browses a project and starts an inquiry with two photos', async () => {
		await prospect.goto('/');
		await prospect
			.getByRole('navigation', { name: 'Main' })
			.getByRole('link', { name: 'Our work' })
			.click();
		await prospect
			.getByRole('navigation', { name: 'Kinds of project' })
			.getByRole('link', { name: /^Ponds/ })
			.click();
		await prospect.getByRole('link', { name: 'A pond for wildlife' }).click();
		await expect(
			prospect.getByRole('heading', { level: 1, name: 'A pond for wildlife' })
		).toBeVisible();
		await shot(prospect, 'project');
		await prospect.getByRole('link', { name: 'Start a project like this' }).first().click();
		await expect(prospect).toHaveURL(/\/start\?ref=wildlife-pond$/);
		const shownAt = Date.now();
		await expect(prospect.getByText('You are asking about something like')).toBeVisible();
		await prospect.getByLabel('Your name').fill(HOMEOWNER.name);
		await prospect.getByLabel('E-mail', { exact: true }).fill(HOMEOWNER.email);
		await prospect.getByLabel('Phone (optional)').fill('555 010 7720');
		await prospect.getByLabel('Street address').fill('9 Heronsgate Lane');
		await prospect.getByLabel('Town').fill('Marten Springs');
		await prospect.getByLabel('Pond', { exact: true }).check();
		await prospect.getByLabel('Budget').selectOption('15k-30k');
		await prospect.getByLabel('When').selectOption('this-season');
		await prospect
			.getByLabel('Tell us about it (optional)')
			.fill('A wildlife pond like yours, under the old willow.');
		await prospect.getByRole('checkbox', { name: /may call or e-mail me/ }).check();
		await prospect.locator('input[name="photos"][multiple]').setInputFiles([
			{ name: 'willow.jpg', mimeType: 'image/jpeg', buffer: await jpeg('#4f9597') },
			{ name: 'lawn.jpg', mimeType: 'image/jpeg', buffer: await jpeg('#6b8f3a') }
		]);
		await expect(prospect.getByText('Uploaded', { exact: true })).toHaveCount(2);
		await expect(prospect.locator('input[name="photoToken"]')).toHaveCount(2);
		const left = MIN_FILL_MS - (Date.now() - shownAt);
		if (left > 0) await prospect.waitForTimeout(left);
		await shot(prospect, 'inquiry');
		await prospect.getByRole('button', { name: 'Send my inquiry' }).click();
		await expect(prospect).toHaveURL(/\/start\/thanks\?n=\d+/);
		const number = await prospect.getByText(/^R-\d+$/).textContent();
		const ack = await waitForMail(HOMEOWNER.email, new RegExp(number!));
		expect(ack.text).toContain('Photos: 2');
		await waitForMail(demoUser('owner').email, new RegExp(`New lead ${number}`));
		await shot(prospect, 'thanks');
	});

	await test.step('the owner sees it on Today and assigns it to Teo', async () => {
		await signIn(owner, 'owner');
		const awaiting = owner.locator('section[aria-labelledby="awaiting-heading"]');
		await awaiting.getByRole('link', { name: HOMEOWNER.name }).click();
		await expect(owner.getByRole('heading', { level: 1 })).toHaveText(HOMEOWNER.name);
		leadUrl = owner.url();
		await expect(owner.getByRole('button', { name: /Photo 2.*open full size/ })).toBeVisible();
		await owner.getByLabel('Assigned to').selectOption({ label: teo.name });
		await owner.getByRole('button', { name: 'Assign' }).click();
		await expect(owner.getByRole('status').filter({ hasText: 'Assigned' })).toBeVisible();
		await expect(owner.locator('[data-kind="assign"]').first()).toContainText(
			`Assigned to ${teo.name}`
		);
		await shot(owner, 'assigned');
	});

	await test.step('Teo logs a call and books a visit; the invitation carries an .ics', async () => {
		await signIn(sales, 'sales');
		await sales.goto(leadUrl);
		await sales
			.getByLabel('What was said or noted')
			.fill('Called: wants frogs and a shallow beach; visit this week');
		await sales.getByRole('button', { name: 'Save to the timeline' }).click();
		await expect(sales.locator('[data-kind="call"]').first()).toContainText('shallow beach');
		await sales.getByRole('link', { name: 'Book a site visit' }).click();
		await expect(sales.getByRole('heading', { level: 1 })).toHaveText(
			`Site visit for ${HOMEOWNER.name}`
		);
		await sales.getByLabel('Salesperson').selectOption({ label: teo.name });
		const radios = sales.locator('input[name="startsAt"]');
		await expect(radios.first()).toBeAttached();
		const slot = await radios.first().getAttribute('value');
		await sales.locator(`label:has(input[name="startsAt"][value="${slot}"])`).click();
		await sales.getByLabel(/Note for the homeowner/).fill('We will walk round by the willow.');
		await sales.getByRole('button', { name: 'Confirm the visit' }).click();
		await expect(sales.getByRole('status')).toContainText('Visit booked');
		const booked = await waitForMail(HOMEOWNER.email, /^Site visit booked/);
		expect(hasIcs(booked)).toBe(true);
		expect(booked.text).toContain('We will walk round by the willow.');
		await shot(sales, 'visit-booked');
	});

	await test.step('the visit notes on a phone (390 × 844)', async () => {
		await sales.setViewportSize({ width: 390, height: 844 });
		await sales.getByRole('link', { name: 'Visit notes' }).click();
		await expect(sales.getByRole('heading', { name: 'Visit notes' })).toBeVisible();
		await sales.getByLabel('Spot length (ft)').fill('16');
		await sales.getByLabel('Spot width (ft)').fill('11');
		await sales.getByLabel('Distance to patio (ft)').fill('12');
		await sales.getByLabel('Slope', { exact: true }).selectOption('gentle');
		await sales.getByLabel('Locate request (811) made').selectOption('no');
		await sales.getByLabel('Where power is').fill('GFCI outlet on the shed, 30 ft');
		await sales.getByLabel('Notes', { exact: true }).fill('Willow roots on the north side.');
		expect(await sales.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
			390
		);
		await sales.getByRole('button', { name: 'Save notes' }).click();
		await expect(sales.getByText('Notes saved.')).toBeVisible();
		await shot(sales, 'visit-notes-390');
		await sales.setViewportSize({ width: 1280, height: 900 });
	});

	await test.step('the estimate is built with a pump match and an option, and sent', async () => {
		await sales.goto(`${leadUrl}/estimate`);
		await sales.getByRole('button', { name: 'Start the estimate' }).click();
		// The inquiry asked for a pond: the design starts with one, each feature with its own pump.
		await expect(sales.locator('[data-testid="feature"][data-kind="pond"]')).toHaveCount(1);
		const fountain = sales.getByTestId('water-system').filter({ hasText: 'Basalt columns' });
		const chart = fountain.getByTestId('pump-chart');
		await expect(chart).toBeVisible();
		await expect(fountain.getByTestId('operating-point')).toBeVisible();
		const before = Number(await chart.getAttribute('data-operating-flow'));
		expect(before).toBeGreaterThan(0);
		const outlets = await sales.getByTestId('outlet-row').count();
		const saved = sales.waitForResponse(
			(r) => r.url().includes('/api/estimates/') && r.request().method() === 'PUT' && r.ok()
		);
		await sales.getByRole('button', { name: 'Add an outlet' }).click();
		await expect(sales.getByTestId('outlet-row')).toHaveCount(outlets + 1);
		await expect(chart).not.toHaveAttribute('data-operating-flow', String(before));
		await saved;
		await expect(sales.getByTestId('save-status')).toHaveText(/All changes saved/);
		await shot(sales, 'estimate-built');
		await sales.getByRole('button', { name: /^Send to/ }).click();
		await expect(sales.getByTestId('estimate-status')).toHaveText('Sent');
		const mail = await waitForMail(HOMEOWNER.email, /Your estimate from/);
		estimateLink = linkIn(mail, /^\/estimate\/[A-Za-z0-9_-]+$/);
	});

	await test.step('the homeowner takes the option, accepts and pays the deposit', async () => {
		await prospect.goto(estimateLink);
		await expect(prospect.getByRole('heading', { name: /Your estimate/ })).toBeVisible();
		const base = await prospect.getByTestId('homeowner-total').textContent();
		await prospect.getByRole('checkbox', { name: /Low retaining wall/ }).check();
		await expect(prospect.getByTestId('homeowner-total')).not.toHaveText(base!);
		const deposit = (await prospect.getByTestId('homeowner-deposit').textContent())!.trim();
		await prospect.getByLabel('Your full name').fill(HOMEOWNER.name);
		await prospect.getByRole('checkbox', { name: /I accept this estimate/ }).check();
		await shot(prospect, 'estimate-option');
		await prospect.getByRole('button', { name: /^Accept for/ }).click();
		await expect(prospect.getByRole('heading', { name: 'Accepted: thank you' })).toBeVisible();
		await waitForMail(HOMEOWNER.email, /Your acceptance of estimate/);
		await shot(prospect, 'accepted');

		await prospect.getByRole('link', { name: 'Pay the deposit' }).click();
		await expect(prospect).toHaveURL(/\/pay\/[A-Za-z0-9_-]+$/);
		await expect(prospect.getByRole('button', { name: /by card/ })).toContainText(deposit);
		await prospect.getByRole('button', { name: /by card/ }).click();
		await expect(prospect.getByText('Local test payment page')).toBeVisible();
		await shot(prospect, 'payment-stand-in');
		await prospect.getByRole('button', { name: /^Pay \$/ }).click();
		await expect(prospect).toHaveURL(/\/receipt\?session=cs_test_/);
		await expect(
			prospect.getByRole('heading', { name: 'Thank you: payment received' })
		).toBeVisible();
		await shot(prospect, 'deposit-receipt');
	});

	await test.step('the owner sets the testimonial delay to 0 and gives the job to Rosa', async () => {
		await owner.goto('/office/jobs/settings');
		await owner.getByLabel('Ask for a testimonial this many days after completion').fill('0');
		await owner.getByRole('button', { name: 'Save' }).click();
		await expect(owner.getByRole('status')).toHaveText('Saved.');

		await owner.goto('/office/jobs');
		await owner
			.getByRole('listitem')
			.filter({ hasText: HOMEOWNER.name })
			.getByRole('link')
			.first()
			.click();
		await expect(owner).toHaveURL(/\/office\/jobs\/[A-Za-z0-9_-]+$/);
		jobUrl = owner.url();
		const schedule = owner.locator('section[aria-labelledby="schedule-heading"]');
		const dayInputs = schedule.locator('input[name="day"]');
		await dayInputs.nth(0).fill(firmDay(0));
		await schedule.getByLabel('Crew lead').selectOption({ label: 'Rosa Lindqvist' });
		// The form saves in the background: reload only once its answer is back.
		const saved = owner.waitForResponse(
			(r) => r.url().includes('?/schedule') && r.request().method() === 'POST'
		);
		await schedule.getByRole('button', { name: 'Save schedule' }).click();
		expect((await saved).ok()).toBe(true);
		await owner.reload();
		await expect(schedule.getByLabel('Crew lead').locator('option:checked')).toHaveText(
			'Rosa Lindqvist'
		);
		await shot(owner, 'job-scheduled');
	});

	await test.step('crew lead Rosa picks materials and completes the job', async () => {
		const crewContext = await browser.newContext({ viewport: { width: 390, height: 844 } });
		const crew = await crewContext.newPage();
		await signIn(crew, 'crew');
		await crew.goto('/office/jobs');
		await crew
			.locator('section[aria-labelledby="list-heading"]')
			.getByRole('listitem')
			.filter({ hasText: HOMEOWNER.name })
			.getByRole('link')
			.click();
		await expect(crew).toHaveURL(jobUrl);
		const materials = crew.getByTestId('material');
		expect(await materials.count()).toBeGreaterThan(0);
		const first = materials.first();
		const pick = first.getByRole('button', { name: /^Pick / });
		const label = (await pick.getAttribute('aria-label'))!.replace(/^Pick /, '');
		await pick.click();
		await expect(first.getByRole('button', { name: `Picked ${label}` })).toHaveAttribute(
			'aria-pressed',
			'true'
		);
		await crew.reload();
		await expect(crew.getByText(/1 of \d+ picked/)).toBeVisible();
		await shot(crew, 'crew-materials-390');
		await crew.getByRole('button', { name: 'Mark underway' }).click();
		await expect(crew.getByTestId('stage')).toHaveText('Underway');
		await crew.getByRole('button', { name: 'Mark complete' }).click();
		await expect(crew.getByTestId('stage')).toHaveText('Complete');
		await shot(crew, 'crew-complete');
		await crewContext.close();
	});

	await test.step('the owner records the balance by hand', async () => {
		const jobId = new URL(jobUrl).pathname.split('/').pop()!;
		await owner.goto(`/office/payments/${jobId}`);
		const balance = owner.locator('section[aria-label="Balance"] dt:text-is("Balance") + dd');
		const due = (await balance.textContent())!.trim();
		expect(due).not.toBe('$0.00');
		await owner.locator('#pay-kind').selectOption('final');
		await owner.locator('#pay-method').selectOption('cheque');
		await owner.locator('#pay-amount').fill(due.replace(/[$,]/g, ''));
		await owner.locator('#pay-reference').fill(`CHQ-${tag}`);
		await owner.getByRole('button', { name: 'Record payment' }).click();
		await expect(balance).toHaveText('$0.00');
		// The form clears for the next payment but keeps a date, so a second entry is not undated.
		await expect(owner.locator('#pay-amount')).toHaveValue('');
		await expect(owner.locator('#pay-date')).toHaveValue(/^\d{4}-\d{2}-\d{2}$/);
		await shot(owner, 'balance-paid');
	});

	await test.step('the testimonial request arrives', async () => {
		const ask = await waitForMail(HOMEOWNER.email, /How is your new water feature\?/);
		expect(linkIn(ask, /^\/testimonial\//)).toMatch(/\/testimonial\/[\w-]{20,}/);
		await prospect.goto(linkIn(ask, /^\/testimonial\//));
		await shot(prospect, 'testimonial');
	});

	await prospectContext.close();
	await ownerContext.close();
	await salesContext.close();
});
