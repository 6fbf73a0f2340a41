// The fabricator's read-only sheet behind a share link. No account: the token alone opens exactly one revision.
import { framesOf, openShare, sheetOf } from '$lib/server/sharing/sheet';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	// The token is in the URL: keep it out of Referer headers, shared caches and search engines.
	event.setHeaders({ 'cache-control': 'private, no-store', 'referrer-policy': 'no-referrer', 'x-robots-tag': 'noindex' });
	const opened = await openShare(event.params.token, event.getClientAddress());
	const { geometry, ...sheet } = await sheetOf(opened);
	return { ...sheet, frames: framesOf(geometry), csvHref: `/s/${event.params.token}/csv` };
};
