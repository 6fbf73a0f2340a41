// Frame: ISO 8855 vehicle axes, x forward, y left, z up; moves in mm, measures in degrees or mm.
// Fix search: the moves of chosen point coordinates (within bounds) that bring a corner's heave curves
// back onto a target, by bounded least squares (Levenberg-Marquardt of ml-levenberg-marquardt) from
// several starting points. Residuals: weight × (change from design − target) at every travel position;
// for a band target, weight × the distance outside the band.

import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { AXES, CornerEvaluator, toChange, type Coordinate, type CurveMeasure, type HeaveGrid } from './evaluate';
import type { PackagingSpec, Reach } from './packaging';
import type { CornerInput } from '../kinematics/corner';

/** A free coordinate and its bounds: the move (mm) stays within min…max (min ≤ 0 ≤ max). */
export interface FreeCoordinate extends Coordinate {
	min: number;
	max: number;
}

/** A measure to fit: its target curve of change from design (one per position), or a band on the change. */
export interface FitMeasure {
	key: CurveMeasure;
	weight: number;
	/** target change from design at each grid position (degrees or mm); absent = zero, unless a band is given */
	target?: ArrayLike<number>;
	/** the change should stay within lo…hi over the range */
	band?: [number, number];
}

export interface FixSearchInput {
	corner: CornerInput;
	grid: HeaveGrid;
	free: FreeCoordinate[];
	measures: FitMeasure[];
	/** number of starting points (the corner as it is, then a deterministic spread inside the bounds) */
	starts?: number;
	maxIterations?: number;
	/** keep-out volumes and the steering ratio: moved points and their members stay out of the volumes at every pose */
	packaging?: { spec: PackagingSpec; ratioBand: [number, number] | null; ratioWeight: number };
}

/** One starting point's outcome. */
export interface StartOutcome {
	start: number[];
	moves: number[];
	/** weighted RMS residual; null when the start could not be assembled at all */
	rms: number | null;
	iterations: number;
	/** the keep-out volumes this start's fix still reaches into (empty: clear; absent without volumes) */
	collides?: string[];
}

/** Per measure: the curves (changes from design) and the error against the target. */
export interface FitReport {
	key: CurveMeasure;
	before: number[];
	after: number[];
	target: number[] | null;
	band: [number, number] | null;
	/** RMS and largest absolute error against the target (outside the band for a band), degrees or mm */
	rmsBefore: number;
	maxBefore: number;
	rmsAfter: number;
	maxAfter: number;
}

export interface FixSearchResult {
	positions: number[];
	free: (FreeCoordinate & { move: number; at: boolean })[];
	measures: FitReport[];
	starts: StartOutcome[];
	/** starting points that hit a pose that cannot be assembled, penalised and left */
	rejected: number;
	evaluations: number;
	/** keep-out volumes and steering ratio, when asked for */
	packaging: PackagingReport | null;
}

/** One keep-out volume before and after the fix: where it is reached deepest (depth < 0 is the clearance). */
export interface VolumeReport {
	name: string;
	before: Reach | null;
	after: Reach | null;
	/** after the fix: 'collides' (reaches in), 'limits' (within LIMIT_MM of it: the fit is pressed against it) or 'clear' */
	status: 'collides' | 'limits' | 'clear';
}

/** The packaging side of a fix search. */
export interface PackagingReport {
	/** the members checked (moved points and the rods and arms ending on them) */
	members: string[];
	/** rack positions (mm) at which the travel was checked */
	racks: number[];
	volumes: VolumeReport[];
	/** this wheel's overall steering ratio through the steering range, before and after, and the band held */
	ratio: { angles: number[]; before: number[]; after: number[]; band: [number, number] | null; maxOutside: number } | null;
	/** when every start's fix reaches into a volume: the one that stops the best of them, and how many starts each stopped */
	blocked: { volume: string; member: string; depth: number; travel: number; rack: number; starts: { name: string; count: number }[] } | null;
}

/** Penalty residual (per position) where the corner cannot be assembled: far above any real error. */
const PENALTY = 1e3;
/** A weighted RMS residual below this (degrees or mm) is a fit: far below what a car or a gauge shows. */
const GOOD_ENOUGH = 1e-4;
/** Finite-difference step for the Jacobian (mm): small against bounds, large against solver noise (1e-11 mm). */
const DIFF_MM = 1e-3;
/** Residual per mm of reach into a keep-out volume: 1 mm weighs as 100° of toe, so a fix never trades a collision for a fit. */
const CLEAR_WEIGHT = 100;
/** The fit keeps this far (mm) beyond a volume's surface, so the fix found is clear, not flush against it. */
const KEEP_MM = 0.2;
/** A fix this close (mm) to a volume is pressed against it: the volume limits the fix. */
const LIMIT_MM = 0.5;

/** Runs the search; throws only for an input that cannot be solved as it is. */
export function fixSearch(input: FixSearchInput): FixSearchResult {
	const keys = input.measures.map((m) => m.key);
	const pack = input.packaging;
	const ev = new CornerEvaluator(input.corner, input.grid, keys, pack?.spec);
	const check = ev.packaging;
	const n = ev.count;
	const M = keys.length;
	const coords = input.free;
	const values = new Float64Array(M * n);
	const targets = input.measures.map((m) => (m.band ? null : Float64Array.from({ length: n }, (_, k) => m.target?.[k] ?? 0)));
	const V = pack?.spec.volumes.length ?? 0;
	const rows = check?.rows ?? 0;
	const depths = new Float64Array(V * rows);
	// the ratio is solved in every evaluation only when the search holds it in a band
	const R = pack?.ratioBand ? (check?.ratioCount ?? 0) : 0;
	const ratios = new Float64Array(R);
	const residuals = new Float64Array(M * n + V * rows + R);
	let evaluations = 0;

	/** Fill residuals for moves p; false (residuals = penalty) when the corner cannot be assembled. */
	const residualsAt = (p: ArrayLike<number>): boolean => {
		evaluations++;
		if (!ev.evaluate(coords, p, values, depths, ratios)) {
			residuals.fill(PENALTY);
			return false;
		}
		toChange(values, M, n, ev.design);
		input.measures.forEach((m, j) => fillResidual(residuals, values, j, n, m, targets[j]));
		const o = M * n;
		for (let i = 0; i < V * rows; i++) residuals[o + i] = CLEAR_WEIGHT * Math.max(0, depths[i] + KEEP_MM);
		for (let k = 0; k < R; k++) residuals[o + V * rows + k] = pack!.ratioWeight * outside(ratios[k], pack!.ratioBand!);
		return true;
	};
	/** The volumes reached into (depth > 0 somewhere) after residualsAt. */
	const collided = (): string[] => {
		const out: string[] = [];
		for (let v = 0; v < V; v++) {
			for (let r = 0; r < rows; r++) {
				if (depths[v * rows + r] > 0) {
					out.push(pack!.spec.volumes[v].name);
					break;
				}
			}
		}
		return out;
	};

	let lastKey = '';
	const model = (p: number[]) => {
		const key = p.join(',');
		if (key !== lastKey) {
			residualsAt(p);
			lastKey = key;
		}
		const r = residuals.slice();
		return (i: number) => r[i];
	};
	const data = { x: Float64Array.from({ length: residuals.length }, (_, i) => i), y: new Float64Array(residuals.length) };
	const starts = startingPoints(coords, input.starts ?? 5);
	const outcomes: StartOutcome[] = [];
	let rejected = 0;
	for (const start of starts) {
		if (!residualsAt(start)) {
			rejected++;
			outcomes.push({ start, moves: start, rms: null, iterations: 0, ...(V ? { collides: [] } : {}) });
			continue;
		}
		lastKey = '';
		const fit = levenbergMarquardt(data, model, {
			initialValues: start,
			minValues: coords.map((c) => c.min),
			maxValues: coords.map((c) => c.max),
			gradientDifference: DIFF_MM,
			damping: 1e-2,
			maxIterations: input.maxIterations ?? 30,
			// stop once the weighted RMS residual is below GOOD_ENOUGH (the package's tolerance is on the sum of squares)
			errorTolerance: GOOD_ENOUGH * GOOD_ENOUGH * residuals.length
		});
		const ok = residualsAt(fit.parameterValues);
		outcomes.push({ start, moves: fit.parameterValues, rms: ok ? rmsOf(residuals) : null, iterations: fit.iterations, ...(V ? { collides: ok ? collided() : [] } : {}) });
		if (!ok) rejected++;
	}
	const assembled = outcomes.filter((o) => o.rms !== null).sort((a, b) => a.rms! - b.rms!);
	// a fix that reaches into a keep-out volume is taken only when every fix does
	const best = assembled.find((o) => !o.collides?.length) ?? assembled[0] ?? null;
	const moves = best?.moves ?? coords.map(() => 0);
	const result = report(ev, input, coords, moves, targets, outcomes, rejected, evaluations);
	if (pack && check) result.packaging = packagingReport(ev, input, coords, moves, assembled, best);
	return result;
}

/** Volumes before and after, the steering ratio, and what blocks the search when every fix collides. */
function packagingReport(
	ev: CornerEvaluator,
	input: FixSearchInput,
	coords: FreeCoordinate[],
	moves: number[],
	assembled: StartOutcome[],
	best: StartOutcome | null
): PackagingReport {
	const pack = input.packaging!;
	const check = ev.packaging!;
	const zero = coords.map(() => 0);
	const before = ev.reaches(coords, zero);
	const after = ev.reaches(coords, moves);
	const volumes = pack.spec.volumes.map((v, i): VolumeReport => {
		const a = after?.[i] ?? null;
		const status = !a ? 'clear' : a.depth > 0 ? 'collides' : a.depth > -LIMIT_MM ? 'limits' : 'clear';
		return { name: v.name, before: before?.[i] ?? null, after: a, status };
	});
	let ratio: PackagingReport['ratio'] = null;
	if (pack.spec.ratio) {
		const scratch = new Float64Array(input.measures.length * ev.count);
		const depths = new Float64Array(pack.spec.volumes.length * check.rows);
		const ratios = new Float64Array(check.ratioCount);
		const at = (p: number[]) => (ev.evaluate(coords, p, scratch, depths, ratios) ? Array.from(ratios) : []);
		const b = at(zero);
		const a = at(moves);
		const band = pack.ratioBand;
		ratio = { angles: check.ratioAngles(), before: b, after: a, band, maxOutside: band ? a.reduce((m, v) => Math.max(m, Math.abs(outside(v, band))), 0) : 0 };
	}
	let blocked: PackagingReport['blocked'] = null;
	if (best?.collides?.length) {
		const counts = new Map<string, number>();
		for (const o of assembled) for (const name of o.collides ?? []) counts.set(name, (counts.get(name) ?? 0) + 1);
		const deepest = volumes.filter((v) => best.collides!.includes(v.name)).sort((x, y) => (y.after?.depth ?? 0) - (x.after?.depth ?? 0))[0];
		blocked = {
			volume: deepest.name,
			member: deepest.after?.member ?? '',
			depth: deepest.after?.depth ?? 0,
			travel: deepest.after?.travel ?? 0,
			rack: deepest.after?.rack ?? 0,
			starts: [...counts].map(([name, count]) => ({ name, count })).sort((x, y) => y.count - x.count)
		};
	}
	return { members: check.memberLabels, racks: check.racks, volumes, ratio, blocked };
}

/** Residuals of measure j (curves in `values`, changes from design) into its rows of r. */
function fillResidual(r: Float64Array, values: Float64Array, j: number, n: number, m: FitMeasure, target: Float64Array | null): void {
	for (let k = 0; k < n; k++) {
		const v = values[j * n + k];
		r[j * n + k] = m.weight * (target ? v - target[k] : outside(v, m.band!));
	}
}

/** How far v lies outside lo…hi (0 inside). */
function outside(v: number, [lo, hi]: [number, number]): number {
	return v > hi ? v - hi : v < lo ? v - lo : 0;
}

/** Root mean square of xs. */
function rmsOf(xs: ArrayLike<number>): number {
	let s = 0;
	for (let i = 0; i < xs.length; i++) s += xs[i] * xs[i];
	return Math.sqrt(s / Math.max(1, xs.length));
}

const PRIMES = [2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37];

/** The radical inverse of i in base b (the Halton sequence, J. H. Halton, Numer. Math. 2, 1960), in (0, 1). */
function halton(i: number, b: number): number {
	let f = 1;
	let r = 0;
	for (let k = i; k > 0; k = Math.floor(k / b)) {
		f /= b;
		r += f * (k % b);
	}
	return r;
}

/**
 * Starting points: no move first (clamped into the bounds), then a deterministic Halton spread over the middle
 * 80 % of each coordinate's bounds.
 */
export function startingPoints(coords: readonly FreeCoordinate[], count: number): number[][] {
	const out: number[][] = [coords.map((c) => Math.min(c.max, Math.max(c.min, 0)))];
	for (let s = 1; s < count; s++) {
		out.push(coords.map((c, i) => (c.min + c.max) / 2 + 0.8 * (halton(s, PRIMES[i % PRIMES.length]) - 0.5) * (c.max - c.min)));
	}
	return out;
}

/** The result: curves before and after, errors, moves per coordinate. */
function report(
	ev: CornerEvaluator,
	input: FixSearchInput,
	coords: FreeCoordinate[],
	moves: number[],
	targets: (Float64Array | null)[],
	starts: StartOutcome[],
	rejected: number,
	evaluations: number
): FixSearchResult {
	const n = ev.count;
	const M = input.measures.length;
	const before = toChange(curves(ev, coords, coords.map(() => 0), M), M, n, ev.design);
	const after = toChange(curves(ev, coords, moves, M), M, n, ev.design);
	const measures = input.measures.map((m, j): FitReport => {
		const b = Array.from(before.subarray(j * n, (j + 1) * n));
		const a = Array.from(after.subarray(j * n, (j + 1) * n));
		const t = targets[j];
		const err = (xs: number[]) => xs.map((v, k) => (t ? v - t[k] : outside(v, m.band!)));
		const eb = err(b);
		const ea = err(a);
		return {
			key: m.key, before: b, after: a, target: t ? Array.from(t) : null, band: m.band ?? null,
			rmsBefore: rmsOf(eb), maxBefore: maxAbs(eb), rmsAfter: rmsOf(ea), maxAfter: maxAbs(ea)
		};
	});
	return {
		positions: Array.from(ev.positions),
		free: coords.map((c, i) => ({ ...c, move: moves[i], at: Math.abs(moves[i] - c.min) < 1e-6 || Math.abs(moves[i] - c.max) < 1e-6 })),
		measures,
		starts,
		rejected,
		evaluations,
		packaging: null
	};
}

/** The curves of all measures with `moves` applied (NaN-filled when the corner cannot be assembled). */
function curves(ev: CornerEvaluator, coords: FreeCoordinate[], moves: number[], M: number): Float64Array {
	const out = new Float64Array(M * ev.count);
	if (!ev.evaluate(coords, moves, out)) out.fill(NaN);
	return out;
}

/** Largest absolute value of xs. */
function maxAbs(xs: number[]): number {
	return xs.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
}

/** A note of what moved, for the revision saved from a search ("steer.inner y +3.2 mm, z −1.0 mm"). */
export function movesNote(free: { point: string; axis: 0 | 1 | 2; move: number }[], digits = 1): string {
	const byPoint = new Map<string, string[]>();
	for (const f of free) {
		const v = Number(f.move.toFixed(digits));
		if (v === 0) continue;
		const sign = v > 0 ? '+' : '−';
		const list = byPoint.get(f.point) ?? [];
		list.push(`${AXES[f.axis]} ${sign}${Math.abs(v).toFixed(digits)} mm`);
		byPoint.set(f.point, list);
	}
	return [...byPoint].map(([p, l]) => `${p} ${l.join(', ')}`).join('; ') || 'no move';
}
