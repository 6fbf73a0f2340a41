import { json } from '@sveltejs/kit';
import { keptMails, requireMailbox } from '$lib/server/mail/mailbox';
import type { RequestHandler } from './$types';

// The kept messages as JSON (?to= filters by recipient), for tests and scripts; development and demo mode only.
export const GET: RequestHandler = async ({ url }) => json({ messages: await keptMails(requireMailbox(), url.searchParams.get('to') ?? undefined) });
