// Yard work without water: a patio-and-planting lead's estimate starts from a flagstone path and
// planting beds, is reshaped with the polygon editor, sent, and accepted on a 390 px phone; a
// lighting lead's estimate is built on a 390 px phone with lighting alone and accepted on a desktop.
import { expect, test } from '@playwright/test';
import postgres from 'postgres';
import { formatCents } from '../../src/lib/money';
import { accept, salesLead, saved, sendAndOpen } from './pages/estimate';
import { signIn } from './pages/staff';

const sql = postgres(process.env.E2E_DATABASE_URL!, { max: 2, onnotice: () => {} });
test.afterAll(async () => {
	await sql.end();
});

test('a path and planting: built from the lead, reshaped by corners, sent and accepted on a 390 px phone', async ({
	page,
	browser
}) => {
	const lead = await salesLead(
		sql,
		'Odile Fairweather',
		['patio', 'planting'],
		'A stone path and beds'
	);
	await signIn(page, 'sales');
	await page.goto(`/office/leads/${lead.id}/estimate`);
	await page.getByRole('button', { name: 'Start the estimate' }).click();
	const path = page.locator('[data-testid="feature"][data-kind="path"]');
	const beds = page.locator('[data-testid="feature"][data-kind="planting"]');
	await expect(path).toHaveCount(1);
	await expect(beds).toHaveCount(1);
	await expect(page.locator('[data-testid="feature"][data-kind="fountain"]')).toHaveCount(0);
	await expect(page.getByTestId('pump-chart')).toHaveCount(0);
	const takeoff = page.getByTestId('takeoff');
	await expect(takeoff).toContainText('Sandstone flagstone');
	await expect(takeoff).toContainText('Compactable road base');
	await expect(takeoff).toContainText('Perennial, 1 gal');
	await expect(takeoff).toContainText('Shredded bark mulch');
	// 20 × 4 ft at 18 in triangular over 60%: 30 perennials, 12 grasses, 3 shrubs.
	await expect(page.getByTestId('plant-count')).toHaveText('45');
	await expect(page.getByText('Send water away from foundations').first()).toBeVisible();
	await expect(page.getByText('Steps: even risers, within the local code').first()).toBeVisible();

	// The path becomes a polygon by its corners: same area first, then a wider end costs more.
	await expect(page.getByTestId('path-area')).toHaveText(/80(\.0)? ft²/);
	const total = await page.getByTestId('total').textContent();
	await path.getByLabel('Path area 1').selectOption('polygon');
	await expect(path.getByTestId('areas-total')).toContainText('80.0 ft²');
	const once = saved(page);
	await path.getByLabel('Corner 3 y (ft)').fill('8');
	await expect(path.getByTestId('areas-total')).toContainText('120.0 ft²');
	await expect(page.getByTestId('path-area')).toHaveText(/120(\.0)? ft²/);
	await expect(page.getByTestId('total')).not.toHaveText(total!);
	await once;

	// A step too tall is flagged against the code.
	const twice = saved(page);
	await path.getByLabel('Rise each (in)').fill('9');
	await expect(page.getByText(/R311\.7\.5\.1/).first()).toBeVisible();
	await path.getByLabel('Rise each (in)').fill('6');
	await twice;

	// The ground: clay, dug by machine, the soil kept on site. The digging is timed by the machine,
	// the loader is priced, and the haul-off line goes.
	const site = page.getByTestId('site-form');
	const tasks = page.getByTestId('labor-tasks');
	await expect(takeoff).toContainText('Haul away');
	await expect(tasks).toContainText('(by hand)');
	const thrice = saved(page);
	await site.getByLabel('Soil', { exact: true }).selectOption('clay');
	await expect(site.getByTestId('site-rates')).toContainText('By hand in clay: 4.5 person-hours');
	await site.getByLabel('Digging', { exact: true }).selectOption('machine');
	await expect(tasks).toContainText('(machine)');
	await expect(tasks).not.toContainText('(by hand)');
	await expect(takeoff).toContainText('Compact track loader');
	await site.getByLabel('Dug soil').selectOption('keep');
	await expect(takeoff).not.toContainText('Haul away');
	await expect(page.getByTestId('site-work')).toContainText('kept on site');
	await thrice;

	const { link, row } = await sendAndOpen(sql, page, lead);
	const [{ design }] = await sql`select design from estimates where id = ${row.id}`;
	expect((design as { features: { kind: string }[] }).features.map((f) => f.kind)).toEqual([
		'path',
		'planting'
	]);
	expect((design as { site: unknown }).site).toEqual({
		soil: 'clay',
		dig: 'machine',
		haulSpoil: false
	});

	const phone = await browser.newContext({
		viewport: { width: 390, height: 844 },
		isMobile: true,
		hasTouch: true
	});
	const home = await phone.newPage();
	await home.goto(link);
	await expect(home.getByTestId('homeowner-total')).toHaveText(formatCents(row.total_cents));
	await home.getByText(/^What is included/).click();
	const groups = home.getByTestId('included-group');
	await expect(groups.getByRole('heading', { name: 'Flagstone path', exact: true })).toBeVisible();
	await expect(groups.getByRole('heading', { name: 'Planting beds', exact: true })).toBeVisible();
	await expect(groups.first()).toContainText('Sandstone flagstone');
	await expect(home.getByRole('heading', { name: /— path and planting$/ })).toBeVisible();
	await expect(home.getByText('Send water away from foundations')).toBeVisible();
	await expect(home.getByText('Steps: even risers, within the local code')).toBeVisible();
	expect(await home.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
	await home.screenshot({ path: test.info().outputPath('path-planting-390.png'), fullPage: true });
	expect(await accept(sql, home, lead, row.id)).toBe(row.total_cents);
	await phone.close();
});

test('lighting alone: built on a 390 px phone with no water feature, accepted on a desktop', async ({
	browser
}) => {
	const lead = await salesLead(sql, 'Piet Vandermolen', ['lighting'], 'Light the garden path');
	const staff = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true });
	const page = await staff.newPage();
	await signIn(page, 'sales');
	await page.goto(`/office/leads/${lead.id}/estimate`);
	await page.getByRole('button', { name: 'Start the estimate' }).click();
	await expect(page.getByTestId('feature')).toHaveCount(0);
	await expect(page.getByTestId('water-system')).toHaveCount(0);
	const takeoff = page.getByTestId('takeoff');
	await expect(takeoff).toContainText('LED path light');
	await expect(takeoff).toContainText('Low-voltage transformer');
	await expect(takeoff).not.toContainText('Basalt');
	await expect(
		page.getByText('Ground-fault protection for pumps and lights near water').first()
	).toBeVisible();
	const { link, row } = await sendAndOpen(sql, page, lead);
	const [{ design }] = await sql`select design from estimates where id = ${row.id}`;
	expect((design as { features: unknown[] }).features).toEqual([]);
	await staff.close();

	const desk = await browser.newContext();
	const home = await desk.newPage();
	await home.goto(link);
	await expect(home.getByTestId('homeowner-total')).toHaveText(formatCents(row.total_cents));
	await home.getByText(/^What is included/).click();
	await expect(home.getByTestId('included-group').first()).toContainText('LED uplight');
	expect(await accept(sql, home, lead, row.id)).toBe(row.total_cents);
	await desk.close();
});
