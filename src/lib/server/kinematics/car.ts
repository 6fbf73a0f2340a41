// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height, y = 0 centreline.
// The whole car from a car revision's model and its pinned corner geometries: each axle built from its corners
// (the right one measured or the left mirrored), solved at design for tracks, roll centres and motion ratios,
// then the statics of vehicle.ts: CG, corner weights, wheel rates, ride frequencies, roll stiffness, roll
// gradient and the load-transfer split. Units: mm, kg, N, N/mm, N·m/deg, Hz, degrees.

import type { AxleModel, CarModel } from '$lib/schemas/car-model';
import { mirrorCorner } from '$lib/schemas/axle';
import type { CornerGeometry } from '$lib/schemas/geometry';
import { AxleSolver, barFigures, barReach, type AxleInput } from './axle';
import type { VehicleInput } from './corner';
import * as V from './vehicle';
import { solveSolidAxle } from './solid-axle';

/** One wheel at design as the statics need it. */
interface WheelAtDesign {
	wheel_centre: readonly number[];
	contact_patch: readonly number[];
	motion_ratio: number | null;
	rc_height?: number | null;
}

/** An axle at design: both wheels, its track, roll-centre height and anti-roll bar figures. */
interface AxleAtDesign {
	left: WheelAtDesign;
	right: WheelAtDesign;
	track: number;
	rc: number | null;
	rcWarning: string | null;
	bar: ReturnType<typeof barFigures>;
}

/** A solid rear axle at design (rc_height of its lateral locator: common practice). */
function solidAtDesign(model: CarModel): AxleAtDesign {
	const solid = model.rear.solid!;
	if (model.rear.anti_roll_bar) throw new CarModelError('rear.anti_roll_bar', 'an anti-roll bar on a solid axle is not modelled yet');
	const res = solveSolidAxle(solid, null, { sweep: 'heave', from: 0, to: 0, step: 1 });
	const s = res.samples[0];
	if (!s) throw new CarModelError('rear.solid', res.error?.message ?? 'the solid axle cannot be assembled at design');
	return { left: s.left, right: s.right, track: Math.abs(s.left.contact_patch[1] - s.right.contact_patch[1]), rc: s.rc_height, rcWarning: s.rc_height === null ? 'rear axle: the lateral locator gives no roll centre; taken at the ground' : null, bar: null };
}

/** An independent axle at design from its solver. */
function independentAtDesign(s: AxleSolver, a: AxleName): AxleAtDesign {
	const d = s.design;
	const rcSample = s.sweep({ sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0]?.rc ?? null;
	let rc = rcSample ? rcSample[1] : null;
	let rcWarning: string | null = null;
	if (rc === null) {
		rc = d.left.rc_height;
		rcWarning = `${a} axle: the two sides' front-view lines do not meet; ${rc === null ? 'roll centre taken at the ground' : "the left corner's roll-centre height is used"}`;
	}
	const reach = barReach(s);
	if (reach) throw new CarModelError(`${a}.anti_roll_bar.link_end`, `the ${reach.side} drop link cannot reach the bar lever at ${reach.travel} mm of wheel travel`);
	const bar = barFigures(s);
	if (s.bar && !bar) throw new CarModelError(`${a}.anti_roll_bar.link_end`, 'the drop link cannot reach the bar lever at design');
	return { left: d.left, right: d.right, track: s.track, rc, rcWarning, bar };
}

export type AxleName = 'front' | 'rear';
export type Position = 'front_left' | 'front_right' | 'rear_left' | 'rear_right';
export type CarCorners = Partial<Record<Position, CornerGeometry>>;

/** A car that cannot be analysed as asked: the field (e.g. `rear.right`, `front.spring_rate`) and why. */
export class CarModelError extends Error {
	constructor(
		readonly field: string,
		message: string
	) {
		super(`${field}: ${message}`);
	}
}

/** What the corners' vehicle block needs besides the geometry: brake and drive shares. */
export interface CarSettings {
	frontBrakeFraction?: number | null;
	driveLayout?: 'fwd' | 'rwd' | 'awd' | null;
}

/** The axle's corners as an axle input: the left one, and the right one measured or mirrored. */
export function axleInput(model: CarModel, corners: CarCorners, axle: AxleName, vehicle: VehicleInput | null): AxleInput {
	const a: AxleModel = model[axle];
	const left = corners[`${axle}_left`];
	if (!left) throw new CarModelError(`${axle}.left`, `the car has no ${axle}-left corner revision to analyse`);
	let right = corners[`${axle}_right`];
	if (a.right === 'mirror' || !right) {
		if (a.right === 'measured') throw new CarModelError(`${axle}.right`, `'measured' but the car has no ${axle}-right corner revision (use 'mirror')`);
		right = mirrorCorner(left);
	}
	return { left, right, steering: a.steering ?? null, anti_roll_bar: a.anti_roll_bar ?? null, vehicle };
}

/** An axle's solver, its failures named under the axle (`front.…`). */
function solveAxle(input: AxleInput, axle: AxleName): AxleSolver {
	try {
		return new AxleSolver(input);
	} catch (e) {
		// an axle field the solver names (e.g. `anti_roll_bar.link_on: …`) is named under this axle
		const m = /^([a-z_]+(?:\.[a-z_]+)*): (.*)$/s.exec((e as Error).message);
		throw m ? new CarModelError(`${axle}.${m[1]}`, m[2]) : new CarModelError(axle, (e as Error).message);
	}
}

export interface AxleFigures {
	track: number;
	x: number;
	rc_height: number | null;
	motion_ratio_left: number | null;
	motion_ratio_right: number | null;
	wheel_rate_left: number;
	wheel_rate_right: number;
	ride_frequency_left: number;
	ride_frequency_right: number;
	roll_stiffness_springs: number;
	roll_stiffness_bar: number;
	roll_stiffness: number;
	bar: ReturnType<typeof barFigures>;
}

export interface CarFigures {
	mass: number;
	sprung_mass: number;
	cg: [number, number, number];
	front_share: number;
	left_share: number;
	wheelbase: number;
	corner_weights: V.CornerWeights;
	axles: Record<AxleName, AxleFigures>;
	/** N at 1 g lateral */
	lateral_transfer: V.LoadTransfer;
	/** N moved from rear to front at 1 g braking */
	braking_transfer: number;
	warnings: string[];
}

/** The car's figures; throws CarModelError naming the field when a needed corner, spring or figure is missing. */
export function carFigures(model: CarModel, corners: CarCorners): CarFigures {
	const warnings: string[] = [];
	// First pass without a vehicle block: positions, tracks, motion ratios, roll centres.
	const design: Record<AxleName, AxleAtDesign> = {
		front: independentAtDesign(solveAxle(axleInput(model, corners, 'front', null), 'front'), 'front'),
		rear: model.rear.solid ? solidAtDesign(model) : independentAtDesign(solveAxle(axleInput(model, corners, 'rear', null), 'rear'), 'rear')
	};
	const at = (a: AxleName) => {
		const d = design[a];
		return { x: (d.left.contact_patch[0] + d.right.contact_patch[0]) / 2, yLeft: d.left.contact_patch[1], yRight: d.right.contact_patch[1] };
	};
	const wb: V.WheelBase = { front: at('front'), rear: at('rear') };
	const wheelbase = wb.front.x - wb.rear.x;
	if (!(wheelbase > 100)) throw new CarModelError('rear.left', `the rear wheels must stand behind the front ones (wheelbase ${wheelbase.toFixed(0)} mm): check the corners' x`);

	// Mass: the items (sprung) and each corner's unsprung mass at its wheel centre.
	const unsprungItems: V.MassItem[] = [];
	for (const a of ['front', 'rear'] as const) {
		const d = design[a];
		for (const [side, s] of [['left', d.left], ['right', d.right]] as const) {
			const [x, y, z] = s.wheel_centre;
			unsprungItems.push({ name: `${a} ${side} unsprung`, mass: model[a].unsprung_mass, x, y, z });
		}
	}
	const sprung = V.massCentre(model.mass_items)!;
	const all = V.massCentre([...model.mass_items, ...unsprungItems])!;
	const weights = V.cornerWeights(all.mass, all.cg, wb);

	const axles = {} as Record<AxleName, AxleFigures>;
	const statics = {} as Record<AxleName, V.AxleStatics>;
	for (const a of ['front', 'rear'] as const) {
		const d = design[a];
		const spring = model[a].spring_rate;
		const mr = (v: number | null, side: string) => {
			if (v === null) throw new CarModelError(a === 'rear' && model.rear.solid ? `rear.solid.points.spring_${side}.axle` : `${a}_${side}`, `no spring points, so the motion ratio (and wheel rate) is unknown`);
			return v;
		};
		const mrl = mr(d.left.motion_ratio, 'left');
		const mrr = mr(d.right.motion_ratio, 'right');
		const wrl = V.wheelRate(spring, mrl);
		const wrr = V.wheelRate(spring, mrr);
		const tyre = model[a].tyre_rate ?? null;
		const cw = a === 'front' ? [weights.fl, weights.fr] : [weights.rl, weights.rr];
		const fl = V.rideFrequency(V.rideRate(wrl, tyre), cw[0] - model[a].unsprung_mass);
		const fr = V.rideFrequency(V.rideRate(wrr, tyre), cw[1] - model[a].unsprung_mass);
		const track = d.track;
		const rc = d.rc;
		if (d.rcWarning) warnings.push(d.rcWarning);
		const bar = d.bar;
		// a solid axle's springs work in roll only over their own spacing: roll rate k·MR²·(spacing / track)² (common practice, no source)
		const solid = a === 'rear' ? model.rear.solid : null;
		const sl = solid?.points['spring_left.axle'];
		const sr = solid?.points['spring_right.axle'];
		const rollShare = sl && sr ? (Math.abs(sl[1] - sr[1]) / track) ** 2 : 1;
		const springs = V.springRollStiffness(wrl * rollShare, wrr * rollShare, track);
		const barK = bar?.roll_stiffness ?? 0;
		axles[a] = {
			track,
			x: wb[a].x,
			rc_height: rc,
			motion_ratio_left: mrl,
			motion_ratio_right: mrr,
			wheel_rate_left: wrl,
			wheel_rate_right: wrr,
			ride_frequency_left: fl,
			ride_frequency_right: fr,
			roll_stiffness_springs: springs,
			roll_stiffness_bar: barK,
			roll_stiffness: springs + barK,
			bar
		};
		statics[a] = {
			track,
			rcHeight: rc ?? 0,
			x: wb[a].x,
			rollStiffness: springs + barK,
			unsprungMass: 2 * model[a].unsprung_mass,
			unsprungHeight: (d.left.wheel_centre[2] + d.right.wheel_centre[2]) / 2
		};
	}
	const lateral = V.lateralLoadTransfer(sprung.mass, sprung.cg, statics.front, statics.rear);
	if (lateral.roll_gradient < 0 || !Number.isFinite(lateral.roll_gradient)) warnings.push('the roll stiffness cannot hold the body up (W·H exceeds the springs and bars): the roll gradient is not meaningful');
	return {
		mass: all.mass,
		sprung_mass: sprung.mass,
		cg: all.cg,
		front_share: (weights.fl + weights.fr) / all.mass,
		left_share: (weights.fl + weights.rl) / all.mass,
		wheelbase,
		corner_weights: weights,
		axles,
		lateral_transfer: lateral,
		braking_transfer: V.longitudinalLoadTransfer(all.mass, all.cg[2], wheelbase),
		warnings
	};
}

/** The vehicle block of an axle's corners from the car's own figures (for anti-dive and anti-squat in axle sweeps). */
export function vehicleOf(figures: Pick<CarFigures, 'wheelbase' | 'cg'>, axle: AxleName, settings: CarSettings): VehicleInput | null {
	if (axle === 'front') {
		const brake = settings.frontBrakeFraction;
		return brake === null || brake === undefined ? null : { axle, wheelbase: figures.wheelbase, cg_height: figures.cg[2], front_brake_fraction: brake };
	}
	// an all-wheel-drive car's split is not stored: half to the rear (common practice for a first estimate, no source)
	const drive = settings.driveLayout === 'fwd' ? 0 : settings.driveLayout === 'awd' ? 0.5 : 1;
	return { axle, wheelbase: figures.wheelbase, cg_height: figures.cg[2], rear_drive_fraction: drive };
}

/** One axle at one body pitch: its wheel travel (mm, + bump) and the side-view figures of its left wheel. */
export interface PitchAxle {
	travel: number;
	/** side-view instant centre [x, z] of the left wheel (the solid axle's), mm */
	svic: [number, number] | null;
	/** front: anti-dive (percent); rear: anti-squat (percent); null without the vehicle figures they need */
	anti: number | null;
	camber: number | null;
	toe: number | null;
}

export interface PitchSample {
	/** body pitch in degrees, + = nose down (braking) */
	pitch: number;
	front: PitchAxle;
	rear: PitchAxle;
}

export interface PitchSweepResult {
	/** x of the pitch axis (mm): through the centre of gravity */
	pivot_x: number;
	cg_height: number;
	wheelbase: number;
	samples: PitchSample[];
	/** the first pitch at which an axle cannot be assembled, or null */
	error: { axle: AxleName; pitch: number; message: string } | null;
}

/**
 * A pitch sweep of the whole car: the body turns about a lateral axis through the centre of gravity (common
 * practice for a kinematic pitch sweep; the tyres' and springs' share of the pitch centre is left out), so each
 * axle's wheels travel by (x_axle − x_cg) · tan(pitch) against the body, front in bump and rear in rebound when the
 * nose goes down. Anti-dive (front, braking) and anti-squat (rear, drive) follow the contract's definitions with
 * the car's own wheelbase and CG height (Milliken & Milliken, Race Car Vehicle Dynamics, ch. 17).
 */
export function pitchSweep(model: CarModel, corners: CarCorners, settings: CarSettings, grid: { from: number; to: number; step: number }): PitchSweepResult {
	const figures = carFigures(model, corners);
	const [xcg, , zcg] = figures.cg;
	const n = Math.floor((grid.to - grid.from) / grid.step + 1e-9) + 1;
	const axleAt = {} as Record<AxleName, (travel: number) => PitchAxle | string>;
	const xOf = {} as Record<AxleName, number>;
	for (const a of ['front', 'rear'] as const) {
		const vehicle = vehicleOf(figures, a, settings);
		xOf[a] = figures.axles[a].x;
		if (a === 'rear' && model.rear.solid) {
			const solid = model.rear.solid;
			const v = vehicle && { wheelbase: vehicle.wheelbase, cg_height: vehicle.cg_height, axle: 'rear' as const, rear_drive_fraction: vehicle.rear_drive_fraction };
			axleAt[a] = (t) => {
				const r = solveSolidAxle(solid, v, { sweep: 'heave', from: t, to: t, step: 1 });
				const s = r.samples[0];
				return s ? { travel: t, svic: s.svic, anti: s.anti_squat, camber: null, toe: null } : (r.error?.message ?? 'cannot be assembled');
			};
			continue;
		}
		const solver = solveAxle(axleInput(model, corners, a, vehicle), a);
		axleAt[a] = (t) => {
			const r = solver.sweep({ sweep: 'heave', from: t, to: t, step: 1 });
			const s = r.samples[0]?.left;
			if (!s) return r.error ? `${r.error.side} ${r.error.link} cannot be assembled` : 'cannot be assembled';
			return { travel: t, svic: s.svic, anti: a === 'front' ? s.anti_dive : s.anti_squat, camber: s.camber, toe: s.toe };
		};
	}
	const samples: PitchSample[] = [];
	let error: PitchSweepResult['error'] = null;
	for (let k = 0; k < n; k++) {
		const pitch = Math.round((grid.from + k * grid.step) * 1e9) / 1e9;
		const tan = Math.tan((pitch * Math.PI) / 180);
		const out = {} as Record<AxleName, PitchAxle>;
		for (const a of ['front', 'rear'] as const) {
			const travel = Math.round((xOf[a] - xcg) * tan * 1e9) / 1e9;
			const r = axleAt[a](travel);
			if (typeof r === 'string') {
				error ??= { axle: a, pitch, message: r };
				break;
			}
			out[a] = r;
		}
		if (out.front && out.rear) samples.push({ pitch, front: out.front, rear: out.rear });
	}
	return { pivot_x: xcg, cg_height: zcg, wheelbase: figures.wheelbase, samples, error };
}
