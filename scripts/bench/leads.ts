/**
 * `npm run bench:leads` (not a test): GET /api/leads of the production app against a bare
 * node:http server that runs the same SQL (src/lib/server/leads/list-sql.ts) through postgres.js with
 * the same pool size, in the same run, with autocannon at 50 connections.
 *
 * Needs the services running (`npm run services`) and a database with the bulk leads
 * (`npm run seed:bulk -- 100000`). Uses the dev database unless DATABASE_URL is set; builds the
 * app into BUILD_DIR (default `build`) when the sources changed (BENCH_SKIP_BUILD=1: never). BENCH_SECONDS (default 10) sets
 * the length of each run, which follows 2 s of the same load that is not counted. Each case runs at 50 connections beside the baseline (goal: the app's
 * p99 within ×1.5 of the baseline's) and again at 10 connections, a load the two shared cores can
 * serve (goal: p99 under 50 ms). Prints p50, p99 and requests per second, the ratios, the searched
 * case's throughput against the first page's (goal: within ×1.2), and the EXPLAIN ANALYZE plans
 * of each case (goal: the searched case's query under 2 ms). A case whose stage facets are counted
 * exactly (service, dates, search), or a deep page, is planned twice: counting them or finding
 * the page by offset (a view's first request, or the first after a lead changed) and with the
 * facets or the page's start kept (its next requests, as in the runs, where app and baseline both
 * keep them through runList; a search's next requests read their page by number from the matches
 * kept with its facets). Exits 1 when a goal is missed.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:http';
import { loadavg } from 'node:os';
import autocannon from 'autocannon';
import postgres from 'postgres';
import { appEnv, databaseUrl } from '../lib/config';
import { buildIfNeeded } from '../lib/build';
import { DEMO_STAFF } from '../seed/demo-data';
import { parseLeadQuery } from '../../src/lib/schema/leads';
import { listSql, type Statement } from '../../src/lib/server/leads/list-sql';
import { facetsKey, KeptFacets, PREPARED, runList } from '../../src/lib/server/leads/kept-facets';

const url = process.env.DATABASE_URL ?? databaseUrl('dev');
const POOL = 10;
const APP_PORT = Number(process.env.BENCH_APP_PORT ?? 3410);
const BASE_PORT = Number(process.env.BENCH_BASE_PORT ?? 3411);
const SECONDS = Number(process.env.BENCH_SECONDS ?? 10);
// Both servers start just before the first case: the warm-up lets the JIT and each pooled
// connection's prepared statements settle before anything is counted.
const WARMUP_SECONDS = 2;
const CONNECTIONS = 50;
const FEW_CONNECTIONS = 10;
const SEARCHED = 'filtered and searched';

const CASES = [
	{ name: 'first page, sorted by received', search: '' },
	{
		name: SEARCHED,
		search: '?stage=new&stage=contacted&service=water-feature&q=patio'
	},
	{ name: 'page 200', search: '?page=200' },
	{ name: 'sorted by budget', search: '?sort=budget&dir=desc' }
];

// --- the bare baseline (run as a child process: `leads.ts --baseline <userId>`) ---------------
if (process.argv[2] === '--baseline') {
	const userId = process.argv[3];
	const sql = postgres(url, { max: POOL, onnotice: () => {} });
	const kept = new KeptFacets();
	createServer(async (req, res) => {
		const u = new URL(req.url ?? '/', 'http://127.0.0.1');
		const parsed = parseLeadQuery(u.searchParams);
		if (!parsed.success) {
			res.writeHead(400, { 'content-type': 'application/json' });
			return res.end(JSON.stringify({ error: parsed.error.message }));
		}
		// Prepared, and keeping the facets of a view as the app's listLeads() does.
		const list = await runList(parsed.data, { userId }, kept, (s) =>
			sql.unsafe(s.text, s.params as never[], PREPARED)
		);
		res.writeHead(200, { 'content-type': 'application/json' });
		res.end(JSON.stringify(list));
	}).listen(BASE_PORT, '127.0.0.1', () => console.log('baseline ready'));
} else {
	await main();
}

async function waitFor(target: string, child: ChildProcess) {
	for (let i = 0; i < 200; i++) {
		if (child.exitCode !== null) throw new Error(`${target}: the process exited`);
		try {
			if ((await fetch(target)).status < 500) return;
		} catch {
			/* not up yet */
		}
		await new Promise((r) => setTimeout(r, 150));
	}
	throw new Error(`${target} did not answer`);
}

function cannon(target: string, headers: Record<string, string>, connections = CONNECTIONS) {
	return autocannon({
		url: target,
		connections,
		duration: SECONDS,
		headers,
		warmup: { connections, duration: WARMUP_SECONDS }
	});
}

async function main() {
	const sql = postgres(url, { max: 2, onnotice: () => {} });
	const [{ n }] = await sql<{ n: number }[]>`select count(*)::int as n from leads`;
	if (n < 100_000) {
		console.warn(
			`Only ${n.toLocaleString('en-US')} leads in the database; run \`npm run seed:bulk -- 100000\` first for the issue's figures.`
		);
	}
	const owner = DEMO_STAFF.find((s) => s.role === 'owner')!;
	const [user] = await sql<{ id: string }[]>`select id from users where email = ${owner.email}`;
	if (!user) throw new Error('The demo owner is missing: run `npm start` once, or `npm run seed`.');

	const buildDir = process.env.BUILD_DIR ?? 'build';
	const env = {
		...appEnv('dev'),
		DATABASE_URL: url,
		PORT: String(APP_PORT),
		ORIGIN: `http://127.0.0.1:${APP_PORT}`,
		DATABASE_POOL_SIZE: String(POOL),
		NODE_ENV: 'production'
	};
	// BENCH_SKIP_BUILD=1 measures the build as it is (e.g. while another build holds the lock).
	if (!process.env.BENCH_SKIP_BUILD) buildIfNeeded(buildDir, env);
	const app = spawn(process.execPath, [buildDir], {
		env: { ...process.env, ...env },
		stdio: ['ignore', 'ignore', 'inherit']
	});
	const base = spawn(
		process.execPath,
		['--import', 'tsx', import.meta.filename, '--baseline', user.id],
		{ env: { ...process.env, DATABASE_URL: url }, stdio: ['ignore', 'ignore', 'inherit'] }
	);
	// SIGKILL: the app keeps its database pool open after SIGTERM and would linger.
	const stop = () => {
		app.kill('SIGKILL');
		base.kill('SIGKILL');
	};
	process.on('exit', stop);
	try {
		const appUrl = `http://127.0.0.1:${APP_PORT}`;
		await waitFor(`${appUrl}/sign-in`, app);
		await waitFor(`http://127.0.0.1:${BASE_PORT}/`, base);
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
		const cookie = (signIn.headers.getSetCookie?.() ?? []).map((c) => c.split(';')[0]).join('; ');
		if (signIn.status !== 303 || !cookie) throw new Error(`Sign-in failed (${signIn.status})`);

		console.log(
			`\n${n.toLocaleString('en-US')} leads · ${CONNECTIONS} and ${FEW_CONNECTIONS} connections · ${SECONDS} s per run · pool ${POOL} each · load average ${loadavg()
				.map((l) => l.toFixed(2))
				.join(' ')}\n`
		);
		const lines: string[] = [];
		const missed: string[] = [];
		const rates: Record<string, number> = {};
		const row = (label: string, r: autocannon.Result) =>
			`  ${label.padEnd(12)} p50 ${String(r.latency.p50).padStart(5)} ms   p99 ${String(r.latency.p99).padStart(5)} ms   ${r.requests.average.toFixed(0).padStart(6)} req/s`;
		for (const c of CASES) {
			const check = await fetch(`${appUrl}/api/leads${c.search}`, { headers: { cookie } });
			const body = (await check.json()) as { total: number; rows: unknown[] };
			if (check.status !== 200) throw new Error(`${c.name}: the app answered ${check.status}`);
			const a = await cannon(`${appUrl}/api/leads${c.search}`, { cookie });
			const b = await cannon(`http://127.0.0.1:${BASE_PORT}/api/leads${c.search}`, {});
			const few = await cannon(`${appUrl}/api/leads${c.search}`, { cookie }, FEW_CONNECTIONS);
			rates[c.name] = a.requests.average;
			const bad = a.non2xx + b.non2xx + few.non2xx + a.errors + b.errors + few.errors;
			const ratioMet = a.latency.p99 <= 1.5 * b.latency.p99;
			const fewMet = few.latency.p99 < 50;
			if (!ratioMet) missed.push(`${c.name}: p99 at ${CONNECTIONS} over 1.5 × baseline`);
			if (!fewMet) missed.push(`${c.name}: p99 at ${FEW_CONNECTIONS} connections ≥ 50 ms`);
			if (bad) missed.push(`${c.name}: ${bad} errors or non-2xx`);
			lines.push(
				`${c.name} (/api/leads${c.search}; ${body.total.toLocaleString('en-US')} matching, ${body.rows.length} rows)`,
				row(`app ×${CONNECTIONS}`, a),
				row(`baseline ×${CONNECTIONS}`, b),
				`  ratio        p50 ×${(a.latency.p50 / Math.max(b.latency.p50, 0.01)).toFixed(2)}   p99 ×${(a.latency.p99 / Math.max(b.latency.p99, 0.01)).toFixed(2)}   req/s ×${(a.requests.average / b.requests.average).toFixed(2)}   goal: p99 ≤ 1.5 × baseline ${ratioMet ? 'met' : 'MISSED'}`,
				row(`app ×${FEW_CONNECTIONS}`, few) +
					`   goal: p99 < 50 ms ${fewMet ? 'met' : 'MISSED'}${bad ? `   (${bad} errors or non-2xx!)` : ''}`,
				''
			);
			console.log(lines.slice(-6).join('\n'));
		}
		const first = rates[CASES[0].name];
		const searched = rates[SEARCHED];
		const rateMet = first / searched <= 1.2;
		if (!rateMet) missed.push(`${SEARCHED}: throughput more than ×1.2 below the first page's`);
		console.log(
			`first page ${first.toFixed(0)} req/s ÷ ${SEARCHED} ${searched.toFixed(0)} req/s = ×${(first / searched).toFixed(2)} at ${CONNECTIONS} connections   goal: ≤ ×1.2 ${rateMet ? 'met' : 'MISSED'}\n`
		);
		// The app's fixed cost per request, without the list query: the session lookup, the role
		// check and SvelteKit, answered with a 400 for an unknown parameter before any list SQL.
		const floor = await cannon(`${appUrl}/api/leads?bench=floor`, { cookie });
		console.log(
			`app floor (session lookup + role check + a 400, no list SQL): p50 ${floor.latency.p50} ms   p99 ${floor.latency.p99} ms   ${floor.requests.average.toFixed(0)} req/s\n`
		);
		console.log('Query plans (EXPLAIN ANALYZE):');
		// Warm, then the best of five: the plan's own time, not the machine's neighbours.
		const bestPlan = async (s: { text: string; params: unknown[] }) => {
			let best = Infinity;
			let text = '';
			for (let i = 0; i < 6; i++) {
				const plan = await sql.unsafe(
					`explain (analyze, buffers off) ${s.text}`,
					s.params as never[]
				);
				const lines = plan.map((r) => r['QUERY PLAN'] as string);
				const ms = Number(/Execution Time: ([\d.]+) ms/.exec(lines.at(-1) ?? '')?.[1] ?? NaN);
				if (i > 0 && ms < best) {
					best = ms;
					text = lines.join('\n');
				}
			}
			return { ms: best, text };
		};
		for (const c of CASES) {
			const q = parseLeadQuery(new URLSearchParams(c.search)).data!;
			const ctx = { userId: user.id };
			const cold = listSql(q, ctx);
			// A view keeps what its first request found (runList): the facets counted exactly
			// (service, dates, search) and where a deep page begins, each with its snapshot. Its
			// next requests (every request of the runs above but the first) pass them back and
			// read only the page, from its start. Both statements are planned when they differ.
			const plans = [{ label: c.name, s: cold }];
			const kept = new KeptFacets();
			let next: Statement = cold;
			const record = (s: Statement) => {
				next = s;
				return sql.unsafe(s.text, s.params as never[]);
			};
			await runList(q, ctx, kept, record);
			await runList(q, ctx, kept, record);
			if (next.text !== cold.text) {
				const what = facetsKey(q, ctx) ? 'facets' : 'page start';
				plans[0].label = `${c.name}, ${what} found (a view's first request, or after a lead changed)`;
				plans.push({ label: `${c.name}, ${what} kept (its next requests)`, s: next });
			}
			for (const { label, s } of plans) {
				const { ms, text } = await bestPlan(s);
				const isGoal = c.name === SEARCHED;
				const goal = isGoal ? `   goal: under 2 ms ${ms < 2 ? 'met' : 'MISSED'}` : '';
				if (isGoal && !(ms < 2)) missed.push(`${label}: query ${ms} ms`);
				console.log(
					`\n— ${label}: ${ms} ms (best of 5)${goal} (${/Index|Bitmap/.test(text) ? 'uses an index' : 'NO INDEX'}; ${indexesOf(text)}):\n${text}`
				);
			}
		}
		console.log(
			`\nload average ${loadavg()
				.map((l) => l.toFixed(2))
				.join(' ')}`
		);
		console.log(missed.length ? `\nGoals missed:\n- ${missed.join('\n- ')}` : '\nEvery goal met.');
		if (missed.length) process.exitCode = 1;
	} finally {
		stop();
		await sql.end();
	}
}

/** The indexes a plan reads, and its sequential scans (of small tables only, if all is well). */
function indexesOf(plan: string): string {
	const names = (re: RegExp) => [...new Set([...plan.matchAll(re)].map((m) => m[1]))].join(', ');
	const used = names(/(?: using | Index Scan on )(\w+)/g);
	const seq = names(/Seq Scan on (\w+)/g);
	return `indexes: ${used || 'none'}${seq ? `; sequential scans: ${seq}` : ''}`;
}
