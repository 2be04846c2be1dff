/**
 * `npm run bench:bodies` (not a test): four uploads of 200 MB each, sent at once and chunked (no
 * Content-Length), to the photo upload API of the production build, which must stop each at its
 * 15 MB limit with a 413 while its resident memory stays nearly flat. Goal: the app's RSS rises by
 * less than 50 MB (peak during the uploads against the value before them).
 *
 * Starts its own throwaway PostgreSQL and stand-ins (test profile, RILLSTONE_DATA_DIR default
 * `.test-data-bodies`, on PG_PORT … PAY_PORT), seeds the demo firm, builds into BUILD_DIR (default
 * `.test-build-bodies`) when the sources changed (BENCH_SKIP_BUILD=1: never), and reports the RSS
 * (VmRSS from /proc/<pid>/status, polled every 50 ms) before, at the peak and after, with each
 * upload's status, message and how much it had sent when the answer came.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';

const defaults: Record<string, string> = {
	PG_PORT: '54379',
	S3_PORT: '4679',
	SMTP_PORT: '1075',
	MAIL_WEB_PORT: '1082',
	PORT: '4193',
	PAY_PORT: '4593',
	RILLSTONE_DATA_DIR: '.test-data-bodies'
};
for (const [k, v] of Object.entries(defaults)) process.env[k] ??= v;

const { appEnv, databaseUrl } = await import('../lib/config');
const { buildIfNeeded } = await import('../lib/build');
const { startServices } = await import('../lib/services');
const { seedDemo } = await import('../seed/index');
const { writeResult } = await import('./lib');
const { streamBody } = await import('../../tests/support/raw-http');

const UPLOADS = Number(process.env.BODIES_UPLOADS ?? 4);
const MB = 1024 * 1024;
const BYTES = Number(process.env.BODIES_MB ?? 200) * MB;
const GOAL_MB = 50;

const rssMiB = (pid: number) =>
	Number(/VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1] ?? 0) / 1024;

async function waitFor(target: string, child: ChildProcess) {
	for (let i = 0; i < 400; i++) {
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

const services = await startServices('test', {
	fresh: true,
	log: (line) => console.log(`  ${line}`)
});
let app: ChildProcess | null = null;
try {
	const url = databaseUrl('test');
	await seedDemo(url);
	const env = { ...appEnv('test'), DATABASE_URL: url, NODE_ENV: 'production' };
	const buildDir = process.env.BUILD_DIR ?? '.test-build-bodies';
	if (!process.env.BENCH_SKIP_BUILD) buildIfNeeded(buildDir, env);
	app = spawn(process.execPath, ['scripts/serve.js', buildDir], {
		env: { ...process.env, ...env },
		stdio: ['ignore', 'ignore', 'inherit']
	});
	const appUrl = env.ORIGIN;
	await waitFor(`${appUrl}/sign-in`, app);
	const pid = app.pid!;
	const boundary = '----rillstonebench';
	const upload = (bytes: number) =>
		streamBody(appUrl, '/api/uploads', {
			bytes,
			prefix: Buffer.from(
				`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="big.jpg"\r\nContent-Type: image/jpeg\r\n\r\n`
			),
			suffix: Buffer.from(`\r\n--${boundary}--\r\n`),
			headers: {
				'content-type': `multipart/form-data; boundary=${boundary}`,
				accept: 'application/json'
			}
		});
	// Warm up: pages, the refusal path once, then let the heap settle.
	for (let i = 0; i < 5; i++) await fetch(`${appUrl}/sign-in`);
	await upload(20 * MB);
	await new Promise((r) => setTimeout(r, 2000));

	const before = rssMiB(pid);
	let peak = before;
	const poll = setInterval(() => (peak = Math.max(peak, rssMiB(pid))), 50);
	const started = Date.now();
	const answers = await Promise.all(Array.from({ length: UPLOADS }, () => upload(BYTES)));
	const seconds = (Date.now() - started) / 1000;
	// The app drains what is left of each refused body for a moment: keep watching.
	await new Promise((r) => setTimeout(r, 3000));
	clearInterval(poll);
	const after = rssMiB(pid);
	const result = {
		uploads: UPLOADS,
		bytesEach: BYTES,
		seconds,
		statuses: answers.map((a) => a.status),
		messages: [...new Set(answers.map((a) => JSON.parse(a.body).message))],
		sentMiBWhenAnswered: answers.map((a) => Number((a.sentBytes / MB).toFixed(1))),
		rssMiB: { before: +before.toFixed(1), peak: +peak.toFixed(1), after: +after.toFixed(1) },
		riseMiB: +(peak - before).toFixed(1),
		goalMiB: GOAL_MB
	};
	console.log(
		`${UPLOADS} × ${BYTES / MB} MB chunked uploads at once: statuses ${result.statuses.join(', ')}` +
			` (${result.messages.join(' | ')}), answered after ${result.sentMiBWhenAnswered.join(', ')} MiB sent`
	);
	console.log(
		`app RSS before ${result.rssMiB.before} MiB, peak ${result.rssMiB.peak} MiB, after ${result.rssMiB.after} MiB:` +
			` rise ${result.riseMiB} MiB (goal < ${GOAL_MB})`
	);
	console.log(`Written to ${writeResult('bodies', result)}`);
	if (result.riseMiB >= GOAL_MB || result.statuses.some((s) => s !== 413)) process.exitCode = 1;
} finally {
	if (app && app.exitCode === null) {
		const exited = new Promise((r) => app!.once('exit', r));
		app.kill('SIGTERM');
		const timer = setTimeout(() => app!.kill('SIGKILL'), 5_000);
		await exited;
		clearTimeout(timer);
	}
	await services.stop();
}
process.exit();
