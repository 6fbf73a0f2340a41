// The app's side of design-space explorations: request → checked spec → rows and queued chunks; rows → JSON.
// The sampling and the measures live in $lib/server/studies/explore.ts; the queue in $lib/server/queue.
import { error } from '@sveltejs/kit';
import type PgBoss from 'pg-boss';
import { joinRocker, kindSpec, measuresNotApplying } from '$lib/kinds';
import { carModelSchema } from '$lib/schemas/car-model';
import { AXIS_NAMES } from '$lib/schemas/analysis';
import type { ExploreRequest } from '$lib/schemas/explore';
import type { CornerGeometry } from '$lib/schemas/geometry';
import { db } from '$lib/server/db';
import { carRevisionOfCar } from '$lib/server/db/queries/car-revisions';
import { createExploration, deleteExploration, explorationProgress } from '$lib/server/db/queries/explorations';
import type { explorations } from '$lib/server/db/schema';
import { serverEnv } from '$lib/server/env';
import { onShutdown } from '$lib/server/lifecycle';
import { enqueueChunks, startQueue } from '$lib/server/queue/explore-queue';
import { DEFAULT_CHUNK, exploreEvaluator, measuresOf, variantCount, variantOffsets, type ExploreSpec } from '$lib/server/studies/explore';
import type { PackagingSpec } from '$lib/server/studies/packaging';
import type { Volume } from '$lib/server/kinematics/keep-out';

/** What the car model gives a corner's exploration: its keep-out volumes (those on this axle) and its steering. */
export interface CarPackaging {
	carRevision: { id: string; number: number };
	keepOut: Volume[];
	steering: { rack_travel_per_turn: number } | null;
}

/** The packaging of the car's newest car revision for a corner at `position` (null: the car has no model yet). */
export async function carPackaging(carId: string, position: string): Promise<CarPackaging | null> {
	const axle = position.startsWith('front') ? 'front' : 'rear';
	const row = await carRevisionOfCar(db, carId, null);
	const model = row ? carModelSchema.safeParse(row.model) : null;
	if (!row || !model?.success) return null;
	return {
		carRevision: { id: row.id, number: row.number },
		keepOut: model.data.keep_out.filter((v) => v.shape !== 'rim' || v.axle === axle) as Volume[],
		steering: model.data[axle].steering ?? null
	};
}

let boss: Promise<PgBoss> | null = null;
let stopRegistered = false;

/** The app's handle on the queue (started on first use; no maintenance here, the workers run it). */
export function queue(): Promise<PgBoss> {
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

const bad = (field: string, message: string): never => error(400, { message: `${field}: ${message}`, code: 'invalid', field });

/**
 * Checks the request against the corner and its car model (400 naming the field), then stores the exploration and
 * queues its chunks. The car model's keep-out volumes, when it has any, are a constraint of every variant (checked
 * through the travel, and at the steering lock when the axle steers); its steering gives the steering ratio.
 */
export async function startExploration(geometry: CornerGeometry, ids: { cornerId: string; revisionId: string; userId: string }, input: ExploreRequest, car: CarPackaging | null = null) {
	const points = joinRocker(geometry.points, geometry.rocker);
	input.coordinates.forEach((c, i) => {
		if (!points[c.point]) bad(`coordinates.${i}.point`, `this corner (${geometry.kind}) has no point ${c.point}`);
	});
	const missing = measuresNotApplying(geometry.kind, points);
	const steers = kindSpec(geometry.kind).steers;
	input.measures.forEach((m, i) => {
		if ((m === 'rc_height' || m === 'rc_migration') && missing.has('rc_height')) bad(`measures.${i}`, `this corner (${geometry.kind}) gives no roll centre`);
		if (m === 'motion_ratio' && missing.has('motion_ratio')) bad(`measures.${i}`, `this corner (${geometry.kind}) gives no motion ratio (it has no spring or damper)`);
		if (m === 'steer_ratio' && !steers) bad(`measures.${i}`, `this corner kind (${geometry.kind}) does not steer`);
		if (m === 'steer_ratio' && !car?.steering) bad(`measures.${i}`, "the steering ratio needs the car model's steering (rack travel per turn); give the car a model with it first");
	});
	const volumes = car?.keepOut ?? [];
	const steering = steers ? (car?.steering ?? null) : null;
	const lockRack = steering ? (input.steeringLock * steering.rack_travel_per_turn) / 360 : 0;
	const wantsRatio = input.measures.includes('steer_ratio');
	const packaging: PackagingSpec | undefined =
		volumes.length || wantsRatio
			? {
					volumes,
					racks: lockRack && volumes.length ? [-lockRack, lockRack] : [],
					moved: [...new Set(input.coordinates.map((c) => c.point))],
					ratio: wantsRatio && steering ? { perTurn: steering.rack_travel_per_turn, lockRack } : null
				}
			: undefined;
	const spec: ExploreSpec = {
		plan: input.plan,
		coords: input.coordinates.map((c) => ({ point: c.point, axis: AXIS_NAMES.indexOf(c.axis) as 0 | 1 | 2, from: c.from, to: c.to })),
		variants: input.variants,
		levels: input.levels,
		seed: input.seed,
		grid: input.travel,
		rollCentre: !missing.has('rc_height'),
		motionRatio: !missing.has('motion_ratio'),
		measures: input.measures,
		...(packaging ? { packaging } : {})
	};
	const variants = variantCount(spec);
	if (spec.plan === 'factorial') spec.variants = variants;
	try {
		exploreEvaluator(geometry, spec);
	} catch (e) {
		const message = (e as Error).message;
		if (packaging && /steering lock|steered to lock/.test(message)) bad('steeringLock', message);
		bad('travel', message);
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
		measures: measuresOf(spec),
		keepOut: (spec.packaging?.volumes ?? []).map((v) => v.name),
		createdAt: row.createdAt,
		finishedAt: row.finishedAt
	};
}

/** Variant `idx`'s moves (mm, rounded to µm), as the save path takes them. */
export function movesOf(spec: ExploreSpec, idx: number) {
	const off = variantOffsets(spec, idx);
	return spec.coords.map((c, j) => ({ point: c.point, axis: AXIS_NAMES[c.axis], move: Math.round(off[j] * 1000) / 1000 }));
}
