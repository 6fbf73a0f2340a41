// The mailbox of the local fake SMTP server: development and demo mode only (404 otherwise).
import { keptMails, requireMailbox } from '$lib/server/mail/mailbox';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const dir = requireMailbox();
	const to = url.searchParams.get('to') ?? '';
	const mails = await keptMails(dir, to || undefined);
	return { to, mails: mails.map(({ html: _html, text, ...m }) => ({ ...m, preview: text.slice(0, 160) })) };
};
