/**
 * `npm run bench:load` (not a test): 50 prospects send an inquiry with two photos each, all at
 * once, while autocannon holds 50 connections on the office API (GET /api/leads as the owner),
 * against the production build on loopback. Bounded in count (50 inquiries, 100 photos) and time:
 * autocannon runs LOAD_SECONDS (default 60; the report says whether that covered the whole intake,
 * since stopping it early would count its requests in flight as errors), and the whole run gives
 * up after LOAD_TIMEOUT_SECONDS (300).
 *
 * It starts its own throwaway PostgreSQL and stand-ins (the test profile, in RILLSTONE_DATA_DIR,
 * default `.test-data-load`, on PG_PORT … PAY_PORT; defaults below differ from `npm start` and
 * `npm test`), seeds the demo firm, builds into BUILD_DIR (default `.test-build-load`) when the
 * sources changed (BENCH_SKIP_BUILD=1: never), and serves the build with ADDRESS_HEADER=x-forwarded-for so that each prospect
 * has an address of their own, as 50 real prospects would (the intake rate limit is per address:
 * 10 inquiries in 15 minutes). Any 429 is still counted and reported apart.
 *
 * Reports: inquiries answered with the thank-you redirect, the leads and photos rows really in the
 * database, every status seen per step, errors other than the rate limit's, the API's latency and
 * request rate under the intake load, and the app process's peak resident memory (VmHWM from
 * /proc/<pid>/status, with VmRSS polled every 100 ms as a cross-check). Goal: the peak under
 * 256 MiB, the ceiling for a one-gigabyte server beside its PostgreSQL; the script exits 1 above it.
 * The app starts as `npm run serve` starts it (scripts/lib/production.ts: the README's small-server
 * settings); LOAD_NODE_OPTIONS starts it with those Node flags instead and without those settings
 * (empty: Node's defaults), LOAD_POOL_SIZE sets the app's database pool.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import autocannon from 'autocannon';
import postgres from 'postgres';
import { yardJpeg } from '../../tests/fixtures/images/make';

const defaults: Record<string, string> = {
	PG_PORT: '54369',
	S3_PORT: '4669',
	SMTP_PORT: '1065',
	MAIL_WEB_PORT: '1081',
	PORT: '4183',
	PAY_PORT: '4592',
	RILLSTONE_DATA_DIR: '.test-data-load'
};
for (const [k, v] of Object.entries(defaults)) process.env[k] ??= v;

// Imported after the ports are settled: the config reads them from the environment.
const { appEnv, databaseUrl } = await import('../lib/config');
const { buildIfNeeded } = await import('../lib/build');
const { startServices } = await import('../lib/services');
const { seedDemo } = await import('../seed/index');
const { DEMO_STAFF } = await import('../seed/demo-data');
const { appLaunch, writeResult } = await import('./lib');

const PROSPECTS = Number(process.env.LOAD_PROSPECTS ?? 50);
const CONNECTIONS = 50;
const SECONDS = Number(process.env.LOAD_SECONDS ?? 60);
const TIMEOUT_MS = Number(process.env.LOAD_TIMEOUT_SECONDS ?? 300) * 1000;
const GOAL_MIB = 256;
const launch = appLaunch('LOAD');
const MIN_FILL_MS = 3_200; // the form refuses a post sooner than 3 s after it was shown
const EMAIL_DOMAIN = 'load.bench.example';

const statuses: Record<string, Record<string, number>> = { form: {}, upload: {}, inquiry: {} };
const errors: string[] = [];
const count = (step: string, status: number | string) =>
	(statuses[step][status] = (statuses[step][status] ?? 0) + 1);

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

/** Resident memory of a process in KiB: the current value and the kernel's high-water mark. */
function memoryOf(pid: number): { rss: number; hwm: number } {
	const status = readFileSync(`/proc/${pid}/status`, 'utf8');
	const kib = (key: string) => Number(new RegExp(`${key}:\\s+(\\d+) kB`).exec(status)?.[1] ?? 0);
	return { rss: kib('VmRSS'), hwm: kib('VmHWM') };
}

/** One prospect: open the form, upload two photos, wait out the fill time, send. */
async function prospect(
	i: number,
	appUrl: string,
	photos: Buffer[]
): Promise<'saved' | 'limited' | 'failed'> {
	const address = `10.77.${Math.floor(i / 250)}.${(i % 250) + 1}`;
	const headers = { 'x-forwarded-for': address, origin: appUrl };
	const form = await fetch(`${appUrl}/start`, { headers });
	count('form', form.status);
	const html = await form.text();
	const startedAt = /name="startedAt" value="([^"]+)"/.exec(html)?.[1];
	if (form.status !== 200 || !startedAt) {
		errors.push(`prospect ${i}: the form answered ${form.status}`);
		return 'failed';
	}
	const shownAt = Date.now();
	const tokens: string[] = [];
	for (const [n, photo] of photos.entries()) {
		const body = new FormData();
		body.set('file', new Blob([new Uint8Array(photo)], { type: 'image/jpeg' }), `yard-${n}.jpg`);
		const res = await fetch(`${appUrl}/api/uploads`, { method: 'POST', headers, body });
		count('upload', res.status);
		const json = (await res.json()) as { token?: string; message?: string };
		if (res.status === 429) return 'limited';
		if (res.status !== 201 || !json.token) {
			errors.push(`prospect ${i}: upload ${n} answered ${res.status} ${json.message ?? ''}`);
			return 'failed';
		}
		tokens.push(json.token);
	}
	const left = MIN_FILL_MS - (Date.now() - shownAt);
	if (left > 0) await new Promise((r) => setTimeout(r, left));
	const fields = new URLSearchParams({
		startedAt,
		website: '',
		name: `Load Prospect ${i}`,
		email: `load-${i}@${EMAIL_DOMAIN}`,
		phone: `555 01${String(i).padStart(2, '0')} 000`,
		street: `${i} Bench Row`,
		town: 'Linden Ford',
		postalCode: '80999',
		services: 'pond',
		budget: '15k-30k',
		timeframe: 'this-season',
		message: 'A small pond by the back steps, from the load benchmark.',
		consent: 'yes'
	});
	for (const t of tokens) fields.append('photoToken', t);
	const res = await fetch(`${appUrl}/start`, {
		method: 'POST',
		redirect: 'manual',
		headers: {
			...headers,
			accept: 'text/html',
			'content-type': 'application/x-www-form-urlencoded'
		},
		body: fields
	});
	count('inquiry', res.status);
	if (res.status === 303 && res.headers.get('location')?.startsWith('/start/thanks')) {
		return 'saved';
	}
	if (res.status === 429) return 'limited';
	errors.push(`prospect ${i}: the inquiry answered ${res.status}`);
	return 'failed';
}

/** SIGTERM, then SIGKILL if the app is still winding down its queue after 5 s. */
async function stopApp(app: ChildProcess | null) {
	if (!app || app.exitCode !== null) return;
	const exited = new Promise((r) => app.once('exit', r));
	app.kill('SIGTERM');
	const timer = setTimeout(() => app.kill('SIGKILL'), 5_000);
	await exited;
	clearTimeout(timer);
}

async function main() {
	const services = await startServices('test', {
		fresh: true,
		log: (line) => console.log(`  ${line}`)
	});
	const url = databaseUrl('test');
	const sql = postgres(url, { max: 2, onnotice: () => {} });
	let app: ChildProcess | null = null;
	try {
		await seedDemo(url);
		const env = {
			...appEnv('test'),
			DATABASE_URL: url, // the seed points process.env.DATABASE_URL elsewhere
			NODE_ENV: 'production',
			ADDRESS_HEADER: 'x-forwarded-for',
			XFF_DEPTH: '1',
			...launch.env,
			...(process.env.LOAD_POOL_SIZE ? { DATABASE_POOL_SIZE: process.env.LOAD_POOL_SIZE } : {})
		};
		const buildDir = process.env.BUILD_DIR ?? '.test-build-load';
		// BENCH_SKIP_BUILD=1 measures the build as it is (e.g. while another build holds the lock).
		if (!process.env.BENCH_SKIP_BUILD) buildIfNeeded(buildDir, env);
		app = spawn(process.execPath, [...launch.nodeFlags, buildDir], {
			env: { ...process.env, ...env },
			stdio: ['ignore', 'ignore', 'inherit']
		});
		const appUrl = env.ORIGIN;
		await waitFor(`${appUrl}/sign-in`, app);

		const owner = DEMO_STAFF.find((s) => s.role === 'owner')!;
		const office = { origin: appUrl, 'x-forwarded-for': '10.78.0.1' };
		const signIn = await fetch(`${appUrl}/sign-in`, {
			method: 'POST',
			redirect: 'manual',
			headers: {
				...office,
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

		const photos = [await yardJpeg(2400, 1600), await yardJpeg(1600, 1200)];
		const [{ n: leadsBefore }] = await sql<{ n: number }[]>`select count(*)::int as n from leads`;
		const pid = app.pid!;
		let peakPolled = memoryOf(pid).rss;
		const idle = memoryOf(pid);
		const poll = setInterval(() => {
			try {
				peakPolled = Math.max(peakPolled, memoryOf(pid).rss);
			} catch {
				/* the process is gone; the run reports that below */
			}
		}, 100);

		console.log(
			`\n${PROSPECTS} inquiries with 2 photos each, and ${CONNECTIONS} connections on /api/leads for ${SECONDS} s, at once\n`
		);
		const started = performance.now();
		const deadline = new Promise<never>((_, reject) =>
			setTimeout(
				() => reject(new Error(`gave up after ${TIMEOUT_MS / 1000} s`)),
				TIMEOUT_MS
			).unref()
		);
		const inquiries = Promise.all(
			Array.from({ length: PROSPECTS }, (_, i) =>
				prospect(i, appUrl, photos).catch((error: Error) => {
					errors.push(`prospect ${i}: ${error.message}`);
					return 'failed' as const;
				})
			)
		).then((outcomes) => ({ outcomes, seconds: (performance.now() - started) / 1000 }));
		// In a worker thread of its own: the stand-ins share this process's event loop, and a busy
		// S3 stand-in must not pass for a slow app.
		const api = autocannon({
			url: `${appUrl}/api/leads`,
			workers: 1,
			connections: CONNECTIONS,
			duration: SECONDS,
			headers: { cookie, 'x-forwarded-for': '10.78.0.1' }
		});
		const [intake, cannon] = await Promise.race([Promise.all([inquiries, api]), deadline]);
		clearInterval(poll);
		const peak = memoryOf(pid);

		const [{ n: leadsSaved }] = await sql<{ n: number }[]>`
			select count(*)::int as n from leads l join contacts c on c.id = l.contact_id
			where c.email like ${'%@' + EMAIL_DOMAIN}`;
		const [{ n: photosSaved }] = await sql<{ n: number }[]>`
			select count(*)::int as n from photos p join leads l on l.id = p.lead_id
			join contacts c on c.id = l.contact_id where c.email like ${'%@' + EMAIL_DOMAIN}`;
		const outcome = (k: string) => intake.outcomes.filter((o) => o === k).length;
		const apiStatuses = Object.fromEntries(
			Object.entries(cannon.statusCodeStats ?? {}).map(([code, s]) => [code, s.count])
		);
		const apiNon2xx = Object.entries(apiStatuses)
			.filter(([code]) => !code.startsWith('2'))
			.reduce((n, [code, c]) => n + (code === '429' ? 0 : c), 0);
		const result = {
			prospects: PROSPECTS,
			photosEach: 2,
			inquiries: {
				answeredWithThanks: outcome('saved'),
				refusedByRateLimit: outcome('limited'),
				failed: outcome('failed'),
				leadsRowsSaved: leadsSaved,
				photoRowsSaved: photosSaved,
				allSeconds: Number(intake.seconds.toFixed(2)),
				statuses
			},
			officeApi: {
				connections: CONNECTIONS,
				seconds: SECONDS,
				coveredTheWholeIntake: SECONDS >= intake.seconds,
				requests: cannon.requests.total,
				requestsPerSecond: Math.round(cannon.requests.average),
				p50Ms: cannon.latency.p50,
				p99Ms: cannon.latency.p99,
				statuses: apiStatuses,
				socketErrors: cannon.errors,
				timeouts: cannon.timeouts
			},
			errorsOtherThanRateLimit: errors.length + apiNon2xx + cannon.errors + cannon.timeouts,
			errorSamples: errors.slice(0, 5),
			appMemoryMiB: {
				idleRss: Number((idle.rss / 1024).toFixed(1)),
				peakRssPolled: Number((peakPolled / 1024).toFixed(1)),
				peakVmHWM: Number((peak.hwm / 1024).toFixed(1))
			},
			leadsBefore,
			app: launch.label,
			loadAverage: loadavg().map((l) => Number(l.toFixed(2)))
		};
		console.log(JSON.stringify(result, null, 2));
		const every = leadsSaved === PROSPECTS - outcome('limited') && photosSaved === 2 * leadsSaved;
		console.log(
			`\n${leadsSaved}/${PROSPECTS} inquiries saved (${outcome('limited')} refused by the rate limit), ` +
				`${photosSaved} photos; errors other than the rate limit's: ${result.errorsOtherThanRateLimit}; ` +
				`office API ${result.officeApi.requestsPerSecond} req/s, p99 ${result.officeApi.p99Ms} ms; ` +
				`app peak RSS ${result.appMemoryMiB.peakVmHWM} MiB` +
				(every ? '' : '  — NOT every accepted inquiry is in the database!')
		);
		const memoryMet = result.appMemoryMiB.peakVmHWM < GOAL_MIB;
		console.log(
			`goal: app peak RSS < ${GOAL_MIB} MiB ${memoryMet ? 'met' : 'MISSED'} (${result.appMemoryMiB.peakVmHWM} MiB` +
				`, app ${launch.label}); load average ${result.loadAverage.join(' ')}`
		);
		console.log(`Written to ${writeResult('load', result)}`);
		if (!every || result.errorsOtherThanRateLimit > 0 || !memoryMet) process.exitCode = 1;
	} finally {
		await stopApp(app);
		await sql.end();
		await services.stop();
	}
}

await main();
process.exit();
