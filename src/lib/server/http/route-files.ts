// Lists the route files of the app, for the coverage and route-matrix tests.
import { readdirSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';

export interface RouteFile {
	file: string;
	/** The URL pattern, groups removed, e.g. /office/team or /api/leads/[id]. */
	pattern: string;
	kind: 'page' | 'page-server' | 'server' | 'layout-server';
}

const KINDS: Record<string, RouteFile['kind']> = {
	'+page.svelte': 'page',
	'+page.server.ts': 'page-server',
	'+server.ts': 'server',
	'+layout.server.ts': 'layout-server'
};

export function routeFiles(routesDir: string): RouteFile[] {
	const out: RouteFile[] = [];
	const walk = (dir: string) => {
		for (const entry of readdirSync(dir)) {
			const path = join(dir, entry);
			if (statSync(path).isDirectory()) walk(path);
			else if (KINDS[entry]) {
				const segments = relative(routesDir, dir)
					.split(sep)
					.filter((s) => s && !/^\(.*\)$/.test(s));
				out.push({ file: path, pattern: '/' + segments.join('/'), kind: KINDS[entry] });
			}
		}
	};
	walk(routesDir);
	return out;
}
