// Yard work without water: a patio-and-planting lead's estimate starts from a flagstone path and
// planting beds, is reshaped with the polygon editor, sent, and accepted on a 390 px phone; a
// lighting lead's estimate is built on a 390 px phone with lighting alone and accepted on a desktop.
import { expect, test, type Page } from '@playwright/test';
import postgres from 'postgres';
import { formatCents } from '../../src/lib/money';
import { seedLead } from '../support/lead';
import { saved, sendAndOpen } from './pages/estimate';
import { demoUser, signIn } from './pages/staff';

const sql = postgres(process.env.E2E_DATABASE_URL!, { max: 2, onnotice: () => {} });
test.afterAll(async () => {
	await sql.end();
});

async function makeLead(name: string, services: string[], message: string) {
	const [sales] = await sql`select id from users where email = ${demoUser('sales').email}`;
	return seedLead(sql, { name, services, message, assigneeId: sales.id });
}

async function accept(home: Page, lead: { id: string; name: string }, estimateId: string) {
	await home.getByLabel('Your full name').fill(lead.name);
	await home.getByRole('checkbox', { name: /I accept this estimate/ }).check();
	await home.getByRole('button', { name: /^Accept for/ }).click();
	await expect(home.getByRole('heading', { name: 'Accepted: thank you' })).toBeVisible();
	const [acc] =
		await sql`select total_cents from estimate_acceptances where estimate_id = ${estimateId}`;
	const [after] = await sql`select stage from leads where id = ${lead.id}`;
	expect(after.stage).toBe('sold');
	return acc.total_cents as number;
}

test('a path and planting: built from the lead, reshaped by corners, sent and accepted on a 390 px phone', async ({
	page,
	browser
}) => {
	const lead = await makeLead('Odile Fairweather', ['patio', 'planting'], 'A stone path and beds');
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

	const { link, row } = await sendAndOpen(sql, page, lead);
	const [{ design }] = await sql`select design from estimates where id = ${row.id}`;
	expect((design as { features: { kind: string }[] }).features.map((f) => f.kind)).toEqual([
		'path',
		'planting'
	]);

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
	expect(await accept(home, lead, row.id)).toBe(row.total_cents);
	await phone.close();
});

test('lighting alone: built on a 390 px phone with no water feature, accepted on a desktop', async ({
	browser
}) => {
	const lead = await makeLead('Piet Vandermolen', ['lighting'], 'Light the garden path');
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
	expect(await accept(home, lead, row.id)).toBe(row.total_cents);
	await desk.close();
});
