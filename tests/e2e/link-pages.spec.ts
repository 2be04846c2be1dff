// The homeowner's link pages live in one route group whose layout sets their headers: a link
// holds a private token, so no page of it may be cached, indexed or leak its address onward.
import { randomBytes } from 'node:crypto';
import { resolve } from 'node:path';
import postgres from 'postgres';
import { expect, test, type APIResponse } from '@playwright/test';
import { routeFiles } from '../../src/lib/server/http/route-files';
import { seedAcceptedJob } from '../support/accepted-job';

const GROUP = resolve('src/routes/(homeowner)');
const linkPages = routeFiles(GROUP)
	.filter((r) => r.kind === 'page')
	.map((r) => r.pattern);

function expectLinkHeaders(res: APIResponse) {
	const h = res.headers();
	expect(h['cache-control']).toBe('private, no-store');
	expect(h['x-robots-tag']).toBe('noindex');
	expect(h['referrer-policy']).toBe('same-origin');
}

test('the group holds every kind of homeowner link', () => {
	for (const kind of [
		'estimate',
		'visit',
		'change-order',
		'pay',
		'invoice',
		'testimonial',
		'care',
		'callback'
	]) {
		expect(linkPages.some((p) => p.startsWith(`/${kind}/`))).toBe(true);
	}
});

for (const pattern of linkPages) {
	test(`an unknown link at ${pattern} is a 404 that is neither cached nor indexed, nor referred to another site`, async ({
		request
	}) => {
		const path = pattern
			.replace(/\[token\]/g, randomBytes(20).toString('base64url'))
			.replace(/\[number\]/g, '1');
		const res = await request.get(path, { maxRedirects: 0 });
		expect(res.status()).toBe(404);
		expectLinkHeaders(res);
	});
}

test('a real payment link carries the same headers', async ({ request }) => {
	const sql = postgres(process.env.E2E_DATABASE_URL!, { max: 1, onnotice: () => {} });
	try {
		const { token } = await seedAcceptedJob(sql, {
			name: 'Linnea Harrowgate',
			email: `linnea.${randomBytes(4).toString('hex')}@example.com`,
			message: 'A small bubbler by the porch.',
			scope: 'One stone bubbler.',
			title: 'Porch bubbler',
			totalCents: 480_000,
			depositCents: 144_000
		});
		const res = await request.get(`/pay/${token}`);
		expect(res.status()).toBe(200);
		expectLinkHeaders(res);
	} finally {
		await sql.end();
	}
});
