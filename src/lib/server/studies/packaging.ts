// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm; the rack in mm (+ = toward +y).
// Packaging of one corner for the fix search: how deep its moved points and the members that end on them reach
// into keep-out volumes through the heave travel at the rack positions of the steering range, and this wheel's
// overall steering ratio through the steering range. The geometry of the volumes is kinematics/keep-out.ts.

import { kindMembers, ROCKER_MEMBERS } from '../../kinds';
import type { CornerModel } from '../kinematics/corner';
import { depthOfSegment, surelyClear, type Volume, type WheelFrame } from '../kinematics/keep-out';
import { F_TOE, N_FIELDS, SWEEP_STEER } from '../kinematics/measures';
import { OK } from '../kinematics/solve';
import { gridCount, runSweep, SweepBuffer, type SweepSpec } from '../kinematics/sweep';
import { DEG } from '../kinematics/constants';

/** Depth (mm) below which a member is taken as clear without searching along it; also the floor of recorded depths. */
export const CLEAR_FLOOR_MM = 1;
/** Steering-ratio positions across the steering range, lock to lock. */
export const RATIO_POSITIONS = 9;

/** What to check, beside the heave curves. */
export interface PackagingSpec {
	/** the volumes that apply to this corner (a rim only on its own axle) */
	volumes: Volume[];
	/** rack positions (mm) at which the travel is checked; 0 is always checked */
	racks: number[];
	/** the points the search moves: they and the members ending on them are checked */
	moved: string[];
	/** the steering ratio through the range: rack travel per steering-wheel turn (mm) and the rack at lock (mm) */
	ratio: { perTurn: number; lockRack: number } | null;
}

/** A member checked against the volumes: two indices into the model's point list (equal for a lone point). */
interface Member {
	a: number;
	b: number;
	label: string;
}

/** Where a volume is reached deepest: depth (mm, < 0 = clearance), the member, and the pose. */
export interface Reach {
	depth: number;
	member: string;
	travel: number;
	rack: number;
}

/** Checks a corner's packaging; built once per search from the first compiled model, reused for every move. */
export class PackagingCheck {
	readonly racks: number[];
	/** rows per volume: racks × travel positions */
	readonly rows: number;
	readonly ratioCount: number;
	private readonly members: Member[];
	private readonly centre: number;
	private readonly axisInner: number;
	private readonly buffer = new SweepBuffer();
	private readonly steer = [new SweepBuffer(), new SweepBuffer(), new SweepBuffer()];
	private readonly wheel = { centre: new Float64Array(3), axis: new Float64Array(3) } satisfies WheelFrame;
	private readonly a = new Float64Array(3);
	private readonly b = new Float64Array(3);
	private readonly at = new Float64Array(1);

	constructor(
		m: CornerModel,
		readonly spec: PackagingSpec,
		private readonly heave: SweepSpec,
		readonly travelCount: number,
		kind: string
	) {
		this.racks = [0, ...spec.racks.filter((r) => r !== 0)];
		this.rows = this.racks.length * travelCount;
		this.ratioCount = spec.ratio ? RATIO_POSITIONS : 0;
		const names = m.outPoints.map((p) => p.name);
		const index = (n: string) => names.indexOf(n);
		this.centre = index('wheel.centre');
		this.axisInner = index('wheel.axis_inner');
		const moved = new Set(spec.moved);
		const { links, strut } = kindMembers(kind);
		const all = [...links, ...(strut ? [strut] : []), ...ROCKER_MEMBERS];
		this.members = [];
		const covered = new Set<string>();
		for (const [p, q] of all) {
			if (!(moved.has(p) || moved.has(q)) || index(p) < 0 || index(q) < 0) continue;
			this.members.push({ a: index(p), b: index(q), label: `${p}–${q}` });
			covered.add(p).add(q);
		}
		for (const p of moved) if (!covered.has(p) && index(p) >= 0) this.members.push({ a: index(p), b: index(p), label: p });
	}

	/** The members checked, as labels ("steer.inner–steer.outer"). */
	get memberLabels(): string[] {
		return this.members.map((m) => m.label);
	}

	/**
	 * Solve model m at each rack position through the travel (the rack-0 rows come from `main`, a heave sweep run
	 * with points) and write each volume's deepest reach per row into depths[v * rows + row], floored at
	 * −CLEAR_FLOOR_MM; then, when `ratios` has room, the steering ratio per position. False when a pose cannot be
	 * assembled.
	 */
	measure(m: CornerModel, main: SweepBuffer, depths: Float64Array, ratios: Float64Array): boolean {
		const ok = this.eachRow(m, main, (buf, k, row) => this.rowDepths(buf, k, row, depths, null));
		return ok && (this.spec.ratio && ratios.length ? this.ratios(m, this.spec.ratio, ratios) : true);
	}

	/** The deepest reach of each volume over every row, with the member and the pose (for the report). */
	reaches(m: CornerModel, main: SweepBuffer): Reach[] | null {
		const best: Reach[] = this.spec.volumes.map(() => ({ depth: -Infinity, member: '', travel: 0, rack: 0 }));
		const ok = this.eachRow(m, main, (buf, k, row) =>
			this.rowDepths(buf, k, 0, null, (v, depth, member) => {
				if (depth > best[v].depth) best[v] = { depth, member, travel: buf.positions[k], rack: this.racks[Math.floor(row / this.travelCount)] };
			})
		);
		return ok ? best : null;
	}

	/**
	 * Each row (rack position × travel position) of model m: the rack-0 rows from `main`, a heave sweep run with
	 * points, the others solved here with the rack held. False when a pose cannot be assembled.
	 */
	private eachRow(m: CornerModel, main: SweepBuffer, row: (buf: SweepBuffer, k: number, row: number) => void): boolean {
		const n = this.travelCount;
		for (let r = 0; r < this.racks.length; r++) {
			let buf = main;
			if (r > 0) {
				buf = this.buffer;
				runSweep(m, { ...this.heave, rack: this.racks[r], points: true }, buf);
				if (buf.failCode !== OK || buf.lo !== 0 || buf.hi !== n - 1) return false;
			}
			for (let k = 0; k < n; k++) row(buf, k, r * n + k);
		}
		return true;
	}

	/** Steering-wheel angles (degrees) of the ratio positions. */
	ratioAngles(): number[] {
		const ratio = this.spec.ratio;
		if (!ratio) return [];
		const lock = (ratio.lockRack * 360) / ratio.perTurn;
		return Array.from({ length: RATIO_POSITIONS }, (_, i) => Math.round((-lock + (2 * lock * i) / (RATIO_POSITIONS - 1)) * 1e6) / 1e6);
	}

	/** Row k of buf: each volume's deepest reach, into depths (exact depths are floored) or handed to `each` unfloored. */
	private rowDepths(buf: SweepBuffer, k: number, row: number, depths: Float64Array | null, each: ((v: number, depth: number, member: string) => void) | null): void {
		const pts = buf.points;
		const o = k * buf.nPoints * 3;
		const w = this.wheel;
		if (this.centre >= 0 && this.axisInner >= 0) {
			const c = o + 3 * this.centre;
			const i = o + 3 * this.axisInner;
			let len = 0;
			for (let d = 0; d < 3; d++) {
				w.centre[d] = pts[c + d];
				w.axis[d] = pts[c + d] - pts[i + d];
				len += w.axis[d] * w.axis[d];
			}
			len = Math.sqrt(len);
			for (let d = 0; d < 3; d++) w.axis[d] /= len;
		}
		const volumes = this.spec.volumes;
		for (let v = 0; v < volumes.length; v++) {
			const vol = volumes[v];
			const frame = vol.shape === 'rim' ? w : null;
			let deepest = -CLEAR_FLOOR_MM;
			for (const mem of this.members) {
				for (let d = 0; d < 3; d++) {
					this.a[d] = pts[o + 3 * mem.a + d];
					this.b[d] = pts[o + 3 * mem.b + d];
				}
				if (each) each(v, depthOfSegment(vol, this.a, this.b, frame, this.at), mem.label);
				else if (!surelyClear(vol, this.a, this.b, frame, CLEAR_FLOOR_MM)) deepest = Math.max(deepest, depthOfSegment(vol, this.a, this.b, frame, this.at));
			}
			if (depths) depths[v * this.rows + row] = deepest;
		}
	}

	/**
	 * This wheel's overall steering ratio (steering-wheel degrees per road-wheel degree) at RATIO_POSITIONS rack
	 * positions lock to lock: the central difference over ±1° of steering wheel, as the axle's `steering_ratio`
	 * (geometry-format.md), from three steer sweeps on the same grid shifted by ±1°.
	 */
	private ratios(m: CornerModel, ratio: { perTurn: number; lockRack: number }, out: Float64Array): boolean {
		const h = ratio.perTurn / 360;
		const step = (2 * ratio.lockRack) / (RATIO_POSITIONS - 1);
		for (let s = 0; s < 3; s++) {
			const shift = (s - 1) * h;
			const buf = this.steer[s];
			runSweep(m, { sweep: SWEEP_STEER, from: -ratio.lockRack + shift, to: ratio.lockRack + shift, step, rack: 0, points: false }, buf);
			if (buf.failCode !== OK || buf.lo !== 0 || buf.hi !== gridCount(-ratio.lockRack, ratio.lockRack, step) - 1) return false;
		}
		const [minus, , plus] = this.steer;
		for (let k = 0; k < RATIO_POSITIONS; k++) {
			const i = k * N_FIELDS + F_TOE;
			if (!minus.has[i] || !plus.has[i]) return false;
			const dToe = (plus.values[i] - minus.values[i]) * DEG;
			out[k] = Math.abs(dToe) > 1e-12 ? 2 / Math.abs(dToe) : 1e6;
		}
		return true;
	}
}
