#!/usr/bin/env node
// `npm run dev`: the same set-up as `npm start`, then Vite's dev server with hot reload on http://127.0.0.1:5173.
import { spawn } from 'node:child_process';
import { root } from './db.mjs';
import { smtpPort } from './mail-server.mjs';
import { s3Port } from './object-store.mjs';
import { appEnv, ensurePackages, prepareDatabase, say } from './setup.mjs';

ensurePackages();
const databaseUrl = process.env.DATABASE_URL ?? prepareDatabase();
const env = { ...process.env, ...appEnv({ databaseUrl, port: 5173, smtpPort, s3Port }) };
if (!process.env.SMTP_HOST) {
	const { startMailServer } = await import('./mail-server.mjs');
	const mail = await startMailServer({ port: smtpPort });
	say(`fake SMTP server on 127.0.0.1:${mail.port}; messages at http://127.0.0.1:5173/dev/mail`);
}
if (!process.env.S3_ENDPOINT) {
	const { startObjectStore } = await import('./object-store.mjs');
	const storage = await startObjectStore({ port: s3Port });
	say(`fake object storage on ${storage.endpoint}`);
}
const vite = spawn('npx', ['vite', 'dev', ...process.argv.slice(2)], { cwd: root, env, stdio: 'inherit' });
vite.on('exit', (code) => process.exit(code ?? 0));
