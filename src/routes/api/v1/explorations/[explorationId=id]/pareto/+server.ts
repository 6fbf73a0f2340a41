import { json } from '@sveltejs/kit';
import { paretoQuery } from '$lib/schemas/explore';
import { endpoint, invalid, parseQuery } from '$lib/server/api';
import { db } from '$lib/server/db';
import { variantColumns } from '$lib/server/db/queries/explorations';
import { requireExploration } from '$lib/server/permissions';
import { measuresOf, paretoFrontN, type ExploreSpec } from '$lib/server/studies/explore';
import type { RequestEvent } from './$types';

// The Pareto front of two or three measures over the variants that assemble (optionally only those clear of the
// keep-out volumes), and an even sample of the rest for a scatter. Each point: idx, x, y (and z), clear.
export const GET = endpoint<RequestEvent>(async (event) => {
	const { exploration } = await requireExploration(event, event.params.explorationId, 'view');
	const q = parseQuery(event, paretoQuery);
	if (q.x === q.y) invalid('y', 'pick two different measures');
	if (q.z && (q.z === q.x || q.z === q.y)) invalid('z', 'pick a third measure different from the other two');
	const kept = measuresOf(exploration.spec as unknown as ExploreSpec);
	for (const f of ['x', 'y', 'z'] as const) {
		const c = q[f];
		if (c && !kept.includes(c)) invalid(f, `this exploration did not keep ${c} (it kept ${kept.join(', ')})`);
	}
	const axes = [
		{ col: q.x, sense: q.xSense },
		{ col: q.y, sense: q.ySense },
		...(q.z ? [{ col: q.z, sense: q.zSense }] : [])
	];
	const raw = await variantColumns(db, exploration.id, axes.map((a) => a.col), q.clear === 'only');
	const rows = raw.map((r) => ({ idx: r.idx, clear: r.clear, x: r[q.x], y: r[q.y], ...(q.z ? { z: r[q.z] } : {}) }));
	const objectives = axes.map(({ col, sense }) => Float64Array.from(raw, (r) => (r[col] === null ? NaN : sense === 'min' ? r[col]! : -r[col]!)));
	const front = paretoFrontN(objectives).map((i) => rows[i]);
	front.sort((a, b) => (a.x ?? 0) - (b.x ?? 0));
	const step = rows.length > q.cloud ? rows.length / q.cloud : 1;
	const cloud = [];
	if (q.cloud > 0) for (let k = 0; k < rows.length; k += step) cloud.push(rows[Math.floor(k)]);
	return json({ x: q.x, y: q.y, z: q.z ?? null, xSense: q.xSense, ySense: q.ySense, zSense: q.z ? q.zSense : null, count: rows.length, front, cloud });
});
