// A salesperson builds an estimate, sees the pump chart move when an outlet is added, and sends it;
// the homeowner opens the link on a phone, sees the plan and their yard photo, takes an option and
// accepts; the office sees it sold. The builder's topping polygon and a second lighting run change
// the takeoff; wrong and expired links answer 404.
import { expect, test, type Locator, type Page } from '@playwright/test';
import postgres from 'postgres';
import sharp from 'sharp';
import { randomBytes } from 'node:crypto';
import { formatCents } from '../../src/lib/money';
import { putObject, randomKey } from '../../src/lib/server/platform/storage';
import { seedLead } from '../support/lead';
import { linkIn, waitForMail } from '../support/mailbox';
import { demoUser, signIn } from './pages/staff';

const sql = postgres(process.env.E2E_DATABASE_URL!, { max: 2, onnotice: () => {} });
test.afterAll(async () => {
	await sql.end();
});

async function makeLead() {
	const [sales] = await sql`select id from users where email = ${demoUser('sales').email}`;
	return seedLead(sql, {
		name: 'Ada Fernhill',
		message: 'Three bubbling columns by the patio',
		assigneeId: sales.id
	});
}

/** A yard photo sent with the inquiry, stored as the intake pipeline stores it. */
async function addYardPhoto(leadId: string) {
	const jpeg = await sharp({
		create: { width: 480, height: 360, channels: 3, background: '#6b7f45' }
	})
		.jpeg()
		.toBuffer();
	const displayKey = randomKey('e2e', 'display.jpg');
	const thumbKey = randomKey('e2e', 'thumb.jpg');
	await putObject(displayKey, jpeg, 'image/jpeg');
	await putObject(thumbKey, jpeg, 'image/jpeg');
	await sql`insert into photos (id, lead_id, context, display_key, thumb_key, width, height, bytes, original_name)
		values (${'p-' + randomBytes(6).toString('hex')}, ${leadId}, 'intake', ${displayKey}, ${thumbKey}, 480, 360, ${jpeg.length}, 'yard.jpg')`;
}

const savedOnce = (page: Page) =>
	page.waitForResponse(
		(r) => r.url().includes('/api/estimates/') && r.request().method() === 'PUT' && r.ok()
	);

/** The quantity cell of the takeoff row that names `text`. */
const qty = (page: Page, text: string): Locator =>
	page.getByTestId('takeoff').getByRole('row').filter({ hasText: text }).locator('td').nth(1);

test('build, send, accept on a phone, sold in the office', async ({ page, browser }) => {
	const lead = await makeLead();
	await addYardPhoto(lead.id);
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

	// Stone handling: the weight (right-aligned) and the method beside it read apart, never as
	// one run of text such as "314 lbStone cart".
	const stoneRow = page.getByTestId('stones').locator('tbody tr').first();
	await expect(stoneRow).toBeVisible();
	const gap = await stoneRow.evaluate((tr) => {
		const [, weight, method] = tr.querySelectorAll('td');
		const box = (cell: Element) => {
			const range = document.createRange();
			range.selectNodeContents(cell);
			return range.getBoundingClientRect();
		};
		return box(method).left - box(weight).right;
	});
	expect(gap).toBeGreaterThanOrEqual(8);

	// The builder, the print document and the stored totals agree to the cent.
	const [saved] =
		await sql`select e.id, total_cents, deposit_cents, design from estimates e where lead_id = ${lead.id}`;
	expect((saved.design as { features: { outlets: unknown[] }[] }).features[0].outlets).toHaveLength(
		outlets + 1
	);
	await expect(page.getByTestId('total')).toHaveText(formatCents(saved.total_cents));
	await expect(page.getByTestId('deposit')).toHaveText(formatCents(saved.deposit_cents));
	expect(await page.getByTestId('print-total').textContent()).toBe(formatCents(saved.total_cents));
	expect(await page.getByTestId('print-deposit').textContent()).toBe(
		formatCents(saved.deposit_cents)
	);
	// The printed estimate carries the plan too.
	await page.emulateMedia({ media: 'print' });
	await expect(page.getByTestId('print-plan').getByRole('img').first()).toBeVisible();
	await expect(page.getByTestId('plan-drawing')).toBeHidden();
	await page.screenshot({ path: test.info().outputPath('print.png'), fullPage: true });
	await page.emulateMedia({ media: 'screen' });

	await page.getByRole('button', { name: /^Send to/ }).click();
	await expect(page.getByTestId('estimate-status')).toHaveText('Sent');
	await expect(page.getByLabel('Outlet', { exact: true }).first()).toBeDisabled();
	const mail = await waitForMail(lead.email, /Your estimate from/);
	expect(mail.text).toContain(formatCents(saved.total_cents));
	const link = linkIn(mail, /^\/estimate\/[A-Za-z0-9_-]+$/);

	// The homeowner, on a phone set to a zone far from the firm's. The link's last day is the
	// firm's calendar day: 03:00 UTC on June 1 is still May 31 in the firm's zone (Denver) while it
	// is already June 1 on the phone (Auckland). The expected text comes from the platform's own
	// formatter (ECMA-402 Intl.DateTimeFormat, en-US, dateStyle long) in the firm's zone.
	const lastMoment = new Date('2099-06-01T03:00:00Z');
	await sql`update estimates set expires_at = ${lastMoment} where id = ${saved.id}`;
	const [{ time_zone: firmZone }] = await sql`select time_zone from settings limit 1`;
	const lastDay = (timeZone: string) =>
		new Intl.DateTimeFormat('en-US', { dateStyle: 'long', timeZone }).format(lastMoment);
	expect(lastDay(firmZone)).not.toBe(lastDay('Pacific/Auckland'));
	const phone = await browser.newContext({
		viewport: { width: 375, height: 740 },
		isMobile: true,
		hasTouch: true,
		timezoneId: 'Pacific/Auckland'
	});
	const home = await phone.newPage();
	await home.goto(link);
	await expect(home.getByRole('heading', { name: /Your estimate/ })).toBeVisible();
	await expect(home.getByText(`The link works until ${lastDay(firmZone)}.`)).toBeVisible();
	await expect(home.getByTestId('homeowner-total')).toHaveText(formatCents(saved.total_cents));
	// Mobile first: nothing runs wider than the phone.
	expect(await home.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375);
	// At 390 × 844 the plan and the yard photo are there, and the plan follows the choices.
	await home.setViewportSize({ width: 390, height: 844 });
	const plan = home.getByTestId('plan-drawing');
	await expect(plan.getByRole('img', { name: /^Plan of the feature from above/ })).toBeVisible();
	await expect(
		plan.getByRole('listitem').filter({ hasText: 'Basin 6 × 4 ft, 2 ft deep' })
	).toBeVisible();
	await expect(plan.getByTestId('plan-run')).toHaveCount(1);
	await expect(plan.getByText(/Dashed bar: Low retaining wall/)).toBeVisible();
	const photo = home.getByTestId('yard-photo');
	await expect(photo).toHaveCount(1);
	await photo.scrollIntoViewIfNeeded();
	await expect
		.poll(() => photo.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth))
		.toBeGreaterThan(0);
	expect(await home.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
	await plan.scrollIntoViewIfNeeded();
	await home.screenshot({ path: test.info().outputPath('homeowner-plan-390.png'), fullPage: true });
	const wall = home.getByRole('checkbox', { name: /Low retaining wall/ });
	await wall.check();
	await expect(home.getByTestId('homeowner-total')).not.toHaveText(formatCents(saved.total_cents));
	await expect(plan.getByText(/Cross-hatched bar: Low retaining wall/)).toBeVisible();
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

test('the builder takes a polygon topping and a second lighting run; an expired link is a 404', async ({
	page
}) => {
	const lead = await makeLead();
	await signIn(page, 'sales');
	await page.goto(`/office/leads/${lead.id}/estimate`);
	await page.getByRole('button', { name: 'Start the estimate' }).click();
	await expect(page.getByTestId('takeoff')).toBeVisible();

	// A polygon topping: its area is shown from the corners and the takeoff prices it.
	const toppings = page.getByTestId('topping');
	const before = await toppings.count();
	await page.getByRole('button', { name: 'Add a topping' }).click();
	const topping = toppings.nth(before);
	const name = `Topping ${before + 1}`;
	await topping.getByLabel('Material').selectOption({ label: 'River pebble, 1–2 in' });
	await topping.getByLabel('Area 1', { exact: true }).selectOption('polygon');
	await expect(topping.getByLabel('Corner 4 y (ft)')).toHaveValue('4');
	await expect(topping.getByTestId('area-ft2')).toHaveText('Area 24.0 ft²');
	const rect = await qty(page, name).textContent();
	await topping.getByLabel('Corner 3 y (ft)').fill('8');
	await expect(topping.getByTestId('area-ft2')).toHaveText('Area 36.0 ft²');
	await topping.getByRole('button', { name: 'Add a corner' }).click();
	await topping.getByLabel('Corner 5 x (ft)').fill('-3');
	// The trapezoid (6 ft wide, sides 4 and 8 ft) is 36 ft²; the fifth corner adds a 4 × 3 ft
	// triangle of 6 ft² (shoelace, by hand).
	await expect(topping.getByTestId('area-ft2')).toHaveText('Area 42.0 ft²');
	await expect(
		topping.getByRole('img', { name: /^Area 1: 5 corners, 9 ft by 8 ft/ })
	).toBeVisible();
	await expect(qty(page, name)).not.toHaveText(rect!);
	// An engine field error sits beside its field, and goes when the value is fixed.
	await topping.getByLabel('Depth (in)').fill('0');
	await expect(topping.getByText('Must be greater than zero')).toBeVisible();
	await expect(page.getByTestId('engine-errors')).toBeVisible();
	await topping.getByLabel('Depth (in)').fill('3');
	await expect(topping.getByText('Must be greater than zero')).toHaveCount(0);

	// A second run on a second transformer: more cable, two transformers, two runs in the plan.
	const cable = await qty(page, 'Direct-burial cable').textContent();
	await expect(qty(page, 'Low-voltage transformer')).toHaveText('1');
	await page.getByRole('button', { name: 'Add a transformer' }).click();
	await page.getByRole('button', { name: 'Add a lighting run' }).click();
	const run2 = page.getByTestId('lighting-run').nth(1);
	await run2.getByLabel('Fed from').selectOption({ label: 'Transformer 2, 150 VA' });
	await run2.getByLabel('Cable to it (ft)').fill('40');
	await run2.getByRole('button', { name: 'Add a light to run 2' }).click();
	await expect(run2.getByTestId('run-fixture')).toHaveCount(2);
	await expect(qty(page, 'Low-voltage transformer')).toHaveText('2');
	await expect(qty(page, 'Direct-burial cable')).not.toHaveText(cable!);
	expect(Number(await qty(page, 'Direct-burial cable').textContent())).toBeGreaterThan(
		Number(cable) + 40
	);
	await expect(page.getByTestId('plan-drawing').getByTestId('plan-run')).toHaveCount(2);
	await page.screenshot({ path: test.info().outputPath('builder-polygon.png'), fullPage: true });

	// A second wall, then an alternate that holds it: its lines move under the alternate's choice.
	const walls = await page.getByTestId('wall').count();
	await page.getByRole('button', { name: 'Add a wall' }).click();
	const wall = page.getByTestId('wall').nth(walls);
	const wallName = `Wall ${walls + 1}`;
	await expect(qty(page, `${wallName} units`)).toBeVisible();
	await page.getByRole('button', { name: 'Add an alternate' }).click();
	const alternate = page.getByTestId('alternate').last();
	await alternate.getByLabel('Alternate name').fill('Edge');
	await alternate.getByLabel('Choice 1', { exact: true }).fill('Boulders only');
	await alternate.getByLabel('Choice 2', { exact: true }).fill('Second wall');
	await wall.getByLabel('Part of').selectOption({ label: 'Edge: Second wall' });
	const takeoff = page.getByTestId('takeoff');
	const group = takeoff.locator('tbody').filter({ hasText: 'Edge: Second wall' });
	await expect(group.getByRole('row').filter({ hasText: `${wallName} units` })).toBeVisible();

	const saved = savedOnce(page);
	await page.getByLabel('Design', { exact: true }).fill('Columns, pebbles and two light runs');
	await saved;
	await expect(page.getByTestId('save-status')).toHaveText(/All changes saved/);
	const [row] = await sql`select id, design from estimates where lead_id = ${lead.id}`;
	const design = row.design as {
		aggregates: { name: string; areas: { shape: string; pointsFt?: number[][] }[] }[];
		lighting: { runs: unknown[]; transformers: unknown[] };
	};
	const stored = design.aggregates.find((a) => a.name === name)!;
	expect(stored.areas[0]).toEqual({
		shape: 'polygon',
		pointsFt: [
			[0, 0],
			[6, 0],
			[6, 8],
			[0, 4],
			[-3, 2]
		]
	});
	expect(design.lighting.runs).toHaveLength(2);
	expect(design.lighting.transformers).toHaveLength(2);
	expect(
		(row.design as { alternates: { name: string }[] }).alternates.map((a) => a.name)
	).toContain('Edge');

	// Sent, then past its date: the link answers 404 with the plain page.
	await page.getByRole('button', { name: /^Send to/ }).click();
	await expect(page.getByTestId('estimate-status')).toHaveText('Sent');
	const mail = await waitForMail(lead.email, /Your estimate from/);
	const link = linkIn(mail, /^\/estimate\/[A-Za-z0-9_-]+$/);
	await sql`update estimates set expires_at = now() - interval '1 minute' where id = ${row.id}`;
	const res = await page.goto(link);
	expect(res?.status()).toBe(404);
	await expect(
		page.getByRole('heading', { name: 'This link does not open an estimate' })
	).toBeVisible();
	await expect(page.getByText(/R-\d+/)).toHaveCount(0);
});

test('a wrong link answers 404 with a plain page', async ({ page }) => {
	for (const token of ['not-a-real-token-0123456789', randomBytes(20).toString('base64url')]) {
		const res = await page.goto(`/estimate/${token}`);
		expect(res?.status()).toBe(404);
		await expect(
			page.getByRole('heading', { name: 'This link does not open an estimate' })
		).toBeVisible();
		await expect(page.getByText(/R-\d+/)).toHaveCount(0);
		await expect(page.getByText(/Call us at/)).toBeVisible();
	}
});
