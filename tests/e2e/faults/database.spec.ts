// PostgreSQL stopped under a running app: friendly 503s, the process stays up, and it recovers
// by itself when the database returns.
import { expect, test } from '@playwright/test';
import { startCluster, stopCluster } from '../../../scripts/lib/postgres';
import { signIn } from '../pages/staff';

const dataDir = process.env.TEST_PG_DATA ?? '';
const port = Number(process.env.TEST_PG_PORT);

test('the app answers 503 while the database is down and recovers when it is back', async ({
	page,
	browser
}) => {
	expect(dataDir, 'run through npm test, which starts the test cluster').not.toBe('');
	await signIn(page, 'owner');
	stopCluster(dataDir);
	try {
		const office = await page.goto('/office/team');
		expect(office?.status()).toBe(503);
		await expect(page.getByRole('heading', { name: 'Back in a moment' })).toBeVisible();
		const health = await page.request.get('/api/health');
		expect(health.status()).toBe(503);
		// A visitor without a session still gets pages that need no records.
		const anonymous = await browser.newPage();
		expect((await anonymous.goto('/sign-in'))?.status()).toBe(200);
		await anonymous.close();
	} finally {
		startCluster({ dataDir, port, database: 'unused' });
	}
	await expect(async () => {
		const res = await page.goto('/office/team');
		expect(res?.status()).toBe(200);
	}).toPass({ timeout: 20_000 });
	await expect(page.getByRole('heading', { name: 'Team' })).toBeVisible();
});
