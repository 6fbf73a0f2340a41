import { fileName } from '$lib/server/corners/present';
import { cachedSheet, openShare, sheetCsv } from '$lib/server/sharing/sheet';
import type { RequestHandler } from './$types';

// The sheet's coordinate table as CSV, reached only through the token (never by a revision id).
export const GET: RequestHandler = async (event) => {
	const opened = await openShare(event.params.token, event.getClientAddress(), { count: false });
	const sheet = await cachedSheet(opened);
	const name = fileName(sheet.car.name, sheet.corner.position, `r${sheet.revision.number}`, 'sheet');
	return new Response(sheetCsv(sheet.rows, sheet.hasTolerances), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${name}.csv"`,
			'cache-control': 'private, no-store',
			'referrer-policy': 'no-referrer'
		}
	});
};
