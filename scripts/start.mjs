#!/usr/bin/env node
// `npm start`: everything a fresh machine needs, then the app on http://127.0.0.1:3000 (PORT overrides).
// This process owns what it starts: the fake SMTP server runs inside it, and the app is its child on an IPC
// channel, so the app ends when this process ends, even by `kill -9` (the channel closes). The fake object storage
// runs inside this process too. This process in turn ends when its own parent (npm) goes. SIGINT/SIGTERM stop the app
// gracefully (it finishes requests in flight and closes its pool within 5 s), then the mail server and the object
// storage, then this process.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import { root } from './db.mjs';
import { smtpPort } from './mail-server.mjs';
import { s3Port } from './object-store.mjs';
import { portFree, portInUseMessage } from './ports.mjs';
import { appEnv, ensureBuild, ensurePackages, prepareDatabase, say } from './setup.mjs';

const port = Number(process.env.PORT ?? 3000);
const fakeMail = !process.env.SMTP_HOST;
const fakeStorage = !process.env.S3_ENDPOINT;

/** Stops with a plain message when a port we need is taken. */
async function needPort(p, what, variable) {
	if (await portFree(p)) return;
	console.error(`[start] ${portInUseMessage(p, what, variable)}`);
	process.exit(1);
}

await needPort(port, 'the app', 'PORT');
if (fakeMail) await needPort(smtpPort, 'the fake SMTP server', 'LW_SMTP_PORT');
if (fakeStorage) await needPort(s3Port, 'the fake object storage', 'LW_S3_PORT');
ensurePackages();
const databaseUrl = process.env.DATABASE_URL ?? prepareDatabase();
ensureBuild();
// checked again: the set-up can take a while
await needPort(port, 'the app', 'PORT');
const env = { ...process.env, ...appEnv({ databaseUrl, port, smtpPort, s3Port }) };
// With no real SMTP server configured, mail goes to the local fake one (read it at /dev/mail in demo mode).
let mail = null;
if (fakeMail) {
	const { startMailServer } = await import('./mail-server.mjs');
	mail = await startMailServer({ port: smtpPort });
	say(`fake SMTP server on 127.0.0.1:${mail.port}; messages kept in ${mail.dir}`);
}
// With no S3_ENDPOINT configured, scans go to the local fake object storage (s3rver) in the data folder.
let storage = null;
if (fakeStorage) {
	const { startObjectStore } = await import('./object-store.mjs');
	storage = await startObjectStore({ port: s3Port });
	say(`fake object storage on ${storage.endpoint} (bucket ${storage.bucket}); objects kept in ${storage.dir}`);
}
say(`Linkwright on http://127.0.0.1:${port}  (demo accounts in README.md; Ctrl-C stops the app, \`npm run db stop\` stops PostgreSQL)`);
const app = spawn(process.execPath, ['scripts/serve.mjs'], { cwd: root, env, stdio: ['inherit', 'inherit', 'inherit', 'ipc'] });
// One local queue worker for design-space explorations (one thread; `npm run worker` elsewhere adds more).
// LW_LOCAL_WORKER=0 leaves it out. Stopped with the app.
const worker =
	process.env.LW_LOCAL_WORKER === '0'
		? null
		: spawn(process.execPath, ['node_modules/tsx/dist/cli.mjs', 'scripts/worker.ts'], { cwd: root, env: { ...env, LW_WORKER_THREADS: process.env.LW_WORKER_THREADS ?? '1', LW_WORKER_PARENT: String(process.pid) }, stdio: 'inherit' });

let stopping = false;
/** Stops the app (SIGTERM, SIGKILL after 8 s), then the mail server, then exits. */
function stop(reason) {
	if (stopping) return;
	stopping = true;
	if (reason) say(reason);
	if (app.exitCode === null && app.signalCode === null) app.kill('SIGTERM');
	if (worker && worker.exitCode === null && worker.signalCode === null) worker.kill('SIGTERM');
	setTimeout(() => {
		app.kill('SIGKILL');
		worker?.kill('SIGKILL');
	}, 8000).unref();
}

for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) process.on(signal, () => stop());
/** The parent pid of a process (Linux /proc), or null. */
function ppidOf(pid) {
	try {
		return Number(fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ')[1]);
	} catch {
		return null;
	}
}

// npm killed outright: `npm start` runs us through `sh -c`, so either our parent or its parent is re-parented;
// stop rather than serve on as an orphan.
const parent = process.ppid;
const grandparent = ppidOf(parent);
setInterval(() => {
	if (process.ppid !== parent || (grandparent !== null && ppidOf(parent) !== grandparent)) stop('the process that started us has gone; stopping');
}, 1000).unref();
app.on('exit', async (code, signal) => {
	if (worker && worker.exitCode === null && worker.signalCode === null) {
		worker.kill('SIGTERM');
		await new Promise((resolve) => worker.once('exit', resolve));
	}
	await mail?.close();
	await storage?.close();
	process.exit(code ?? (signal ? 1 : 0));
});
