// The office leads: the owner works the table (filters, search, sort, pages, URL state), opens
// a lead, views a photo, assigns it, logs a call and closes another with a reason; crew is refused.
import { randomBytes } from 'node:crypto';
import postgres from 'postgres';
import sharp from 'sharp';
import { expect, test } from '@playwright/test';
import { putObject, randomKey } from '../../src/lib/server/platform/storage';
import { signIn } from './pages/staff';

const run = randomBytes(4).toString('hex');
const token = `tarn${run}`; // a word only this run's leads carry, so demo data never interferes
const id = () => randomBytes(12).toString('base64url');
const names = {
	photo: `Wren Slatebrook ${run}`,
	closing: `Otto Marlpit ${run}`
};

test.beforeAll(async () => {
	const sql = postgres(process.env.E2E_DATABASE_URL ?? process.env.DATABASE_URL!, { max: 1 });
	try {
		const base = Date.now() - 3 * 86_400_000;
		const people = [
			...Array.from({ length: 28 }, (_, i) => ({
				name: `Pondfinder ${String(i + 1).padStart(2, '0')} ${run}`,
				stage: i < 24 ? 'new' : i < 26 ? 'contacted' : 'estimating'
			})),
			{ name: names.photo, stage: 'new' },
			{ name: names.closing, stage: 'contacted' }
		];
		for (const [i, p] of people.entries()) {
			const contactId = id();
			const propertyId = id();
			const leadId = id();
			await sql`insert into contacts (id, name, email) values (${contactId}, ${p.name}, ${`e2e.${run}.${i}@test.example`})`;
			await sql`insert into properties (id, contact_id, street, town) values (${propertyId}, ${contactId}, ${`${i + 1} Weir Road`}, 'Alder Crossing')`;
			const created = new Date(base + i * 60_000);
			await sql`insert into leads (id, contact_id, property_id, stage, services, budget, message, created_at, last_touch_at)
				values (${leadId}, ${contactId}, ${propertyId}, ${p.stage}, ${['water-feature']}, '5k-15k',
				${`A basalt column by the ${token} patio`}, ${created}, ${created})`;
			await sql`insert into activities (lead_id, kind, body, created_at) values (${leadId}, 'inquiry', '', ${created})`;
			if (p.name === names.photo) {
				const jpeg = await sharp({
					create: { width: 320, height: 240, channels: 3, background: '#4f9597' }
				})
					.jpeg()
					.toBuffer();
				const displayKey = randomKey('e2e', 'display.jpg');
				const thumbKey = randomKey('e2e', 'thumb.jpg');
				await putObject(displayKey, jpeg, 'image/jpeg');
				await putObject(thumbKey, jpeg, 'image/jpeg');
				await sql`insert into photos (id, lead_id, display_key, thumb_key, width, height, bytes, original_name)
					values (${id()}, ${leadId}, ${displayKey}, ${thumbKey}, 320, 240, ${jpeg.length}, 'spot.jpg')`;
			}
		}
	} finally {
		await sql.end();
	}
});

test('the owner filters, searches, sorts and pages; the URL keeps the view', async ({ page }) => {
	await signIn(page, 'owner');
	await page
		.getByRole('navigation', { name: 'Office sections' })
		.getByRole('link', { name: 'Leads' })
		.click();
	await expect(page).toHaveURL(/\/office\/leads$/);

	await page.getByRole('button', { name: /^new/ }).click();
	await expect(page).toHaveURL(/stage=new/);
	await page.getByLabel(/Search name/).fill(token);
	await expect(page).toHaveURL(new RegExp(`q=${token}`));
	await expect(page.getByText('25 leads')).toBeVisible();

	await page.getByRole('button', { name: /^Name/ }).click();
	await expect(page).toHaveURL(/sort=name&dir=asc/);
	const rows = page.locator('tbody tr[data-lead]');
	await expect(rows.first()).toContainText(`Pondfinder 01 ${run}`);
	await expect(page.getByText('Page 1 of 1')).toBeVisible();

	await page.getByRole('button', { name: /^contacted/ }).click();
	await expect(page).toHaveURL(/stage=new&stage=contacted/);
	await expect(page.getByText('28 leads')).toBeVisible();
	await page.getByRole('button', { name: 'Next' }).click();
	await expect(page).toHaveURL(/page=2/);
	await expect(rows).toHaveCount(3);
	await expect(rows.last()).toContainText(names.photo);

	await page.reload();
	await expect(page.getByText('Page 2 of 2')).toBeVisible();
	await expect(rows).toHaveCount(3);
	await expect(page.getByLabel(/Search name/)).toHaveValue(token);

	await page.goBack();
	await expect(page).not.toHaveURL(/page=2/);
	await expect(page.getByText('Page 1 of 2')).toBeVisible();
	// The pager follows the URL at once; the rows once page 1 has loaded (page 2 had 3).
	await expect(rows).toHaveCount(25);

	// Keyboard: focus the first row, move down with the arrow key, open with Enter.
	await rows.first().focus();
	await page.keyboard.press('ArrowDown');
	await expect(rows.nth(1)).toBeFocused();
	await page.keyboard.press('Enter');
	await expect(page).toHaveURL(/\/office\/leads\/[A-Za-z0-9_-]+$/);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(`Pondfinder 01 ${run}`);
});

test('the owner opens a lead, views a photo, assigns it, logs a call; closes another', async ({
	page
}) => {
	await signIn(page, 'owner');
	await page.goto(`/office/leads?q=${encodeURIComponent(names.photo)}`);
	await page.getByRole('link', { name: names.photo }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(names.photo);
	await expect(page.getByRole('link', { name: 'Book a site visit' })).toBeVisible();

	await page.getByRole('button', { name: /Photo 1.*open full size/ }).click();
	const full = page.getByRole('dialog').getByRole('img');
	await expect(full).toBeVisible();
	await expect
		.poll(() => full.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth))
		.toBe(320);
	expect(await full.getAttribute('src')).toContain('X-Amz-Signature=');
	await page.getByRole('button', { name: 'Close' }).click();

	await page.getByLabel('Assigned to').selectOption({ label: 'Teo Baptiste' });
	await page.getByRole('button', { name: 'Assign' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Assigned' })).toBeVisible();
	await expect(page.locator('[data-kind="assign"]').first()).toContainText(
		'Assigned to Teo Baptiste'
	);

	await page
		.getByLabel('What was said or noted')
		.fill('Called: wants the column lit, visit next week');
	await page.getByRole('button', { name: 'Save to the timeline' }).click();
	await expect(page.locator('[data-kind="call"]').first()).toContainText('wants the column lit');
	await expect(page.locator('[data-kind="stage"]').first()).toContainText('new → contacted');

	await page.goto(`/office/leads?q=${encodeURIComponent(names.closing)}`);
	await page.getByRole('link', { name: names.closing }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(names.closing);
	await page.getByRole('combobox', { name: 'Stage' }).selectOption('closed');
	await page.getByRole('button', { name: 'Close the lead' }).click();
	await expect(page.getByText('Pick the reason').or(page.locator(':invalid'))).not.toHaveCount(0);
	await page.getByLabel('chose another firm').check();
	await page.getByRole('button', { name: 'Close the lead' }).click();
	await expect(page.locator('[data-kind="stage"]').first()).toContainText(
		'Closed: chose another firm'
	);
	await expect(page.locator('header').getByText('closed: chose another firm')).toBeVisible();
});

test('crew is refused the leads page and API, and sees no Leads link', async ({ page }) => {
	await signIn(page, 'crew');
	await expect(
		page.getByRole('navigation', { name: 'Office sections' }).getByRole('link', { name: 'Leads' })
	).toHaveCount(0);
	const res = await page.goto('/office/leads');
	expect(res?.status()).toBe(403);
	const api = await page.request.get('/api/leads');
	expect(api.status()).toBe(403);
});

test.describe('on a tablet', () => {
	test.use({ viewport: { width: 1024, height: 768 }, hasTouch: true });

	test('the table fits the screen without sideways scrolling and a tap opens the lead', async ({
		page
	}) => {
		await signIn(page, 'owner');
		await page.goto(`/office/leads?stage=new&q=${token}&sort=name&dir=asc`);
		const rows = page.locator('tbody tr[data-lead]');
		await expect(rows.first()).toContainText(`Pondfinder 01 ${run}`);
		const overflow = (selector: string) =>
			page
				.locator(selector)
				.first()
				.evaluate((el) => el.scrollWidth - el.clientWidth);
		expect(await overflow('html')).toBe(0);
		expect(await overflow('table >> xpath=..')).toBe(0);
		await expect(page.getByRole('columnheader', { name: 'Reply wait' })).toBeInViewport();
		await rows.first().getByText('Alder Crossing').tap();
		await expect(page.getByRole('heading', { level: 1 })).toHaveText(`Pondfinder 01 ${run}`);
	});
});

test.describe('on a tablet held upright', () => {
	test.use({ viewport: { width: 768, height: 1024 }, hasTouch: true });

	test('the leads and their reply wait fit the width of the page', async ({ page }) => {
		await signIn(page, 'owner');
		await page.goto(`/office/leads?stage=new&q=${token}&sort=name&dir=asc`);
		const first = page.locator('tbody tr[data-lead]').first();
		await expect(first).toContainText(`Pondfinder 01 ${run}`);
		// Neither the office header nor the leads make the page scroll sideways.
		const html = page.locator('html');
		expect(await html.evaluate((el) => el.scrollWidth - el.clientWidth)).toBe(0);
		await expect(page.getByRole('button', { name: 'Menu' })).toBeVisible();
		expect(
			await page.locator('table >> xpath=..').evaluate((el) => el.scrollWidth - el.clientWidth)
		).toBe(0);
		// The eighth cell is the reply wait: every lead of this run has waited three days.
		await expect(first.locator('td').nth(7)).toContainText('waiting');
		await expect(first.locator('td').nth(7)).toBeInViewport();
	});
});
