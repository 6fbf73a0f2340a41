// The suspension kinds: the one list every part of the app reads (schemas, database check,
// point table, diagram, import, 3-D view, solver). Client-safe.
import { doubleWishbone } from './double-wishbone';
import { multiLink } from './multi-link';
import { semiTrailing } from './semi-trailing';
import { strut } from './strut';
import { ROCKER_KEYS, ROCKER_POINTS, SPRING_POINTS, type KindSpec, type PointSpec } from './types';

export type { BodyName, JointSpec, KindSpec, PointSpec, SteeringAxisSpec } from './types';
export { ROCKER_KEYS, ROCKER_POINTS, SPRING_POINTS } from './types';

/** Every kind, in the order the kind picker shows them. */
export const KIND_SPECS = [doubleWishbone, strut, multiLink, semiTrailing] as const satisfies readonly KindSpec[];

/** The kind names, as the file's `kind` field spells them. */
export const CORNER_KINDS = ['double_wishbone', 'strut', 'multi_link', 'semi_trailing'] as const;
export type CornerKind = (typeof CORNER_KINDS)[number];

const BY_NAME = new Map<string, KindSpec>(KIND_SPECS.map((k) => [k.kind, k]));

/** The description of `kind` (throws on an unknown kind: callers validate first). */
export function kindSpec(kind: string): KindSpec {
	const k = BY_NAME.get(kind);
	if (!k) throw new Error(`unknown suspension kind ${kind}`);
	return k;
}

/** The required point names of each kind (the contract's table). */
export const REQUIRED_POINTS = Object.fromEntries(KIND_SPECS.map((k) => [k.kind, k.points.map((p) => p.name)])) as unknown as Record<
	CornerKind,
	readonly string[]
>;

/**
 * The straight members of a kind, read from its joints, as pairs of point names: each arm from its pivot axis to
 * its ball joint (an arm that carries the upright rigidly: to the spin axis, and along its pivot axis), each rod
 * from its inner to its outer joint, and the strut (lower point to top mount) as `strut`.
 */
export function kindMembers(kind: string): { links: [string, string][]; strut: [string, string] | null } {
	const spec = kindSpec(kind);
	const links: [string, string][] = [];
	let strut: [string, string] | null = null;
	const pivotOf = (body: string) => spec.joints.find((q) => q.type === 'pivot' && q.body === body);
	for (const j of spec.joints) {
		if (j.type === 'ball') {
			const pivot = pivotOf(j.body);
			if (pivot && pivot.type === 'pivot') links.push([pivot.axis[0], j.at], [pivot.axis[1], j.at]);
		} else if (j.type === 'rod') links.push([j.inner, j.outer]);
		else if (j.type === 'slider') strut = [j.lower, j.top];
		else if (j.type === 'rigid') {
			const pivot = pivotOf(j.body);
			if (pivot && pivot.type === 'pivot') links.push([pivot.axis[0], 'wheel.axis_inner'], [pivot.axis[1], 'wheel.axis_inner'], [pivot.axis[0], pivot.axis[1]]);
		}
	}
	return { links, strut };
}

/** The rocker's straight members (table names): its pivot axis, the rod to it, and the line between its joints. */
export const ROCKER_MEMBERS: readonly [string, string][] = [
	['rocker.pivot_a', 'rocker.pivot_b'],
	['rocker.rod_end', 'rocker.rod_outer'],
	['rocker.rod_end', 'rocker.spring_end']
];

/** The kinds' labels for pickers and headings. */
export const KIND_LABELS = Object.fromEntries(KIND_SPECS.map((k) => [k.kind, k.label])) as Record<CornerKind, string>;

/** Every point a kind's table shows: required, spring ends, then the rocker's when the kind takes one (its spring then ends on the rocker). */
export function tablePoints(kind: string, rocker = false): PointSpec[] {
	const k = kindSpec(kind);
	const withRocker = rocker && k.rockerRodOn.length > 0;
	return [...k.points, ...SPRING_POINTS.filter((p) => !withRocker || p.name !== 'spring.body'), ...(withRocker ? ROCKER_POINTS : [])];
}

/** Every point name any kind knows, including the rocker's table names (`rocker.pivot_a`, ...). */
export const ALL_POINT_NAMES: readonly string[] = [
	...new Set([...KIND_SPECS.flatMap((k) => k.points.map((p) => p.name)), ...SPRING_POINTS.map((p) => p.name), ...ROCKER_POINTS.map((p) => p.name)])
];

/** Points whose placement a fabricator sets (chassis brackets, upright joints, the rocker's): every kind's points
 * less the wheel's spin axis and the spring ends. The fix search may move them and the tolerance study spreads them. */
export const LINKAGE_POINT_NAMES: readonly string[] = ALL_POINT_NAMES.filter((p) => !p.startsWith('wheel.') && !p.startsWith('spring.'));

/** The `rocker` block's key of a table name (`rocker.rod_end` → `rod_end`), or null. */
export function rockerKey(name: string): (typeof ROCKER_KEYS)[number] | null {
	const key = name.startsWith('rocker.') ? name.slice(7) : '';
	return (ROCKER_KEYS as readonly string[]).includes(key) ? (key as (typeof ROCKER_KEYS)[number]) : null;
}

type P = [number, number, number];

/** The corner file's points and rocker block from the point table's flat points (`rocker.*` rows make the block). */
export function splitRocker(points: Record<string, P>, rodOn: string | null): { points: Record<string, P>; rocker: Record<string, unknown> | null } {
	const own: Record<string, P> = {};
	const block: Record<string, unknown> = {};
	for (const [name, p] of Object.entries(points)) {
		const key = rockerKey(name);
		if (key) block[key] = p;
		else own[name] = p;
	}
	if (!rodOn || !Object.keys(block).length) return { points: own, rocker: null };
	return { points: own, rocker: { ...block, rod_on: rodOn } };
}

/**
 * The point table's flat points of a corner file: its points plus the rocker block's under `rocker.*`. A point
 * already under its table name wins (the analyses offset points there).
 */
export function joinRocker(points: Record<string, P>, rocker: object | null | undefined): Record<string, P> {
	if (!rocker) return points;
	const block = rocker as Record<string, unknown>;
	const out = { ...points };
	for (const k of ROCKER_KEYS) if (!out[`rocker.${k}`] && Array.isArray(block[k])) out[`rocker.${k}`] = block[k] as P;
	return out;
}

/**
 * A kind's template placed for a corner: mirrored to the right side when `position` is a right corner,
 * and moved along x so its wheel centre sits on the front axle (x = 0) or the rear (x = −wheelbase).
 */
export function templateFor(kind: string, position: string, wheelbase: number | null, rocker = false) {
	const t = kindSpec(kind).template;
	const rear = position.startsWith('rear');
	const right = position.endsWith('right');
	const w = t.points['wheel.centre'];
	const dx = (rear ? -(wheelbase ?? 2600) : 0) - w[0];
	const move = (p: P): P => [Math.round((p[0] + dx) * 1000) / 1000, right ? -p[1] : p[1], p[2]];
	const withRocker = rocker && !!t.rocker;
	const source: Record<string, P> = withRocker ? { ...t.points, ...t.rocker!.points, 'spring.chassis': t.rocker!.spring_chassis } : t.points;
	const points = Object.fromEntries(
		Object.entries(source)
			.filter(([k]) => !withRocker || k !== 'spring.body')
			.map(([k, p]) => [k, move(p)])
	) as Record<string, P>;
	return { kind, points, spring_on: t.spring_on, rod_on: withRocker ? t.rocker!.rod_on : null, tyre: { ...t.tyre } };
}

/** The measures that need a steering axis (null on a kind without one: contract, "More kinds"). */
const AXIS_MEASURES = ['caster', 'kpi', 'scrub_radius', 'trail'];

/**
 * The measures a corner of `kind` with these points (the table's flat points, rocker ones included) cannot have:
 * the steering-axis figures without an axis, the rocker angle without a rocker, the motion ratio without a spring.
 * Pickers and the analyses leave them out rather than solve for a curve that is null everywhere.
 */
export function measuresNotApplying(kind: string, points: Record<string, unknown>): Set<string> {
	const out = new Set<string>();
	if (kindSpec(kind).steeringAxis.type === 'none') for (const m of AXIS_MEASURES) out.add(m);
	const rocker = !!points['rocker.pivot_a'];
	if (!rocker) out.add('rocker_angle');
	if (!points['spring.chassis'] || (!rocker && !points['spring.body'])) out.add('motion_ratio');
	return out;
}
