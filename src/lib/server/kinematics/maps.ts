// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees at the edge.
// Combined motions as maps: toe and camber over wheel travel × rack travel (bump steer at lock) and over wheel travel
// × body roll.
// - heave × steer: one heave sweep per rack position, the rack held (exact: the engine's own sweep).
// - heave × roll: a corner's pose depends only on its wheel travel and the rack, so the body heaved by h and rolled
//   by φ puts the corner at the travel t where the contact point lies on the rolled ground raised by h:
//   n · W(t) − r √(1 − (n · a(t))²) = h, n = (0, −sin φ, cos φ) the rolled ground's normal (geometry-format.md: the
//   contact point is the lowest point of the wheel circle against the ground). t is found on a 0.5 mm heave sweep by
//   a sign change and linear interpolation, and the measures are read there; camber to the ground is camber + s · φ.
//   At h = 0 this is the engine's roll sweep (the unit test checks it against that sweep).
import { sub, unit } from '../../vec';
import { solveSweep, type CornerInput, type Sample } from './index';

export type MapKind = 'heave_steer' | 'heave_roll';
export const MAP_MEASURES = ['toe', 'camber', 'camber_ground'] as const;
export type MapMeasure = (typeof MAP_MEASURES)[number];

export interface MapRange {
	from: number;
	to: number;
	step: number;
}

export interface MotionMap {
	kind: MapKind;
	/** wheel travel (mm, + bump) */
	x: number[];
	/** rack travel (mm, + to the left) or body roll (°, + left side down) */
	y: number[];
	/** value[iy][ix] in degrees; null where the corner cannot be assembled */
	values: Record<MapMeasure, (number | null)[][]>;
	/** the rack held in a heave × roll map (mm) */
	rack: number;
}

const RAD = Math.PI / 180;

function grid(r: MapRange): number[] {
	const n = Math.round((r.to - r.from) / r.step);
	return Array.from({ length: n + 1 }, (_, i) => Math.round((r.from + i * r.step) * 1e9) / 1e9);
}

const empty = (ny: number, nx: number) => Array.from({ length: ny }, () => new Array<number | null>(nx).fill(null));

/** A map of toe, camber (and camber to the ground in roll) over wheel travel × rack travel or × body roll. */
export function motionMap(corner: CornerInput, kind: MapKind, heave: MapRange, second: MapRange, rack = 0): MotionMap {
	const x = grid(heave);
	const y = grid(second);
	const values: MotionMap['values'] = { toe: empty(y.length, x.length), camber: empty(y.length, x.length), camber_ground: empty(y.length, x.length) };
	const side = Math.sign(corner.points['wheel.centre'][1]) || 1;
	if (kind === 'heave_steer') {
		y.forEach((r, iy) => {
			const { samples } = solveSweep(corner, { sweep: 'heave', from: heave.from, to: heave.to, step: heave.step, rack: r });
			for (const s of samples) {
				const ix = x.findIndex((v) => Math.abs(v - s.travel!) < 1e-6);
				if (ix < 0) continue;
				values.toe[iy][ix] = s.toe;
				values.camber[iy][ix] = s.camber;
				values.camber_ground[iy][ix] = s.camber;
			}
		});
		return { kind, x, y, values, rack };
	}
	// heave × roll: a fine heave sweep wide enough for the roll's own travel at the contact point
	const r0 = corner.tyre.loaded_radius;
	const reach = Math.abs(corner.points['wheel.centre'][1]) * Math.sin(Math.max(Math.abs(second.from), Math.abs(second.to)) * RAD) + 20;
	const lo = Math.floor((heave.from - reach) / 10) * 10;
	const hi = Math.ceil((heave.to + reach) / 10) * 10;
	const { samples } = solveSweep(corner, { sweep: 'heave', from: lo, to: hi, step: 0.5, rack, points: true });
	const axes = samples.map((s) => spinAxis(s));
	y.forEach((phi, iy) => {
		const n = [0, -Math.sin(phi * RAD), Math.cos(phi * RAD)];
		const g = samples.map((s, k) => {
			const W = s.wheel_centre;
			const na = n[0] * axes[k][0] + n[1] * axes[k][1] + n[2] * axes[k][2];
			return n[0] * W[0] + n[1] * W[1] + n[2] * W[2] - r0 * Math.sqrt(Math.max(0, 1 - na * na));
		});
		// g is the contact point's height over the rolled ground through the origin: find where it equals h
		x.forEach((h, ix) => {
			for (let k = 0; k < samples.length; k++) {
				const a = g[k] - h;
				const b = k + 1 < samples.length ? g[k + 1] - h : NaN;
				if (a !== 0 && !(a * b < 0)) continue;
				const f = a === 0 ? 0 : a / (a - b);
				const next = a === 0 ? samples[k] : samples[k + 1];
				const at = (key: 'toe' | 'camber') => samples[k][key] + f * (next[key] - samples[k][key]);
				values.toe[iy][ix] = at('toe');
				values.camber[iy][ix] = at('camber');
				values.camber_ground[iy][ix] = at('camber') + side * phi;
				break;
			}
		});
	});
	return { kind, x, y, values, rack };
}

/** The unit spin axis, pointing outboard, of a sample solved with its points. */
function spinAxis(s: Sample): [number, number, number] {
	return unit(sub(s.points!['wheel.centre'], s.points!['wheel.axis_inner']));
}
