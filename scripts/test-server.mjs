#!/usr/bin/env node
// Serves the built app against the test database (used by `npm test` and by Playwright when run alone).
import { spawn } from 'node:child_process';
import { databaseUrl, root, testDatabase } from './db.mjs';
import { appEnv } from './setup.mjs';

/** Starts the built app on port against the test database; returns the child process. */
export function startTestServer(port) {
	const env = { ...process.env, ...appEnv({ databaseUrl: databaseUrl(testDatabase), port }), LW_DEMO: 'true' };
	return spawn('node', ['build'], { cwd: root, env, stdio: ['ignore', 'inherit', 'inherit'] });
}

if (import.meta.url === `file://${process.argv[1]}`) {
	const child = startTestServer(Number(process.env.LW_TEST_PORT ?? 3100));
	for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => child.kill(signal));
	child.on('exit', (code) => process.exit(code ?? 0));
}
