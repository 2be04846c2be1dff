import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';
import { rolesFor } from './access';
import { safeNext } from '../http/redirects';
import { routeFiles } from '../http/route-files';

const routesDir = resolve('src/routes');
const HANDLERS = new Set(['GET', 'POST', 'PUT', 'PATCH', 'DELETE', 'fallback']);

function callsRequireRole(node: ts.Node): boolean {
	let found = false;
	const visit = (n: ts.Node) => {
		if (
			ts.isCallExpression(n) &&
			ts.isIdentifier(n.expression) &&
			n.expression.text === 'requireRole'
		) {
			found = true;
		}
		if (!found) ts.forEachChild(n, visit);
	};
	visit(node);
	return found;
}

/** Every exported handler, action and load of a file, with whether it calls requireRole. */
function checkedEntryPoints(file: string): { name: string; checked: boolean }[] {
	const source = ts.createSourceFile(
		file,
		readFileSync(file, 'utf8'),
		ts.ScriptTarget.Latest,
		true
	);
	const out: { name: string; checked: boolean }[] = [];
	for (const statement of source.statements) {
		const exported =
			ts.canHaveModifiers(statement) &&
			ts.getModifiers(statement)?.some((m) => m.kind === ts.SyntaxKind.ExportKeyword);
		if (!exported) continue;
		if (
			ts.isFunctionDeclaration(statement) &&
			statement.name &&
			(HANDLERS.has(statement.name.text) || statement.name.text === 'load')
		) {
			out.push({ name: statement.name.text, checked: callsRequireRole(statement) });
		}
		if (!ts.isVariableStatement(statement)) continue;
		for (const decl of statement.declarationList.declarations) {
			if (!ts.isIdentifier(decl.name) || !decl.initializer) continue;
			const name = decl.name.text;
			let init: ts.Expression = decl.initializer;
			while (ts.isSatisfiesExpression(init) || ts.isAsExpression(init)) init = init.expression;
			if (name === 'actions' && ts.isObjectLiteralExpression(init)) {
				for (const prop of init.properties) {
					out.push({
						name: `actions.${prop.name?.getText(source)}`,
						checked: callsRequireRole(prop)
					});
				}
			} else if (HANDLERS.has(name) || name === 'load') {
				out.push({ name, checked: callsRequireRole(init) });
			}
		}
	}
	return out;
}

describe('every office and API entry point re-checks the role', () => {
	const guarded = routeFiles(routesDir).filter(
		(r) => /^\/(office|api)(\/|$)/.test(r.pattern) && r.kind !== 'page'
	);

	it('finds the guarded route files', () => {
		expect(guarded.length).toBeGreaterThan(2);
	});

	for (const route of guarded) {
		it(`${route.pattern} (${route.kind})`, () => {
			const unchecked = checkedEntryPoints(route.file)
				.filter(
					(e) =>
						!e.checked &&
						!(
							route.pattern === '/api/health' ||
							route.pattern === '/api/uploads' ||
							route.pattern === '/api/payments/webhook'
						)
				)
				.map((e) => e.name);
			expect(
				unchecked,
				`call requireRole(event, …) in ${unchecked.join(', ')} of ${route.file}`
			).toEqual([]);
		});
	}
});

describe('the route-to-role table', () => {
	it('keeps team and settings for the owner', () => {
		expect(rolesFor('/office/team')).toEqual(['owner']);
		expect(rolesFor('/office/settings/anything')).toEqual(['owner']);
	});
	it('lets every staff role into the office home', () => {
		expect(rolesFor('/office')).toEqual(['owner', 'sales', 'crew']);
	});
	it('does not let a look-alike prefix borrow a rule', () => {
		expect(rolesFor('/office/teamwork')).toEqual(['owner', 'sales', 'crew']);
		expect(rolesFor('/officer')).toBeNull();
	});
});

describe('the return path after sign-in', () => {
	it('follows office paths only', () => {
		expect(safeNext('/office/team?x=1')).toBe('/office/team?x=1');
		expect(safeNext('https://elsewhere.example/office')).toBe('/office');
		expect(safeNext('//elsewhere.example')).toBe('/office');
		expect(safeNext('/estimate/abc')).toBe('/office');
	});
});
