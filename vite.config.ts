import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	server: {
		// The SQLite file and its WAL change on every write; watching them would reload the dev server.
		watch: { ignored: ['**/data/**', '**/bench/.data/**'] }
	},
	test: {
		// A test that makes no assertion cannot fail: every test in every project must call expect().
		// Projects inherit this through `extends: true`.
		expect: { requireAssertions: true },
		projects: [
			{
				extends: true,
				test: {
					name: 'unit',
					include: ['tests/unit/**/*.test.ts', 'src/**/*.test.ts'],
					environment: 'node',
					setupFiles: ['tests/support/fast-check.ts']
				}
			},
			{
				extends: true,
				test: {
					name: 'integration',
					include: ['tests/integration/**/*.test.ts'],
					environment: 'node',
					setupFiles: ['tests/support/fast-check.ts'],
					testTimeout: 30_000
				}
			},
			{
				extends: true,
				test: {
					name: 'e2e',
					include: ['tests/e2e/**/*.test.ts'],
					environment: 'node',
					globalSetup: ['tests/support/global-setup.ts'],
					testTimeout: 60_000,
					hookTimeout: 120_000,
					fileParallelism: false
				}
			}
		]
	}
});
