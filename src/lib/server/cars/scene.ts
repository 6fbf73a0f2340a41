// What the car model page draws and charts of a car revision, from the server's solves: the steered axle through
// the steering range (with every point, for the 3-D view), both axles through roll (roll-centre path), the rear
// axle at design (its corners' links, or a solid axle's housing, links and lateral locator) and a body outline
// built from the track, wheelbase and sprung mass items with the CG. Nothing here solves: it calls axleSweep.
// Frame: ISO 8855 vehicle axes, x forward, y left, z up, mm, z = 0 the ground.
import { kindSpec } from '$lib/kinds';
import type { CarModel } from '$lib/schemas/car-model';
import { solidRods } from '$lib/schemas/solid-axle';
import type { Car } from '$lib/server/db/schema';
import type { AxleSample } from '$lib/server/kinematics/axle';
import type { CarCorners, CarFigures } from '$lib/server/kinematics/car';
import type { SolidSample } from '$lib/server/kinematics/solid-axle';
import type { SceneAxle, SceneBody, SceneWheel, Vec3 } from '$lib/components/linkage/types';
import { axleSweep } from './model';

type CarRow = Pick<Car, 'id' | 'teamId' | 'frontBrakeFraction' | 'driveLayout'>;

/** One side of the steered axle at one steering-wheel angle (points for the 3-D view). */
export interface SideFrame {
	points: Record<string, Vec3>;
	wheel_centre: Vec3;
	contact_patch: Vec3;
}

export interface SteerSample {
	steering_wheel: number;
	delta_left: number | null;
	delta_right: number | null;
	ackermann: number | null;
	steering_ratio: number | null;
	turning_circle: number | null;
}

/** The front axle through the steering range (10° steps, ±180°), with every point when `points`. */
export function steerFrames(car: CarRow, model: CarModel, corners: CarCorners, points: boolean) {
	if (!model.front.steering) return null;
	const r = axleSweep(car, model, corners, 'front', { sweep: 'steer', from: -180, to: 180, step: 10, points });
	const side = (s: AxleSample['left']): SideFrame => ({ points: (s.points ?? {}) as Record<string, Vec3>, wheel_centre: s.wheel_centre as Vec3, contact_patch: s.contact_patch as Vec3 });
	return {
		error: r.error,
		kinds: r.kinds as string[],
		samples: (r.samples as AxleSample[]).map((s) => ({
			steering_wheel: s.steering_wheel!,
			delta_left: s.delta_left,
			delta_right: s.delta_right,
			ackermann: s.ackermann,
			steering_ratio: s.steering_ratio,
			turning_circle: s.turning_circle,
			...(points ? { left: side(s.left), right: side(s.right) } : {})
		}))
	};
}

/** Both axles through ±3° of body roll: the roll centre [y, z] at each step (null where it has none). */
export function rollPaths(car: CarRow, model: CarModel, corners: CarCorners) {
	const roll = (a: 'front' | 'rear') =>
		(axleSweep(car, model, corners, a, { sweep: 'roll', from: -3, to: 3, step: 0.25 }).samples as { roll?: number; rc: [number, number] | null }[]).map((s) => ({
			roll: s.roll!,
			rc: s.rc
		}));
	return { front: roll('front'), rear: roll('rear') };
}

const pairs = (pts: Record<string, Vec3>, lines: readonly (readonly [string, string])[]) =>
	lines.filter(([a, b]) => pts[a] && pts[b]).map(([a, b]) => [pts[a], pts[b]] as [Vec3, Vec3]);

/** The named lines of a solid axle: its links and lateral locator, its springs; the housing apart. */
function solidLines(lateral: 'panhard' | 'watt') {
	const links: [string, string][] = solidRods(lateral).map(([, a, b]) => [a, b]);
	if (lateral === 'watt') links.push(['watt.upper_end', 'watt.pivot'], ['watt.pivot', 'watt.lower_end']);
	links.push(['spring_left.chassis', 'spring_left.axle'], ['spring_right.chassis', 'spring_right.axle']);
	const housing: [string, string][] = [
		['wheel_left.centre', 'wheel_right.centre'],
		['lower_left.axle', 'upper_left.axle'],
		['lower_right.axle', 'upper_right.axle']
	];
	return { links, housing };
}

/** The rear axle at design ride height, solved with every point. */
export function rearAtDesign(car: CarRow, model: CarModel, corners: CarCorners): SceneAxle {
	const r = axleSweep(car, model, corners, 'rear', { sweep: 'heave', from: 0, to: 0, step: 1, points: true });
	const solid = model.rear.solid;
	if (solid) {
		const s = r.samples[0] as SolidSample;
		const pts = (s?.points ?? {}) as Record<string, Vec3>;
		const lines = solidLines(solid.lateral);
		const radius = solid.tyre.loaded_radius;
		const wheel = (side: 'left' | 'right'): SceneWheel => ({ centre: pts[`wheel_${side}.centre`], axis_inner: pts[`wheel_${side}.axis_inner`], radius });
		return {
			type: 'solid',
			label: `solid axle, four links and ${solid.lateral === 'panhard' ? 'a Panhard rod' : "a Watt's linkage"}`,
			links: pairs(pts, lines.links),
			housing: pairs(pts, lines.housing),
			wheels: [wheel('left'), wheel('right')]
		};
	}
	const s = r.samples[0] as AxleSample;
	const kinds = r.kinds as string[];
	const side = (i: 0 | 1) => (i === 0 ? s.left : s.right);
	const wheel = (i: 0 | 1): SceneWheel => {
		const x = side(i);
		const pts = (x.points ?? {}) as Record<string, Vec3>;
		return { centre: x.wheel_centre as Vec3, axis_inner: pts['wheel.axis_inner'] ?? (x.wheel_centre as Vec3), radius: (x.wheel_centre as Vec3)[2] - (x.contact_patch as Vec3)[2] };
	};
	return {
		type: 'corners',
		label: kindsLabel(kinds),
		links: [0, 1].flatMap((i) => pairs((side(i as 0 | 1).points ?? {}) as Record<string, Vec3>, kindSpec(kinds[i]).diagram)),
		housing: [],
		wheels: [wheel(0), wheel(1)]
	};
}

/**
 * A simple hull round the sprung items: from ahead of the front axle to behind the rear one, as wide as the items
 * (and at least a cockpit), inside the narrower track less a tyre's width; floor to above the highest item.
 */
export function bodyOutline(model: CarModel, figures: CarFigures): SceneBody {
	const items = model.mass_items;
	const xf = figures.axles.front.x;
	const xr = figures.axles.rear.x;
	const halfTrack = Math.min(figures.axles.front.track, figures.axles.rear.track) / 2;
	const widest = Math.max(...items.map((i) => Math.abs(i.y) + 150), 300);
	const w = Math.min(widest, Math.max(halfTrack - 250, 250));
	const nose = Math.max(xf + 0.35 * halfTrack, ...items.map((i) => i.x + 150));
	const tail = Math.min(xr - 0.25 * halfTrack, ...items.map((i) => i.x - 150));
	const plan: [number, number][] = [
		[nose, 0.35 * w],
		[xf, 0.55 * w],
		[xf - 0.3 * (xf - xr), w],
		[xr + 0.1 * (xf - xr), w],
		[tail, 0.8 * w],
		[tail, -0.8 * w],
		[xr + 0.1 * (xf - xr), -w],
		[xf - 0.3 * (xf - xr), -w],
		[xf, -0.55 * w],
		[nose, -0.35 * w]
	];
	const floor = Math.max(20, Math.min(...items.map((i) => i.z)) - 40);
	const top = Math.max(...items.map((i) => i.z)) + 250;
	return { plan, floor, top, cg: figures.cg, items: items.map((i) => ({ name: i.name, mass: i.mass, at: [i.x, i.y, i.z] as Vec3 })) };
}

const kindsLabel = (kinds: string[]) =>
	kinds[0] === kinds[1] ? `${kindSpec(kinds[0]).label.toLowerCase()}, both sides` : `${kindSpec(kinds[0]).label.toLowerCase()} left, ${kindSpec(kinds[1]).label.toLowerCase()} right`;

/**
 * Everything the car's 3-D view draws: the front axle's frames (through the steering range when it steers, else
 * one frame at design), the rear axle at design, the body outline.
 */
export function carScene(car: CarRow, model: CarModel, corners: CarCorners, figures: CarFigures, steer: ReturnType<typeof steerFrames>) {
	let frontFrames: { steering_wheel: number; delta_left: number | null; delta_right: number | null; left: SideFrame; right: SideFrame }[];
	let kinds: string[];
	if (steer) {
		frontFrames = steer.samples as typeof frontFrames;
		kinds = steer.kinds;
	} else {
		const r = axleSweep(car, model, corners, 'front', { sweep: 'heave', from: 0, to: 0, step: 1, points: true });
		const s = r.samples[0] as AxleSample;
		const side = (x: AxleSample['left']): SideFrame => ({ points: (x.points ?? {}) as Record<string, Vec3>, wheel_centre: x.wheel_centre as Vec3, contact_patch: x.contact_patch as Vec3 });
		frontFrames = s ? [{ steering_wheel: 0, delta_left: null, delta_right: null, left: side(s.left), right: side(s.right) }] : [];
		kinds = r.kinds as string[];
	}
	return {
		front: { label: `${kindsLabel(kinds)}${steer ? ', steered' : ''}`, kinds, frames: frontFrames },
		rear: rearAtDesign(car, model, corners),
		body: bodyOutline(model, figures)
	};
}
