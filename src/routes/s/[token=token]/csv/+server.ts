import { fileName } from '$lib/server/corners/present';
import { cachedSheet, openShare, sheetCsv } from '$lib/server/sharing/sheet';
import type { RequestHandler } from './$types';

// The sheet's coordinate table as CSV (?unit=in for inches), reached only through the token (never by a revision id).
export const GET: RequestHandler = async (event) => {
	const opened = await openShare(event.params.token, event.getClientAddress(), { count: false });
	const sheet = await cachedSheet(opened);
	const name = fileName(sheet.car.name, sheet.corner.position, `r${sheet.revision.number}`, 'sheet');
	// ?unit=in: inches, as the sheet shows them when the reader chose inches; anything else is mm
	const unit = event.url.searchParams.get('unit') === 'in' ? 'in' : 'mm';
	return new Response(sheetCsv(sheet.rows, sheet.hasTolerances, unit), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${name}.csv"`,
			'cache-control': 'private, no-store',
			'referrer-policy': 'no-referrer'
		}
	});
};
