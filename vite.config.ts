import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';
import { workerPlugin } from './scripts/worker-bundle.mjs';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit(), workerPlugin()],
	server: { host: '127.0.0.1', port: 5173 },
	test: {
		expect: { requireAssertions: true },
		projects: [
			{
				extends: true,
				test: {
					name: 'unit',
					include: ['tests/unit/**/*.spec.ts'],
					environment: 'node'
				}
			},
			{
				extends: true,
				test: {
					name: 'integration',
					include: ['tests/integration/**/*.spec.ts'],
					environment: 'node',
					// One database: run integration files one after another.
					fileParallelism: false,
					globalSetup: ['tests/integration/global-setup.ts'],
					testTimeout: 30000,
					hookTimeout: 60000
				}
			}
		]
	}
});
