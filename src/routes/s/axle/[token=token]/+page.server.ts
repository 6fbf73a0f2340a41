// The fabricator's read-only sheet of one axle behind a share link. No account: the token opens exactly one axle of
// one car revision. Built anew on each opening (axle links have few readers; the revision sheet is the cached one).
import { buildAxleSheet, openAxleShare } from '$lib/server/sharing/axle-sheet';
import { SHEET_CACHE_CONTROL } from '$lib/server/sharing/sheet-cache';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	// The token is in the URL: keep it out of Referer headers, shared caches and search engines.
	event.setHeaders({ 'cache-control': SHEET_CACHE_CONTROL, 'referrer-policy': 'no-referrer', 'x-robots-tag': 'noindex' });
	const opened = await openAxleShare(event.params.token, event.getClientAddress());
	return { ...(await buildAxleSheet(opened)), csvHref: `/s/axle/${event.params.token}/csv` };
};
