// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// A suspension kind as data: its bodies, joints, points, labels and 2-D diagram. The solver's
// plan compiler (src/lib/server/kinematics/plan.ts) reads the joints and picks its steps from
// their structure, so a kind whose structure it knows needs no solver code of its own.
// Client-safe: no imports.

/** The bodies a corner may have besides the chassis. `arm` is a single arm that carries the upright rigidly. */
export type BodyName = 'chassis' | 'rack' | 'lower' | 'upper' | 'upright' | 'arm' | 'rocker';

/** One named point of a kind: where it sits, what it is, and its place in the diagram (0–100). */
export interface PointSpec {
	name: string;
	label: string;
	description: string;
	/** the body the point is fixed to */
	body: BodyName;
	/** front-view diagram position, 0–100 on each axis (y down) */
	diagram: [number, number];
	/** the trade's names for it that a point-list import should accept (besides our own name) */
	aliases?: readonly string[];
}

/** How the bodies are joined. */
export type JointSpec =
	/** an arm turning about a pivot axis fixed to the chassis (two bushes or joints) */
	| { type: 'pivot'; body: BodyName; axis: readonly [string, string] }
	/** a ball joint between an arm and the upright */
	| { type: 'ball'; body: BodyName; at: string }
	/** a rod with a ball joint at both ends: `inner` on the chassis (or the rack), `outer` on the upright */
	| { type: 'rod'; link: string; inner: string; outer: string }
	/** the upright's strut slides through a mount on the chassis: the strut axis passes through `top`, `lower` is a second point on it */
	| { type: 'slider'; top: string; lower: string }
	/** the upright is fixed to an arm (one rigid body) */
	| { type: 'rigid'; body: BodyName };

/** Where the steering axis comes from. */
export type SteeringAxisSpec =
	/** through two points of the upright (ball joints, or the strut's top mount) */
	| { type: 'points'; lower: string; upper: string }
	/** virtual: the ends are where the lines of two pairs of links come closest */
	| { type: 'virtual'; lower: readonly [string, string]; upper: readonly [string, string] }
	/** none: the wheel does not steer about an axis */
	| { type: 'none' };

/** A suspension kind. */
export interface KindSpec {
	kind: string;
	label: string;
	/** one sentence for the kind picker */
	summary: string;
	points: readonly PointSpec[];
	joints: readonly JointSpec[];
	steeringAxis: SteeringAxisSpec;
	/** 'arm-planes': each arm's plane through its pivot axis and ball joint (contract); 'motion': from the upright's velocity */
	instantCentres: 'arm-planes' | 'motion';
	/** the bodies `spring_on` may name */
	springOn: readonly BodyName[];
	/** the bodies a rocker's rod may be fixed to; empty when the kind takes no rocker */
	rockerRodOn: readonly BodyName[];
	/** whether a steer sweep (rack travel) applies */
	steers: boolean;
	/** lines of the front-view diagram, as pairs of point names */
	diagram: readonly (readonly [string, string])[];
	/** an invented corner of this kind to start from (front left unless said), corner-geometry/1 fields */
	template: {
		points: Record<string, [number, number, number]>;
		spring_on?: string;
		tyre: { loaded_radius: number };
		/** a pushrod or pullrod rocker for this template (kinds that take one): its points under their table names, the rod's body, and the spring's chassis end it then uses */
		rocker?: { points: Record<string, [number, number, number]>; rod_on: BodyName; spring_chassis: [number, number, number] };
	};
}

/** The spring points every kind may carry. */
export const SPRING_POINTS: readonly PointSpec[] = [
	{
		name: 'spring.chassis',
		label: 'Spring, chassis end',
		description: 'Chassis end of the spring or damper.',
		body: 'chassis',
		diagram: [50, 14],
		aliases: ['damper chassis', 'damper top', 'damper upper', 'shock top', 'shock upper', 'spring top', 'spring upper', 'coilover top']
	},
	{
		name: 'spring.body',
		label: 'Spring, moving end',
		description: 'Moving end of the spring or damper, on the body named by "spring on". Not used when a rocker works the spring.',
		body: 'upright',
		diagram: [56, 72],
		aliases: ['damper lower', 'damper bottom', 'damper bot', 'shock lower', 'shock bottom', 'shock bot', 'spring lower', 'spring bottom', 'spring bot', 'coilover bottom']
	}
];

/** The rocker's points (the `rocker` block of the file), as the point table names them. */
export const ROCKER_POINTS: readonly PointSpec[] = [
	{
		name: 'rocker.pivot_a',
		label: 'Rocker, pivot A',
		description: 'One end of the rocker\'s pivot axis on the chassis; the rocker angle is right-handed about A to B.',
		body: 'chassis',
		diagram: [40, 10],
		aliases: ['rocker pivot front', 'bell crank pivot front', 'rocker axis front']
	},
	{
		name: 'rocker.pivot_b',
		label: 'Rocker, pivot B',
		description: 'The other end of the rocker\'s pivot axis on the chassis.',
		body: 'chassis',
		diagram: [42, 13],
		aliases: ['rocker pivot rear', 'bell crank pivot rear', 'rocker axis rear']
	},
	{
		name: 'rocker.rod_end',
		label: 'Rocker, rod joint',
		description: 'Where the pushrod or pullrod meets the rocker.',
		body: 'rocker',
		diagram: [48, 18],
		aliases: ['pushrod inner', 'pullrod inner', 'pushrod rocker', 'pullrod rocker', 'bell crank rod']
	},
	{
		name: 'rocker.spring_end',
		label: 'Rocker, spring joint',
		description: 'Where the spring or damper meets the rocker.',
		body: 'rocker',
		diagram: [34, 16],
		aliases: ['rocker damper', 'rocker spring', 'bell crank damper', 'bell crank spring']
	},
	{
		name: 'rocker.rod_outer',
		label: 'Pushrod or pullrod, outer joint',
		description: 'The rod\'s other end, on the body "rod on" names (lower arm, upper arm, upright or arm).',
		body: 'lower',
		diagram: [66, 74],
		aliases: ['pushrod outer', 'pullrod outer', 'pushrod lower', 'pullrod upper', 'pushrod wishbone', 'pullrod wishbone']
	}
];

/** The keys of the file's `rocker` block, in the order of ROCKER_POINTS. */
export const ROCKER_KEYS = ['pivot_a', 'pivot_b', 'rod_end', 'spring_end', 'rod_outer'] as const;
