/**
 * `npm run bench:export` (not a test): downloads the whole leads CSV export
 * (`/office/leads/export.csv`, every lead) from the production build as the owner, and reports
 * the time, the bytes, the rate and the app's resident memory before, during (peak) and after.
 * Goals: the peak rises less than 50 MB over the memory before, and the rate is at least 20 MB/s.
 *
 * Needs the services running (`npm run services`) and a database with the bulk leads
 * (`npm run seed:bulk -- 100000`). Uses the dev database unless DATABASE_URL is set; builds the
 * app into BUILD_DIR (default `build`) when the sources changed (BENCH_SKIP_BUILD=1: never);
 * serves it on BENCH_APP_PORT (default 3412). EXPORT_RUNS (default 3) downloads one after the
 * other in the same app. The first is the cold one: its PostgreSQL connection has never read the
 * tables (a new backend's first pass over them ran ~0.4 s slower here, in psql too) and the app
 * loads the route's code; it is reported, and the memory goal counts it, but the rate goal is
 * judged on the warm downloads after it (on the only one when EXPORT_RUNS is 1). The app starts
 * as `npm run serve` starts it; EXPORT_NODE_OPTIONS starts it with those Node flags instead
 * (empty: Node's defaults). `--compare DIR` first measures another build (say, one of an older
 * commit) in the same run, for a side-by-side figure; only the build of this checkout decides the
 * exit code. Each download prints the start of its SHA-256, so two builds can be seen to write
 * the same file.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { createHash } from 'node:crypto';
import { readFileSync, writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import postgres from 'postgres';
import { appEnv, databaseUrl } from '../lib/config';
import { buildIfNeeded } from '../lib/build';
import { DEMO_STAFF } from '../seed/demo-data';
import { appLaunch, writeResult } from './lib';

const url = process.env.DATABASE_URL ?? databaseUrl('dev');
const APP_PORT = Number(process.env.BENCH_APP_PORT ?? 3412);
const RUNS = Number(process.env.EXPORT_RUNS ?? 3);
const launch = appLaunch('EXPORT');
const GOAL_RISE_MB = 50;
const GOAL_RATE_MBPS = 20;
const MB = 1_000_000;

const compareAt = process.argv.indexOf('--compare');
const compareDir = compareAt > 0 ? process.argv[compareAt + 1] : undefined;

/** Resident memory of a process in bytes: now and the kernel's high-water mark. */
function memoryOf(pid: number): { rss: number; hwm: number } {
	const status = readFileSync(`/proc/${pid}/status`, 'utf8');
	const kib = (key: string) => Number(new RegExp(`${key}:\\s+(\\d+) kB`).exec(status)?.[1] ?? 0);
	return { rss: kib('VmRSS') * 1024, hwm: kib('VmHWM') * 1024 };
}

/** Resets the kernel's high-water mark of a process (Linux `clear_refs` 5); false if refused. */
function resetPeak(pid: number): boolean {
	try {
		writeFileSync(`/proc/${pid}/clear_refs`, '5');
		return true;
	} catch {
		return false;
	}
}

async function waitFor(target: string, child: ChildProcess) {
	for (let i = 0; i < 300; i++) {
		if (child.exitCode !== null) throw new Error(`${target}: the app exited`);
		try {
			if ((await fetch(target)).status < 500) return;
		} catch {
			/* not up yet */
		}
		await new Promise((r) => setTimeout(r, 150));
	}
	throw new Error(`${target} did not answer`);
}

const load = () =>
	loadavg()
		.map((l) => l.toFixed(2))
		.join(' ');
const mb = (bytes: number) => Number((bytes / MB).toFixed(1));

interface Run {
	seconds: number;
	/** Until the first chunk: the header row leaves with the first batch, after the query's work. */
	firstByteSeconds: number;
	bytes: number;
	rows: number;
	mbPerSecond: number;
	rssBeforeMB: number;
	peakRssMB: number;
	riseMB: number;
	rssAfterMB: number;
	loadAverage: string;
	sha256: string;
}

async function measure(buildDir: string, leads: number): Promise<Run[]> {
	const env = {
		...appEnv('dev'),
		DATABASE_URL: url,
		PORT: String(APP_PORT),
		ORIGIN: `http://127.0.0.1:${APP_PORT}`,
		NODE_ENV: 'production',
		...launch.env
	};
	const app = spawn(process.execPath, [...launch.nodeFlags, buildDir], {
		env: { ...process.env, ...env },
		stdio: ['ignore', 'ignore', 'inherit']
	});
	const stop = () => app.kill('SIGKILL');
	process.on('exit', stop);
	try {
		const appUrl = `http://127.0.0.1:${APP_PORT}`;
		await waitFor(`${appUrl}/sign-in`, app);
		const owner = DEMO_STAFF.find((s) => s.role === 'owner')!;
		const signIn = await fetch(`${appUrl}/sign-in`, {
			method: 'POST',
			redirect: 'manual',
			headers: {
				origin: appUrl,
				accept: 'text/html',
				'content-type': 'application/x-www-form-urlencoded'
			},
			body: new URLSearchParams({ email: owner.email, password: owner.password })
		});
		const cookie = signIn.headers
			.getSetCookie()
			.map((c) => c.split(';')[0])
			.join('; ');
		if (signIn.status !== 303 || !cookie) throw new Error(`Sign-in failed (${signIn.status})`);
		// Warm the office once (the first request loads the route's modules), then settle.
		await (await fetch(`${appUrl}/api/leads`, { headers: { cookie } })).arrayBuffer();
		await new Promise((r) => setTimeout(r, 1000));

		const runs: Run[] = [];
		for (let i = 0; i < RUNS; i++) {
			const pid = app.pid!;
			const before = memoryOf(pid).rss;
			let peak = before;
			const hwmReset = resetPeak(pid);
			const poll = setInterval(() => {
				try {
					peak = Math.max(peak, memoryOf(pid).rss);
				} catch {
					/* the app is gone: the download fails below */
				}
			}, 25);
			const started = performance.now();
			const res = await fetch(`${appUrl}/office/leads/export.csv`, { headers: { cookie } });
			if (res.status !== 200) throw new Error(`the export answered ${res.status}`);
			let bytes = 0;
			let lineEnds = 0;
			let tail = '';
			// A digest of the file, so that two builds can be seen to write the same bytes.
			const digest = createHash('sha256');
			let firstByte = 0;
			for await (const chunk of res.body as unknown as AsyncIterable<Uint8Array>) {
				if (!bytes) firstByte = (performance.now() - started) / 1000;
				bytes += chunk.length;
				digest.update(chunk);
				for (let j = 0; j < chunk.length; j++) if (chunk[j] === 10) lineEnds++;
				tail = Buffer.from(chunk.subarray(-2)).toString('latin1');
			}
			const seconds = (performance.now() - started) / 1000;
			clearInterval(poll);
			// The kernel's high-water mark since it was reset below catches a peak between polls.
			peak = Math.max(peak, hwmReset ? memoryOf(pid).hwm : memoryOf(pid).rss);
			if (tail !== '\r\n') throw new Error('the file does not end with a line break');
			await new Promise((r) => setTimeout(r, 1000));
			const after = memoryOf(pid).rss;
			runs.push({
				seconds: Number(seconds.toFixed(2)),
				firstByteSeconds: Number(firstByte.toFixed(2)),
				bytes,
				rows: lineEnds - 1, // the header's line break; fields with line breaks are quoted and rare
				mbPerSecond: Number((bytes / MB / seconds).toFixed(1)),
				rssBeforeMB: mb(before),
				peakRssMB: mb(peak),
				riseMB: mb(peak - before),
				rssAfterMB: mb(after),
				loadAverage: load(),
				sha256: digest.digest('hex')
			});
			const r = runs.at(-1)!;
			console.log(
				`  run ${i + 1}${i === 0 && RUNS > 1 ? ' (cold)' : ''}: ${r.rows.toLocaleString('en-US')} rows of ${leads.toLocaleString('en-US')}, ` +
					`${(bytes / MB).toFixed(1)} MB in ${r.seconds} s = ${r.mbPerSecond} MB/s ` +
					`(first bytes after ${r.firstByteSeconds} s); ` +
					`RSS before ${r.rssBeforeMB} MB, peak ${r.peakRssMB} MB (+${r.riseMB} MB), ` +
					`after ${r.rssAfterMB} MB; load average ${r.loadAverage}; sha256 ${r.sha256.slice(0, 12)}`
			);
		}
		return runs;
	} finally {
		stop();
		process.off('exit', stop);
		await new Promise((r) => (app.exitCode !== null ? r(null) : app.once('exit', r)));
	}
}

const sql = postgres(url, { max: 1, onnotice: () => {} });
const [{ n }] = await sql<{ n: number }[]>`select count(*)::int as n from leads`;
await sql.end();
if (n < 100_000) {
	console.warn(
		`Only ${n.toLocaleString('en-US')} leads in the database; run \`npm run seed:bulk -- 100000\` first for the issue's figures.`
	);
}
const buildDir = process.env.BUILD_DIR ?? 'build';
if (!process.env.BENCH_SKIP_BUILD) {
	buildIfNeeded(buildDir, { ...appEnv('dev'), DATABASE_URL: url, NODE_ENV: 'production' });
}
console.log(
	`\nLeads CSV export of ${n.toLocaleString('en-US')} leads, ${RUNS} downloads per app` +
		`, app ${launch.label}` +
		'\n'
);
let compared: Run[] | undefined;
if (compareDir) {
	console.log(`${compareDir} (for comparison):`);
	compared = await measure(compareDir, n);
}
console.log(`${buildDir} (this checkout):`);
const runs = await measure(buildDir, n);
const worstRise = Math.max(...runs.map((r) => r.riseMB));
const warm = runs.length > 1 ? runs.slice(1) : runs;
const slowest = Math.min(...warm.map((r) => r.mbPerSecond));
const rowsOk = runs.every((r) => r.rows === n);
console.log(
	`\ngoals: peak rise < ${GOAL_RISE_MB} MB ${worstRise < GOAL_RISE_MB ? 'met' : 'MISSED'} (+${worstRise} MB); ` +
		`≥ ${GOAL_RATE_MBPS} MB/s ${slowest >= GOAL_RATE_MBPS ? 'met' : 'MISSED'} (${slowest} MB/s, slowest warm download)` +
		(rowsOk ? '' : `; rows counted ${runs.map((r) => r.rows).join(', ')} of ${n}: check the file!`)
);
console.log(
	`Written to ${writeResult('export', { leads: n, app: launch.label, runs, compareDir, compared })}`
);
if (worstRise >= GOAL_RISE_MB || slowest < GOAL_RATE_MBPS || !rowsOk) process.exitCode = 1;
process.exit();
