// The fabricator's read-only sheet behind a share link. No account: the token alone opens exactly one revision.
// The hook (sharing/sheet-cache.ts) has usually opened and counted the link already and serves repeat readers
// from memory; this load renders the page once per version of the sheet.
import { cachedSheet, openShare } from '$lib/server/sharing/sheet';
import { SHEET_CACHE_CONTROL, openedFor } from '$lib/server/sharing/sheet-cache';
import { db } from '$lib/server/db';
import { pointSourcesOf } from '$lib/server/db/queries/scans';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	// The token is in the URL: keep it out of Referer headers, shared caches and search engines.
	event.setHeaders({ 'cache-control': SHEET_CACHE_CONTROL, 'referrer-policy': 'no-referrer', 'x-robots-tag': 'noindex' });
	const opened = openedFor(event) ?? (await openShare(event.params.token, event.getClientAddress()));
	const { geometry: _g, version: _v, ...sheet } = await cachedSheet(opened);
	// where points captured on a scan came from (written with the revision, so as immutable as it; no scan ids shown)
	const sources = (await pointSourcesOf(db, opened.revision.id)).map((p) => ({ point: p.point, scanName: p.scanName, fit: p.fit, residualMm: p.residualMm, pointsUsed: p.pointsUsed }));
	return { ...sheet, sources, csvHref: `/s/${event.params.token}/csv` };
};
