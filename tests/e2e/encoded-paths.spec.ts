// The hook's role table sees the path the router sees: every office and API path of the route
// tree, sent with escapes (lower and upper case), doubled slashes and dot segments, meets the same
// rule as the plain path. A visitor is sent to sign in (or answered 401 by the API), and crew
// are refused wherever the plain path refuses them.
import { resolve } from 'node:path';
import { expect, test } from '@playwright/test';
import { routeFiles } from '../../src/lib/server/http/route-files';
import { rolesFor } from '../../src/lib/server/auth/access';
import { apiAs } from './pages/staff';
import { rawRequest } from '../support/raw-http';

const paths = [
	...new Set(
		routeFiles(resolve('src/routes'))
			.map((r) => r.pattern)
			.filter((p) => /^\/(office|api)(\/|$)/.test(p))
			.map((p) => p.replace(/\[[^\]]+\]/g, 'x1'))
	)
];

/**
 * Escapes one letter of the last segment that has one: the first letter, or (`hexLetter`) the
 * first whose escape has a hex letter in it, written in lower or upper case (`%6c`, `%6C`).
 */
function escapeLetter(path: string, upper: boolean, hexLetter = true): string {
	const parts = path.split('/');
	for (let i = parts.length - 1; i > 0; i--) {
		const m = (hexLetter ? /[j-o]|z/ : /[a-z]/).exec(parts[i]);
		if (!m) continue;
		const hex = m[0].charCodeAt(0).toString(16);
		parts[i] =
			parts[i].slice(0, m.index) +
			'%' +
			(upper ? hex.toUpperCase() : hex) +
			parts[i].slice(m.index + 1);
		return parts.join('/');
	}
	return path;
}

export function variants(path: string): string[] {
	const [, top, ...rest] = path.split('/');
	return [
		escapeLetter(path, false, false),
		escapeLetter(path, false),
		escapeLetter(path, true),
		'/' + [top, ...rest].join('//'),
		'/' + path,
		`/${top}/./${rest.join('/')}`.replace(/\/$/, ''),
		`/${top}/zz/../${rest.join('/')}`.replace(/\/$/, ''),
		path.replace(
			/^\/(office|api)/,
			(m) => `/${m.slice(1, 2)}%${m.charCodeAt(2).toString(16)}${m.slice(3)}`
		),
		path + '/'
	];
}

/**
 * The router answers a path that ends in a slash (`/office/team/`, or `/office/.` once the URL
 * parser resolved the dot) with a 308 to the plain path, where the guard then applies.
 */
function trailingSlashRedirect(
	path: string,
	res: { status: number; headers: Record<string, unknown> }
) {
	return res.status === 308 && res.headers.location === path;
}

test('the variants really are encoded (a sample)', () => {
	expect(variants('/office/team')).toEqual(
		expect.arrayContaining([
			'/office/%74eam',
			'/office/tea%6d',
			'/office/tea%6D',
			'/office//team',
			'//office/team',
			'/office/./team',
			'/office/zz/../team',
			'/o%66fice/team'
		])
	);
	expect(variants('/api/leads')).toEqual(expect.arrayContaining(['/api/%6ceads', '/api/%6Ceads']));
	expect(paths).toEqual(expect.arrayContaining(['/office/team', '/api/leads']));
});

test('a visitor meets sign-in on every encoded office and API path that is not public', async ({
	baseURL
}) => {
	test.setTimeout(120_000);
	const failures: string[] = [];
	for (const path of paths) {
		const roles = rolesFor(path);
		if (roles && roles.length === 0) continue; // public (health, uploads, webhook)
		for (const v of variants(path)) {
			const res = await rawRequest(baseURL!, v, { headers: { accept: 'text/html' } });
			const ok = trailingSlashRedirect(path, res)
				? true
				: path.startsWith('/api')
					? res.status === 401
					: res.status === 303 && /^\/sign-in\?next=/.test(String(res.headers.location));
			if (!ok) failures.push(`${v}: ${res.status}`);
		}
	}
	expect(failures).toEqual([]);
});

test('crew are refused on every encoded variant of a path their role may not open', async ({
	baseURL
}) => {
	test.setTimeout(120_000);
	const crew = await apiAs(baseURL!, 'crew');
	const cookie = (await crew.storageState()).cookies.map((c) => `${c.name}=${c.value}`).join('; ');
	await crew.dispose();
	const failures: string[] = [];
	let checked = 0;
	for (const path of paths) {
		const roles = rolesFor(path);
		if (!roles || roles.length === 0 || roles.includes('crew')) continue;
		for (const v of variants(path)) {
			checked++;
			const res = await rawRequest(baseURL!, v, { cookie });
			if (res.status !== 403 && !trailingSlashRedirect(path, res)) {
				failures.push(`${v}: ${res.status}`);
			}
		}
	}
	expect(checked).toBeGreaterThan(50);
	expect(failures).toEqual([]);
});
