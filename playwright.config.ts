import { defineConfig } from '@playwright/test';

const port = Number(process.env.LW_TEST_PORT ?? 3100);
const baseURL = process.env.LW_TEST_BASE_URL ?? `http://127.0.0.1:${port}`;

export default defineConfig({
	testDir: 'tests/e2e',
	outputDir: 'test-results/playwright',
	fullyParallel: false,
	workers: 2,
	retries: 0,
	// Generous limits: the machine's two cores are shared, and the 3-D view renders in software (no GPU).
	timeout: 90_000,
	expect: { timeout: 10_000 },
	reporter: [['list'], ['json', { outputFile: 'test-results/playwright.json' }]],
	use: {
		baseURL,
		trace: 'retain-on-failure',
		screenshot: 'only-on-failure',
		launchOptions: {
			executablePath: '/usr/bin/chromium',
			args: [
				'--no-sandbox',
				'--disable-gpu',
				'--disable-quic',
				'--no-first-run',
				'--disable-background-networking',
				'--disable-component-update',
				'--disable-sync'
			]
		}
	},
	// Run alone (`npx playwright test`), Playwright serves the built app against the test database itself.
	webServer: process.env.LW_TEST_BASE_URL
		? undefined
		: { command: 'node scripts/test-server.mjs', url: `${baseURL}/signin`, reuseExistingServer: true, timeout: 60_000 }
});
