// Frame: ISO 8855 vehicle axes, x forward, y left, z up; coordinates in mm, angles in degrees.
// Sensitivity: the derivative of each measure with respect to each point coordinate, by central
// differences of the whole heave sweep, ranked so the engineer sees which points matter.

import { LINKAGE_POINT_NAMES, measuresNotApplying } from '../../kinds';
import { flatPoints, type CornerInput } from '../kinematics/corner';
import { AXES, CornerEvaluator, toChange, type Coordinate, type CurveMeasure, type HeaveGrid } from './evaluate';

/** Points whose placement a fabricator sets, in the kinds' order (the kinds' list). */
export const LINKAGE_POINTS = LINKAGE_POINT_NAMES;

/** Scalar figures ranked: change over the range (value at `to` minus value at `from`) or the design value. */
export const SCALAR_MEASURES = {
	toe_change: { curve: 'toe', basis: 'range', unit: '°', label: 'Toe change over the range' },
	camber_change: { curve: 'camber', basis: 'range', unit: '°', label: 'Camber change over the range' },
	rc_height: { curve: 'rc_height', basis: 'design', unit: 'mm', label: 'Roll-centre height at design' },
	caster: { curve: 'caster', basis: 'design', unit: '°', label: 'Caster at design' },
	kpi: { curve: 'kpi', basis: 'design', unit: '°', label: 'Kingpin inclination at design' }
} as const satisfies Record<string, { curve: CurveMeasure; basis: 'range' | 'design'; unit: string; label: string }>;
export type ScalarMeasure = keyof typeof SCALAR_MEASURES;
export const SCALAR_KEYS = Object.keys(SCALAR_MEASURES) as ScalarMeasure[];

/** Central-difference step (mm): the solver's position error is about 1e-11 mm, measures are smooth over 0.01 mm. */
export const SENSITIVITY_STEP_MM = 0.01;

/** Every coordinate (x, y, z) of the linkage points this corner has. */
export function linkageCoordinates(corner: CornerInput): Coordinate[] {
	const out: Coordinate[] = [];
	const points = flatPoints(corner);
	for (const p of LINKAGE_POINTS) if (points[p]) for (const axis of [0, 1, 2] as const) out.push({ point: p, axis });
	return out;
}

/** Derivatives of the curves (as changes from design) of `measures` at every position, per coordinate. */
export interface CurveDerivatives {
	coords: Coordinate[];
	measures: CurveMeasure[];
	positions: number[];
	/** d[(i * measures + j) * count + k]: coordinate i, measure j, position k; degrees or mm per mm */
	d: Float64Array;
	/** coordinates whose ± step could not be assembled (their derivatives are 0) */
	failed: Coordinate[];
}

/** Central-difference derivatives of the change-from-design curves of `measures` over `grid`. */
export function curveDerivatives(corner: CornerInput, grid: HeaveGrid, measures: CurveMeasure[], coords = linkageCoordinates(corner), h = SENSITIVITY_STEP_MM): CurveDerivatives {
	const ev = new CornerEvaluator(corner, grid, measures);
	const n = ev.count;
	const M = measures.length;
	const plus = new Float64Array(M * n);
	const minus = new Float64Array(M * n);
	const d = new Float64Array(coords.length * M * n);
	const failed: Coordinate[] = [];
	coords.forEach((c, i) => {
		const ok = ev.evaluate([c], [h], plus) && ev.evaluate([c], [-h], minus);
		if (!ok) return void failed.push(c);
		toChange(plus, M, n, ev.design);
		toChange(minus, M, n, ev.design);
		for (let q = 0; q < M * n; q++) d[i * M * n + q] = (plus[q] - minus[q]) / (2 * h);
	});
	return { coords, measures, positions: Array.from(ev.positions), d, failed };
}

/** One coordinate's derivative of one scalar figure. */
export interface RankedCoordinate {
	point: string;
	axis: 'x' | 'y' | 'z';
	/** degrees or mm per mm */
	derivative: number;
}

/** Per scalar figure: every coordinate's derivative, largest magnitude first, and per point the root-sum-square. */
export interface SensitivityRanking {
	key: ScalarMeasure;
	label: string;
	unit: string;
	ranked: RankedCoordinate[];
	byPoint: { point: string; magnitude: number }[];
}

export interface SensitivityResult {
	grid: HeaveGrid;
	step: number;
	rankings: SensitivityRanking[];
	failed: { point: string; axis: 'x' | 'y' | 'z' }[];
}

/** Sensitivity of every scalar figure the corner has to every linkage coordinate (or `coords`), ranked. */
export function sensitivity(corner: CornerInput, grid: HeaveGrid, coords = linkageCoordinates(corner)): SensitivityResult {
	const missing = measuresNotApplying(corner.kind, flatPoints(corner));
	const curves = (['toe', 'camber', 'rc_height', 'caster', 'kpi'] as CurveMeasure[]).filter((m) => !missing.has(m));
	const keys = SCALAR_KEYS.filter((k) => curves.includes(SCALAR_MEASURES[k].curve));
	const ev = new CornerEvaluator(corner, grid, curves);
	const n = ev.count;
	const M = curves.length;
	const h = SENSITIVITY_STEP_MM;
	const plus = new Float64Array(M * n);
	const minus = new Float64Array(M * n);
	const figure = (v: Float64Array, key: ScalarMeasure) => {
		const s = SCALAR_MEASURES[key];
		const j = curves.indexOf(s.curve);
		return s.basis === 'range' ? v[j * n + n - 1] - v[j * n] : v[j * n + ev.design];
	};
	const derivs = keys.map(() => new Float64Array(coords.length));
	const failed: SensitivityResult['failed'] = [];
	coords.forEach((c, i) => {
		if (!(ev.evaluate([c], [h], plus) && ev.evaluate([c], [-h], minus))) return void failed.push({ point: c.point, axis: AXES[c.axis] });
		keys.forEach((key, q) => (derivs[q][i] = (figure(plus, key) - figure(minus, key)) / (2 * h)));
	});
	const rankings = keys.map((key, q): SensitivityRanking => {
		const ranked = coords
			.map((c, i) => ({ point: c.point, axis: AXES[c.axis], derivative: derivs[q][i] }))
			.sort((a, b) => Math.abs(b.derivative) - Math.abs(a.derivative));
		const sums = new Map<string, number>();
		for (const r of ranked) sums.set(r.point, (sums.get(r.point) ?? 0) + r.derivative ** 2);
		const byPoint = [...sums].map(([point, s]) => ({ point, magnitude: Math.sqrt(s) })).sort((a, b) => b.magnitude - a.magnitude);
		const s = SCALAR_MEASURES[key];
		return { key, label: s.label, unit: s.unit, ranked, byPoint };
	});
	return { grid, step: h, rankings, failed };
}
