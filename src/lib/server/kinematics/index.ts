// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height,
// y = 0 centreline. Lengths in mm; angles in degrees here at the edge (radians inside).
// Public API of the kinematics engine: contract-shaped samples (`corner-solve/1`).

import { DEG, MAX_SAMPLES } from './constants';
import { compileCorner, isFault, SPRING_NONE, type CornerInput, type CornerModel } from './corner';
import * as F from './measures';
import { gridCount, runSweep, SweepBuffer, type SweepSpec } from './sweep';

export type { CornerInput, PointTuple, RockerInput, VehicleInput } from './corner';
export { flatPoints } from './corner';

/** Sweep kinds of the contract. */
export type SweepKind = 'heave' | 'roll' | 'steer';

/** A sweep request: grid in mm (heave travel, steer rack) or degrees (roll); `rack` held in heave and roll (mm, default 0). */
export interface SweepOptions {
	sweep: SweepKind;
	from: number;
	to: number;
	step: number;
	rack?: number;
	/** add the solved positions of the linkage points (and the spring length) to each sample */
	points?: boolean;
}

/** One contract sample. Angles in degrees, lengths in mm; null where a quantity does not apply. */
export interface Sample {
	travel?: number;
	roll?: number;
	rack?: number;
	camber: number;
	toe: number;
	caster: number | null;
	kpi: number | null;
	scrub_radius: number | null;
	trail: number | null;
	half_track_change: number;
	wheelbase_change: number;
	fvic: [number, number] | null;
	fvsa: number | null;
	rc_height: number | null;
	svic: [number, number] | null;
	anti_dive: number | null;
	anti_squat: number | null;
	camber_ground: number | null;
	motion_ratio: number | null;
	/** the rocker's rotation from design (degrees, right-handed about pivot_a → pivot_b); null without a rocker */
	rocker_angle: number | null;
	wheel_centre: [number, number, number];
	contact_patch: [number, number, number];
	/** only with options.points: solved point positions (mm, chassis axes) */
	points?: Record<string, [number, number, number]>;
	/** only with options.points: spring installed length at this pose (mm), null without spring points */
	spring_length?: number | null;
}

/** Why a sweep stopped: the link that cannot be assembled and the sweep position (mm or degrees). */
export interface SweepError {
	link: string;
	position: number;
	sweep: SweepKind;
	message: string;
}

/** A sweep's solved samples (ascending) and the error that stopped it, if any. */
export interface SweepResult {
	samples: Sample[];
	error: SweepError | null;
}

/** Thrown for geometry the engine cannot model (the shared zod schema catches these first). */
export class CornerGeometryError extends Error {
	constructor(
		readonly field: string,
		message: string
	) {
		super(`${field}: ${message}`);
	}
}

/** Thrown for a sweep request outside the contract (step ≤ 0, from > to, non-finite). */
export class SweepOptionsError extends Error {}

const SWEEP_CODE: Record<SweepKind, number> = { heave: F.SWEEP_HEAVE, roll: F.SWEEP_ROLL, steer: F.SWEEP_STEER };
/** The sample field that carries each sweep's variable. */
export const SWEEP_VAR: Record<SweepKind, 'travel' | 'roll' | 'rack'> = { heave: 'travel', roll: 'roll', steer: 'rack' };

/** A compiled corner with its own reusable buffers: for repeated sweeps of one corner. */
export class CornerSolver {
	readonly model: CornerModel;
	readonly buffer = new SweepBuffer();

	/** Compile `corner` (a validated corner-geometry/1 object); throws CornerGeometryError. */
	constructor(corner: CornerInput) {
		const m = compileCorner(corner);
		if (isFault(m)) throw new CornerGeometryError(m.field, m.message);
		this.model = m;
	}

	private readonly spec: SweepSpec = { sweep: 0, from: 0, to: 0, step: 1, rack: 0, points: false };

	/** Solve a sweep into this solver's buffer (no samples built, nothing allocated once warm); returns the buffer. */
	run(options: SweepOptions): SweepBuffer {
		if (options.sweep === 'steer' && !this.model.steers) throw new SweepOptionsError('sweep: this corner kind does not steer (no steer sweep)');
		runSweep(this.model, specOf(options, this.spec), this.buffer);
		return this.buffer;
	}

	/** Solve a sweep and return contract samples plus the error, if any. */
	sweep(options: SweepOptions): SweepResult {
		const buf = this.run(options);
		const samples: Sample[] = [];
		let broken = NaN;
		for (let k = buf.lo; k <= buf.hi; k++) {
			// a guard that should never trip: a non-finite row is dropped rather than printed
			if (rowFinite(buf, k)) samples.push(sampleOf(this.model, buf, k, options));
			else if (Number.isNaN(broken)) broken = buf.positions[k];
		}
		if (!Number.isNaN(broken) && buf.failCode === 0) {
			buf.failCode = 5;
			buf.failPosition = broken;
		}
		const error = buf.failCode === 0 ? null : errorOf(this.model, buf, options.sweep);
		return { samples, error };
	}

	/** Spring installed length at design (mm): spring.chassis to spring.body; null without spring points. */
	springInstalledLength(): number | null {
		const m = this.model;
		if (m.springOn === SPRING_NONE) return null;
		const b = m.rocker ? m.points['rocker.spring_end'] : m.points['spring.body'];
		const c = m.springChassis;
		return Math.hypot(b[0] - c[0], b[1] - c[1], b[2] - c[2]);
	}
}

/** Solve one sweep of `corner` (validated corner-geometry/1); throws CornerGeometryError or SweepOptionsError. */
export function solveSweep(corner: CornerInput, options: SweepOptions): SweepResult {
	return new CornerSolver(corner).sweep(options);
}

/** Spring installed length at design of `corner` (mm), or null without spring points. */
export function springInstalledLength(corner: CornerInput): number | null {
	return new CornerSolver(corner).springInstalledLength();
}

/** Throw SweepOptionsError unless v is a finite number. */
function finite(name: string, v: unknown): void {
	if (typeof v !== 'number' || !Number.isFinite(v)) throw new SweepOptionsError(`${name}: must be a finite number`);
}

/** Fill `out` (the engine's sweep spec) from API options; throws SweepOptionsError. */
function specOf(o: SweepOptions, out: SweepSpec): SweepSpec {
	const rack = o.rack ?? 0;
	if (!Object.hasOwn(SWEEP_CODE, o.sweep)) throw new SweepOptionsError(`sweep: unknown sweep '${String(o.sweep)}'`);
	finite('from', o.from);
	finite('to', o.to);
	finite('step', o.step);
	finite('rack', rack);
	if (!(o.step > 0)) throw new SweepOptionsError('step: must be > 0');
	if (!(o.from <= o.to)) throw new SweepOptionsError('from: must be <= to');
	if (gridCount(o.from, o.to, o.step) > MAX_SAMPLES) throw new SweepOptionsError(`step: more than ${MAX_SAMPLES} positions`);
	out.sweep = SWEEP_CODE[o.sweep];
	out.from = o.from;
	out.to = o.to;
	out.step = o.step;
	out.rack = rack;
	out.points = !!o.points;
	return out;
}

/** Column f of row k, or null. */
function val(buf: SweepBuffer, k: number, f: number): number | null {
	const i = k * F.N_FIELDS + f;
	const v = buf.values[i];
	return buf.has[i] && Number.isFinite(v) ? v : null; // never NaN or Infinity in output
}

/** Column f of row k in degrees, or null. */
function deg(buf: SweepBuffer, k: number, f: number): number | null {
	const v = val(buf, k, f);
	return v === null ? null : v * DEG;
}

/** A pair of columns as [a, b], or null if either is absent. */
function pair(buf: SweepBuffer, k: number, f: number): [number, number] | null {
	const a = val(buf, k, f);
	const b = val(buf, k, f + 1);
	return a === null || b === null ? null : [a, b];
}

/** Three columns as a point. */
function triple(buf: SweepBuffer, k: number, f: number): [number, number, number] {
	const o = k * F.N_FIELDS + f;
	return [buf.values[o], buf.values[o + 1], buf.values[o + 2]];
}

/** True when every number of row k that will be printed is finite. */
function rowFinite(buf: SweepBuffer, k: number): boolean {
	const o = k * F.N_FIELDS;
	for (const f of [F.F_CAMBER, F.F_TOE, F.F_HALF_TRACK, F.F_WHEELBASE, F.F_WC_X, F.F_WC_X + 1, F.F_WC_X + 2, F.F_CP_X, F.F_CP_X + 1, F.F_CP_X + 2]) {
		if (!Number.isFinite(buf.values[o + f])) return false;
	}
	return true;
}

/** The contract sample of row k (key order as in the contract). */
function sampleOf(m: CornerModel, buf: SweepBuffer, k: number, o: SweepOptions): Sample {
	const s = {
		[SWEEP_VAR[o.sweep]]: buf.positions[k],
		camber: deg(buf, k, F.F_CAMBER)!,
		toe: deg(buf, k, F.F_TOE)!,
		caster: deg(buf, k, F.F_CASTER),
		kpi: deg(buf, k, F.F_KPI),
		scrub_radius: val(buf, k, F.F_SCRUB),
		trail: val(buf, k, F.F_TRAIL),
		half_track_change: val(buf, k, F.F_HALF_TRACK)!,
		wheelbase_change: val(buf, k, F.F_WHEELBASE)!,
		fvic: pair(buf, k, F.F_FVIC_Y),
		fvsa: val(buf, k, F.F_FVSA),
		rc_height: val(buf, k, F.F_RC),
		svic: pair(buf, k, F.F_SVIC_X),
		anti_dive: val(buf, k, F.F_ANTI_DIVE),
		anti_squat: val(buf, k, F.F_ANTI_SQUAT),
		camber_ground: deg(buf, k, F.F_CAMBER_GROUND),
		motion_ratio: val(buf, k, F.F_MOTION_RATIO),
		rocker_angle: deg(buf, k, F.F_ROCKER_ANGLE),
		wheel_centre: triple(buf, k, F.F_WC_X),
		contact_patch: triple(buf, k, F.F_CP_X)
	} as Sample;
	if (o.points) {
		s.points = pointsOf(m, buf, k);
		s.spring_length = val(buf, k, F.F_SPRING_LENGTH);
	}
	return s;
}

/** The named points of row k (the kind's, the spring's and the rocker's), in the model's order. */
function pointsOf(m: CornerModel, buf: SweepBuffer, k: number): Record<string, [number, number, number]> {
	const out: Record<string, [number, number, number]> = {};
	const o = k * buf.nPoints * 3;
	const p = buf.points;
	m.outPoints.forEach(({ name }, i) => {
		out[name] = [p[o + 3 * i], p[o + 3 * i + 1], p[o + 3 * i + 2]];
	});
	return out;
}

/** The API error of a failed sweep. */
function errorOf(m: CornerModel, buf: SweepBuffer, sweep: SweepKind): SweepError {
	const link = m.failNames[buf.failCode] ?? 'linkage';
	const unit = sweep === 'roll' ? '°' : ' mm';
	const what = sweep === 'heave' ? 'travel' : SWEEP_VAR[sweep];
	return {
		link,
		position: buf.failPosition,
		sweep,
		message: `${link} cannot be assembled at ${what} ${buf.failPosition}${unit}`
	};
}
