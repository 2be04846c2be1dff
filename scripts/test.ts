// `npm test`: starts its own PostgreSQL and stand-ins on the test ports (fresh data each run),
// then runs the unit and integration tests (vitest) and the end-to-end tests (Playwright)
// against a production build. Exits non-zero on any failure.
import './lib/tether.js';
import type { ChildProcess } from 'node:child_process';
import { appEnv, serviceConfig } from './lib/config';
import { buildInBackgroundIfNeeded } from './lib/build';
import { spawnTethered, stopChild } from './lib/children';
import { exitWithError } from './lib/errors';
import { ensureDatabase } from './lib/postgres';
import { runMigrations } from './lib/migrate';
import { startServices, stopOnSignals } from './lib/services';
import { seedDemo } from './seed/index';
import { startStandInControl } from './lib/standins';

const c = serviceConfig('test');
process.env.PG_FSYNC = 'off'; // throwaway test cluster: durability is not needed, speed is

// `npm test -- e2e tests/e2e/x.spec.ts --no-deps`: step names select steps, the rest go to Playwright.
const STEPS = ['unit', 'integration', 'e2e'];
const only = process.argv.slice(2).filter((a) => STEPS.includes(a));
// Vitest files (`npm test -- integration tests/integration/x.test.ts`) narrow the vitest steps;
// everything else goes to Playwright.
const isVitestFile = (a: string) => /\.test\.ts$/.test(a);
const vitestFiles = process.argv.slice(2).filter(isVitestFile);
const playwrightArgs = process.argv.slice(2).filter((a) => !STEPS.includes(a) && !isVitestFile(a));
const want = (step: string) => only.length === 0 || only.includes(step);

// The step running now (a test runner or the build): a signal stops it, then the services.
let child: ChildProcess | null = null;
let control: Awaited<ReturnType<typeof startStandInControl>> | null = null;
stopOnSignals(async () => {
	if (child) await stopChild(child, 8_000);
	await control?.stop();
});

let services;
try {
	services = await startServices('test', {
		fresh: true,
		log: (line) => console.log(`  ${line}`),
		ports: want('e2e') ? [{ name: 'app under test', port: c.appPort, setting: 'PORT' }] : []
	});
} catch (error) {
	exitWithError(error);
}
control = await startStandInControl(services.standIns);

const base = appEnv('test');
const e2eDatabase = `${c.pgDatabase}_e2e`;
const e2eUrl = `postgres://app@127.0.0.1:${c.pgPort}/${e2eDatabase}`;
await ensureDatabase({ dataDir: services.pgDataDir, port: c.pgPort, database: e2eDatabase });
await runMigrations(e2eUrl);
await seedDemo(e2eUrl);

const shared = {
	...base,
	TEST_PG_DATA: services.pgDataDir,
	TEST_PG_PORT: String(c.pgPort),
	TEST_S3_PORT: String(c.s3Port),
	TEST_SMTP_PORT: String(c.smtpPort),
	TEST_MAIL_API: `http://127.0.0.1:${c.mailWebPort}/api`,
	E2E_DATABASE_URL: e2eUrl,
	TEST_STANDIN_CONTROL: control.url,
	BUILD_DIR: process.env.BUILD_DIR ?? '.test-build'
};

// The runners themselves, not through npx: a signal then reaches them directly.
const VITEST = 'node_modules/vitest/vitest.mjs';
const PLAYWRIGHT = 'node_modules/@playwright/test/cli.js';

// Asynchronous on purpose: the stand-ins live in this process and must keep answering.
function run(
	label: string,
	cmd: string,
	args: string[],
	env: Record<string, string>
): Promise<boolean> {
	console.log(`\n▶ ${label}`);
	const step = spawnTethered(cmd, args, { stdio: 'inherit', env: { ...process.env, ...env } });
	child = step;
	return new Promise((resolve) => step.on('exit', (code) => resolve(code === 0)));
}

const results: Record<string, boolean> = {};

// Separate runs: integration files share one database and must not run beside each other.
if (want('unit')) {
	results.unit = await run(
		'unit tests (vitest)',
		process.execPath,
		[VITEST, 'run', '--project', 'unit', ...vitestFiles],
		shared
	);
}
if (want('integration')) {
	results.integration = await run(
		'integration tests (vitest, real PostgreSQL and stand-ins)',
		process.execPath,
		[VITEST, 'run', '--project', 'integration', ...vitestFiles],
		shared
	);
}
if (want('e2e')) {
	try {
		// E2E_REUSE_BUILD=1 keeps a build that is newer than every source (handy for one spec).
		const force = process.env.E2E_REUSE_BUILD !== '1';
		await buildInBackgroundIfNeeded(
			shared.BUILD_DIR,
			{ ...shared, DATABASE_URL: e2eUrl },
			(build) => (child = build),
			force
		);
		results.site = await run(
			'build-output tests of the public site',
			process.execPath,
			[VITEST, 'run', '--project', 'site'],
			shared
		);
		results.e2e = await run(
			'end-to-end tests (Playwright, production build)',
			process.execPath,
			[PLAYWRIGHT, 'test', ...playwrightArgs],
			{ ...shared, DATABASE_URL: e2eUrl }
		);
	} catch (error) {
		console.error((error as Error).message);
		results.e2e = false;
	}
}

await control.stop();
await services.stop();
const failed = Object.entries(results)
	.filter(([, ok]) => !ok)
	.map(([name]) => name);
console.log(failed.length ? `\n✗ failed: ${failed.join(', ')}` : '\n✓ every test step passed');
process.exit(failed.length ? 1 : 0);
