// `npm start` (production build) and `npm run dev` (Vite's dev server): services, migrations,
// demo data on an empty database, then the app on http://127.0.0.1:3000.
import { spawn } from 'node:child_process';
import { appEnv, databaseUrl, serviceConfig } from './lib/config';
import { buildIfNeeded } from './lib/build';
import { portInUse } from './lib/ports';
import { PortBusyError, startServices, stopOnSignals } from './lib/services';
import { databaseIsEmpty, seedDemo } from './seed/index';
import { DEMO_STAFF } from './seed/demo-data';

const dev = process.argv.includes('--dev');
const c = serviceConfig('dev');
const env = appEnv('dev');

if (await portInUse(c.appPort)) {
	console.error(
		`Port ${c.appPort} on 127.0.0.1 is in use: Rillstone (or something else) is already running there. Stop it first, or set PORT.`
	);
	process.exit(1);
}

let services;
try {
	services = await startServices('dev', { log: console.log });
} catch (error) {
	console.error(error instanceof PortBusyError ? error.message : error);
	process.exit(1);
}

const url = env.DATABASE_URL ?? databaseUrl('dev');
if (await databaseIsEmpty(url)) {
	console.log('Empty database: writing the demo scenario…');
	await seedDemo(url);
}

try {
	if (!dev) buildIfNeeded('build', env);
} catch (error) {
	console.error((error as Error).message);
	await services.stop();
	process.exit(1);
}

const app = dev
	? spawn(
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
	: spawn(process.execPath, ['scripts/serve.js', 'build'], {
			stdio: 'inherit',
			env: { ...process.env, ...env, NODE_ENV: 'production' }
		});

stopOnSignals(services.stop, () => app.kill('SIGTERM'));
app.on('exit', (code) => {
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
