import { describe, expect, it } from 'vitest';
import { requestPath } from './request-path';
import { queryProblem } from '../hooks/input';
import { safeNext } from './redirects';
import { rolesFor } from '../auth/access';

describe('requestPath: the path the role table sees is the one the router matches', () => {
	it('decodes escapes in any case, joins slashes and resolves dot segments', () => {
		expect(requestPath('/office/%74eam')).toBe('/office/team');
		expect(requestPath('/api/%6Ceads')).toBe('/api/leads');
		expect(requestPath('/api/%6ceads')).toBe('/api/leads');
		expect(requestPath('//office//team')).toBe('/office/team');
		expect(requestPath('/office/./team')).toBe('/office/team');
		expect(requestPath('/office/jobs/../team')).toBe('/office/team');
		expect(requestPath('/%2e%2e/office/team')).toBe('/office/team');
		expect(requestPath('/office/team/')).toBe('/office/team/');
	});

	it('decodes as the router does: %25 stays, and an encoded / or \\ is refused (null)', () => {
		expect(requestPath('/office/%2574eam')).toBe('/office/%2574eam');
		expect(requestPath('/office%2Fteam')).toBeNull();
		expect(requestPath('/office%2fteam')).toBeNull();
		expect(requestPath('/office/payments/x%2F..%2F..%2Fjobs')).toBeNull();
		expect(requestPath('/office%5Cteam')).toBeNull();
	});

	it('gives crew no way around the owner-only rule', () => {
		for (const raw of ['/office/%74eam', '//office/team', '/office/jobs/../team']) {
			expect(rolesFor(requestPath(raw)!), raw).toEqual(['owner']);
		}
	});

	it('answers null for a malformed escape', () => {
		expect(requestPath('/office/%zz')).toBeNull();
		expect(requestPath('/office/%')).toBeNull();
	});
});

describe('queryProblem: control characters and bad escapes in query parameters', () => {
	it('accepts ordinary, empty, unicode and script-like values', () => {
		for (const q of [
			'',
			'?',
			'?q=a+b',
			'?q=%3Cscript%3E',
			'?q=a%E2%80%AEb',
			'?from=2027-02-30',
			'?a=1&a=2'
		]) {
			expect(queryProblem(q), q).toBeNull();
		}
	});

	it('names the reason for NUL, CR, LF, tab and bad escapes', () => {
		expect(queryProblem('?q=a%00b')).toMatch(/control character/);
		expect(queryProblem('?next=%0D%0ASet-Cookie:x')).toMatch(/control character/);
		expect(queryProblem('?q=a%09b')).toMatch(/control character/);
		expect(queryProblem('?q=%')).toMatch(/percent-escape/);
		expect(queryProblem('?q=%zz')).toMatch(/percent-escape/);
		expect(queryProblem('?a%00=1')).toMatch(/control character/);
	});
});

describe('safeNext: only same-site office paths', () => {
	it('keeps office paths with their query', () => {
		expect(safeNext('/office/leads?stage=new')).toBe('/office/leads?stage=new');
	});
	it('refuses other hosts, tricks and control characters', () => {
		for (const bad of [
			'https://elsewhere.example/office',
			'//elsewhere.example/office',
			'/\\elsewhere.example/office',
			'/office/\r\nSet-Cookie: x=1',
			'/office\u0000',
			'/office/../estimate/abc',
			'javascript:alert(1)',
			'x'.repeat(6000)
		]) {
			expect(safeNext(bad), JSON.stringify(bad)).toBe('/office');
		}
	});
});
