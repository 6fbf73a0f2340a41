// The app's side of design-space explorations: request → checked spec → rows and queued chunks; rows → JSON.
// The sampling and the measures live in $lib/server/studies/explore.ts; the queue in $lib/server/queue.
import { error } from '@sveltejs/kit';
import type PgBoss from 'pg-boss';
import { joinRocker, measuresNotApplying } from '$lib/kinds';
import { AXIS_NAMES } from '$lib/schemas/analysis';
import type { ExploreRequest } from '$lib/schemas/explore';
import type { CornerGeometry } from '$lib/schemas/geometry';
import { db } from '$lib/server/db';
import { createExploration, deleteExploration, explorationProgress } from '$lib/server/db/queries/explorations';
import type { explorations } from '$lib/server/db/schema';
import { serverEnv } from '$lib/server/env';
import { onShutdown } from '$lib/server/lifecycle';
import { enqueueChunks, startQueue } from '$lib/server/queue/explore-queue';
import { DEFAULT_CHUNK, exploreEvaluator, variantCount, variantOffsets, type ExploreSpec } from '$lib/server/studies/explore';

let boss: Promise<PgBoss> | null = null;
let stopRegistered = false;

/** The app's handle on the queue (started on first use; no maintenance here, the workers run it). */
function queue(): Promise<PgBoss> {
	if (!boss) {
		boss = startQueue(serverEnv().DATABASE_URL, { supervise: false, max: 2 });
		boss.catch(() => (boss = null)); // the next request tries again (the database may be back)
		if (!stopRegistered) {
			stopRegistered = true;
			onShutdown('job queue', async () => {
				const b = await boss?.catch(() => null);
				await b?.stop({ graceful: false, wait: true, timeout: 1000 });
			});
		}
	}
	return boss;
}

/** Checks the request against the corner (400 naming the field), then stores the exploration and queues its chunks. */
export async function startExploration(geometry: CornerGeometry, ids: { cornerId: string; revisionId: string; userId: string }, input: ExploreRequest) {
	const points = joinRocker(geometry.points, geometry.rocker);
	input.coordinates.forEach((c, i) => {
		if (!points[c.point]) error(400, { message: `coordinates.${i}.point: this corner (${geometry.kind}) has no point ${c.point}`, code: 'invalid', field: `coordinates.${i}.point` });
	});
	const missing = measuresNotApplying(geometry.kind, points);
	const spec: ExploreSpec = {
		plan: input.plan,
		coords: input.coordinates.map((c) => ({ point: c.point, axis: AXIS_NAMES.indexOf(c.axis) as 0 | 1 | 2, from: c.from, to: c.to })),
		variants: input.variants,
		levels: input.levels,
		seed: input.seed,
		grid: input.travel,
		rollCentre: !missing.has('rc_height'),
		motionRatio: !missing.has('motion_ratio')
	};
	const variants = variantCount(spec);
	if (spec.plan === 'factorial') spec.variants = variants;
	try {
		exploreEvaluator(geometry, spec);
	} catch (e) {
		error(400, { message: `travel: ${(e as Error).message}`, code: 'invalid', field: 'travel' });
	}
	const chunks = Math.ceil(variants / DEFAULT_CHUNK);
	const q = await queue();
	const row = await createExploration(db, { ...ids, spec: spec as unknown as Record<string, unknown>, variants, chunkSize: DEFAULT_CHUNK, chunks, createdBy: ids.userId });
	try {
		await enqueueChunks(q, row.id, chunks);
	} catch (e) {
		await deleteExploration(db, row.id); // a study whose chunks are not all queued would never finish
		throw e;
	}
	return row;
}

/** An exploration as the API and the page show it. */
export async function explorationView(row: typeof explorations.$inferSelect) {
	const p = await explorationProgress(db, row.id);
	const spec = row.spec as unknown as ExploreSpec;
	return {
		id: row.id,
		cornerId: row.cornerId,
		revisionId: row.revisionId,
		status: row.status,
		error: row.error,
		variants: row.variants,
		chunks: row.chunks,
		chunksDone: p.done,
		feasible: p.feasible,
		plan: spec.plan,
		seed: spec.seed,
		travel: spec.grid,
		coordinates: spec.coords.map((c) => ({ point: c.point, axis: AXIS_NAMES[c.axis], from: c.from, to: c.to })),
		createdAt: row.createdAt,
		finishedAt: row.finishedAt
	};
}

/** Variant `idx`'s moves (mm, rounded to µm), as the save path takes them. */
export function movesOf(spec: ExploreSpec, idx: number) {
	const off = variantOffsets(spec, idx);
	return spec.coords.map((c, j) => ({ point: c.point, axis: AXIS_NAMES[c.axis], move: Math.round(off[j] * 1000) / 1000 }));
}
