// `npm run bench`: every benchmark, then one markdown report (bench/results/REPORT.md) with the
// figures and their ratios to the baselines. Benchmarks are not tests: machines here are shared
// and noisy, so compare ratios measured side by side in one run, not absolute times.
// The site and leads benchmarks need the production app running (`npm start` in another terminal).
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { portInUse } from '../lib/ports';
import { resultsDir } from './lib';

const baseUrl = process.env.BASE_URL ?? 'http://127.0.0.1:3000';
const appUp = await portInUse(Number(new URL(baseUrl).port || 80));

const benches: { name: string; script: string; needsApp: boolean; args?: string[] }[] = [
	{ name: 'estimate', script: 'scripts/bench/estimate.ts', needsApp: false },
	{ name: 'photos', script: 'scripts/bench/photos.ts', needsApp: false },
	{ name: 'signin', script: 'scripts/bench/signin.ts', needsApp: false },
	{ name: 'care', script: 'scripts/bench/care.ts', needsApp: false },
	{ name: 'site', script: 'scripts/bench/site.ts', needsApp: true, args: [baseUrl] },
	{ name: 'leads', script: 'scripts/bench/leads.ts', needsApp: true },
	{ name: 'export', script: 'scripts/bench/export.ts', needsApp: true },
	// Starts its own services and app on ports of its own (see the script's header).
	{ name: 'load', script: 'scripts/bench/load.ts', needsApp: false },
	{ name: 'bodies', script: 'scripts/bench/bodies.ts', needsApp: false }
];

const ran: Record<string, string> = {};
for (const b of benches) {
	if (!existsSync(b.script)) {
		ran[b.name] = 'not present in this checkout';
		continue;
	}
	if (b.needsApp && !appUp) {
		ran[b.name] = `not run: no app answering at ${baseUrl} (start it with \`npm start\`)`;
		continue;
	}
	console.log(`\n▶ ${b.name}`);
	const result = spawnSync('npx', ['tsx', b.script, ...(b.args ?? [])], {
		stdio: 'inherit',
		env: { ...process.env, BASE_URL: baseUrl }
	});
	ran[b.name] = result.status === 0 ? 'ran' : `failed (exit ${result.status})`;
}

function flatten(value: unknown, prefix = ''): [string, string][] {
	if (value && typeof value === 'object' && !Array.isArray(value)) {
		return Object.entries(value).flatMap(([k, v]) => flatten(v, prefix ? `${prefix}.${k}` : k));
	}
	if (Array.isArray(value)) return value.flatMap((v, i) => flatten(v, `${prefix}[${i}]`));
	const shown =
		typeof value === 'number'
			? Number.isInteger(value)
				? String(value)
				: value.toFixed(3)
			: String(value);
	return [[prefix, shown]];
}

const lines = [
	'# Rillstone benchmark report',
	'',
	`Written ${new Date().toISOString()} by \`npm run bench\`.`,
	''
];
for (const b of benches) {
	lines.push(`## ${b.name}`, '', `Status: ${ran[b.name]}.`, '');
	const file = join(resultsDir, `${b.name}.json`);
	if (ran[b.name] === 'ran' && existsSync(file)) {
		lines.push('| figure | value |', '| --- | --- |');
		for (const [k, v] of flatten(JSON.parse(readFileSync(file, 'utf8')))) {
			lines.push(`| ${k} | ${v} |`);
		}
		lines.push('');
	}
}
const report = join(resultsDir, 'REPORT.md');
writeFileSync(report, lines.join('\n'));
console.log(`\nReport written to ${report}`);
