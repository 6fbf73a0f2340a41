// Design-space explorations: the study row, its solved chunks (one row each, written once) and its variants.
import { and, asc, desc, eq, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { cars, corners, explorationChunks, explorations, explorationVariants, memberships, revisions } from '../schema';

/** The measure columns a caller may sort, filter or plot by (API name → column). */
export const VARIANT_COLUMNS = {
	toe_rms: explorationVariants.toeRms,
	camber_gain: explorationVariants.camberGain,
	rc_height: explorationVariants.rcHeight,
	rc_migration: explorationVariants.rcMigration,
	motion_ratio: explorationVariants.motionRatio
} as const;
export type VariantColumn = keyof typeof VARIANT_COLUMNS;

export interface NewExploration {
	cornerId: string;
	revisionId: string;
	spec: Record<string, unknown>;
	variants: number;
	chunkSize: number;
	chunks: number;
	createdBy: string;
}

export async function createExploration(db: Database, e: NewExploration) {
	const [row] = await db.insert(explorations).values(e).returning();
	return row;
}

/** Removes an exploration (its jobs could not be queued: nothing half-saved). */
export async function deleteExploration(db: Database, id: string) {
	await db.delete(explorations).where(eq(explorations.id, id));
}

/** The exploration (with corner and car) if the user is a member of its team, with the user's role; else null. */
export async function explorationForUser(db: Database, userId: string, id: string) {
	const [row] = await db
		.select({ exploration: explorations, corner: corners, car: cars, role: memberships.role })
		.from(explorations)
		.innerJoin(corners, eq(corners.id, explorations.cornerId))
		.innerJoin(cars, eq(cars.id, corners.carId))
		.innerJoin(memberships, and(eq(memberships.teamId, cars.teamId), eq(memberships.userId, userId)))
		.where(eq(explorations.id, id))
		.limit(1);
	return row ?? null;
}

/** For a worker: the exploration's spec, status and the revision's geometry (no user; workers are trusted). */
export async function explorationForWorker(db: Database, id: string) {
	const [row] = await db
		.select({ spec: explorations.spec, status: explorations.status, chunkSize: explorations.chunkSize, variants: explorations.variants, geometry: revisions.geometry })
		.from(explorations)
		.innerJoin(revisions, eq(revisions.id, explorations.revisionId))
		.where(eq(explorations.id, id));
	return row ?? null;
}

/** A corner's explorations, newest first. */
export function explorationsOfCorner(db: Database, cornerId: string) {
	return db
		.select({
			id: explorations.id,
			variants: explorations.variants,
			chunks: explorations.chunks,
			status: explorations.status,
			createdAt: explorations.createdAt,
			done: sql<number>`(select count(*)::int from exploration_chunks c where c.exploration_id = "explorations"."id")`
		})
		.from(explorations)
		.where(eq(explorations.cornerId, cornerId))
		.orderBy(desc(explorations.createdAt))
		.limit(20);
}

/** Chunks done and variants that assemble so far. */
export async function explorationProgress(db: Database, id: string) {
	const [row] = await db
		.select({ done: sql<number>`count(*)::int`, feasible: sql<number>`coalesce(sum(${explorationChunks.feasible}), 0)::int` })
		.from(explorationChunks)
		.where(eq(explorationChunks.explorationId, id));
	return row;
}

/** Marks a queued exploration cancelled; false when it had already finished. */
export async function cancelExploration(db: Database, id: string) {
	const rows = await db
		.update(explorations)
		.set({ status: 'cancelled', finishedAt: sql`now()` })
		.where(and(eq(explorations.id, id), eq(explorations.status, 'queued')))
		.returning({ id: explorations.id });
	if (rows.length) await db.execute(sql`select pg_notify(${PROGRESS_CHANNEL}, ${id})`);
	return rows.length > 0;
}

/** The LISTEN/NOTIFY channel of exploration progress: the payload is the exploration's id. */
export const PROGRESS_CHANNEL = 'exploration_progress';

/** Listens for progress on the driver's own listening connection; returns a function that stops listening. */
export async function listenProgress(client: { listen: (channel: string, fn: (payload: string) => void) => Promise<{ unlisten: () => Promise<void> }> }, fn: (id: string) => void) {
	const { unlisten } = await client.listen(PROGRESS_CHANNEL, fn);
	return unlisten;
}

/** Marks an exploration failed with a reason (a corner the worker cannot solve at all). */
export async function failExploration(db: Database, id: string, error: string) {
	await db.update(explorations).set({ status: 'failed', error, finishedAt: sql`now()` }).where(and(eq(explorations.id, id), eq(explorations.status, 'queued')));
}

/** A Postgres array literal of numbers, null for NaN. */
function arrayLiteral(values: ArrayLike<number>, step = 1, offset = 0, count = values.length): string {
	const parts: string[] = [];
	for (let i = 0; i < count; i++) {
		const v = values[i * step + offset];
		parts.push(Number.isFinite(v) ? String(v) : 'NULL');
	}
	return `{${parts.join(',')}}`;
}

/**
 * Stores one solved chunk in one transaction: the chunk's row first (keyed by exploration + chunk), and only when
 * that row is new, its variants (one batched insert through unnest); then the exploration is marked done when this
 * was the last chunk. A chunk solved twice (a worker killed after writing, a retried job) adds nothing the second time.
 * True when this call wrote the chunk.
 */
export async function storeChunk(db: Database, id: string, chunk: number, first: number, ok: Uint8Array, values: Float64Array, measures: number) {
	return db.transaction(async (tx) => {
		const feasible = ok.reduce((a, b) => a + b, 0);
		const inserted = await tx.insert(explorationChunks).values({ explorationId: id, chunk, feasible }).onConflictDoNothing().returning({ chunk: explorationChunks.chunk });
		if (inserted.length === 0) return false;
		const n = ok.length;
		const idx = `{${Array.from({ length: n }, (_, i) => first + i).join(',')}}`;
		const oks = `{${Array.from(ok, (v) => (v ? 't' : 'f')).join(',')}}`;
		await tx.execute(sql`insert into exploration_variants (exploration_id, idx, ok, toe_rms, camber_gain, rc_height, rc_migration, motion_ratio)
			select ${id}::uuid, * from unnest(${idx}::int[], ${oks}::bool[], ${arrayLiteral(values, measures, 0, n)}::real[], ${arrayLiteral(values, measures, 1, n)}::real[],
				${arrayLiteral(values, measures, 2, n)}::real[], ${arrayLiteral(values, measures, 3, n)}::real[], ${arrayLiteral(values, measures, 4, n)}::real[])`);
		// The study's row is locked before counting, so of two chunks committing at once the second sees the first
		// (without it, each transaction counts only its own new chunk and neither marks the study done).
		await tx.execute(sql`select 1 from explorations where id = ${id}::uuid for update`);
		await tx.execute(sql`update explorations set status = 'done', finished_at = now()
			where id = ${id}::uuid and status = 'queued' and chunks = (select count(*) from exploration_chunks where exploration_id = ${id}::uuid)`);
		// delivered at commit to every app instance listening (the progress stream)
		await tx.execute(sql`select pg_notify(${PROGRESS_CHANNEL}, ${id})`);
		return true;
	});
}

export interface VariantQuery {
	sort: VariantColumn | 'idx';
	dir: 'asc' | 'desc';
	offset: number;
	limit: number;
	/** only variants that assemble */
	okOnly: boolean;
	/** optional range filters on measures */
	filters: { column: VariantColumn; min?: number; max?: number }[];
}

/** One page of an exploration's variants, sorted and filtered in the database, with the total matching. */
export async function variantsPage(db: Database, id: string, q: VariantQuery) {
	const conds = [eq(explorationVariants.explorationId, id)];
	if (q.okOnly) conds.push(eq(explorationVariants.ok, true));
	for (const f of q.filters) {
		const col = VARIANT_COLUMNS[f.column];
		if (f.min !== undefined) conds.push(sql`${col} >= ${f.min}`);
		if (f.max !== undefined) conds.push(sql`${col} <= ${f.max}`);
	}
	const where = and(...conds);
	const sortCol = q.sort === 'idx' ? explorationVariants.idx : VARIANT_COLUMNS[q.sort];
	const order = q.dir === 'asc' ? sql`${sortCol} asc nulls last` : sql`${sortCol} desc nulls last`;
	const rows = await db
		.select({
			idx: explorationVariants.idx,
			ok: explorationVariants.ok,
			toe_rms: explorationVariants.toeRms,
			camber_gain: explorationVariants.camberGain,
			rc_height: explorationVariants.rcHeight,
			rc_migration: explorationVariants.rcMigration,
			motion_ratio: explorationVariants.motionRatio
		})
		.from(explorationVariants)
		.where(where)
		.orderBy(order, asc(explorationVariants.idx))
		.limit(q.limit)
		.offset(q.offset);
	const [{ total }] = await db.select({ total: sql<number>`count(*)::int` }).from(explorationVariants).where(where);
	return { rows, total };
}

/** Two measures of every variant that assembles (for the scatter and the Pareto front), by index. */
export async function variantPairs(db: Database, id: string, x: VariantColumn, y: VariantColumn) {
	return db
		.select({ idx: explorationVariants.idx, x: VARIANT_COLUMNS[x], y: VARIANT_COLUMNS[y] })
		.from(explorationVariants)
		.where(and(eq(explorationVariants.explorationId, id), eq(explorationVariants.ok, true)))
		.orderBy(asc(explorationVariants.idx));
}

/** One variant's row, or null. */
export async function variantOf(db: Database, id: string, idx: number) {
	const [row] = await db
		.select()
		.from(explorationVariants)
		.where(and(eq(explorationVariants.explorationId, id), eq(explorationVariants.idx, idx)));
	return row ?? null;
}
