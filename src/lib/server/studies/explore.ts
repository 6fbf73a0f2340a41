// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm; angles in degrees.
// Design-space exploration: up to 10 point coordinates, each moved over a range, sampled by a plan (Latin
// hypercube, Sobol sequence or full factorial); every variant is swept in heave and reduced to a few measures.
// A variant's offsets are a pure function of (plan, seed, index), so any chunk can be solved anywhere, in any
// order, by any number of workers, with identical results.

import { CornerEvaluator, type Coordinate, type CurveMeasure, type HeaveGrid } from './evaluate';
import type { CornerInput } from '../kinematics/corner';
import type { PackagingSpec } from './packaging';
import { Random } from './random';

export const MAX_COORDINATES = 10;
export const MAX_VARIANTS = 1_000_000;
/** Variants per queued job (common practice, no source: large enough that the queue's overhead is small). */
export const DEFAULT_CHUNK = 2000;

export type SamplingPlan = 'lhs' | 'sobol' | 'factorial';

export interface ExploreCoordinate extends Coordinate {
	/** offset range from the point's current position, mm (from < to) */
	from: number;
	to: number;
}

export interface ExploreSpec {
	plan: SamplingPlan;
	coords: ExploreCoordinate[];
	/** variants for lhs and sobol; factorial uses levels^coords */
	variants: number;
	/** levels per coordinate for the factorial plan */
	levels: number;
	seed: number;
	grid: HeaveGrid;
	/** whether the corner gives a roll centre and a motion ratio (false: those measures stay empty) */
	rollCentre?: boolean;
	motionRatio?: boolean;
	/** the measures kept (absent: the first five, as before measures were chosen) */
	measures?: ExploreMeasure[];
	/**
	 * the car model's packaging: keep-out volumes checked through the travel (and at the steering lock), and the
	 * steering system for the steering ratio; absent: neither
	 */
	packaging?: PackagingSpec;
}

/** The measures a variant can have, in this order (its row in ChunkResult.values). */
export const EXPLORE_MEASURES = ['toe_rms', 'camber_gain', 'rc_height', 'rc_migration', 'motion_ratio', 'steer_ratio'] as const;
export type ExploreMeasure = (typeof EXPLORE_MEASURES)[number];
export const EXPLORE_MEASURE_INFO: Record<ExploreMeasure, { label: string; unit: string }> = {
	toe_rms: { label: 'Toe change RMS over the travel', unit: '°' },
	camber_gain: { label: 'Camber gain at design', unit: '°/mm' },
	rc_height: { label: 'Roll-centre height at design', unit: 'mm' },
	rc_migration: { label: 'Roll-centre migration over the travel (max − min)', unit: 'mm' },
	motion_ratio: { label: 'Motion ratio at design', unit: '' },
	steer_ratio: { label: 'Steering ratio at straight ahead (steering-wheel ° per road-wheel °)', unit: '' }
};
/** What a study keeps when it does not say (the spec of explorations queued before measures were chosen). */
export const DEFAULT_MEASURES: ExploreMeasure[] = ['toe_rms', 'camber_gain', 'rc_height', 'rc_migration', 'motion_ratio'];

/** The measures a study keeps, in EXPLORE_MEASURES order. */
export function measuresOf(spec: Pick<ExploreSpec, 'measures'>): ExploreMeasure[] {
	const want = new Set(spec.measures ?? DEFAULT_MEASURES);
	return EXPLORE_MEASURES.filter((m) => want.has(m));
}

/** How many variants a spec has. */
export function variantCount(spec: Pick<ExploreSpec, 'plan' | 'variants' | 'levels' | 'coords'>): number {
	return spec.plan === 'factorial' ? Math.pow(spec.levels, spec.coords.length) : spec.variants;
}

// ---------- sampling ----------

/** A 32-bit integer hash (the SplitMix32 finaliser). */
function mix32(z: number): number {
	z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
	z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
	return (z ^ (z >>> 16)) >>> 0;
}

/**
 * A seeded permutation of [0, n) evaluated at one index without building it: a four-round Feistel network on the
 * smallest even bit width holding n, with cycle-walking back into range (Black & Rogaway, "Ciphers with arbitrary
 * finite domains", CT-RSA 2002). A bijection, so every index has its own image.
 */
export function permuteIndex(i: number, n: number, key: number): number {
	let bits = 2;
	while (1 << bits < n) bits += 2;
	const half = bits >>> 1;
	const mask = (1 << half) - 1;
	let x = i;
	do {
		let l = x >>> half;
		let r = x & mask;
		for (let round = 0; round < 4; round++) {
			const f = mix32((r ^ mix32(key + round * 0x9e3779b9)) >>> 0) & mask;
			const t = l ^ f;
			l = r;
			r = t;
		}
		x = (l << half) | r;
	} while (x >= n);
	return x;
}

/** Sobol direction numbers for dimensions 2–10 (Joe & Kuo 2008, new-joe-kuo-6.21201: s, a, m_1..m_s). */
const JOE_KUO: [number, number, number[]][] = [
	[1, 0, [1]],
	[2, 1, [1, 3]],
	[3, 1, [1, 3, 1]],
	[3, 2, [1, 1, 1]],
	[4, 1, [1, 1, 3, 3]],
	[4, 4, [1, 3, 5, 13]],
	[5, 2, [1, 1, 5, 5, 17]],
	[5, 4, [1, 1, 5, 5, 5]],
	[5, 7, [1, 1, 7, 11, 19]]
];

/** 32 direction numbers per dimension (dimension 1 is the van der Corput sequence in base 2). */
const SOBOL_V: Uint32Array[] = (() => {
	const out: Uint32Array[] = [];
	const first = new Uint32Array(32);
	for (let k = 0; k < 32; k++) first[k] = (1 << (31 - k)) >>> 0;
	out.push(first);
	for (const [s, a, m0] of JOE_KUO) {
		const m = [...m0];
		for (let k = s; k < 32; k++) {
			let v = m[k - s] ^ (m[k - s] << s);
			for (let b = 1; b < s; b++) if ((a >>> (s - 1 - b)) & 1) v ^= m[k - b] << b;
			m.push(v);
		}
		const v = new Uint32Array(32);
		for (let k = 0; k < 32; k++) v[k] = (m[k] * Math.pow(2, 31 - k)) >>> 0;
		out.push(v);
	}
	return out;
})();

/** The i-th point (Gray-code order, point 0 = origin) of dimension d of the unscrambled Sobol sequence, in [0, 1). */
export function sobolPoint(i: number, d: number): number {
	const g = (i ^ (i >>> 1)) >>> 0;
	const v = SOBOL_V[d];
	let x = 0;
	for (let b = 0; b < 32 && g >>> b; b++) if ((g >>> b) & 1) x ^= v[b];
	return (x >>> 0) / 4294967296;
}

/**
 * Variant i's position in the unit cube, one value per coordinate into `out`.
 * - lhs: Latin hypercube (McKay, Beckman & Conover, Technometrics 21(2), 1979): coordinate j's stratum is a seeded
 *   permutation of the variant index, the point uniform inside it.
 * - sobol: the Sobol sequence, digitally shifted by a seeded 32-bit word per dimension (seed 0: no shift).
 * - factorial: level digits of i in mixed radix, spread evenly from 0 to 1.
 */
export function unitSample(spec: ExploreSpec, i: number, out: Float64Array, rng = new Random(0)): void {
	const k = spec.coords.length;
	if (spec.plan === 'lhs') {
		const n = spec.variants;
		rng.reseed(spec.seed, i);
		for (let j = 0; j < k; j++) {
			const stratum = permuteIndex(i, n, mix32((spec.seed ^ mix32(j + 1)) >>> 0));
			out[j] = (stratum + rng.uniform()) / n;
		}
	} else if (spec.plan === 'sobol') {
		for (let j = 0; j < k; j++) {
			const shift = spec.seed === 0 ? 0 : mix32((spec.seed ^ mix32(j + 101)) >>> 0);
			const g = (i ^ (i >>> 1)) >>> 0;
			const v = SOBOL_V[j];
			let x = shift;
			for (let b = 0; b < 32 && g >>> b; b++) if ((g >>> b) & 1) x ^= v[b];
			out[j] = (x >>> 0) / 4294967296;
		}
	} else {
		const L = spec.levels;
		let r = i;
		for (let j = 0; j < k; j++) {
			out[j] = L > 1 ? (r % L) / (L - 1) : 0.5;
			r = Math.floor(r / L);
		}
	}
}

/** Variant i's offsets in mm. */
export function variantOffsets(spec: ExploreSpec, i: number, out = new Float64Array(spec.coords.length), rng = new Random(0)): Float64Array {
	unitSample(spec, i, out, rng);
	for (let j = 0; j < spec.coords.length; j++) {
		const c = spec.coords[j];
		out[j] = c.from + (c.to - c.from) * out[j];
	}
	return out;
}

// ---------- solving ----------

type CurveSpec = Pick<ExploreSpec, 'rollCentre' | 'motionRatio' | 'measures'>;

/** The curves a study solves: only those its chosen measures need (the roll centre and motion ratio where the corner gives them). */
function curvesOf(spec: CurveSpec): CurveMeasure[] {
	const m = new Set(measuresOf(spec));
	const out: CurveMeasure[] = [];
	if (m.has('toe_rms')) out.push('toe');
	if (m.has('camber_gain')) out.push('camber');
	if (spec.rollCentre !== false && (m.has('rc_height') || m.has('rc_migration'))) out.push('rc_height');
	if (spec.motionRatio !== false && m.has('motion_ratio')) out.push('motion_ratio');
	return out;
}

/** The evaluator for a study: the corner swept over the grid for its curves (throws when it cannot be assembled as it is). */
export function exploreEvaluator(corner: CornerInput, spec: Pick<ExploreSpec, 'grid' | 'packaging'> & CurveSpec): CornerEvaluator {
	return new CornerEvaluator(corner, spec.grid, curvesOf(spec), spec.packaging);
}

/** One chunk's results: per variant a 1 (assembles over the whole range) or 0, and the measures (NaN when not kept or not assembled). */
export interface ChunkResult {
	first: number;
	count: number;
	ok: Uint8Array;
	/** count × EXPLORE_MEASURES.length, row-major */
	values: Float64Array;
	/** per variant 1 clear of every keep-out volume, 0 reaching into one (meaningful where ok); null: no volumes checked */
	clear: Uint8Array | null;
}

/** Variants [first, first + count) of the study, solved; only the chosen measures are filled in. */
export function solveChunk(ev: CornerEvaluator, spec: ExploreSpec, first: number, count: number): ChunkResult {
	const m = EXPLORE_MEASURES.length;
	const n = ev.count;
	const d = ev.design;
	const names = curvesOf(spec);
	const keep = new Set(measuresOf(spec));
	const curves = new Float64Array(names.length * n);
	const toe = names.indexOf('toe') * n;
	const camber = names.indexOf('camber') * n;
	const rc = names.indexOf('rc_height') * n;
	const mr = names.indexOf('motion_ratio') * n;
	const pk = ev.packaging;
	const volumes = pk ? pk.spec.volumes.length : 0;
	const depths = pk ? new Float64Array(volumes * pk.rows) : undefined;
	const ratios = pk ? new Float64Array(pk.ratioCount) : undefined;
	const steer = keep.has('steer_ratio') && pk && pk.ratioCount > 0 ? pk.ratioCount >>> 1 : -1;
	const want = { toe: toe >= 0, camber: camber >= 0, rcHeight: rc >= 0 && keep.has('rc_height'), rcMigration: rc >= 0 && keep.has('rc_migration'), mr: mr >= 0 };
	const offsets = new Float64Array(spec.coords.length);
	const rng = new Random(0);
	const ok = new Uint8Array(count);
	const clear = volumes > 0 ? new Uint8Array(count) : null;
	const values = new Float64Array(count * m).fill(NaN);
	const h = ev.positions;
	for (let v = 0; v < count; v++) {
		variantOffsets(spec, first + v, offsets, rng);
		if (!ev.evaluate(spec.coords, offsets, curves, depths, ratios)) continue;
		ok[v] = 1;
		const o = v * m;
		if (want.toe) {
			let ss = 0;
			for (let p = 0; p < n; p++) {
				const dt = curves[toe + p] - curves[toe + d];
				ss += dt * dt;
			}
			values[o] = Math.sqrt(ss / n);
		}
		if (want.camber) {
			const lo = Math.max(0, d - 1);
			const hi = Math.min(n - 1, d + 1);
			values[o + 1] = (curves[camber + hi] - curves[camber + lo]) / (h[hi] - h[lo]);
		}
		if (want.rcHeight) values[o + 2] = curves[rc + d];
		if (want.rcMigration) {
			let rcMin = Infinity;
			let rcMax = -Infinity;
			for (let p = 0; p < n; p++) {
				const r = curves[rc + p];
				if (r < rcMin) rcMin = r;
				if (r > rcMax) rcMax = r;
			}
			values[o + 3] = rcMax - rcMin;
		}
		if (want.mr) values[o + 4] = curves[mr + d];
		if (steer >= 0) values[o + 5] = ratios![steer];
		if (clear) {
			let deepest = -Infinity;
			for (let i = 0; i < depths!.length; i++) if (depths![i] > deepest) deepest = depths![i];
			clear[v] = deepest <= 0 ? 1 : 0;
		}
	}
	return { first, count, ok, values, clear };
}

// ---------- Pareto front ----------

/**
 * Indices (into xs/ys) of the Pareto front of two objectives, both minimised (negate one to maximise): the
 * points no other point is at least as good as in both and better in one. Sort by x then y, keep each point whose
 * y is below every y seen before it. O(n log n).
 */
export function paretoFront(xs: ArrayLike<number>, ys: ArrayLike<number>): number[] {
	const idx = Array.from({ length: xs.length }, (_, i) => i).filter((i) => Number.isFinite(xs[i]) && Number.isFinite(ys[i]));
	idx.sort((a, b) => xs[a] - xs[b] || ys[a] - ys[b] || a - b);
	const out: number[] = [];
	let best = Infinity;
	let lastX = NaN;
	let lastY = NaN;
	for (const i of idx) {
		if (ys[i] < best) {
			out.push(i);
			best = ys[i];
			lastX = xs[i];
			lastY = ys[i];
		} else if (xs[i] === lastX && ys[i] === lastY) {
			out.push(i); // an exact duplicate of a front point is not dominated either
		}
	}
	return out;
}

/**
 * Indices of the Pareto front of any number of objectives, all minimised (negate one to maximise): the points no
 * other point is at least as good as in every objective and better in one. Points with a non-finite objective are
 * left out; exact duplicates of a front point are kept (neither dominates the other).
 * Sorted lexicographically, a point can only be dominated by one before it, and (dominance being transitive) then by
 * one already on the front; so each point is checked against the front so far: O(n log n + n × front).
 */
export function paretoFrontN(objectives: ArrayLike<number>[]): number[] {
	const k = objectives.length;
	if (k === 2) return paretoFront(objectives[0], objectives[1]);
	const n = k ? objectives[0].length : 0;
	const idx: number[] = [];
	outer: for (let i = 0; i < n; i++) {
		for (let j = 0; j < k; j++) if (!Number.isFinite(objectives[j][i])) continue outer;
		idx.push(i);
	}
	idx.sort((a, b) => {
		for (let j = 0; j < k; j++) {
			const d = objectives[j][a] - objectives[j][b];
			if (d) return d;
		}
		return a - b;
	});
	const front: number[] = [];
	for (const i of idx) {
		let dominated = false;
		for (let f = front.length - 1; f >= 0 && !dominated; f--) {
			const q = front[f];
			let le = true;
			let lt = false;
			for (let j = 0; j < k && le; j++) {
				const a = objectives[j][q];
				const b = objectives[j][i];
				if (a > b) le = false;
				else if (a < b) lt = true;
			}
			dominated = le && lt;
		}
		if (!dominated) front.push(i);
	}
	return front;
}
