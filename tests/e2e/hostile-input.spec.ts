// Every page, API and export of the route tree gets hostile values in every query parameter it
// reads, as owner and as a visitor: nothing may answer 5xx. A parameter read by a route is found
// in its server files (`searchParams.get('…')`, or the shared query schemas they parse with), so a
// new route or parameter is covered without editing this file.
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import postgres from 'postgres';
import { expect, test } from '@playwright/test';
import { routeFiles } from '../../src/lib/server/http/route-files';
import { leadQuerySchema } from '../../src/lib/schema/leads';
import { slotsQuerySchema } from '../../src/lib/schema/visits';
import { apiAs } from './pages/staff';
import { rawRequest } from '../support/raw-http';

const sql = postgres(process.env.E2E_DATABASE_URL ?? process.env.DATABASE_URL!, {
	max: 1,
	onnotice: () => {}
});
test.afterAll(async () => {
	await sql.end();
});

/** The hostile values, each sent percent-encoded (the lone "%" also raw, as a bad escape). */
export const HOSTILE: ReadonlyArray<{ label: string; value: string }> = [
	{ label: 'empty', value: '' },
	{ label: '6000 characters', value: 'x'.repeat(6000) },
	{ label: 'NUL', value: 'a\u0000b' },
	{ label: 'CR/LF header injection', value: 'a\r\nSet-Cookie: x=1' },
	{ label: 'impossible date 2027-02-30', value: '2027-02-30' },
	{ label: 'impossible month 2027-13-01', value: '2027-13-01' },
	{ label: 'zero date', value: '0000-00-00' },
	{ label: 'negative', value: '-1' },
	{ label: 'huge integer', value: '99999999999999999999999' },
	{ label: 'overflowing float', value: '1e309' },
	{ label: 'NaN', value: 'NaN' },
	{ label: 'percent sign', value: '%' },
	{ label: 'SQL', value: "' OR 1=1; drop table leads; --" },
	{ label: 'script', value: '<script>alert(1)</script>' },
	{ label: 'path traversal', value: '../../etc/passwd' },
	{ label: 'right-to-left override', value: 'a\u202eb' }
];

const schemaKeys = (schema: unknown): string[] => {
	// Both query schemas are zod objects, possibly wrapped by refinements.
	let s = schema as { shape?: Record<string, unknown>; def?: { in?: unknown; schema?: unknown } };
	while (!s.shape && s.def) s = (s.def.in ?? s.def.schema) as typeof s;
	return Object.keys(s.shape ?? {});
};

/** The query parameters a route's server files read. */
function paramsOf(files: string[]): string[] {
	const names = new Set<string>();
	for (const file of files) {
		const source = readFileSync(file, 'utf8');
		for (const m of source.matchAll(/searchParams\.(?:get|getAll|has)\(\s*'([^']+)'/g)) {
			names.add(m[1]);
		}
		if (source.includes('parseLeadQuery')) schemaKeys(leadQuerySchema).forEach((k) => names.add(k));
		if (source.includes('slotsQuerySchema')) {
			schemaKeys(slotsQuerySchema).forEach((k) => names.add(k));
		}
	}
	return [...names];
}

const routes = (() => {
	const byPattern = new Map<string, string[]>();
	for (const r of routeFiles(resolve('src/routes'))) {
		if (r.kind === 'page') continue;
		const files = byPattern.get(r.pattern) ?? [];
		files.push(r.file);
		// Layout loads read the address too: they run for every page below them.
		byPattern.set(r.pattern, files);
	}
	const layouts = [...byPattern.entries()].filter(([, files]) =>
		files.some((f) => f.endsWith('+layout.server.ts'))
	);
	return [...byPattern.entries()]
		.map(([pattern, files]) => {
			const inherited = layouts
				.filter(([p]) => pattern === p || pattern.startsWith(p === '/' ? '/' : p + '/'))
				.flatMap(([, f]) => f.filter((x) => x.endsWith('+layout.server.ts')));
			return { pattern, params: paramsOf([...new Set([...files, ...inherited])]) };
		})
		.filter((r) => r.params.length > 0);
})();

test('the walker finds the routes that read query parameters', () => {
	const patterns = routes.map((r) => r.pattern);
	// A sample that must be there; if the scan broke, these would vanish.
	for (const p of ['/api/leads', '/office/leads/export.csv', '/sign-in', '/api/visits/slots']) {
		expect(patterns, p).toContain(p);
	}
	expect(routes.find((r) => r.pattern === '/api/leads')!.params).toEqual(
		expect.arrayContaining(['q', 'from', 'to', 'page', 'size', 'stage'])
	);
});

/** Real records for [id]-style segments, so a route reads its parameters instead of 404ing. */
async function fill(pattern: string): Promise<string> {
	const one = async (q: Promise<{ id: string }[]>) => (await q)[0]?.id ?? 'unknown';
	const ids: Record<string, () => Promise<string>> = {
		lead: () => one(sql`select id from leads order by number limit 1`),
		job: () => one(sql`select id from jobs order by created_at limit 1`),
		visit: () => one(sql`select id from site_visits order by created_at limit 1`)
	};
	let path = pattern;
	for (const m of pattern.matchAll(/\[([^\]]+)\]/g)) {
		const before = pattern.slice(0, m.index);
		const kind = before.includes('/leads')
			? 'lead'
			: before.includes('/jobs') || m[1] === 'jobId'
				? 'job'
				: before.includes('/visits')
					? 'visit'
					: null;
		path = path.replace(m[0], kind ? await ids[kind]() : 'unknown');
	}
	return path;
}

for (const route of routes) {
	test(`GET ${route.pattern}: hostile values in ${route.params.join(', ')} never answer 5xx`, async ({
		baseURL
	}) => {
		test.setTimeout(180_000);
		const owner = await apiAs(baseURL!, 'owner');
		const cookie = (await owner.storageState()).cookies
			.map((c) => `${c.name}=${c.value}`)
			.join('; ');
		await owner.dispose();
		const path = await fill(route.pattern);
		const failures: string[] = [];
		for (const who of ['owner', 'anonymous'] as const) {
			for (const param of route.params) {
				const queries = [
					...HOSTILE.map((h) => ({
						label: h.label,
						query: `${param}=${encodeURIComponent(h.value)}`
					})),
					{ label: 'raw bad escape', query: `${param}=%` },
					{
						label: 'repeated',
						query: `${param}=1&${param}=2&${param}=${encodeURIComponent('<x>')}`
					}
				];
				for (const { label, query } of queries) {
					const res = await rawRequest(baseURL!, `${path}?${query}`, {
						cookie: who === 'owner' ? cookie : undefined
					});
					if (res.status >= 500) failures.push(`${who} ${path}?${param}= ${label}: ${res.status}`);
				}
			}
		}
		expect(failures).toEqual([]);
	});
}

test('control characters and bad escapes are refused with the reason', async ({ baseURL }) => {
	const nul = await rawRequest(baseURL!, '/api/leads?q=a%00b', {
		headers: { accept: 'application/json' }
	});
	expect(nul.status).toBe(400);
	expect(JSON.parse(nul.body).message).toMatch(/control character/);
	const crlf = await rawRequest(
		baseURL!,
		`/sign-in?next=${encodeURIComponent('/office\r\nSet-Cookie: x=1')}`
	);
	expect(crlf.status).toBe(400);
	expect(crlf.body).toContain('control character');
	expect(crlf.headers['set-cookie'] ?? []).not.toContain('x=1');
	const escape = await rawRequest(baseURL!, '/office/leads?q=%');
	expect(escape.status).toBe(400);
	expect(escape.body).toContain('percent-escape');
});

test('an impossible date is a 400 naming the field, in the API and the CSV export', async ({
	baseURL
}) => {
	const owner = await apiAs(baseURL!, 'owner');
	const api = await owner.get('/api/leads?from=2027-02-30', {
		headers: { accept: 'application/json' }
	});
	expect(api.status()).toBe(400);
	expect(JSON.stringify(await api.json())).toMatch(/from/);
	const csv = await owner.get('/office/leads/export.csv?from=2027-02-30');
	expect(csv.status()).toBe(400);
	await owner.dispose();
});
