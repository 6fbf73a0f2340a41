// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm; angles in degrees on the way out.
// The fast path for analyses that solve one corner many times with its points moved: a heave sweep of a
// few chosen measures, the points offset by given amounts, into a caller's Float64Array.

import { DEG } from '../kinematics/constants';
import { compileCorner, flatPoints, isFault, type CornerInput, type CornerModel, type PointTuple } from '../kinematics/corner';
import * as F from '../kinematics/measures';
import { OK } from '../kinematics/solve';
import { gridCount, runSweep, SweepBuffer, type SweepSpec } from '../kinematics/sweep';
import { PackagingCheck, type PackagingSpec, type Reach } from './packaging';

/** Curve measures an analysis may ask for, with their column and whether they are angles (degrees out). */
export const CURVE_MEASURES = {
	toe: { field: F.F_TOE, angle: true, unit: '°' },
	camber: { field: F.F_CAMBER, angle: true, unit: '°' },
	caster: { field: F.F_CASTER, angle: true, unit: '°' },
	kpi: { field: F.F_KPI, angle: true, unit: '°' },
	rc_height: { field: F.F_RC, angle: false, unit: 'mm' },
	half_track_change: { field: F.F_HALF_TRACK, angle: false, unit: 'mm' },
	scrub_radius: { field: F.F_SCRUB, angle: false, unit: 'mm' },
	motion_ratio: { field: F.F_MOTION_RATIO, angle: false, unit: '' },
	rocker_angle: { field: F.F_ROCKER_ANGLE, angle: true, unit: '°' }
} as const;
export type CurveMeasure = keyof typeof CURVE_MEASURES;
export const CURVE_MEASURE_KEYS = Object.keys(CURVE_MEASURES) as CurveMeasure[];

/** A point coordinate: point name and axis (0 = x, 1 = y, 2 = z). */
export interface Coordinate {
	point: string;
	axis: 0 | 1 | 2;
}

/** Axis letters, for labels. */
export const AXES = ['x', 'y', 'z'] as const;

/** A heave grid in mm (from ≤ 0 ≤ to, so the design position is on it). */
export interface HeaveGrid {
	from: number;
	to: number;
	step: number;
}

/** Solves one corner with its points offset, many times over one heave grid, for a fixed list of measures. */
export class CornerEvaluator {
	readonly positions: Float64Array;
	/** index of travel 0 in positions */
	readonly design: number;
	readonly count: number;
	private readonly base: Record<string, PointTuple>;
	private readonly work: Record<string, PointTuple>;
	private readonly input: CornerInput;
	private readonly buffer = new SweepBuffer();
	private readonly spec: SweepSpec;
	private readonly fields: number[];
	private readonly scale: number[];
	/** the packaging check (keep-out volumes, steering ratio), when asked for */
	readonly packaging: PackagingCheck | null = null;

	/**
	 * `corner` a validated corner file, `grid` the heave grid (mm), `measures` the curves to record; `packaging` adds
	 * the keep-out and steering-ratio checks (throws, naming the rack, when the corner as it is cannot reach them).
	 */
	constructor(
		corner: CornerInput,
		grid: HeaveGrid,
		readonly measures: readonly CurveMeasure[],
		packaging?: PackagingSpec
	) {
		this.count = gridCount(grid.from, grid.to, grid.step);
		this.spec = { sweep: F.SWEEP_HEAVE, from: grid.from, to: grid.to, step: grid.step, rack: 0, points: !!packaging };
		this.base = clonePoints(flatPoints(corner));
		this.work = clonePoints(flatPoints(corner));
		this.input = { ...corner, points: this.work };
		this.fields = measures.map((m) => CURVE_MEASURES[m].field);
		this.scale = measures.map((m) => (CURVE_MEASURES[m].angle ? DEG : 1));
		const first = this.solve(new Float64Array(measures.length * this.count));
		if (!first) throw new Error('the corner cannot be assembled over the whole range as it is');
		if (packaging) {
			const m = compileCorner(this.input) as CornerModel;
			this.packaging = new PackagingCheck(m, packaging, this.spec, this.count, corner.kind);
			const depths = new Float64Array(packaging.volumes.length * this.packaging.rows);
			const ratios = new Float64Array(this.packaging.ratioCount);
			if (!this.solve(new Float64Array(measures.length * this.count), depths, ratios)) {
				throw new Error(`the corner as it is cannot be assembled through the travel with the rack held at ${this.packaging.racks.filter((r) => r !== 0).map((r) => `${r > 0 ? '+' : ''}${r.toFixed(1)} mm`).join(' and ')} (the steering lock) or steered to lock`);
			}
		}
		this.positions = Float64Array.from(this.buffer.positions.subarray(0, this.count));
		this.design = this.positions.findIndex((p) => Math.abs(p) < 1e-9);
		if (this.design < 0) throw new Error('the travel range must include 0 (design) on its step grid');
	}

	/** The point's coordinates as given (mm). */
	point(name: string): PointTuple | undefined {
		return this.base[name];
	}

	/**
	 * Solve with coords[i] offset by offsets[i] (mm) and write measure j at position k into
	 * out[j * count + k] (degrees or mm). False when the corner cannot be assembled somewhere on the range.
	 */
	evaluate(coords: readonly Coordinate[], offsets: ArrayLike<number>, out: Float64Array, depths?: Float64Array, ratios?: Float64Array): boolean {
		this.move(coords, offsets);
		const ok = this.solve(out, depths, ratios);
		this.restore(coords);
		return ok;
	}

	/** Each keep-out volume's deepest reach with coords moved by offsets (null: no packaging, or not assembled). */
	reaches(coords: readonly Coordinate[], offsets: ArrayLike<number>): Reach[] | null {
		if (!this.packaging) return null;
		this.move(coords, offsets);
		const m = compileCorner(this.input);
		let out: Reach[] | null = null;
		if (!isFault(m)) {
			runSweep(m, this.spec, this.buffer);
			if (this.buffer.failCode === OK && this.buffer.lo === 0 && this.buffer.hi === this.count - 1) out = this.packaging.reaches(m, this.buffer);
		}
		this.restore(coords);
		return out;
	}

	private move(coords: readonly Coordinate[], offsets: ArrayLike<number>): void {
		for (let i = 0; i < coords.length; i++) {
			const c = coords[i];
			this.work[c.point][c.axis] += offsets[i];
		}
	}

	private restore(coords: readonly Coordinate[]): void {
		for (let i = 0; i < coords.length; i++) {
			const c = coords[i];
			this.work[c.point][c.axis] = this.base[c.point][c.axis];
		}
	}

	/** Solve the work points; false when the model faults or any position fails (packaging too, when asked). */
	private solve(out: Float64Array, depths?: Float64Array, ratios?: Float64Array): boolean {
		const m = compileCorner(this.input);
		if (isFault(m)) return false;
		const buf = this.buffer;
		runSweep(m, this.spec, buf);
		if (buf.failCode !== OK || buf.lo !== 0 || buf.hi !== this.count - 1) return false;
		const n = this.count;
		for (let j = 0; j < this.fields.length; j++) {
			const f = this.fields[j];
			const s = this.scale[j];
			for (let k = 0; k < n; k++) {
				const i = k * F.N_FIELDS + f;
				const v = buf.values[i];
				if (!buf.has[i] || !Number.isFinite(v)) return false;
				out[j * n + k] = v * s;
			}
		}
		if (this.packaging && depths && ratios) return this.packaging.measure(m, buf, depths, ratios);
		return true;
	}
}

/** A deep copy of a corner's points. */
function clonePoints(points: Record<string, PointTuple>): Record<string, PointTuple> {
	const out: Record<string, PointTuple> = {};
	for (const [k, v] of Object.entries(points)) out[k] = [v[0], v[1], v[2]];
	return out;
}

/** Subtract each measure's design value from its curve, in place (values become changes from design). */
export function toChange(values: Float64Array, measures: number, count: number, design: number): Float64Array {
	for (let j = 0; j < measures; j++) {
		const d = values[j * count + design];
		for (let k = 0; k < count; k++) values[j * count + k] -= d;
	}
	return values;
}
