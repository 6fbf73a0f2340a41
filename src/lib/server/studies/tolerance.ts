// Frame: ISO 8855 vehicle axes, x forward, y left, z up; tolerances and moves in mm, angles in degrees.
// Tolerance study: every toleranced point displaced at random (fixed seed, so a study repeats exactly),
// the heave sweep solved for each sample, and per travel position the min–max and 5–95 % bands of each
// measure's change from design (static toe and camber are set at alignment, so the change is what the
// brackets decide). Beside it the first-order propagation through the sensitivities (law of propagation
// of uncertainty, JCGM 100:2008 "GUM", 5.1.2), the share of variance each point causes, and tolerances
// suggested so a chosen measure's 5–95 % band stays inside its target.

import type { CornerInput } from '../kinematics/corner';
import { CornerEvaluator, toChange, type Coordinate, type CurveMeasure, type HeaveGrid } from './evaluate';
import { Random } from './random';
import { curveDerivatives } from './sensitivity';

/** A point's tolerance: ± mm on each axis ('axis'), or a ball of radius mm ('sphere'). */
export interface PointTolerance {
	point: string;
	mm: number;
	mode: 'axis' | 'sphere';
}

/**
 * How an 'axis' tolerance ±t is sampled: 'normal' with σ = t/2 (±t holds about 95 % of parts; common
 * workshop reading of a ± tolerance, no published source), or 'uniform' over ±t (the GUM's rectangular
 * distribution for a bound with nothing else known, JCGM 100:2008 4.3.7, σ = t/√3). A 'sphere' is always
 * uniform in the ball (σ = r/√5 per axis): a joint placed anywhere within r of its mark.
 */
export type Distribution = 'normal' | 'uniform';

export interface ToleranceSpec {
	corner: CornerInput;
	grid: HeaveGrid;
	tolerances: PointTolerance[];
	measures: CurveMeasure[];
	samples: number;
	seed: number;
	distribution: Distribution;
}

/** Variance per axis (mm²) of a tolerance of `mm` in `mode` under `distribution`. */
export function axisVariance(t: PointTolerance, distribution: Distribution): number {
	if (t.mode === 'sphere') return (t.mm * t.mm) / 5;
	return distribution === 'normal' ? (t.mm * t.mm) / 4 : (t.mm * t.mm) / 3;
}

/** The coordinates a spec perturbs: x, y, z of every toleranced point, in order. */
export function toleranceCoordinates(spec: Pick<ToleranceSpec, 'tolerances'>): Coordinate[] {
	return spec.tolerances.flatMap((t) => ([0, 1, 2] as const).map((axis) => ({ point: t.point, axis })));
}

/** Fill `out` (3 per toleranced point) with sample `index`'s displacements (mm); one PRNG stream per sample. */
export function sampleOffsets(spec: ToleranceSpec, index: number, rng: Random, out: Float64Array): void {
	rng.reseed(spec.seed, index);
	spec.tolerances.forEach((t, p) => {
		const o = 3 * p;
		if (t.mode === 'sphere') {
			let x: number, y: number, z: number;
			do {
				x = rng.symmetric();
				y = rng.symmetric();
				z = rng.symmetric();
			} while (x * x + y * y + z * z > 1);
			out[o] = x * t.mm;
			out[o + 1] = y * t.mm;
			out[o + 2] = z * t.mm;
			return;
		}
		for (let a = 0; a < 3; a++) out[o + a] = spec.distribution === 'normal' ? rng.normal() * (t.mm / 2) : rng.symmetric() * t.mm;
	});
}

/** Solved samples: values[(s * measures + j) * count + k] (change from design), ok[s] = 0 when it could not be assembled. */
export interface SampleBlock {
	start: number;
	end: number;
	count: number;
	values: Float64Array;
	ok: Uint8Array;
}

/** Solve samples start…end − 1 of `spec`; `progress(done)` is called every `every` samples. */
export function runSamples(spec: ToleranceSpec, start: number, end: number, progress?: (done: number) => void, every = 100): SampleBlock {
	const ev = new CornerEvaluator(spec.corner, spec.grid, spec.measures);
	const coords = toleranceCoordinates(spec);
	const M = spec.measures.length;
	const n = ev.count;
	const values = new Float64Array((end - start) * M * n);
	const ok = new Uint8Array(end - start);
	const offsets = new Float64Array(coords.length);
	const row = new Float64Array(M * n);
	const rng = new Random(spec.seed);
	for (let s = start; s < end; s++) {
		sampleOffsets(spec, s, rng, offsets);
		if (ev.evaluate(coords, offsets, row)) {
			toChange(row, M, n, ev.design);
			values.set(row, (s - start) * M * n);
			ok[s - start] = 1;
		}
		if (progress && (s - start + 1) % every === 0) progress(s - start + 1);
	}
	return { start, end, count: n, values, ok };
}

/** Bands of one measure at each position (degrees or mm, change from design). */
export interface MeasureBands {
	key: CurveMeasure;
	nominal: number[];
	min: number[];
	max: number[];
	p5: number[];
	p95: number[];
	/** sample standard deviation at each position */
	sd: number[];
	/** first-order standard deviation at each position (GUM 5.1.2 through the sensitivities) */
	sdFirstOrder: number[];
}

/** The p-quantile (0…1) of sorted xs, linear between order statistics (Hyndman and Fan's type 7). */
export function quantile(sorted: Float64Array, p: number): number {
	if (sorted.length === 0) return NaN;
	const h = (sorted.length - 1) * p;
	const lo = Math.floor(h);
	const hi = Math.min(sorted.length - 1, lo + 1);
	return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/** Per-measure bands from the solved blocks (ordered by start) and the nominal change curves. */
export function bands(spec: ToleranceSpec, blocks: SampleBlock[], nominal: Float64Array, firstOrderVar: Float64Array): MeasureBands[] {
	const n = blocks[0]?.count ?? 0;
	const M = spec.measures.length;
	const good = blocks.reduce((s, b) => s + b.ok.reduce((a, v) => a + v, 0), 0);
	const col = new Float64Array(good);
	return spec.measures.map((key, j) => {
		const out: MeasureBands = { key, nominal: [], min: [], max: [], p5: [], p95: [], sd: [], sdFirstOrder: [] };
		for (let k = 0; k < n; k++) {
			let c = 0;
			for (const b of blocks) for (let s = 0; s < b.ok.length; s++) if (b.ok[s]) col[c++] = b.values[(s * M + j) * n + k];
			col.sort();
			let mean = 0;
			for (let i = 0; i < c; i++) mean += col[i];
			mean /= Math.max(1, c);
			let v = 0;
			for (let i = 0; i < c; i++) v += (col[i] - mean) ** 2;
			out.nominal.push(nominal[j * n + k]);
			out.min.push(col[0]);
			out.max.push(col[c - 1]);
			out.p5.push(quantile(col, 0.05));
			out.p95.push(quantile(col, 0.95));
			out.sd.push(Math.sqrt(v / Math.max(1, c - 1)));
			out.sdFirstOrder.push(Math.sqrt(firstOrderVar[j * n + k]));
		}
		return out;
	});
}

/** First-order model: per toleranced point, measure and position the variance it causes (GUM 5.1.2, inputs uncorrelated). */
export interface FirstOrder {
	positions: number[];
	/** v[(p * measures + j) * count + k]: point p's variance contribution (degrees² or mm²) */
	v: Float64Array;
	/** total first-order variance per measure and position: total[j * count + k] */
	total: Float64Array;
	/** per point and measure: Σ_k of its sensitivity² per unit variance (for scaling tolerances) */
	perUnit: Float64Array;
}

/** The first-order propagation of the spec's tolerances through central-difference sensitivities. */
export function firstOrder(spec: ToleranceSpec): FirstOrder {
	const coords = toleranceCoordinates(spec);
	const der = curveDerivatives(spec.corner, spec.grid, spec.measures, coords);
	const n = der.positions.length;
	const M = spec.measures.length;
	const P = spec.tolerances.length;
	const v = new Float64Array(P * M * n);
	const perUnit = new Float64Array(P * M * n);
	const total = new Float64Array(M * n);
	spec.tolerances.forEach((t, p) => {
		const varAxis = axisVariance(t, spec.distribution);
		for (let a = 0; a < 3; a++) {
			const i = 3 * p + a;
			for (let q = 0; q < M * n; q++) {
				const g = der.d[i * M * n + q];
				perUnit[p * M * n + q] += g * g;
				v[p * M * n + q] += g * g * varAxis;
			}
		}
		for (let q = 0; q < M * n; q++) total[q] += v[p * M * n + q];
	});
	return { positions: der.positions, v, total, perUnit };
}

/** Each point's share of one measure's variance, summed over the travel positions (first order), largest first. */
export function varianceShares(spec: ToleranceSpec, fo: FirstOrder, j: number): { point: string; share: number }[] {
	const n = fo.positions.length;
	const M = spec.measures.length;
	let all = 0;
	for (let k = 0; k < n; k++) all += fo.total[j * n + k];
	return spec.tolerances
		.map((t, p) => {
			let s = 0;
			for (let k = 0; k < n; k++) s += fo.v[(p * M + j) * n + k];
			return { point: t.point, share: all > 0 ? s / all : 0 };
		})
		.sort((a, b) => b.share - a.share);
}

/** Standard normal 95th percentile: the 5–95 % band of a normal spread is ±1.645 σ. */
const Z95 = 1.6448536269514722;
/** Suggested tolerances are rounded down to this (mm) and kept within these limits. */
export const SUGGEST_STEP_MM = 0.05;
export const SUGGEST_MIN_MM = 0.05;
export const SUGGEST_MAX_MM = 5;

export interface Suggestion {
	measure: CurveMeasure;
	/** the target band on the change from design, over its travel range (mm) */
	band: [number, number];
	range: [number, number];
	/** null when the nominal curve already leaves the band: no tolerance can keep it inside */
	points: { point: string; mm: number; mode: 'axis' | 'sphere' }[] | null;
	reason: string;
}

/**
 * Suggested tolerances (the rule): equal effect per point. At each position k in the range the margin m_k is
 * the distance from the nominal change to the nearer band edge; the first-order σ_k must keep 1.645 σ_k ≤ m_k
 * (a normal 5–95 % band inside the target). Each of the P points gets an equal share of σ_k², so point p may
 * have t_p(k) = (m_k / 1.645) / √(P · S_pk · c), S_pk its summed squared sensitivity and c the variance per
 * unit tolerance² of its mode; t_p is the smallest over k, rounded down to 0.05 mm within 0.05…5 mm.
 */
export function suggestTolerances(spec: ToleranceSpec, fo: FirstOrder, measure: CurveMeasure, band: [number, number], range: [number, number], nominal: Float64Array): Suggestion {
	const j = spec.measures.indexOf(measure);
	const n = fo.positions.length;
	const M = spec.measures.length;
	const P = spec.tolerances.length;
	const limit = spec.tolerances.map(() => Infinity);
	for (let k = 0; k < n; k++) {
		const x = fo.positions[k];
		if (x < range[0] - 1e-9 || x > range[1] + 1e-9) continue;
		const c = nominal[j * n + k];
		const margin = Math.min(band[1] - c, c - band[0]);
		if (margin < 0) return { measure, band, range, points: null, reason: `the nominal curve leaves the band at ${x} mm: no tolerance keeps it inside` };
		spec.tolerances.forEach((t, p) => {
			const s = fo.perUnit[(p * M + j) * n + k] * axisVariance({ ...t, mm: 1 }, spec.distribution);
			if (s > 0) limit[p] = Math.min(limit[p], margin / Z95 / Math.sqrt(P * s));
		});
	}
	const points = spec.tolerances.map((t, p) => ({
		point: t.point,
		mode: t.mode,
		mm: Math.round(100 * Math.min(SUGGEST_MAX_MM, Math.max(SUGGEST_MIN_MM, Math.floor(limit[p] / SUGGEST_STEP_MM + 1e-9) * SUGGEST_STEP_MM))) / 100
	}));
	return { measure, band, range, points, reason: 'equal effect per point, first order, 5–95 % band inside the target' };
}

/** The nominal change-from-design curves of spec's measures (no displacement). */
export function nominalCurves(spec: ToleranceSpec): Float64Array {
	const ev = new CornerEvaluator(spec.corner, spec.grid, spec.measures);
	const out = new Float64Array(spec.measures.length * ev.count);
	ev.evaluate([], [], out);
	return toChange(out, spec.measures.length, ev.count, ev.design);
}

/** Split samples 0…n − 1 into `parts` contiguous ranges. */
export function splitRange(n: number, parts: number): [number, number][] {
	const out: [number, number][] = [];
	for (let i = 0; i < parts; i++) {
		const a = Math.floor((n * i) / parts);
		const b = Math.floor((n * (i + 1)) / parts);
		if (b > a) out.push([a, b]);
	}
	return out;
}
