import { json } from '@sveltejs/kit';
import { paretoQuery } from '$lib/schemas/explore';
import { endpoint, invalid, parseQuery } from '$lib/server/api';
import { db } from '$lib/server/db';
import { variantPairs } from '$lib/server/db/queries/explorations';
import { requireExploration } from '$lib/server/permissions';
import { paretoFront } from '$lib/server/studies/explore';
import type { RequestEvent } from './$types';

// The Pareto front of two measures over the variants that assemble, and an even sample of the rest for a scatter.
export const GET = endpoint<RequestEvent>(async (event) => {
	const { exploration } = await requireExploration(event, event.params.explorationId, 'view');
	const q = parseQuery(event, paretoQuery);
	if (q.x === q.y) invalid('y', 'pick two different measures');
	const rows = await variantPairs(db, exploration.id, q.x, q.y);
	const xs = new Float64Array(rows.length);
	const ys = new Float64Array(rows.length);
	rows.forEach((r, i) => {
		xs[i] = r.x === null ? NaN : q.xSense === 'min' ? r.x : -r.x;
		ys[i] = r.y === null ? NaN : q.ySense === 'min' ? r.y : -r.y;
	});
	const front = paretoFront(xs, ys).map((i) => rows[i]);
	front.sort((a, b) => (a.x ?? 0) - (b.x ?? 0));
	const step = rows.length > q.cloud ? rows.length / q.cloud : 1;
	const cloud = [];
	if (q.cloud > 0) for (let k = 0; k < rows.length; k += step) cloud.push(rows[Math.floor(k)]);
	return json({ x: q.x, y: q.y, xSense: q.xSense, ySense: q.ySense, count: rows.length, front, cloud });
});
