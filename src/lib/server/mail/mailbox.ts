// The fake SMTP server's kept messages (scripts/mail-server.mjs), read for the mailbox page in development and demo mode.
import { error } from '@sveltejs/kit';
import { dev } from '$app/environment';
import fs from 'node:fs/promises';
import path from 'node:path';
import { serverEnv } from '$lib/server/env';

export interface KeptMail {
	id: string;
	receivedAt: string;
	envelopeTo: string[];
	from: string;
	to: string[];
	subject: string;
	text: string;
	html: string;
}

/** Stops with 404 unless this is development or demo mode with a mailbox folder. */
export function requireMailbox(): string {
	const env = serverEnv();
	if (!(dev || env.LW_DEMO) || !env.LW_MAILBOX_DIR) error(404, { message: 'Not found', code: 'not_found' });
	return env.LW_MAILBOX_DIR;
}

/** Every kept message, newest first; `to` filters by a recipient address. */
export async function keptMails(dir: string, to?: string): Promise<KeptMail[]> {
	let names: string[];
	try {
		names = (await fs.readdir(dir)).filter((n) => n.endsWith('.json'));
	} catch {
		return [];
	}
	const mails = await Promise.all(names.map(async (n) => JSON.parse(await fs.readFile(path.join(dir, n), 'utf8')) as KeptMail));
	const wanted = to?.toLowerCase();
	return mails
		.filter((m) => !wanted || m.envelopeTo.includes(wanted) || m.to.includes(wanted))
		.sort((a, b) => b.receivedAt.localeCompare(a.receivedAt) || b.id.localeCompare(a.id));
}

/** One kept message by id, or 404. */
export async function keptMail(dir: string, id: string): Promise<KeptMail> {
	if (!/^[a-z0-9-]{6,40}$/.test(id)) error(404, { message: 'No such message', code: 'not_found' });
	try {
		return JSON.parse(await fs.readFile(path.join(dir, `${id}.json`), 'utf8')) as KeptMail;
	} catch {
		error(404, { message: 'No such message', code: 'not_found' });
	}
}
