import { expect, test } from '@playwright/test';

for (const path of ['/sign-in', '/office', '/api/health']) {
	test(`security headers on ${path}`, async ({ request }) => {
		const res = await request.get(path, { maxRedirects: 0 });
		const h = res.headers();
		expect(h['x-content-type-options']).toBe('nosniff');
		expect(h['referrer-policy']).toBe('strict-origin-when-cross-origin');
		expect(h['x-frame-options']).toBe('DENY');
		if (path === '/sign-in') {
			const csp = h['content-security-policy'];
			expect(csp).toContain("frame-ancestors 'none'");
			expect(csp).toContain("object-src 'none'");
			expect(csp).toMatch(/script-src 'self' 'nonce-[^']+'/);
		}
	});
}

test('the sign-in page runs under its content security policy without violations', async ({
	page
}) => {
	const violations: string[] = [];
	page.on('console', (msg) => {
		if (/Content Security Policy/i.test(msg.text())) violations.push(msg.text());
	});
	await page.goto('/sign-in');
	await page.getByLabel('E-mail').fill('someone@copperleaf.example');
	await expect(page.getByRole('button', { name: 'Sign in' })).toBeEnabled();
	expect(violations).toEqual([]);
});

// Prerendered pages are files adapter-node serves before the hooks run: scripts/serve.js adds
// the headers to them.
for (const path of ['/', '/work', '/about', '/robots.txt']) {
	test(`security headers on the prerendered ${path}`, async ({ request }) => {
		const res = await request.get(path);
		expect(res.status()).toBe(200);
		const h = res.headers();
		expect(h['x-content-type-options']).toBe('nosniff');
		expect(h['referrer-policy']).toBe('strict-origin-when-cross-origin');
		expect(h['x-frame-options']).toBe('DENY');
		expect(h['content-security-policy']).toContain("frame-ancestors 'none'");
	});
}
