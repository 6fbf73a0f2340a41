#!/usr/bin/env node
// `npm start`: everything a fresh machine needs, then the app on http://127.0.0.1:3000 (PORT overrides).
import { spawn } from 'node:child_process';
import { root } from './db.mjs';
import { smtpPort } from './mail-server.mjs';
import { appEnv, ensureBuild, ensurePackages, prepareDatabase, say } from './setup.mjs';

ensurePackages();
const databaseUrl = process.env.DATABASE_URL ?? prepareDatabase();
ensureBuild();
const port = Number(process.env.PORT ?? 3000);
const env = { ...process.env, ...appEnv({ databaseUrl, port, smtpPort }) };
// With no real SMTP server configured, mail goes to the local fake one (read it at /dev/mail in demo mode).
if (!process.env.SMTP_HOST) {
	const { startMailServer } = await import('./mail-server.mjs');
	const mail = await startMailServer({ port: smtpPort });
	say(`fake SMTP server on 127.0.0.1:${mail.port}; messages kept in ${mail.dir}`);
}
say(`Linkwright on http://127.0.0.1:${port}  (demo accounts in README.md; Ctrl-C stops the app, \`npm run db stop\` stops PostgreSQL)`);
const app = spawn('node', ['build'], { cwd: root, env, stdio: 'inherit' });
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => app.kill(signal));
app.on('exit', (code) => process.exit(code ?? 0));
