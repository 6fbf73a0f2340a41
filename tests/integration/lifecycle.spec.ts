// Issue 21 item 7 / issue 15 graceful shutdown: `npm start` (scripts/start.mjs) owns its children. SIGTERM stops it
// with the request in flight answered; after `kill -9` of it, the app ends too and a second start comes up; a port
// in use is named with its process. Bounds on waiting are generous (15 s) and assert that it exits, not how fast
// (speed belongs in benchmarks). Runs against the built app and the test database.
import { spawn, type ChildProcess } from 'node:child_process';
import http from 'node:http';
import net from 'node:net';
import { afterEach, describe, expect, test } from 'vitest';
import { databaseUrl, testDatabase } from '../../scripts/db.mjs';
import { waitForHttp } from '../../scripts/setup.mjs';

const port = Number(process.env.LW_TEST_PORT ?? 3100) + 60;
const base = `http://127.0.0.1:${port}`;
const started: ChildProcess[] = [];

/** `npm start`'s script on its own port, against the test database, mailing to the tests' fake SMTP server. */
function start() {
	const env = {
		...process.env,
		PORT: String(port),
		ORIGIN: base,
		DATABASE_URL: process.env.TEST_DATABASE_URL ?? (databaseUrl(testDatabase) as string),
		SMTP_HOST: '127.0.0.1',
		SMTP_PORT: String(Number(process.env.LW_SMTP_PORT ?? 2526))
	};
	const child = spawn(process.execPath, ['scripts/start.mjs'], { env, stdio: ['ignore', 'pipe', 'pipe'] });
	let output = '';
	child.stdout!.on('data', (d) => (output += d));
	child.stderr!.on('data', (d) => (output += d));
	started.push(child);
	return { child, output: () => output };
}

/** Resolves with the exit code when the process exits, or 'still running' after ms. */
function exited(child: ChildProcess, ms = 15_000) {
	if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve(child.exitCode ?? child.signalCode);
	return new Promise<number | string | null>((resolve) => {
		const timer = setTimeout(() => resolve('still running'), ms);
		child.once('exit', (code, signal) => {
			clearTimeout(timer);
			resolve(code ?? signal);
		});
	});
}

/** True once nothing listens on the app's port, polling up to 15 s. */
async function portFreed() {
	for (let i = 0; i < 60; i++) {
		const free = await new Promise<boolean>((resolve) => {
			const probe = net.createServer();
			probe.once('error', () => resolve(false));
			probe.listen(port, '127.0.0.1', () => probe.close(() => resolve(true)));
		});
		if (free) return true;
		await new Promise((r) => setTimeout(r, 250));
	}
	return false;
}

afterEach(async () => {
	for (const child of started.splice(0)) {
		if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
	}
	await portFreed();
});

describe('npm start: stop and restart', () => {
	test('SIGTERM: the request in flight is answered, then the app and the script exit; a second start comes up', async () => {
		const first = start();
		await waitForHttp(`${base}/signin`);
		// a sign-in whose body has not all arrived when SIGTERM comes
		const body = new URLSearchParams({ email: 'nobody@example.test', password: 'not the password', callbackUrl: '/' }).toString();
		const answer = new Promise<number>((resolve, reject) => {
			const req = http.request(`${base}/auth/callback/credentials`, {
				method: 'POST',
				headers: { 'content-type': 'application/x-www-form-urlencoded', 'content-length': Buffer.byteLength(body), origin: base }
			}, (res) => {
				res.resume();
				res.on('end', () => resolve(res.statusCode ?? 0));
			});
			req.on('error', reject);
			req.write(body.slice(0, 10));
			setTimeout(() => {
				first.child.kill('SIGTERM');
				setTimeout(() => req.end(body.slice(10)), 300);
			}, 300);
		});
		expect(await answer).toBe(302);
		expect(await exited(first.child)).toBe(0);
		expect(await portFreed()).toBe(true);
		const second = start();
		await waitForHttp(`${base}/signin`);
		expect((await fetch(`${base}/signin`)).status).toBe(200);
		second.child.kill('SIGTERM');
		expect(await exited(second.child)).toBe(0);
	}, 90_000);

	test('kill -9 of the start script ends the app with it, and the next start comes up', async () => {
		const first = start();
		await waitForHttp(`${base}/signin`);
		first.child.kill('SIGKILL');
		await exited(first.child);
		expect(await portFreed()).toBe(true);
		const second = start();
		await waitForHttp(`${base}/signin`);
		expect((await fetch(`${base}/signin`)).status).toBe(200);
		second.child.kill('SIGTERM');
		expect(await exited(second.child)).toBe(0);
	}, 90_000);

	test('a port in use stops the start with a message naming the port and the process holding it', async () => {
		const holder = net.createServer();
		await new Promise<void>((resolve) => holder.listen(port, '127.0.0.1', () => resolve()));
		try {
			const run = start();
			expect(await exited(run.child)).toBe(1);
			expect(run.output()).toContain(`port ${port} on 127.0.0.1 (the app) is in use by process ${process.pid}`);
			expect(run.output()).toContain('PORT=');
		} finally {
			await new Promise((resolve) => holder.close(resolve));
		}
	}, 60_000);
});
