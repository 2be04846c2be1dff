import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { spawnSync, type ChildProcess } from 'node:child_process';
import { spawnTethered } from './children';

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

function isStale(outDir: string, force: boolean): boolean {
	const marker = join(outDir, 'handler.js');
	return (
		force || !existsSync(marker) || Math.max(...SOURCES.map(newestMtime)) > statSync(marker).mtimeMs
	);
}

const VITE_BUILD = ['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'warn'];
const buildEnv = (outDir: string, env: Record<string, string>) => ({
	...process.env,
	...env,
	BUILD_DIR: outDir,
	NODE_ENV: 'production'
});

/** Builds the production app into `outDir` unless it is newer than every source file. */
export function buildIfNeeded(outDir: string, env: Record<string, string>, force = false): void {
	if (!isStale(outDir, force)) return;
	console.log(`Building the app into ${outDir}…`);
	const result = spawnSync(process.execPath, VITE_BUILD, {
		stdio: 'inherit',
		env: buildEnv(outDir, env)
	});
	if (result.status !== 0) throw new Error('The build failed (see above).');
}

/**
 * The same without blocking the launcher, which must keep answering Ctrl-C: `onStart` receives
 * the build process so that a signal can stop it.
 */
export async function buildInBackgroundIfNeeded(
	outDir: string,
	env: Record<string, string>,
	onStart: (child: ChildProcess) => void,
	force = false
): Promise<void> {
	if (!isStale(outDir, force)) return;
	console.log(`Building the app into ${outDir}…`);
	const child = spawnTethered(process.execPath, VITE_BUILD, {
		stdio: 'inherit',
		env: buildEnv(outDir, env)
	});
	onStart(child);
	const code = await new Promise<number | null>((resolve) => child.on('exit', resolve));
	if (code !== 0) throw new Error('The build failed (see above).');
}
