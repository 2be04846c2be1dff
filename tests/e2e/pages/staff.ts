import { expect, request, type APIRequestContext, type Page } from '@playwright/test';
import { DEMO_STAFF } from '../../../scripts/seed/demo-data';

export type DemoRole = 'owner' | 'sales' | 'crew';

export function demoUser(role: DemoRole) {
	return DEMO_STAFF.find((s) => s.role === role)!;
}

export async function signIn(page: Page, role: DemoRole, next = ''): Promise<void> {
	const user = demoUser(role);
	await page.goto(`/sign-in${next ? `?next=${encodeURIComponent(next)}` : ''}`);
	await page.getByLabel('E-mail').fill(user.email);
	await page.getByLabel('Password').fill(user.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(next ? new RegExp(next.replace(/[?]/g, '\\?')) : /\/office$/);
}

/** An API context signed in as a demo user (or anonymous when role is null). */
export async function apiAs(baseURL: string, role: DemoRole | null): Promise<APIRequestContext> {
	const ctx = await request.newContext({
		baseURL,
		extraHTTPHeaders: { origin: baseURL, accept: 'text/html' }
	});
	if (role) {
		const user = demoUser(role);
		const res = await ctx.post('/sign-in', {
			form: { email: user.email, password: user.password },
			maxRedirects: 0
		});
		expect(res.status(), `sign-in as ${role}`).toBe(303);
	}
	return ctx;
}
