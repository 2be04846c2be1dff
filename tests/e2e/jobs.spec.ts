// From a sold estimate to a finished job: the demo seed's accepted estimate (Felix Marchbank's,
// converted by the jobs domain) is scheduled by the owner for crew lead Rosa; Rosa works it on a
// phone (materials without prices, a pick, a punch item added and cleared); the homeowner approves
// a change order through the link in the mail stand-in; the job is completed and the testimonial
// request arrives (the owner sets its delay to 0 days on the jobs settings page first).
import { expect, test, type Page } from '@playwright/test';
import { linkIn, waitForMail } from '../support/mailbox';
import { signIn } from './pages/staff';

const HOMEOWNER = 'felix.marchbank@example.test';
const JOB_TITLE = /Basalt columns beside the deck/;

function firmDay(offset: number): string {
	return new Intl.DateTimeFormat('en-CA', {
		timeZone: 'America/Denver',
		year: 'numeric',
		month: '2-digit',
		day: '2-digit'
	}).format(new Date(Date.now() + offset * 86_400_000));
}

async function noSideways(page: Page) {
	const widths = await page.evaluate(() => ({
		scroll: document.documentElement.scrollWidth,
		view: window.innerWidth
	}));
	expect(widths.scroll, 'no sideways scrolling').toBeLessThanOrEqual(widths.view);
}

test('sold estimate to scheduled job, crew phone view, change order, completion, testimonial', async ({
	page,
	browser
}, testInfo) => {
	// The owner makes the testimonial request go out at completion.
	await signIn(page, 'owner');
	await page.goto('/office/jobs/settings');
	await page.getByLabel('Ask for a testimonial this many days after completion').fill('0');
	await page.getByRole('button', { name: 'Save' }).click();
	await expect(page.getByRole('status')).toHaveText('Saved.');

	// The owner schedules the sold job: Rosa, today and tomorrow.
	await page.goto('/office/jobs');
	await page.getByRole('link', { name: JOB_TITLE }).first().click();
	await expect(page.getByRole('heading', { level: 1, name: JOB_TITLE })).toBeVisible();
	const jobUrl = page.url();
	const schedule = page.locator('section[aria-labelledby="schedule-heading"]');
	const dayInputs = schedule.locator('input[name="day"]');
	await dayInputs.nth(0).fill(firmDay(0));
	await dayInputs.nth(1).fill(firmDay(1));
	await schedule.getByLabel('Crew lead').selectOption({ label: 'Rosa Lindqvist' });
	// The form saves in the background: reload only once its answer is back.
	const saved = page.waitForResponse(
		(r) => r.url().includes('?/schedule') && r.request().method() === 'POST'
	);
	await schedule.getByRole('button', { name: 'Save schedule' }).click();
	expect((await saved).ok()).toBe(true);
	await page.reload();
	await expect(schedule.getByLabel('Crew lead')).toHaveValue(/.+/);
	await expect(schedule.getByLabel('Crew lead').locator('option:checked')).toHaveText(
		'Rosa Lindqvist'
	);
	await expect(schedule.locator('input[name="day"]').nth(0)).toHaveValue(firmDay(0));

	// Rosa on her phone: today's job, materials to load, no prices anywhere.
	const crewContext = await browser.newContext({ viewport: { width: 390, height: 844 } });
	const crew = await crewContext.newPage();
	await signIn(crew, 'crew');
	// Her Today page lists the two install days of the job.
	const installDays = crew.locator('section[aria-labelledby="install-heading"]');
	await expect(installDays.getByRole('link', { name: JOB_TITLE })).toHaveCount(2);
	await expect(installDays.getByText('Today', { exact: true })).toBeVisible();
	await crew.goto('/office/jobs');
	const today = crew.locator('section[aria-labelledby="today-heading"]');
	await today.getByRole('link', { name: JOB_TITLE }).click();
	await expect(crew).toHaveURL(jobUrl);
	await expect(crew.getByRole('heading', { name: /Materials/ })).toBeVisible();
	const materials = crew.getByTestId('material');
	expect(await materials.count()).toBeGreaterThan(3);
	const safety = crew.locator('section[aria-labelledby="safety-heading"]');
	await expect(safety).toContainText("built to the engineer's drawings and the permit");
	await expect(safety).toContainText('Local codes and licensed practice come first');
	// One line per topic: the estimate's own caution replaces the fixed line, never both.
	const cautionLines = await safety.locator('li').allInnerTexts();
	for (const topic of [/811|buried utilities/i, /GFCI|ground-fault/i, /heavy stones/i]) {
		expect(cautionLines.filter((line) => topic.test(line))).toHaveLength(1);
	}
	await expect(crew.getByText(/Crew: \d+ people \(the heaviest stone needs \d+\)/)).toBeVisible();
	const bodyText = await crew.locator('body').innerText();
	expect(bodyText).not.toMatch(/\$\s?\d/);
	expect(bodyText).not.toMatch(/margin|unit price|cost/i);
	await noSideways(crew);
	await crew.screenshot({ path: testInfo.outputPath('crew-job-390.png'), fullPage: true });

	// Tick the first item picked.
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

	// A punch item, added and cleared.
	const punch = crew.locator('section[aria-labelledby="punch-heading"]');
	await punch
		.getByLabel('New punch-list item')
		.fill('Reset the tall column level after the settle');
	await punch.getByRole('button', { name: 'Add' }).click();
	const item = punch.getByRole('listitem').filter({ hasText: 'Reset the tall column level' });
	await expect(item).toBeVisible();
	await item.getByRole('button', { name: 'Done' }).click();
	await expect(item.getByRole('button', { name: 'Reopen' })).toBeVisible();

	// A date that is not real in the calendar's address shows today's weeks, not an error.
	const badDate = await page.goto('/office/jobs?from=2027-13-01');
	expect(badDate?.status()).toBe(200);
	await expect(page.getByRole('heading', { name: 'Jobs', exact: true })).toBeVisible();

	// The office writes a change order and sends it.
	await page.goto(jobUrl);
	const co = page.locator('section[aria-labelledby="co-heading"]');
	await co.getByLabel('Title').fill('A third uplight');
	await co.getByLabel('Line 1').fill('Uplight on the tall column');
	await co.getByLabel('Kind').first().selectOption('lighting');
	await co.getByLabel('Quantity').first().fill('1');
	await co.getByLabel('Unit price $').first().fill('185');
	// A quantity in words is refused beside its line; everything typed stays.
	await co.getByLabel('Quantity').first().fill('two');
	await co.getByRole('button', { name: 'Save draft' }).click();
	await expect(co.getByText('Enter a quantity such as 2 or -1')).toBeVisible();
	await expect(co.getByLabel('Title')).toHaveValue('A third uplight');
	await expect(co.getByLabel('Line 1')).toHaveValue('Uplight on the tall column');
	await expect(co.getByLabel('Unit price $').first()).toHaveValue('185');
	await co.getByLabel('Quantity').first().fill('1');
	await co.getByRole('button', { name: 'Save draft' }).click();
	const card = co.getByTestId('change-order').filter({ hasText: 'A third uplight' });
	await expect(card).toContainText('draft');
	await expect(card).toContainText('Ground-fault protection for pumps and lights near water');
	await card.getByRole('button', { name: 'Send to the homeowner' }).click();
	await expect(card).toContainText('sent');

	// The homeowner approves through the private link from the mail.
	const mail = await waitForMail(
		HOMEOWNER,
		/Change order CO-\d+ for your project: A third uplight/
	);
	const homeContext = await browser.newContext({ viewport: { width: 390, height: 844 } });
	const home = await homeContext.newPage();
	await home.goto(linkIn(mail, /^\/change-order\//));
	await expect(home.getByTestId('co-total')).toHaveText('$185.00');
	// A light near water: the GFCI and electrician cautions, and local codes first.
	await expect(
		home.getByText('Ground-fault protection for pumps and lights near water')
	).toBeVisible();
	await expect(home.getByText('Mains wiring by a licensed electrician')).toBeVisible();
	await expect(home.getByText('Local codes and licensed practice come first')).toBeVisible();
	await home.getByLabel('Type your full name').fill('Felix Marchbank');
	await home.getByRole('button', { name: 'Approve the change' }).click();
	await expect(home.getByRole('status')).toContainText('approved');
	await homeContext.close();

	await page.reload();
	await expect(card).toContainText('approved by Felix Marchbank');
	await expect(page.getByTestId('balance')).toContainText('$185.00');

	// The approved line reaches the crew's list; Rosa starts and completes the job.
	await crew.reload();
	await expect(
		crew.getByTestId('material').filter({ hasText: 'Uplight on the tall column' })
	).toBeVisible();
	await crew.getByRole('button', { name: 'Mark underway' }).click();
	await expect(crew.getByTestId('stage')).toHaveText('Underway');
	await crew.getByRole('button', { name: 'Mark complete' }).click();
	await expect(crew.getByTestId('stage')).toHaveText('Complete');
	await crewContext.close();

	// The testimonial request, with its private link.
	const ask = await waitForMail(HOMEOWNER, /How is your new water feature\?/);
	expect(linkIn(ask, /^\/testimonial\//)).toMatch(/\/testimonial\/[\w-]{20,}/);
	await page.reload();
	await expect(page.getByText(/Final balance at completion/)).toBeVisible();

	// The office's job page works on a phone too.
	await page.setViewportSize({ width: 390, height: 844 });
	await page.reload();
	await noSideways(page);
	await page.screenshot({ path: testInfo.outputPath('office-job-390.png'), fullPage: true });
});
