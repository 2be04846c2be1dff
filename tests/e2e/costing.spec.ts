// Job costing: the crew lead logs a day's hours on a phone with the connection cut and restored
// (and once more with the answer lost on the way back), and the owner reads a finished job's
// margin, adds a cost and sees the profit fall by exactly that much.
import { expect, test, type Page } from '@playwright/test';
import { linkIn, waitForMail } from '../support/mailbox';
import { yardJpeg } from '../fixtures/images/make';
import { signIn } from './pages/staff';

const CREW_JOB = /Basalt columns beside the deck/;
const COSTED_JOB = /Basalt columns by the kitchen garden/;

async function noSideways(page: Page) {
	const widths = await page.evaluate(() => ({
		scroll: document.documentElement.scrollWidth,
		view: window.innerWidth
	}));
	expect(widths.scroll, 'no sideways scrolling').toBeLessThanOrEqual(widths.view);
}

function firmDay(offset: number): string {
	return new Intl.DateTimeFormat('en-CA', {
		timeZone: 'America/Denver',
		year: 'numeric',
		month: '2-digit',
		day: '2-digit'
	}).format(new Date(Date.now() + offset * 86_400_000));
}

/** "$1,234.56" or "−$1,234.56" → cents. */
const cents = (text: string) => {
	const n = Math.round(Number(text.replace(/[^0-9.]/g, '')) * 100);
	return /[−-]/.test(text) ? -n : n;
};

test('the crew lead logs a day’s hours at 390 px with the network cut and restored', async ({
	browser
}) => {
	const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
	const page = await context.newPage();
	await signIn(page, 'crew');
	await page.goto('/office/jobs');
	await page.getByRole('link', { name: CREW_JOB }).first().click();
	await page.getByRole('link', { name: 'Log hours' }).click();
	await expect(page.locator('[data-ready]')).toBeVisible();
	await noSideways(page);
	const record = page.getByTestId('on-record');
	const before = await record.locator('li').count();

	// In the backyard, no signal.
	await context.setOffline(true);
	await expect(page.getByTestId('connection')).toHaveText(/No connection/);
	await page
		.getByLabel('Task', { exact: true })
		.selectOption({ label: 'Set the basin, pump and vault' });
	await page.getByLabel('Hours', { exact: true }).fill('4.5');
	await page.getByRole('button', { name: 'Save the hours' }).click();
	await page.getByLabel('Task', { exact: true }).selectOption({ label: 'A task not on the list…' });
	await page.getByLabel('New task').fill('Haul spoil to the trailer');
	await page.getByLabel('Who', { exact: true }).fill('Dane Ashgrove');
	await page.getByLabel('Hours', { exact: true }).fill('3:30');
	await page.getByRole('button', { name: 'Save the hours' }).click();
	// A typo is caught beside the field and not kept.
	await page.getByLabel('Hours', { exact: true }).fill('half a day');
	await page.getByRole('button', { name: 'Save the hours' }).click();
	await expect(page.getByText('Enter the hours, such as 7.5 or 7:30')).toBeVisible();
	const waiting = page.getByTestId('waiting');
	await expect(waiting.getByRole('heading')).toHaveText('On this phone, not sent yet: 2');
	await expect(waiting.locator('li')).toHaveCount(2);
	await noSideways(page);

	// The signal comes back, but the answer to the first send is lost on the way back: the
	// office stored the entries, the phone did not hear it, so they stay waiting.
	let lost!: () => void;
	const answerLost = new Promise<void>((resolve) => (lost = resolve));
	await page.route('**/api/jobs/*/time', async (route) => {
		const reached = await route.fetch();
		expect(reached.status()).toBe(200);
		await route.abort('connectionreset');
		lost();
	});
	await context.setOffline(false);
	await answerLost;
	await page.unroute('**/api/jobs/*/time');
	await expect(waiting.getByRole('heading')).toHaveText('On this phone, not sent yet: 2');

	// Sent again with the same keys: stored once.
	await waiting.getByRole('button', { name: 'Send now' }).click();
	await expect(waiting.getByRole('heading')).toHaveText('On this phone, not sent yet: 0');
	await expect(record.locator('li')).toHaveCount(before + 2);
	await expect(record.locator('li').filter({ hasText: 'Haul spoil to the trailer' })).toHaveCount(
		1
	);
	await expect(record.locator('li').filter({ hasText: 'Dane Ashgrove' })).toHaveText(/3 h 30/);
	// A reload shows the same: nothing twice, nothing lost.
	await page.reload();
	await expect(record.locator('li')).toHaveCount(before + 2);
	await context.close();
});

test('the owner sees a finished job’s margin, and a cost added takes exactly that off the profit', async ({
	page
}) => {
	await signIn(page, 'owner');
	await page.goto('/office/costing');
	const row = page.getByTestId('margins').locator('tr').filter({ hasText: 'Odile Brackenridge' });
	await expect(row).toHaveCount(1);
	const listed = (await row.locator('td').last().textContent())!.trim();
	expect(listed).toMatch(/^-?\d+\.\d %$/);
	await row.getByRole('link').click();
	await expect(page.getByRole('heading', { level: 1, name: COSTED_JOB })).toBeVisible();
	const profit = page.getByTestId('profit');
	await expect(page.getByTestId('margin')).toHaveText(listed);
	const revenue = cents((await profit.locator('dd').nth(0).textContent())!);
	const cost = cents((await profit.locator('dd').nth(2).textContent())!);
	const before = cents((await page.getByTestId('profit-cents').textContent())!);
	expect(before).toBe(revenue - cost);
	await expect(page.getByTestId('cost-chart')).toBeVisible();
	// Tasks over their estimate by more than the set share stand out (the demo's digging ran 35 %
	// over); the stones, set faster than estimated, do not.
	const over = page.getByTestId('tasks').locator('tr[data-over="yes"]');
	await expect(over.filter({ hasText: 'Dig the basin' })).toHaveCount(1);
	await expect(over.filter({ hasText: 'basalt column' })).toHaveCount(0);

	// A delivery charge, forgotten until now; a typo first.
	await page.getByLabel('Kind').selectOption('other');
	await page.getByLabel('What').fill('Delivery charge');
	await page.getByLabel('Amount ($)').fill('x');
	await page.getByRole('button', { name: 'Add the cost' }).click();
	await expect(page.getByText('Enter an amount such as 412.50')).toBeVisible();
	await page.getByLabel('Amount ($)').fill('100');
	await page.getByRole('button', { name: 'Add the cost' }).click();
	await expect
		.poll(async () => cents((await page.getByTestId('profit-cents').textContent())!))
		.toBe(before - 10_000);
	const margin = (await page.getByTestId('margin').textContent())!.trim();
	expect(Number.parseFloat(margin)).toBeCloseTo(((before - 10_000) / revenue) * 100, 1);
	// The list carries the same new margin.
	await page.goto('/office/costing');
	await expect(row.locator('td').last()).toHaveText(margin);
});

test('a purchase order is sent to the supplier, its PDF arrives, and the calendar flags a late delivery', async ({
	page
}) => {
	await signIn(page, 'owner');
	await page.goto('/office/jobs');
	await page.getByRole('link', { name: CREW_JOB }).first().click();
	await page.getByRole('link', { name: 'Purchase orders' }).click();
	await page.getByRole('button', { name: /^Make purchase orders/ }).click();
	await expect(page.getByRole('status')).toHaveText('2 orders made.');
	const quarry = page.locator('article').filter({ hasText: 'Granite Hollow Quarry' });
	const total = (await quarry.getByTestId('po-total').textContent())!;
	// The order's lines add up to its total.
	const amounts = await quarry
		.locator('tbody tr')
		.evaluateAll((rows) => rows.slice(0, -1).map((r) => r.lastElementChild!.textContent!));
	expect(amounts.reduce((s, a) => s + cents(a), 0)).toBe(cents(total));
	const number = (await quarry.getByRole('heading').textContent())!.match(/PO-(\d+)/)![1];
	// Due on the install day itself: too late for the crew, as the calendar will say.
	await quarry.getByLabel('Needed on site by').fill(firmDay(0));
	await quarry.getByLabel('Delivery note').fill('Gate on the east side; call on arrival');
	await quarry.getByRole('button', { name: 'Save date and note' }).click();
	await expect(quarry.getByRole('status')).toHaveText('Saved.');
	await quarry.getByRole('button', { name: 'Send to Granite Hollow Quarry as a PDF' }).click();
	await expect(quarry.getByRole('status')).toHaveText('Sent to orders@granitehollow.example.');
	const mail = await waitForMail(
		'orders@granitehollow.example',
		new RegExp(`PO-${number}`),
		30_000
	);
	expect(mail.attachments?.map((a) => [a.filename, a.contentType])).toEqual([
		[`PO-${number}.pdf`, 'application/pdf']
	]);
	expect(mail.attachments![0].size).toBeGreaterThan(1000);
	expect(mail.text).toContain(total);

	await page.goto('/office/jobs');
	await expect(page.getByTestId('late-materials').first()).toContainText(
		`PO-${number} expected ${firmDay(0)}`
	);
});

test('a homeowner reports a problem with a photo through their link, and the callback appears', async ({
	page,
	browser
}) => {
	// The demo's finished job was completed before problem links went out with the completion
	// mail: the owner mails one.
	await signIn(page, 'owner');
	await page.goto('/office/callbacks');
	const option = page
		.getByLabel('Finished job')
		.locator('option', { hasText: 'Odile Brackenridge' });
	await page.getByLabel('Finished job').selectOption((await option.getAttribute('value'))!);
	await page.getByRole('button', { name: 'Send the link' }).click();
	await expect(page.getByRole('status')).toHaveText('Sent.');
	const mail = await waitForMail('odile.brackenridge@example.test', /Something not right/, 30_000);
	const url = linkIn(mail, /^\/callback\//);

	const phone = await browser.newContext({ viewport: { width: 390, height: 844 } });
	const home = await phone.newPage();
	await home.goto(url);
	await expect(home.getByRole('heading', { level: 1 })).toContainText(
		'Basalt columns by the kitchen garden'
	);
	await home.getByLabel('What is wrong?').fill('short');
	await home.getByRole('button', { name: 'Send' }).click();
	await expect(home.getByText('Tell us what is wrong in a sentence or two')).toBeVisible();
	await home
		.getByLabel('What is wrong?')
		.fill('The tall column only trickles since last week, and the gravel looks wet around it.');
	await home.getByLabel(/^Photos/).setInputFiles({
		name: 'tall-column.jpg',
		mimeType: 'image/jpeg',
		buffer: await yardJpeg(1600, 1200)
	});
	await home.getByRole('button', { name: 'Send' }).click();
	await expect(home.getByRole('status')).toContainText('It falls within your warranty.');
	await phone.close();

	await page.goto('/office/callbacks');
	const row = page.getByTestId('callbacks').locator('li').filter({ hasText: 'Odile Brackenridge' });
	await expect(row).toHaveCount(1);
	await expect(row.getByTestId('warranty')).toHaveText('inside the warranty');
	await expect(row).toContainText('Reported');
	await row.getByRole('link').click();
	await expect(page.getByTestId('description')).toContainText('only trickles');
	const img = page.getByTestId('callback-photos').locator('img');
	await expect(img).toHaveCount(1);
	await expect
		.poll(() => img.evaluate((el: HTMLImageElement) => el.complete && el.naturalWidth > 0))
		.toBe(true);
	// Rosa is sent on a day, as for a service visit.
	await page.getByLabel('Crew lead').selectOption({ label: 'Rosa Lindqvist' });
	await page.locator('#scheduledOn').fill(firmDay(2));
	await page.getByRole('button', { name: 'Schedule the visit' }).click();
	await expect(page.getByTestId('status')).toHaveText('Scheduled');
});
