/**
 * The public site on the production build: navigation from home to a project and its start
 * link, accessibility (axe: no serious or critical violations), no console errors, no script on
 * content pages, nothing fetched from another host, and a 360 px wide layout that fits.
 */
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';

const LOCAL = new Set(['127.0.0.1', 'localhost']);

/** Collects what a page did: console errors, uncaught errors, requests and scripts. */
function watch(page: Page) {
	const seen = { errors: [] as string[], foreign: [] as string[], scripts: [] as string[] };
	page.on('console', (msg) => {
		if (msg.type() === 'error') seen.errors.push(`${page.url()}: ${msg.text()}`);
	});
	page.on('pageerror', (err) => seen.errors.push(`${page.url()}: ${err.message}`));
	page.on('request', (req) => {
		const url = new URL(req.url());
		if (url.protocol === 'data:' || url.protocol === 'blob:') return;
		if (!LOCAL.has(url.hostname)) seen.foreign.push(req.url());
		if (req.resourceType() === 'script') seen.scripts.push(req.url());
	});
	return seen;
}

async function publicPaths(page: Page): Promise<string[]> {
	const res = await page.request.get('/sitemap.xml');
	expect(res.ok()).toBe(true);
	const xml = await res.text();
	return [...xml.matchAll(/<loc>([^<]+)<\/loc>/g)].map((m) => new URL(m[1]).pathname);
}

test.describe('public site', () => {
	test('home → our work → a feature type → a project → start link with ref', async ({ page }) => {
		const seen = watch(page);
		await page.goto('/');
		await expect(page.getByRole('heading', { level: 1 })).toBeVisible();

		await page
			.getByRole('navigation', { name: 'Main' })
			.getByRole('link', { name: 'Our work' })
			.click();
		await expect(page).toHaveURL(/\/work$/);
		await expect(page.getByRole('heading', { level: 1, name: 'Our work' })).toBeVisible();

		await page
			.getByRole('navigation', { name: 'Kinds of project' })
			.getByRole('link', { name: /^Ponds/ })
			.click();
		await expect(page).toHaveURL(/\/work\/type\/ponds$/);
		await expect(page.getByRole('heading', { level: 1, name: 'Ponds' })).toBeVisible();

		await page.getByRole('link', { name: 'A pond for wildlife' }).click();
		await expect(page).toHaveURL(/\/work\/wildlife-pond$/);
		await expect(
			page.getByRole('heading', { level: 1, name: 'A pond for wildlife' })
		).toBeVisible();
		await expect(page.getByRole('heading', { name: 'What we built' })).toBeVisible();

		const start = page.getByRole('link', { name: 'Start a project like this' }).first();
		await expect(start).toHaveAttribute('href', '/start?ref=wildlife-pond');
		expect(seen.errors).toEqual([]);
		expect(seen.scripts).toEqual([]);

		// The inquiry page is tested in intake.spec.ts: only the reference it receives is checked here.
		await start.click();
		await expect(page).toHaveURL(/\/start\?ref=wildlife-pond$/);
		expect(new URL(page.url()).searchParams.get('ref')).toBe('wildlife-pond');
		expect(seen.foreign).toEqual([]);
	});

	test('the skip link is the first stop for the keyboard and lands on the content', async ({
		page
	}) => {
		await page.goto('/work');
		await page.keyboard.press('Tab');
		const skip = page.getByRole('link', { name: 'Skip to main content' });
		await expect(skip).toBeFocused();
		await expect(skip).toBeVisible();
		await page.keyboard.press('Enter');
		await expect(page).toHaveURL(/#main$/);
		await page.keyboard.press('Tab');
		const inMain = await page.evaluate(() => Boolean(document.activeElement?.closest('main')));
		expect(inMain).toBe(true);
	});

	test('an unknown address shows the site 404 page', async ({ page }) => {
		const res = await page.goto('/work/no-such-project');
		expect(res?.status()).toBe(404);
		await expect(page.getByRole('heading', { level: 1 })).toContainText('could not find');
		await expect(page.getByRole('link', { name: 'Our work' }).first()).toBeVisible();
	});

	test('every public page: accessible, silent, script-free, local-only, fits 360 px', async ({
		browser
	}) => {
		test.setTimeout(180_000);
		const context = await browser.newContext({ viewport: { width: 360, height: 800 } });
		const page = await context.newPage();
		const paths = await publicPaths(page);
		expect(paths.length).toBeGreaterThan(10);
		const seen = watch(page);
		const problems: string[] = [];
		for (const path of paths) {
			const res = await page.goto(path);
			expect(res?.status(), path).toBe(200);
			const results = await new AxeBuilder({ page })
				.withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'])
				.analyze();
			for (const v of results.violations) {
				if (v.impact === 'serious' || v.impact === 'critical') {
					problems.push(
						`${path}: ${v.id} (${v.impact}) ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`
					);
				}
			}
			const overflow = await page.evaluate(
				() => document.documentElement.scrollWidth - document.documentElement.clientWidth
			);
			if (overflow > 0) problems.push(`${path}: ${overflow}px wider than a 360 px screen`);
		}
		expect(problems).toEqual([]);
		expect(seen.errors).toEqual([]);
		expect(seen.scripts, 'content pages ship no JavaScript').toEqual([]);
		expect(seen.foreign, 'no request leaves 127.0.0.1').toEqual([]);
		await context.close();
	});
});
