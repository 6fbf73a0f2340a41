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
	motion_ratio: explorationVariants.motionRatio,
	steer_ratio: explorationVariants.steerRatio
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

/**
 * For a worker: the exploration's status and size, and with `full` its spec and the revision's geometry (no user;
 * workers are trusted).
 */
export async function explorationForWorker(db: Database, id: string, full = true) {
	const base = { status: explorations.status, chunkSize: explorations.chunkSize, variants: explorations.variants };
	if (!full) {
		const [row] = await db.select(base).from(explorations).where(eq(explorations.id, id));
		return row ? { ...row, spec: null, geometry: null } : null;
	}
	const [row] = await db
		.select({ ...base, spec: explorations.spec, geometry: revisions.geometry })
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
			done: explorations.chunksDone
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

/** A solved chunk as storeChunk takes it: per variant ok, the measures (row-major, `measures` a row) and keep-out clearance. */
export interface StoredChunk {
	ok: Uint8Array;
	values: Float64Array;
	measures: number;
	clear: Uint8Array | null;
}

/**
 * Stores one solved chunk in one statement (so one transaction and one round trip): the chunk's row (keyed by
 * exploration + chunk), and only when that row is new, its variants (unnest of one array per column, measures in
 * VARIANT_COLUMNS order, null for NaN), the study's counter of chunks done up by one (the study marked done when it
 * reaches the count) and a NOTIFY for the progress stream. A chunk solved twice (a worker killed after writing, a
 * retried job) adds nothing the second time.
 * The counter's update is the only lock on the study's row (no key update: the foreign-key check of other chunks'
 * rows shares it), so two chunks committing at once queue there for a moment, never deadlock, and the second counts
 * on from the first's committed value. True when this call wrote the chunk.
 */
export async function storeChunk(db: Database, id: string, chunk: number, first: number, r: StoredChunk) {
	const { ok, values, measures, clear } = r;
	let feasible = 0;
	for (let i = 0; i < ok.length; i++) feasible += ok[i];
	const n = ok.length;
	const idx = `{${Array.from({ length: n }, (_, i) => first + i).join(',')}}`;
	const oks = `{${Array.from(ok, (v) => (v ? 't' : 'f')).join(',')}}`;
	const clears = clear ? `{${Array.from(clear, (v, i) => (ok[i] ? (v ? 't' : 'f') : 'NULL')).join(',')}}` : null;
	const col = (j: number) => arrayLiteral(values, measures, j, n);
	const [row] = (await db.execute(sql`with c as (
			insert into exploration_chunks (exploration_id, chunk, feasible) values (${id}::uuid, ${chunk}, ${feasible})
			on conflict do nothing returning chunk
		), v as (
			insert into exploration_variants (exploration_id, idx, ok, toe_rms, camber_gain, rc_height, rc_migration, motion_ratio, steer_ratio, clear)
			select ${id}::uuid, u.* from unnest(${idx}::int[], ${oks}::bool[], ${col(0)}::real[], ${col(1)}::real[], ${col(2)}::real[], ${col(3)}::real[], ${col(4)}::real[],
				${col(5)}::real[], ${clears}::bool[]) as u where exists (select 1 from c)
		), s as (
			update explorations set chunks_done = chunks_done + 1,
				status = case when status = 'queued' and chunks_done + 1 >= chunks then 'done' else status end,
				finished_at = case when status = 'queued' and chunks_done + 1 >= chunks then now() else finished_at end
			where id = ${id}::uuid and exists (select 1 from c) returning id
		)
		select (select count(*)::int from c) as wrote, (select count(*)::int from s where pg_notify(${PROGRESS_CHANNEL}, ${id}) is not null) as notified`)) as unknown as { wrote: number }[];
	return row.wrote > 0;
}

export interface VariantQuery {
	sort: VariantColumn | 'idx';
	dir: 'asc' | 'desc';
	offset: number;
	limit: number;
	/** which variants: all, those that assemble, those that assemble clear of the keep-out volumes, or those that reach into one */
	ok: 'all' | 'assembles' | 'clear' | 'blocked';
	/** optional range filters on measures */
	filters: { column: VariantColumn; min?: number; max?: number }[];
}

/** One page of an exploration's variants, sorted and filtered in the database, with the total matching. */
export async function variantsPage(db: Database, id: string, q: VariantQuery) {
	const conds = [eq(explorationVariants.explorationId, id)];
	if (q.ok !== 'all') conds.push(eq(explorationVariants.ok, true));
	// a study without volumes has clear null: every variant that assembles is clear
	if (q.ok === 'clear') conds.push(sql`${explorationVariants.clear} is not false`);
	if (q.ok === 'blocked') conds.push(eq(explorationVariants.clear, false));
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
			motion_ratio: explorationVariants.motionRatio,
			steer_ratio: explorationVariants.steerRatio,
			clear: explorationVariants.clear
		})
		.from(explorationVariants)
		.where(where)
		.orderBy(order, asc(explorationVariants.idx))
		.limit(q.limit)
		.offset(q.offset);
	const [{ total }] = await db.select({ total: sql<number>`count(*)::int` }).from(explorationVariants).where(where);
	return { rows, total };
}

/** Some measures of every variant that assembles (for the scatter and the Pareto front), by index; `clearOnly`: clear of the keep-out volumes too. */
export async function variantColumns(db: Database, id: string, columns: VariantColumn[], clearOnly = false) {
	const pick: Record<string, (typeof VARIANT_COLUMNS)[VariantColumn]> = {};
	for (const c of columns) pick[c] = VARIANT_COLUMNS[c];
	const conds = [eq(explorationVariants.explorationId, id), eq(explorationVariants.ok, true)];
	if (clearOnly) conds.push(sql`${explorationVariants.clear} is not false`);
	return (await db
		.select({ idx: explorationVariants.idx, clear: explorationVariants.clear, ...pick })
		.from(explorationVariants)
		.where(and(...conds))
		.orderBy(asc(explorationVariants.idx))) as ({ idx: number; clear: boolean | null } & Record<VariantColumn, number | null>)[];
}

/**
 * An even sample of at most `sample` variants that assemble (every k-th by index, chosen in the database), with the
 * given measures: the scatter-plot matrix.
 */
export async function variantSample(db: Database, id: string, columns: VariantColumn[], sample: number) {
	const where = and(eq(explorationVariants.explorationId, id), eq(explorationVariants.ok, true));
	const [{ total }] = await db.select({ total: sql<number>`count(*)::int` }).from(explorationVariants).where(where);
	const step = Math.max(1, Math.ceil(total / sample));
	// the measure columns are named as in VARIANT_COLUMNS' keys (the API's names), so only those names reach the SQL
	const cols = sql.raw(columns.filter((c) => c in VARIANT_COLUMNS).map((c) => `, ${VARIANT_COLUMNS[c].name}`).join(''));
	const rows = await db.execute(sql`select idx, clear${cols} from (
			select *, row_number() over (order by idx) - 1 as rn from exploration_variants where exploration_id = ${id}::uuid and ok
		) s where rn % ${step} = 0 order by idx`);
	return { total, rows: rows as unknown as ({ idx: number; clear: boolean | null } & Record<VariantColumn, number | null>)[] };
}

/** One variant's row, or null. */
export async function variantOf(db: Database, id: string, idx: number) {
	const [row] = await db
		.select()
		.from(explorationVariants)
		.where(and(eq(explorationVariants.explorationId, id), eq(explorationVariants.idx, idx)));
	return row ?? null;
}
