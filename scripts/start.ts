// `npm start` (production build) and `npm run dev` (Vite's dev server): services, migrations,
// demo data on an empty database, then the app on http://127.0.0.1:3000.
import './lib/tether.js';
import type { ChildProcess } from 'node:child_process';
import { appEnv, databaseUrl, serviceConfig } from './lib/config';
import { buildInBackgroundIfNeeded } from './lib/build';
import { spawnTethered, stopChild } from './lib/children';
import { exitWithError } from './lib/errors';
import { SERVER_NODE_FLAGS, serverEnv } from './lib/production';
import { startServices, stopOnSignals } from './lib/services';
import { databaseIsEmpty, seedDemo } from './seed/index';
import { DEMO_STAFF } from './seed/demo-data';

const dev = process.argv.includes('--dev');
const c = serviceConfig('dev');
const env = appEnv('dev');

// The build, then the app: whichever runs is stopped first, then the services.
let child: ChildProcess | null = null;
let stopping = false;
stopOnSignals(async () => {
	stopping = true;
	if (child) await stopChild(child);
});

let services;
try {
	services = await startServices('dev', {
		log: console.log,
		ports: [{ name: 'app', port: c.appPort, setting: 'PORT' }]
	});
} catch (error) {
	exitWithError(error);
}

const url = env.DATABASE_URL ?? databaseUrl('dev');
if (await databaseIsEmpty(url)) {
	console.log('Empty database: writing the demo scenario…');
	await seedDemo(url);
}

try {
	if (!dev) await buildInBackgroundIfNeeded('build', env, (build) => (child = build));
} catch (error) {
	console.error((error as Error).message);
	await services.stop();
	process.exit(1);
}

const app = dev
	? spawnTethered(
			process.execPath,
			// Vite itself, not through npx, so that stopping this process stops the server too.
			[
				'node_modules/vite/bin/vite.js',
				'dev',
				'--host',
				'127.0.0.1',
				'--port',
				String(c.appPort),
				'--strictPort'
			],
			{ stdio: 'inherit', env: { ...process.env, ...env } }
		)
	: spawnTethered(process.execPath, [...SERVER_NODE_FLAGS, 'scripts/serve.js', 'build'], {
			stdio: 'inherit',
			env: { ...serverEnv(process.env), ...env, NODE_ENV: 'production' }
		});
child = app;
app.on('exit', (code) => {
	if (stopping) return;
	console.log(`The app stopped (${code ?? 'signal'}); stopping the services.`);
	void services.stop().finally(() => process.exit(code ?? 0));
});

console.log(`
Rillstone is running${dev ? ' (dev server)' : ''}:
  Public site   ${env.ORIGIN}/
  Office        ${env.ORIGIN}/office
  Mail inbox    http://127.0.0.1:${c.mailWebPort}
Demo sign-ins:
${DEMO_STAFF.map((s) => `  ${s.role.padEnd(6)} ${s.email.padEnd(26)} ${s.password}`).join('\n')}
Ctrl-C stops everything.
`);
