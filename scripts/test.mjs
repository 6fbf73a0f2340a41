#!/usr/bin/env node
// `npm test`: the same set-up as `npm start` against a fresh test database, then every test:
// Vitest (unit, then integration against the real database and the built app), then Playwright in Chromium.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { databaseUrl, root, testDatabase } from './db.mjs';
import { ensureBuild, ensureChromium, ensurePackages, prepareDatabase, say, waitForHttp } from './setup.mjs';
import { storageEnv } from './setup.mjs';
import { startTestMailServer, startTestObjectStore, startTestServer, testSmtpPort } from './test-server.mjs';
import { testS3Port } from './object-store.mjs';

ensurePackages();
ensureChromium();
prepareDatabase({ test: true });
ensureBuild();

const port = Number(process.env.LW_TEST_PORT ?? 3100);
const baseUrl = `http://127.0.0.1:${port}`;
const mail = await startTestMailServer();
say(`fake SMTP server on 127.0.0.1:${mail.port}`);
const storage = await startTestObjectStore();
if (storage) say(`fake object storage on ${storage.endpoint}`);
const server = startTestServer(port);
process.on('exit', () => server.kill('SIGKILL'));
await waitForHttp(`${baseUrl}/signin`);

const results = path.join(root, 'test-results');
fs.mkdirSync(results, { recursive: true });
const env = {
	...process.env,
	LW_TEST_BASE_URL: baseUrl,
	TEST_DATABASE_URL: databaseUrl(testDatabase),
	LW_SMTP_PORT: String(testSmtpPort),
	LW_MAILBOX_DIR: mail.dir,
	// the tests read and check the bucket through the same settings as the app
	LW_S3_PORT: String(testS3Port),
	...storageEnv(testS3Port),
	...(storage ? { LW_S3_DIR: storage.dir } : {})
};

/**
 * Runs one test runner with inherited output; resolves to its exit status. Asynchronous on purpose: the fake SMTP
 * server lives in this process and must keep answering while the tests send mail.
 */
function runner(command, args) {
	return new Promise((resolve) => {
		const child = spawn(command, args, { cwd: root, env, stdio: 'inherit' });
		child.on('exit', (code) => resolve(code ?? 1));
		child.on('error', () => resolve(1));
	});
}

say('vitest: unit and integration');
const vitest = await runner('npx', ['vitest', 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${results}/vitest.json`]);
say('playwright: browser journeys in Chromium');
const playwright = await runner('npx', ['playwright', 'test']);

/** Counts passed and failed tests from the runners' JSON reports. */
function counts() {
	let passed = 0;
	let failed = 0;
	try {
		const v = JSON.parse(fs.readFileSync(`${results}/vitest.json`, 'utf8'));
		passed += v.numPassedTests;
		failed += v.numFailedTests;
	} catch {
		failed += vitest === 0 ? 0 : 1;
	}
	try {
		const p = JSON.parse(fs.readFileSync(`${results}/playwright.json`, 'utf8'));
		passed += p.stats.expected + (p.stats.flaky ?? 0);
		failed += p.stats.unexpected;
	} catch {
		failed += playwright === 0 ? 0 : 1;
	}
	return { passed, failed };
}

const { passed, failed } = counts();
console.log(`\nsummary: ${passed} passed, ${failed} failed`);
process.exit(vitest === 0 && playwright === 0 ? 0 : 1);
