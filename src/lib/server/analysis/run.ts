// The app's side of the analyses: request → engine input, engine result → JSON, engine failures → 400s.
// The maths lives in $lib/server/kinematics; this file only translates.
import { joinRocker, kindSpec, measuresNotApplying, splitRocker } from '$lib/kinds';
import { error } from '@sveltejs/kit';
import { AXIS_NAMES, MOVABLE_POINTS, type FixSearchRequest, type ToleranceStudyRequest } from '$lib/schemas/analysis';
import type { CornerGeometry } from '$lib/schemas/geometry';
import { CornerEvaluator, toChange, type CurveMeasure } from '$lib/server/studies/evaluate';
import { fixSearch, movesNote, type FixSearchResult } from '$lib/server/studies/fix-search';
import { runTolerance, type RunOutcome } from '$lib/server/studies/parallel';
import { sensitivity } from '$lib/server/studies/sensitivity';
import { bands, firstOrder, nominalCurves, suggestTolerances, varianceShares, type ToleranceSpec } from '$lib/server/studies/tolerance';
import { workerCode } from './worker-code';

const axisIndex = (a: (typeof AXIS_NAMES)[number]) => AXIS_NAMES.indexOf(a) as 0 | 1 | 2;

/** Stops with 400 unless the corner has `point` (named as `field`). */
function needPoint(geometry: CornerGeometry, point: string, field: string): void {
	if (!joinRocker(geometry.points, geometry.rocker)[point]) error(400, { message: `${field}: this corner has no point ${point}`, code: 'invalid', field });
}

/** Stops with 400 naming `field` when the corner has no such measure (a rocker angle without a rocker, caster without a steering axis). */
function needMeasure(geometry: CornerGeometry, measure: string, field: string): void {
	if (measuresNotApplying(geometry.kind, joinRocker(geometry.points, geometry.rocker)).has(measure))
		error(400, { message: `${field}: this corner has no ${measure.replace('_', ' ')} (its kind or its points do not give one)`, code: 'invalid', field });
}

/** Stops with 400 when the corner cannot be solved over the whole travel as it is. */
function evaluatorOrFail(geometry: CornerGeometry, travel: { from: number; to: number; step: number }, measures: CurveMeasure[]): CornerEvaluator {
	try {
		return new CornerEvaluator(geometry, travel, measures);
	} catch (e) {
		error(400, { message: `travel: ${(e as Error).message}`, code: 'invalid', field: 'travel' });
	}
}

/** The packaging part of a fix search request for a corner on `axle`, or undefined when it asks for none. */
function packagingOf(geometry: CornerGeometry, input: FixSearchRequest, axle: 'front' | 'rear') {
	const steering = input.steering;
	const volumes = input.keepOut.filter((v) => v.shape !== 'rim' || v.axle === axle);
	if (steering && !kindSpec(geometry.kind).steers) error(400, { message: 'steering: this corner kind does not steer (leave the steering out)', code: 'invalid', field: 'steering' });
	if (!volumes.length && !steering) return undefined;
	const lockRack = steering ? (steering.lock * steering.rackTravelPerTurn) / 360 : 0;
	return {
		spec: {
			volumes,
			// the travel is checked at the lock only when there is something to keep out of
			racks: lockRack && volumes.length ? [-lockRack, lockRack] : [],
			moved: [...new Set(input.free.map((f) => f.point))],
			ratio: steering ? { perTurn: steering.rackTravelPerTurn, lockRack } : null
		},
		ratioBand: steering?.ratio ? ([steering.ratio.min, steering.ratio.max] as [number, number]) : null,
		ratioWeight: steering?.ratio?.weight ?? 1
	};
}

/**
 * Runs a fix search on `geometry` (a corner on `axle`); `targetGeometry` is the revision whose curves are the
 * target (or null). Rim volumes of the other axle are left out; the result names those it checked.
 */
export function runFixSearch(geometry: CornerGeometry, input: FixSearchRequest, targetGeometry: CornerGeometry | null, axle: 'front' | 'rear'): FixSearchResult & { note: string } {
	input.free.forEach((f, i) => needPoint(geometry, f.point, `free.${i}.point`));
	input.measures.forEach((m, i) => needMeasure(geometry, m.key, `measures.${i}.key`));
	const keys = input.measures.map((m) => m.key);
	const n = evaluatorOrFail(geometry, input.travel, keys).count;
	const packaging = packagingOf(geometry, input, axle);
	if (packaging) {
		try {
			new CornerEvaluator(geometry, input.travel, keys, packaging.spec);
		} catch (e) {
			error(400, { message: `steering: ${(e as Error).message}`, code: 'invalid', field: 'steering' });
		}
	}
	let targets: Float64Array | null = null;
	if (input.target.kind === 'revision') {
		const ev = evaluatorOrFail(targetGeometry!, input.travel, keys);
		targets = new Float64Array(keys.length * n);
		ev.evaluate([], [], targets);
		toChange(targets, keys.length, n, ev.design);
	}
	const band = input.target.kind === 'band' ? ([input.target.min, input.target.max] as [number, number]) : undefined;
	const result = fixSearch({
		corner: geometry,
		grid: input.travel,
		free: input.free.map((f) => ({ point: f.point, axis: axisIndex(f.axis), min: -f.bound, max: f.bound })),
		measures: input.measures.map((m, j) => ({ key: m.key, weight: m.weight, band, target: targets ? targets.subarray(j * n, (j + 1) * n) : undefined })),
		starts: input.starts,
		packaging
	});
	return { ...result, note: movesNote(result.free) };
}

/** Sensitivity of the corner over the travel. */
export function runSensitivity(geometry: CornerGeometry, travel: { from: number; to: number; step: number }) {
	evaluatorOrFail(geometry, travel, ['toe', 'camber', 'rc_height']);
	return sensitivity(geometry, travel);
}

/** The engine spec of a tolerance study request on `geometry`. */
export function toleranceSpec(geometry: CornerGeometry, input: ToleranceStudyRequest): ToleranceSpec {
	for (const p of Object.keys(input.points)) needPoint(geometry, p, `points.${p}`);
	needMeasure(geometry, input.target.measure, 'target.measure');
	const measures: CurveMeasure[] = ['toe', 'camber'];
	if (!measures.includes(input.target.measure)) measures.push(input.target.measure);
	evaluatorOrFail(geometry, input.travel, measures);
	const all = joinRocker(geometry.points, geometry.rocker);
	const tolerances = MOVABLE_POINTS.filter((p) => all[p]).map((point) => ({ point, ...(input.points[point] ?? input.default) }));
	return { corner: geometry, grid: input.travel, tolerances, measures, samples: input.samples, seed: input.seed, distribution: input.distribution };
}

/**
 * Runs the study's samples and builds its result: in this request on worker threads where they start, or, from
 * QUEUED_TOLERANCE_SAMPLES on, through the job queue (`queued` runs it there). Either way each sample is solved by
 * runSamples from (seed, index) alone, so the result is the same.
 */
export async function runToleranceStudy(spec: ToleranceSpec, input: ToleranceStudyRequest, signal: AbortSignal, onProgress: (done: number) => void, queued?: (spec: ToleranceSpec, signal: AbortSignal, onProgress: (done: number) => void) => Promise<RunOutcome>) {
	const t0 = performance.now();
	const run: RunOutcome = queued ? await queued(spec, signal, onProgress) : await runTolerance(spec, { threads: input.threads, workerCode, signal, onProgress });
	const fo = firstOrder(spec);
	const nominal = nominalCurves(spec);
	const measureBands = bands(spec, run.blocks, nominal, fo.total);
	const failed = run.blocks.reduce((s, b) => s + b.ok.length - b.ok.reduce((a, v) => a + v, 0), 0);
	return {
		positions: fo.positions,
		samples: spec.samples,
		failed,
		seed: spec.seed,
		distribution: spec.distribution,
		tolerances: spec.tolerances,
		threads: run.threads,
		fallback: run.fallback,
		/** chunks solved by the job queue's workers (0: solved in the request) */
		queuedChunks: run.queuedChunks ?? 0,
		ms: Math.round(performance.now() - t0),
		bands: measureBands,
		shares: Object.fromEntries(spec.measures.map((m, j) => [m, varianceShares(spec, fo, j)])),
		suggestion: suggestTolerances(spec, fo, input.target.measure, [input.target.min, input.target.max], [input.travel.from, input.travel.to], nominal)
	};
}
export type ToleranceStudyResult = Awaited<ReturnType<typeof runToleranceStudy>>;

/** The geometry with `moves` (mm) added to the named coordinates. */
export function applyMoves(geometry: CornerGeometry, moves: { point: string; axis: (typeof AXIS_NAMES)[number]; move: number }[]): CornerGeometry {
	const points = structuredClone(joinRocker(geometry.points, geometry.rocker));
	moves.forEach((m, i) => {
		needPoint(geometry, m.point, `moves.${i}.point`);
		points[m.point][axisIndex(m.axis)] = Math.round((points[m.point][axisIndex(m.axis)] + m.move) * 1000) / 1000;
	});
	const split = splitRocker(points, geometry.rocker?.rod_on ?? null);
	return { ...geometry, points: split.points, ...(split.rocker ? { rocker: split.rocker as CornerGeometry['rocker'] } : {}) };
}

/** The generated note of a saved fix. */
export function fixNote(moves: { point: string; axis: (typeof AXIS_NAMES)[number]; move: number }[], extra: string): string {
	const text = movesNote(moves.map((m) => ({ point: m.point, axis: axisIndex(m.axis), move: m.move })));
	return `Fix search moved ${text}.${extra.trim() ? `\n\n${extra.trim()}` : ''}`;
}
