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
