// The fabricator's read-only sheet behind a share link. No account: the token alone opens exactly one revision.
// The hook (sharing/sheet-cache.ts) has usually opened and counted the link already and serves repeat readers
// from memory; this load renders the page once per version of the sheet.
import { cachedSheet, openShare } from '$lib/server/sharing/sheet';
import { SHEET_CACHE_CONTROL, openedFor } from '$lib/server/sharing/sheet-cache';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	// The token is in the URL: keep it out of Referer headers, shared caches and search engines.
	event.setHeaders({ 'cache-control': SHEET_CACHE_CONTROL, 'referrer-policy': 'no-referrer', 'x-robots-tag': 'noindex' });
	const opened = openedFor(event) ?? (await openShare(event.params.token, event.getClientAddress()));
	const { geometry: _g, version: _v, ...sheet } = await cachedSheet(opened);
	return { ...sheet, csvHref: `/s/${event.params.token}/csv` };
};
