// The owner exports the pump models and the labor list, sees a broken curve refused row by row
// with nothing written, then imports the export back unchanged; sales may export but not import.
import { expect, test } from '@playwright/test';
import { signIn } from './pages/staff';

test('owner round-trips the pumps and labor lists through the import page', async ({ page }) => {
	await signIn(page, 'owner');
	await page.goto('/office/price-list');
	const pumpsCsv = await (await page.request.get('/office/price-list/export?list=pumps')).text();
	expect(pumpsCsv.split('\r\n')[0]).toBe('pump_id,name,watts,price,cost,curve_gph_ft');
	const pumpCount = pumpsCsv.trim().split('\r\n').length - 1;
	expect(pumpCount).toBeGreaterThan(1);

	// A curve whose head rises is refused on its line, with no import button.
	const [header, first, ...rest] = pumpsCsv.trim().split('\r\n');
	const broken = first.replace(/;([\d.]+):([\d.]+)$/, ';$1:999');
	await page.goto('/office/price-list/import');
	await page.getByLabel('…or paste it').fill([header, broken, ...rest].join('\n'));
	await page.getByRole('button', { name: 'Preview' }).click();
	const preview = page.getByTestId('import-preview');
	await expect(page.getByRole('heading', { name: /Preview of the pumps/ })).toContainText(
		`${pumpCount} rows, 1 with errors`
	);
	await expect(preview.getByRole('row').nth(1)).toContainText(
		'head must not be higher than the point before'
	);
	await expect(page.getByRole('button', { name: /^Import \d+/ })).toHaveCount(0);

	// The export as it came: every row OK, and the import writes it back unchanged.
	await page.getByLabel('…or paste it').fill(pumpsCsv);
	await page.getByRole('button', { name: 'Preview' }).click();
	await expect(page.getByRole('heading', { name: /Preview of the pumps/ })).toContainText(
		`${pumpCount} rows, 0 with errors`
	);
	await page.getByRole('button', { name: `Import ${pumpCount} pumps` }).click();
	await expect(page.getByRole('status')).toContainText(`Imported ${pumpCount} pumps`);
	expect(await (await page.request.get('/office/price-list/export?list=pumps')).text()).toBe(
		pumpsCsv
	);

	// Labor, chosen by hand this time.
	const laborCsv = await (await page.request.get('/office/price-list/export?list=labor')).text();
	await page.getByLabel('Which list is the file?').selectOption('labor');
	await page.getByLabel('…or paste it').fill(laborCsv);
	await page.getByRole('button', { name: 'Preview' }).click();
	await expect(preview).toContainText('Set a basin or reservoir');
	await page.getByRole('button', { name: /^Import \d+ labor rows$/ }).click();
	await expect(page.getByRole('status')).toContainText('labor rows');
	expect(await (await page.request.get('/office/price-list/export?list=labor')).text()).toBe(
		laborCsv
	);
});

test('sales reads and exports the price list but has no import', async ({ page }) => {
	await signIn(page, 'sales');
	await page.goto('/office/price-list');
	await expect(page.getByRole('link', { name: 'Export pumps CSV' })).toBeVisible();
	await expect(page.getByRole('link', { name: 'Import CSV' })).toHaveCount(0);
	const basin = page
		.getByTestId('task-hours')
		.getByRole('row', { name: /Set a basin or reservoir/ });
	await expect(basin).toContainText(/\d/);
	const labor = await page.request.get('/office/price-list/export?list=labor');
	expect(labor.status()).toBe(200);
	expect((await labor.text()).split('\r\n')[0]).toBe(
		'kind,labor_id,name,unit,hours,cost_per_hour,price_per_hour,default_rate'
	);
	expect((await page.request.get('/office/price-list/import')).status()).toBe(403);
});
