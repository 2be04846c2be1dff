import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';

const SOURCES = [
	'src',
	'content',
	'static',
	'svelte.config.js',
	'vite.config.ts',
	'tailwind.config.ts',
	'package-lock.json'
];

function newestMtime(path: string): number {
	if (!existsSync(path)) return 0;
	const stat = statSync(path);
	if (!stat.isDirectory()) return stat.mtimeMs;
	let newest = stat.mtimeMs;
	for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, entry)));
	return newest;
}

/** Builds the production app into `outDir` unless it is newer than every source file. */
export function buildIfNeeded(outDir: string, env: Record<string, string>, force = false): void {
	const marker = join(outDir, 'handler.js');
	const stale =
		force ||
		!existsSync(marker) ||
		Math.max(...SOURCES.map(newestMtime)) > statSync(marker).mtimeMs;
	if (!stale) return;
	console.log(`Building the app into ${outDir}…`);
	const result = spawnSync(
		process.execPath,
		['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'warn'],
		{
			stdio: 'inherit',
			env: { ...process.env, ...env, BUILD_DIR: outDir, NODE_ENV: 'production' }
		}
	);
	if (result.status !== 0) throw new Error('The build failed (see above).');
}
