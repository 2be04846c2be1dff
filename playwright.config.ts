import { defineConfig, devices } from '@playwright/test';

const port = Number(process.env.PORT ?? 4173);
const baseURL = `http://127.0.0.1:${port}`;

export default defineConfig({
	testDir: 'tests/e2e',
	outputDir: 'test-results',
	fullyParallel: false,
	workers: 1,
	retries: 0,
	forbidOnly: true,
	timeout: 60_000,
	reporter: [['list']],
	use: {
		baseURL,
		trace: 'retain-on-failure',
		screenshot: 'only-on-failure',
		launchOptions: {
			executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
			args: [
				'--no-sandbox',
				'--disable-gpu',
				'--disable-background-networking',
				'--disable-component-update',
				'--disable-sync',
				'--no-first-run'
			]
		}
	},
	projects: [
		{ name: 'main', testIgnore: /faults\//, use: { ...devices['Desktop Chrome'] } },
		{
			name: 'faults',
			testMatch: /faults\/.*\.spec\.ts/,
			dependencies: ['main'],
			use: { ...devices['Desktop Chrome'] }
		}
	],
	webServer: {
		// scripts/serve.js: the build's handler plus the security headers on prerendered pages too.
		command: `node scripts/serve.js ${process.env.BUILD_DIR ?? '.test-build'}`,
		url: `${baseURL}/sign-in`,
		reuseExistingServer: false,
		timeout: 60_000,
		env: {
			...(process.env as Record<string, string>),
			HOST: '127.0.0.1',
			PORT: String(port),
			ORIGIN: baseURL,
			NODE_ENV: 'production'
		}
	}
});
