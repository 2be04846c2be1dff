import { sveltekit } from '@sveltejs/kit/vite';
import { enhancedImages } from '@sveltejs/enhanced-img';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), enhancedImages(), sveltekit()],
	server: { host: '127.0.0.1' },
	preview: { host: '127.0.0.1' },
	test: {
		expect: { requireAssertions: true },
		// A committed .only fails the run instead of silently skipping the rest.
		allowOnly: false,
		projects: [
			{
				extends: './vite.config.ts',
				test: {
					name: 'unit',
					environment: 'node',
					include: ['src/**/*.{spec,test}.ts', 'scripts/**/*.{spec,test}.ts'],
					// The engine's property tests try hundreds of random designs each: a few seconds on
					// an idle machine, more on a shared one, which is not a failure of the engine.
					testTimeout: 30_000
				}
			},
			{
				extends: './vite.config.ts',
				test: { name: 'site', environment: 'node', include: ['tests/site/**/*.spec.ts'] }
			},
			{
				extends: './vite.config.ts',
				test: {
					name: 'integration',
					environment: 'node',
					include: ['tests/integration/**/*.test.ts'],
					fileParallelism: false,
					testTimeout: 30_000,
					hookTimeout: 60_000
				}
			}
		]
	}
});
