import { SERVER_ENV, SERVER_NODE_FLAGS } from '../lib/production';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

export const resultsDir = join(import.meta.dirname, '..', '..', 'bench', 'results');

/** Median of `iterations` timed runs after a warm-up, in milliseconds. */
export async function medianMs(
	run: () => unknown,
	iterations: number,
	warmup = Math.min(200, iterations)
): Promise<number> {
	for (let i = 0; i < warmup; i++) await run();
	const times: number[] = [];
	for (let i = 0; i < iterations; i++) {
		const start = performance.now();
		await run();
		times.push(performance.now() - start);
	}
	times.sort((a, b) => a - b);
	return times[Math.floor(times.length / 2)];
}

export function writeResult(name: string, result: unknown): string {
	mkdirSync(resultsDir, { recursive: true });
	const file = join(resultsDir, `${name}.json`);
	writeFileSync(
		file,
		JSON.stringify({ measuredAt: new Date().toISOString(), ...(result as object) }, null, 2)
	);
	return file;
}

export interface AppLaunch {
	/** Flags for the app's Node, before the script. */
	nodeFlags: string[];
	/** Variables the app starts with (under the bench's own). */
	env: Record<string, string>;
	/** How the app was started, for the report. */
	label: string;
}

/**
 * How a bench starts the app: as `npm run serve` does (SERVER_NODE_FLAGS and SERVER_ENV), unless
 * `<PREFIX>_NODE_OPTIONS` is set, in which case with exactly those flags and glibc's and the
 * app's own defaults (set it empty for Node's defaults, the figure before the product's settings).
 */
export function appLaunch(prefix: string): AppLaunch {
	const given = process.env[`${prefix}_NODE_OPTIONS`];
	if (given === undefined) {
		return {
			nodeFlags: [...SERVER_NODE_FLAGS],
			env: { ...SERVER_ENV },
			label: `as npm run serve starts it (${SERVER_NODE_FLAGS.join(' ')}, ${Object.entries(
				SERVER_ENV
			)
				.map(([k, v]) => `${k}=${v}`)
				.join(' ')})`
		};
	}
	const nodeFlags = given.split(' ').filter(Boolean);
	return {
		nodeFlags,
		env: {},
		label: nodeFlags.length ? `Node flags ${nodeFlags.join(' ')}` : 'Node and glibc defaults'
	};
}
