// Several app processes on one database and one bucket, as behind a reverse proxy: sign-in
// throttling, the session cache, the inquiry rate limit and the mail queue must hold across them.
// The spec starts two processes of the test build on ports of its own (PORT + 1, PORT + 2), each
// reading the client address from X-Forwarded-For, so each test uses addresses no other uses.
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import postgres from 'postgres';
import PgBoss from 'pg-boss';
import { expect, test } from '@playwright/test';
import { hashPassword } from '../../src/lib/server/auth/passwords';
import { newId } from '../../src/lib/server/platform/crypto';
import { rawRequest } from '../support/raw-http';
import { allMail } from '../support/mailbox';
import { demoUser } from './pages/staff';

const DB_URL = process.env.E2E_DATABASE_URL ?? process.env.DATABASE_URL!;
const sql = postgres(DB_URL, { max: 2, onnotice: () => {} });
const base = Number(process.env.PORT ?? 4173);
const apps: { url: string; child: ChildProcess }[] = [];
const tag = randomBytes(3).toString('hex');
const PASSWORD = 'a long password for two processes';

async function startApp(port: number): Promise<{ url: string; child: ChildProcess }> {
	const url = `http://127.0.0.1:${port}`;
	const child = spawn(
		process.execPath,
		['scripts/serve.js', process.env.BUILD_DIR ?? '.test-build'],
		{
			env: {
				...process.env,
				DATABASE_URL: DB_URL,
				HOST: '127.0.0.1',
				PORT: String(port),
				ORIGIN: url,
				PUBLIC_ORIGIN: url,
				NODE_ENV: 'production',
				ADDRESS_HEADER: 'x-forwarded-for',
				XFF_DEPTH: '1',
				// A session cache that outlives every test here: a session that ends shows on the
				// other process only because it was told (NOTIFY), never because its entry expired.
				SESSION_CACHE_MS: String(10 * 60 * 1000)
			},
			stdio: ['ignore', 'inherit', 'inherit']
		}
	);
	const deadline = Date.now() + 30_000;
	while (Date.now() < deadline) {
		try {
			if ((await fetch(`${url}/sign-in`)).ok) return { url, child };
		} catch {
			// not listening yet
		}
		await new Promise((r) => setTimeout(r, 200));
	}
	child.kill();
	throw new Error(`the app on ${url} did not start`);
}

test.beforeAll(async () => {
	test.setTimeout(90_000);
	apps.push(await startApp(base + 1), await startApp(base + 2));
});
test.afterAll(async () => {
	for (const app of apps) app.child.kill('SIGTERM');
	await sql.end();
});

async function makeMember(role: 'sales' | 'crew' = 'sales') {
	const email = `two-${role}-${tag}-${randomBytes(2).toString('hex')}@test.example`;
	await sql`insert into users (id, email, name, role, password_hash)
		values (${newId()}, ${email}, ${'Two Processes ' + role}, ${role}, ${await hashPassword(PASSWORD)})`;
	return email;
}

/** Posts the sign-in form to one process from an address; returns status and cookies set. */
async function signIn(appUrl: string, email: string, password: string, ip: string, cookie = '') {
	const res = await fetch(`${appUrl}/sign-in`, {
		method: 'POST',
		redirect: 'manual',
		headers: {
			origin: appUrl,
			'content-type': 'application/x-www-form-urlencoded',
			accept: 'text/html',
			'x-forwarded-for': ip,
			...(cookie ? { cookie } : {})
		},
		body: new URLSearchParams({ email, password })
	});
	const cookies = res.headers.getSetCookie().map((c) => c.split(';')[0]);
	return { status: res.status, cookies, text: await res.text() };
}

const ip = () => `198.51.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`;

test('sign-in throttling counts failures from both processes, and a known device passes on either', async () => {
	const [a, b] = apps;
	const email = await makeMember();
	// The member signs in once on A: that browser gets its device cookie.
	const first = await signIn(a.url, email, PASSWORD, ip());
	expect(first.status).toBe(303);
	const device = first.cookies.find((c) => c.startsWith('rs_device='))!;
	expect(device).toBeTruthy();
	// Six wrong passwords, alternating between the processes, from an attacker's address; each
	// one told to wait is sent again after the wait it named. Six failures make the next delay
	// 8 s (1 s after the third, doubling), long enough for a loaded machine to check it below.
	const attacker = ip();
	for (const app of [a, b, a, b, a, b]) {
		for (;;) {
			const guess = await signIn(app.url, email, 'wrong guess', attacker);
			if (guess.status === 400) break;
			expect(guess.status).toBe(429);
			const seconds = Number(/Wait (\d+) seconds?/.exec(guess.text)?.[1]);
			expect(seconds).toBeGreaterThan(0);
			await new Promise((r) => setTimeout(r, seconds * 1000));
		}
	}
	// A new device on A is delayed by the count that both built, with the wait named.
	const fresh = await signIn(a.url, email, PASSWORD, ip());
	expect(fresh.status).toBe(429);
	expect(fresh.text).toMatch(/Wait \d+ seconds?/);
	// The known device is not held up, on either process.
	expect((await signIn(b.url, email, PASSWORD, ip(), device)).status).toBe(303);
});

test('a disabled member is refused by both processes, long before the session cache expires', async ({
	baseURL
}) => {
	const [a, b] = apps;
	const email = await makeMember('crew');
	const member = await signIn(a.url, email, PASSWORD, ip());
	const session = member.cookies.find((c) => c.startsWith('rs_session='))!;
	// Both processes have just validated (and cached) the session.
	for (const app of [a, b]) {
		expect((await rawRequest(app.url, '/office', { cookie: session })).status).toBe(200);
	}
	// The owner disables the member through A.
	const owner = await signIn(a.url, demoUser('owner').email, demoUser('owner').password, ip());
	const ownerCookie = owner.cookies.find((c) => c.startsWith('rs_session='))!;
	const [row] = await sql<{ id: string }[]>`select id from users where email = ${email}`;
	const disabled = await fetch(`${a.url}/office/team?/disable`, {
		method: 'POST',
		redirect: 'manual',
		headers: {
			origin: a.url,
			cookie: ownerCookie,
			'content-type': 'application/x-www-form-urlencoded',
			accept: 'application/json',
			'x-sveltekit-action': 'true'
		},
		body: new URLSearchParams({ userId: row.id })
	});
	expect((await disabled.json()).type).toBe('success');
	const at = Date.now();
	// B refuses although its cached entry has minutes left: it was told through NOTIFY.
	let status = 0;
	while (Date.now() - at < 20_000) {
		status = (await rawRequest(b.url, '/office', { cookie: session })).status;
		if (status === 303) break;
		await new Promise((r) => setTimeout(r, 50));
	}
	expect(status).toBe(303);
	expect((await rawRequest(a.url, '/office', { cookie: session })).status).toBe(303);
	expect(baseURL).toBeTruthy();
});

test('the inquiry rate limit counts posts to both processes from one address', async () => {
	const [a, b] = apps;
	const from = ip();
	const statuses: number[] = [];
	for (let i = 0; i < 11; i++) {
		const app = i % 2 ? b : a;
		const res = await fetch(`${app.url}/start`, {
			method: 'POST',
			redirect: 'manual',
			headers: {
				origin: app.url,
				'content-type': 'application/x-www-form-urlencoded',
				accept: 'text/html',
				'x-forwarded-for': from
			},
			// An incomplete form: refused for its fields, but counted like any other post.
			body: new URLSearchParams({ name: `Limit ${i}` })
		});
		statuses.push(res.status);
	}
	expect(statuses.slice(0, 10).every((s) => s === 400)).toBe(true);
	expect(statuses[10]).toBe(429);
	// Another address is not affected.
	const other = await fetch(`${b.url}/start`, {
		method: 'POST',
		redirect: 'manual',
		headers: {
			origin: b.url,
			'content-type': 'application/x-www-form-urlencoded',
			accept: 'text/html',
			'x-forwarded-for': ip()
		},
		body: new URLSearchParams({ name: 'Someone else' })
	});
	expect(other.status).toBe(400);
});

test('each queued mail is sent exactly once while both processes work the queue', async () => {
	test.setTimeout(90_000);
	const ids: string[] = [];
	for (let i = 0; i < 12; i++) {
		const id = newId();
		ids.push(id);
		await sql`insert into outbox (id, dedupe_key, "to", subject, text, html)
			values (${id}, ${`two-processes:${tag}:${i}`}, ${`queue-${tag}-${i}@test.example`},
				${`Queue check ${tag} ${i}`}, 'once', '<p>once</p>')`;
	}
	// Each message is queued three times over (as a redelivery would), so both processes'
	// workers get copies of the same message at the same moment.
	const boss = new PgBoss({ connectionString: DB_URL, schema: 'pgboss', max: 2 });
	await boss.start();
	try {
		await boss.createQueue('mail.send');
		for (const id of ids) {
			for (let copy = 0; copy < 3; copy++) await boss.send('mail.send', { outboxId: id });
		}
	} finally {
		await boss.stop({ graceful: false, wait: true });
	}
	const deadline = Date.now() + 60_000;
	let sent = 0;
	while (Date.now() < deadline) {
		[{ sent }] = await sql<{ sent: number }[]>`
			select count(*)::int as sent from outbox where id in ${sql(ids)} and sent_at is not null`;
		if (sent === ids.length) break;
		await new Promise((r) => setTimeout(r, 500));
	}
	expect(sent).toBe(ids.length);
	// Give any duplicate a moment to arrive, then count what the mail catcher received.
	await new Promise((r) => setTimeout(r, 3000));
	const caught = (await allMail()).filter((m) => m.subject.startsWith(`Queue check ${tag} `));
	const perSubject = new Map<string, number>();
	for (const m of caught) perSubject.set(m.subject, (perSubject.get(m.subject) ?? 0) + 1);
	expect(perSubject.size).toBe(ids.length);
	expect([...perSubject.values()].every((n) => n === 1)).toBe(true);
});
