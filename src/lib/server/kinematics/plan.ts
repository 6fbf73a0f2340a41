// Frame: none (structure only).
// The plan compiler's first half: from a kind's description (its joints) to the chain of solve
// steps the engine runs. Closed-form chains wherever the structure allows, Newton on the rest:
//   - a pivot arm carrying the upright rigidly: the upright turns about the pivot axis (revolute);
//   - two pivot arms ball-jointed to the upright and one rod: circle ∩ sphere, then the rod
//     turns the upright about the steering axis (arms);
//   - one pivot arm ball-jointed to the upright, a slider through a chassis mount and one rod:
//     the slider point on the strut axis, then the rod (slider);
//   - five rods and nothing else: Newton on the upright's six coordinates (rods).
// A kind whose joints match one of these needs no solver code of its own.

import type { JointSpec, KindSpec } from '../../kinds';

/** Chain codes of the hot loop. */
export const CHAIN_ARMS = 0;
export const CHAIN_SLIDER = 1;
export const CHAIN_REVOLUTE = 2;
export const CHAIN_RODS = 3;

/** The structure a kind compiles to: its chain and the joints each step reads. */
export interface Plan {
	chain: number;
	/** the pivot arm that drives the chain (its ball joint is the upright's origin), or the arm carrying the upright */
	driving: { body: string; axis: readonly [string, string]; ball: string | null } | null;
	/** the second pivot arm and its ball joint (arms chain) */
	second: { body: string; axis: readonly [string, string]; ball: string } | null;
	/** the strut (slider chain) */
	slider: { top: string; lower: string } | null;
	/** the rods, in the description's order (arms and slider chains: the one that closes the loop) */
	rods: { link: string; inner: string; outer: string }[];
}

/** The joints of `spec` of one type. */
function joints<T extends JointSpec['type']>(spec: KindSpec, type: T): Extract<JointSpec, { type: T }>[] {
	return spec.joints.filter((j): j is Extract<JointSpec, { type: T }> => j.type === type);
}

/** Compile the chain of `spec`; throws an Error naming the structure when no chain fits. */
export function planOf(spec: KindSpec): Plan {
	const pivots = joints(spec, 'pivot');
	const balls = joints(spec, 'ball');
	const rods = joints(spec, 'rod').map((r) => ({ link: r.link, inner: r.inner, outer: r.outer }));
	const sliders = joints(spec, 'slider');
	const rigid = joints(spec, 'rigid');
	const pivotOf = (body: string) => pivots.find((p) => p.body === body);
	if (rigid.length === 1 && pivots.length === 1 && pivots[0].body === rigid[0].body && !balls.length && !rods.length) {
		return { chain: CHAIN_REVOLUTE, driving: { body: pivots[0].body, axis: pivots[0].axis, ball: null }, second: null, slider: null, rods };
	}
	const armBalls = balls.filter((b) => pivotOf(b.body));
	if (armBalls.length === 2 && rods.length === 1 && !sliders.length) {
		const [a, b] = armBalls;
		return {
			chain: CHAIN_ARMS,
			driving: { body: a.body, axis: pivotOf(a.body)!.axis, ball: a.at },
			second: { body: b.body, axis: pivotOf(b.body)!.axis, ball: b.at },
			slider: null,
			rods
		};
	}
	if (armBalls.length === 1 && sliders.length === 1 && rods.length === 1) {
		const a = armBalls[0];
		return { chain: CHAIN_SLIDER, driving: { body: a.body, axis: pivotOf(a.body)!.axis, ball: a.at }, second: null, slider: sliders[0], rods };
	}
	if (rods.length === 5 && !balls.length && !sliders.length && !rigid.length) {
		return { chain: CHAIN_RODS, driving: null, second: null, slider: null, rods };
	}
	throw new Error(`kind ${spec.kind}: no solve chain for ${pivots.length} pivots, ${balls.length} ball joints, ${rods.length} rods, ${sliders.length} sliders`);
}
