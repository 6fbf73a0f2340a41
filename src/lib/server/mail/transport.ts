// Outgoing mail through nodemailer over SMTP (host, port and sender from the environment, parsed at start-up).
import nodemailer, { type Transporter } from 'nodemailer';
import { serverEnv } from '$lib/server/env';
import type { MailContent } from './messages';

// One transport for the process: it holds connection settings only, nothing of any user.
let transport: Transporter | null = null;

/** The SMTP transport built from the environment. */
function smtp(): Transporter {
	if (transport) return transport;
	const env = serverEnv();
	transport = nodemailer.createTransport({
		host: env.SMTP_HOST,
		port: env.SMTP_PORT,
		secure: env.SMTP_SECURE,
		auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASS ?? '' } : undefined,
		// Fail fast: the page waits for the answer and then says what went wrong.
		connectionTimeout: 5000,
		greetingTimeout: 5000,
		socketTimeout: 10000
	});
	return transport;
}

export type SendResult = { ok: true; messageId: string } | { ok: false; message: string };

/** A sentence for the user from a nodemailer error. */
function explain(e: unknown, to: string): string {
	const err = e as { code?: string; responseCode?: number; response?: string };
	if (err.responseCode && err.responseCode >= 500 && err.responseCode < 600) return `The mail server refused the address ${to}.`;
	if (err.code === 'ECONNECTION' || err.code === 'ETIMEDOUT' || err.code === 'ESOCKET' || err.code === 'EDNS') {
		return 'The mail server could not be reached. Try again later.';
	}
	return 'The mail could not be sent. Try again later.';
}

/** Sends one message with a plain-text and an HTML part; never throws. */
export async function sendMail(to: string, content: MailContent): Promise<SendResult> {
	try {
		const info = await smtp().sendMail({ from: serverEnv().MAIL_FROM, to, subject: content.subject, text: content.text, html: content.html });
		return { ok: true, messageId: info.messageId };
	} catch (e) {
		console.error(`[mail] sending to ${to} failed:`, (e as Error).message);
		return { ok: false, message: explain(e, to) };
	}
}
