#!/usr/bin/env node
// Serves the built app against the test database (used by `npm test` and by Playwright when run alone).
import { spawn } from 'node:child_process';
import { databaseUrl, root, testDatabase } from './db.mjs';
import { testS3Port } from './object-store.mjs';
import { appEnv } from './setup.mjs';

/** The fake SMTP server's port in tests (LW_SMTP_PORT, default 2526 so `npm start`'s 2525 can run beside). */
export const testSmtpPort = Number(process.env.LW_SMTP_PORT ?? 2526);

/** Starts the built app on port against the test database, mailing to the fake server; returns the child process. */
export function startTestServer(port, smtpPort = testSmtpPort, s3Port = testS3Port) {
	const env = { ...process.env, ...appEnv({ databaseUrl: databaseUrl(testDatabase), port, smtpPort, s3Port }), LW_DEMO: 'true' };
	return spawn(process.execPath, ['scripts/serve.mjs'], { cwd: root, env, stdio: ['ignore', 'inherit', 'inherit'] });
}

/** Starts the fake SMTP server of the tests with an empty mailbox. */
export async function startTestMailServer(smtpPort = testSmtpPort) {
	const { startMailServer } = await import('./mail-server.mjs');
	return startMailServer({ port: smtpPort, clear: true });
}

/** Starts the fake object storage of the tests, empty, unless S3_ENDPOINT names a real service. */
export async function startTestObjectStore(s3Port = testS3Port) {
	if (process.env.S3_ENDPOINT) return null;
	const { startObjectStore } = await import('./object-store.mjs');
	return startObjectStore({ port: s3Port, clear: true });
}

if (import.meta.url === `file://${process.argv[1]}`) {
	await startTestMailServer();
	const storage = await startTestObjectStore();
	const child = startTestServer(Number(process.env.LW_TEST_PORT ?? 3100));
	for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => child.kill(signal));
	child.on('exit', async (code) => {
		await storage?.close();
		process.exit(code ?? 0);
	});
}
