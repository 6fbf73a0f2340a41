// Revision A against revision B: which points moved, and how each figure changed through heave.
import { joinRocker, measuresNotApplying } from '$lib/kinds';
import type { CornerGeometry } from '$lib/schemas/geometry';
import { changeLabel, judge, measureWords, TARGET_MEASURES, type Target, type TargetMeasure } from '$lib/schemas/targets';
import type { Sample } from '$lib/server/kinematics';
import { solveCorner } from './solve';
import { lengthText, type LengthUnit } from '$lib/units';

import { DEFAULT_POSITIONS } from '$lib/schemas/compare';

/** The charts' sweep: ±50 mm by 1 mm, widened to take in every chosen position. */
export function compareSweep(positions: number[]) {
	return { sweep: 'heave' as const, from: Math.min(-50, Math.floor(Math.min(...positions))), to: Math.max(50, Math.ceil(Math.max(...positions))), step: 1 };
}
/** travel range of the one-line summaries (mm) */
export const SUMMARY_RANGE = 40;

/** Points that differ between A and B (mm), largest move first. */
export function movedPoints(a: CornerGeometry, b: CornerGeometry) {
	const pa = joinRocker(a.points, a.rocker);
	const pb = joinRocker(b.points, b.rocker);
	const names = [...new Set([...Object.keys(pa), ...Object.keys(pb)])];
	return names
		.map((name) => {
			const p = pa[name];
			const q = pb[name];
			if (!p || !q) return { name, dx: null, dy: null, dz: null, d: null, only: p ? 'a' : 'b' };
			const [dx, dy, dz] = [q[0] - p[0], q[1] - p[1], q[2] - p[2]];
			return { name, dx, dy, dz, d: Math.hypot(dx, dy, dz), only: null };
		})
		.filter((m) => m.d === null || m.d > 1e-6)
		.sort((m, n) => (n.d ?? Infinity) - (m.d ?? Infinity));
}

/** The value of a measure in a sample, or null. */
function valueOf(s: Sample | undefined, key: TargetMeasure): number | null {
	const v = s?.[key];
	return typeof v === 'number' ? v : null;
}

/** One solved sample at exactly each travel position (a one-position sweep each), undefined where it cannot be assembled. */
function samplesAt(g: CornerGeometry, positions: number[]): (Sample | undefined)[] {
	return positions.map((travel) => solveCorner(g, { sweep: 'heave', from: travel, to: travel, step: 1 }).samples[0]);
}

/** The spread of (value − value at design) over ±range, or null when the sweep did not reach it. */
function changeSpread(samples: Sample[], key: TargetMeasure, range: number) {
	const r = judge(samples, { measure: key, basis: 'change', min: -Infinity, max: Infinity, from: -range, to: range });
	return r.lo === null || r.hi === null || r.incomplete ? null : r.hi - r.lo;
}

/** A plain sentence for one measure, e.g. "Toe change over ±40 mm goes from 0.03° to 2.31°". */
function summary(key: TargetMeasure, a: Sample[], b: Sample[], lu: LengthUnit) {
	const { label, unit } = measureWords(key);
	const d = unit === '°' ? 2 : unit === '' ? 3 : 1;
	const sa = changeSpread(a, key, SUMMARY_RANGE);
	const sb = changeSpread(b, key, SUMMARY_RANGE);
	const range = lu === 'mm' ? `±${SUMMARY_RANGE} mm` : `±${lengthText(SUMMARY_RANGE, lu, 1)} in`;
	if (sa === null || sb === null) return `${label}: the sweep does not reach ${range} for both revisions.`;
	// a length change in the reader's unit (0.1 mm, 0.001 in)
	const shown = (v: number) => (unit === 'mm' ? lengthText(v, lu, d) : v.toFixed(d));
	// in inches, the same when the two read the same at 0.001 in (mm as before: closer than half the last digit)
	const same = unit === 'mm' && lu !== 'mm' ? shown(sa) === shown(sb) : Math.abs(sb - sa) < 0.5 * 10 ** -d;
	const u = unit === 'mm' ? ` ${lu}` : unit;
	return `${changeLabel(key)} over ${range} ${same ? 'stays at' : 'goes from'} ${shown(sa)}${u}${same ? '' : ` to ${shown(sb)}${u}`}.`;
}

/** Everything the compare page shows, solved on the server. */
/** `unit`: the reader's length unit for the summary sentences (every number returned stays mm). */
export function compareRevisions(a: CornerGeometry, b: CornerGeometry, targets: Target[], positions: number[] = DEFAULT_POSITIONS, unit: LengthUnit = 'mm') {
	const sweep = compareSweep(positions);
	const sa = solveCorner(a, sweep);
	const sb = solveCorner(b, sweep);
	const pa = samplesAt(a, positions);
	const pb = samplesAt(b, positions);
	// a measure neither corner has (a rocker angle without a rocker, caster without a steering axis) is left out
	const missingA = measuresNotApplying(a.kind, joinRocker(a.points, a.rocker));
	const missingB = measuresNotApplying(b.kind, joinRocker(b.points, b.rocker));
	const applies = (key: TargetMeasure) => !missingA.has(key) || !missingB.has(key);
	const figures = TARGET_MEASURES.filter(applies).map((key) => ({
		key,
		...measureWords(key),
		rows: positions.map((travel, i) => {
			const va = valueOf(pa[i], key);
			const vb = valueOf(pb[i], key);
			return { travel, a: va, b: vb, delta: va === null || vb === null ? null : vb - va };
		}),
		summary: summary(key, sa.samples, sb.samples, unit)
	}));
	return {
		positions,
		moved: movedPoints(a, b),
		figures,
		a: sa,
		b: sb,
		targets: targets.map((t) => ({ a: judge(sa.samples, t), b: judge(sb.samples, t) }))
	};
}
