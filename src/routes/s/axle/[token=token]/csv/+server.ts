import { axleSheetCsv, buildAxleSheet, openAxleShare } from '$lib/server/sharing/axle-sheet';
import type { RequestHandler } from './$types';

// The axle sheet's points as CSV (?unit=in for inches; not counted as an opening; the same link checks and rate limit).
export const GET: RequestHandler = async (event) => {
	const opened = await openAxleShare(event.params.token, event.getClientAddress(), { count: false });
	const sheet = await buildAxleSheet(opened);
	const name = `${sheet.car.name}-c${sheet.carRevision.number}-${sheet.axle}-axle`.replace(/[^A-Za-z0-9._-]+/g, '-');
	// ?unit=in: inches, as the sheet shows them when the reader chose inches; anything else is mm
	const unit = event.url.searchParams.get('unit') === 'in' ? 'in' : 'mm';
	return new Response(axleSheetCsv(sheet.rows, unit), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${name}.csv"`,
			'cache-control': 'private, no-store',
			'referrer-policy': 'no-referrer',
			'x-robots-tag': 'noindex'
		}
	});
};
