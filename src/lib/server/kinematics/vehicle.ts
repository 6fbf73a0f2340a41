// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height, y = 0 centreline.
// Units here: mm, kg, N, N/mm, N·m/deg, Hz, degrees; g = 9.80665 m/s².
// The car's statics: mass items to the centre of gravity and corner weights, springs to wheel rates and ride
// frequencies, roll stiffness per axle, the roll gradient and the steady-state load transfer split into its
// geometric (roll-centre), elastic (springs and bars) and unsprung parts, and the longitudinal transfer under
// braking. Pure functions on numbers; the corner and axle solvers supply motion ratios, tracks and roll centres.

export const G = 9.80665;
const RAD = Math.PI / 180;

/** A mass item: kg at a point (mm). */
export interface MassItem {
	name: string;
	mass: number;
	x: number;
	y: number;
	z: number;
}

/** Where the wheels stand: each axle's x and its two contact points' y (mm). */
export interface WheelBase {
	front: { x: number; yLeft: number; yRight: number };
	rear: { x: number; yLeft: number; yRight: number };
}

export interface MassSummary {
	/** total of the items (kg) */
	mass: number;
	cg: [number, number, number];
}

/** Total mass and centre of gravity of a set of items; null when the total is not positive. */
export function massCentre(items: readonly MassItem[]): MassSummary | null {
	let m = 0;
	let mx = 0;
	let my = 0;
	let mz = 0;
	for (const it of items) {
		m += it.mass;
		mx += it.mass * it.x;
		my += it.mass * it.y;
		mz += it.mass * it.z;
	}
	return m > 0 ? { mass: m, cg: [mx / m, my / m, mz / m] } : null;
}

export interface CornerWeights {
	fl: number;
	fr: number;
	rl: number;
	rr: number;
}

/**
 * Static corner weights (kg) of a mass at cg on level ground: the axle loads by moments about the other axle (a
 * beam on two supports), each axle's load split left/right by the lateral position of the CG between its two
 * contact points. A four-wheeled car is statically indeterminate; this split assumes no diagonal preload from the
 * spring platforms (common practice for a set-up sheet, no source).
 */
export function cornerWeights(mass: number, cg: readonly number[], wb: WheelBase): CornerWeights {
	const front = (mass * (cg[0] - wb.rear.x)) / (wb.front.x - wb.rear.x);
	const rear = mass - front;
	const leftShare = (ax: WheelBase['front']) => (cg[1] - ax.yRight) / (ax.yLeft - ax.yRight);
	const lf = leftShare(wb.front);
	const lr = leftShare(wb.rear);
	return { fl: front * lf, fr: front * (1 - lf), rl: rear * lr, rr: rear * (1 - lr) };
}

/** Wheel rate (N/mm) of a spring acting through a motion ratio: k · MR² (the spring's force and travel both scale by MR). */
export function wheelRate(springRate: number, motionRatio: number): number {
	return springRate * motionRatio * motionRatio;
}

/** Ride rate (N/mm): the wheel rate in series with the tyre's vertical rate (wheel rate alone without a tyre rate). */
export function rideRate(wheel: number, tyre: number | null | undefined): number {
	return tyre && tyre > 0 ? (wheel * tyre) / (wheel + tyre) : wheel;
}

/** Undamped natural frequency (Hz) of a corner's sprung mass (kg) on a ride rate (N/mm): f = √(k/m) / 2π. */
export function rideFrequency(rideRateNmm: number, sprungCornerMass: number): number {
	return sprungCornerMass > 0 ? Math.sqrt((rideRateNmm * 1000) / sprungCornerMass) / (2 * Math.PI) : NaN;
}

/**
 * Roll stiffness (N·m/deg) of an axle's two springs of wheel rate k (N/mm) at track t (mm): each wheel moves t/2 · φ,
 * so the roll moment is k · t² / 2 per radian.
 */
export function springRollStiffness(wheelRateLeft: number, wheelRateRight: number, track: number): number {
	const k = (wheelRateLeft + wheelRateRight) / 2;
	return ((k * track * track) / 2 / 1000) * RAD; // N·mm/rad → N·m/rad → N·m/deg
}

export interface AxleStatics {
	/** track (mm), roll-centre height (mm) and x (mm) of the axle */
	track: number;
	rcHeight: number;
	x: number;
	/** total roll stiffness of the axle (N·m/deg), springs plus bar */
	rollStiffness: number;
	/** unsprung mass of the axle (kg, both corners) and its CG height (mm, usually the wheel-centre height) */
	unsprungMass: number;
	unsprungHeight: number;
}

export interface LoadTransfer {
	/** per axle, N at the lateral acceleration asked for: geometric, elastic, unsprung and their sum */
	front: { geometric: number; elastic: number; unsprung: number; total: number };
	rear: { geometric: number; elastic: number; unsprung: number; total: number };
	/** body roll (degrees) per g and the sprung CG's height above the roll axis (mm) */
	roll_gradient: number;
	roll_arm: number;
	/** the roll axis height under the sprung CG (mm) */
	roll_axis_height: number;
}

/**
 * Steady-state lateral load transfer at ay g (Milliken & Milliken, Race Car Vehicle Dynamics, ch. 18; the split as
 * that chapter gives it, quoted from memory): the sprung mass's weight acts at its CG, a height H above the roll axis
 * (the line through the two roll centres). Its share on each axle transfers through that axle's roll centre
 * (geometric: W_s,axle · ay · z_rc / t); the roll moment W_s · H · ay (plus W_s · H · φ from the CG's sideways shift
 * as the body rolls) is shared by the axles' roll stiffnesses (elastic: K_axle · φ / t); each axle's unsprung mass
 * transfers directly (W_u · ay · z_u / t). The roll gradient φ / ay = W_s H / (K_f + K_r − W_s H).
 */
export function lateralLoadTransfer(sprungMass: number, sprungCg: readonly number[], front: AxleStatics, rear: AxleStatics, ay = 1): LoadTransfer {
	const Ws = sprungMass * G; // N
	const wheelbase = front.x - rear.x;
	const frontShare = (sprungCg[0] - rear.x) / wheelbase; // of the sprung weight
	const roll_axis_height = rear.rcHeight + (front.rcHeight - rear.rcHeight) * frontShare;
	const H = sprungCg[2] - roll_axis_height; // mm
	const kf = front.rollStiffness / RAD; // N·m/rad
	const kr = rear.rollStiffness / RAD;
	const WsH = (Ws * H) / 1000; // N·m
	const phiPerG = WsH / (kf + kr - WsH); // rad per g
	const phi = phiPerG * ay;
	const axle = (a: AxleStatics, share: number, k: number) => {
		const geometric = (Ws * share * ay * a.rcHeight) / a.track;
		const elastic = ((k * phi) / a.track) * 1000;
		const unsprung = (a.unsprungMass * G * ay * a.unsprungHeight) / a.track;
		return { geometric, elastic, unsprung, total: geometric + elastic + unsprung };
	};
	return {
		front: axle(front, frontShare, kf),
		rear: axle(rear, 1 - frontShare, kr),
		roll_gradient: phiPerG / RAD,
		roll_arm: H,
		roll_axis_height
	};
}

/** Longitudinal load transfer (N) from the rear axle to the front under braking at ax g: W · ax · h / L. */
export function longitudinalLoadTransfer(mass: number, cgHeight: number, wheelbase: number, ax = 1): number {
	return (mass * G * ax * cgHeight) / wheelbase;
}
