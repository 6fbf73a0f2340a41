#!/usr/bin/env node
// The local fake SMTP server of development, demo and tests: accepts every message on 127.0.0.1 and keeps it
// as an .eml file plus a parsed .json summary in a git-ignored folder, which the app's mailbox page (/dev/mail) reads.
// Recipients under @fail.example.test are refused (550), so tests can see what a failed send looks like.
// Usage: node scripts/mail-server.mjs   (port LW_SMTP_PORT, default 2525; folder LW_MAILBOX_DIR)
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { root } from './db.mjs';

export const smtpPort = Number(process.env.LW_SMTP_PORT ?? 2525);
export const FAIL_DOMAIN = 'fail.example.test';

/** The folder that keeps the messages of the fake server on a port. */
export function mailboxDir(port = smtpPort) {
	return process.env.LW_MAILBOX_DIR ?? path.join(root, '.data', 'mail', String(port));
}

/** The addresses of a parsed header field (to, cc, from) as lower-case strings. */
function addresses(field) {
	const list = Array.isArray(field) ? field : field ? [field] : [];
	return list.flatMap((f) => f.value.map((v) => v.address?.toLowerCase() ?? '')).filter(Boolean);
}

/** Starts the fake server; resolves once it listens. `clear` empties the folder first. */
export async function startMailServer({ port = smtpPort, dir = mailboxDir(port), clear = false } = {}) {
	const { SMTPServer } = await import('smtp-server');
	const { simpleParser } = await import('mailparser');
	if (clear) fs.rmSync(dir, { recursive: true, force: true });
	fs.mkdirSync(dir, { recursive: true });
	const server = new SMTPServer({
		authOptional: true,
		disabledCommands: ['STARTTLS'],
		banner: 'Linkwright fake SMTP server (keeps every message, delivers none)',
		logger: false,
		onRcptTo(address, _session, callback) {
			if (address.address.toLowerCase().endsWith(`@${FAIL_DOMAIN}`)) {
				const err = Object.assign(new Error('Mailbox unavailable (fake server refuses this domain on purpose)'), { responseCode: 550 });
				return callback(err);
			}
			callback();
		},
		onData(stream, session, callback) {
			const chunks = [];
			stream.on('data', (c) => chunks.push(c));
			stream.on('end', async () => {
				try {
					const raw = Buffer.concat(chunks);
					const parsed = await simpleParser(raw);
					const id = `${Date.now().toString(36)}-${randomUUID().slice(0, 8)}`;
					const summary = {
						id,
						receivedAt: new Date().toISOString(),
						envelopeTo: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
						from: addresses(parsed.from)[0] ?? session.envelope.mailFrom?.address ?? '',
						to: addresses(parsed.to),
						subject: parsed.subject ?? '',
						text: parsed.text ?? '',
						html: typeof parsed.html === 'string' ? parsed.html : ''
					};
					fs.writeFileSync(path.join(dir, `${id}.eml`), raw);
					// The summary last: a reader that sees the .json also finds the .eml.
					fs.writeFileSync(path.join(dir, `${id}.json`), JSON.stringify(summary));
					callback(null, `Kept as ${id}`);
				} catch (e) {
					callback(e);
				}
			});
		}
	});
	await new Promise((resolve, reject) => {
		server.once('error', reject);
		server.listen(port, '127.0.0.1', () => resolve(undefined));
	});
	server.on('error', (e) => console.error('[mail]', e.message));
	return { port, dir, close: () => new Promise((resolve) => server.close(() => resolve(undefined))) };
}

if (import.meta.url === `file://${process.argv[1]}`) {
	const { port, dir } = await startMailServer();
	console.log(`[mail] fake SMTP server on 127.0.0.1:${port}, keeping messages in ${dir}`);
}
