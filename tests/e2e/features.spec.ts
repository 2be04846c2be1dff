// Ponds and streams in the builder and on the homeowner's page: a pond lead's estimate starts
// from a pond, is sent and accepted on a 390 px phone; a stream lead's estimate gets a fountain as
// an option, the homeowner leaves it out and the total follows.
import { expect, test } from '@playwright/test';
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

test('a pond lead: built from a pond, sent, and accepted on a 390 px phone', async ({
	page,
	browser
}) => {
	const lead = await makeLead('Hollis Wrenfield', ['pond'], 'A fish pond by the porch');
	await signIn(page, 'sales');
	await page.goto(`/office/leads/${lead.id}/estimate`);
	await page.getByRole('button', { name: 'Start the estimate' }).click();
	const pond = page.locator('[data-testid="feature"][data-kind="pond"]');
	await expect(pond).toHaveCount(1);
	await expect(page.locator('[data-testid="feature"][data-kind="fountain"]')).toHaveCount(0);
	await expect(page.getByTestId('pump-chart')).toHaveCount(1);
	const takeoff = page.getByTestId('takeoff');
	await expect(takeoff).toContainText('EPDM pond liner');
	await expect(takeoff).toContainText('Pond skimmer');
	await expect(takeoff).toContainText('Biological filter');

	// A longer pond holds more water and costs more.
	const volume = page.getByTestId('pond-volume');
	const before = await volume.textContent();
	const total = await page.getByTestId('total').textContent();
	const once = saved(page);
	await pond.getByLabel('Pond length (ft)').fill('20');
	await expect(volume).not.toHaveText(before!);
	await expect(page.getByTestId('total')).not.toHaveText(total!);
	await once;

	// Crossing edges are an error beside the outline, and the estimate is not priced meanwhile.
	await pond.getByLabel('Outline').selectOption('polygon');
	await pond.getByLabel('Pond corner 3 y (ft)').fill('-4');
	await expect(pond.getByTestId('outline-error')).toContainText('cross');
	await expect(page.getByTestId('engine-errors')).toBeVisible();
	await pond.getByLabel('Outline').selectOption('oval');
	await expect(page.getByTestId('engine-errors')).toHaveCount(0);

	const { link, row } = await sendAndOpen(sql, page, lead);
	const phone = await browser.newContext({
		viewport: { width: 390, height: 844 },
		isMobile: true,
		hasTouch: true
	});
	const home = await phone.newPage();
	await home.goto(link);
	await expect(home.getByTestId('homeowner-total')).toHaveText(formatCents(row.total_cents));
	await home.getByText(/^What is included/).click();
	await expect(
		home.getByTestId('included-group').getByRole('heading', { name: 'Pond', exact: true })
	).toBeVisible();
	await expect(home.getByTestId('included-group').first()).toContainText('EPDM pond liner');
	const plan = home.getByTestId('plan-drawing');
	await expect(
		plan.getByTestId('plan-feature').filter({ hasText: /^Waves: Pond, oval/ })
	).toBeVisible();
	await expect(home.getByText(/Pond holds about \d+ in of open water/)).toBeVisible();
	expect(await home.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
	await home.screenshot({ path: test.info().outputPath('pond-390.png'), fullPage: true });
	await home.getByLabel('Your full name').fill(lead.name);
	await home.getByRole('checkbox', { name: /I accept this estimate/ }).check();
	await home.getByRole('button', { name: /^Accept for/ }).click();
	await expect(home.getByRole('heading', { name: 'Accepted: thank you' })).toBeVisible();
	const [acc] =
		await sql`select total_cents from estimate_acceptances where estimate_id = ${row.id}`;
	expect(acc.total_cents).toBe(row.total_cents);
	const [after] = await sql`select stage from leads where id = ${lead.id}`;
	expect(after.stage).toBe('sold');
	await phone.close();
});

test('a stream with a fountain as an option: the homeowner leaves it out and the total follows', async ({
	page,
	browser
}) => {
	const lead = await makeLead('Ingrid Thornbury', ['stream'], 'A stream down the slope');
	await signIn(page, 'sales');
	await page.goto(`/office/leads/${lead.id}/estimate`);
	await page.getByRole('button', { name: 'Start the estimate' }).click();
	await expect(page.locator('[data-testid="feature"][data-kind="stream"]')).toHaveCount(1);
	await expect(page.getByTestId('stream-results')).toContainText('Reservoir must hold');

	await page.getByRole('button', { name: 'Add an option' }).click();
	await page.getByTestId('option-row').last().getByLabel('Option').fill('Basalt column fountain');
	await page.getByRole('button', { name: 'Add a fountain' }).click();
	const fountain = page.locator('[data-testid="feature"][data-kind="fountain"]');
	await expect(fountain).toHaveCount(1);
	await fountain.getByLabel('Part of').selectOption({ label: 'Option: Basalt column fountain' });
	// One pump for the stream, one for the fountain.
	await expect(page.getByTestId('water-system')).toHaveCount(2);
	// The plan shows the stream and, dotted, the fountain that is an option not taken.
	const key = page.getByTestId('plan-drawing').getByTestId('plan-feature');
	await expect(key).toHaveCount(2);
	await expect(key.last()).toContainText(/^Dotted outline: Fountain, .*\(an option\)/);

	const { link, row } = await sendAndOpen(sql, page, lead);
	const [{ design }] = await sql`select design from estimates where id = ${row.id}`;
	const features = (design as { features: { kind: string; optionId?: string }[] }).features;
	expect(features.map((f) => f.kind)).toEqual(['stream', 'fountain']);
	expect(features[1].optionId).toBeTruthy();

	const phone = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true });
	const home = await phone.newPage();
	await home.goto(link);
	const totalShown = home.getByTestId('homeowner-total');
	await expect(totalShown).toHaveText(formatCents(row.total_cents));
	const option = home.getByRole('checkbox', { name: /Basalt column fountain/ });
	await expect(option).not.toBeChecked();
	await option.check();
	await expect(totalShown).not.toHaveText(formatCents(row.total_cents));
	const withFountain = await totalShown.textContent();
	await option.uncheck();
	await expect(totalShown).toHaveText(formatCents(row.total_cents));
	expect(withFountain).not.toBe(formatCents(row.total_cents));
	await home.getByLabel('Your full name').fill(lead.name);
	await home.getByRole('checkbox', { name: /I accept this estimate/ }).check();
	await home.getByRole('button', { name: /^Accept for/ }).click();
	await expect(home.getByRole('heading', { name: 'Accepted: thank you' })).toBeVisible();
	const [acc] =
		await sql`select total_cents, options_chosen from estimate_acceptances where estimate_id = ${row.id}`;
	expect(acc.options_chosen.options).toEqual([]);
	expect(acc.total_cents).toBe(row.total_cents);
	await phone.close();
});
