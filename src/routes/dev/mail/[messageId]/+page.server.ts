import { keptMail, requireMailbox } from '$lib/server/mail/mailbox';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => ({ mail: await keptMail(requireMailbox(), params.messageId) });
