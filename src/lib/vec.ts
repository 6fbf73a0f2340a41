// Frame: any right-handed Cartesian frame; lengths in mm.
// THE tuple vector helpers (plain [x, y, z] numbers, a new tuple per call; client-safe): the corner file's checks
// (schemas/geometry.ts), the CSV import, the scan fits, the joint angles and maps, and the reference route of the tests
// use these. They read any [x, y, z]-like (a tuple, a typed array's first three) and return a new tuple. The solver's hot loops use
// their own Float64Array helpers that write into `out` (server/kinematics/vec3.ts) and allocate nothing.

export type Vec3 = [number, number, number];
/** Anything with x, y, z at 0, 1, 2. */
type V = ArrayLike<number>;

/** a − b (mm). */
export const sub = (a: V, b: V): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
/** a + b (mm). */
export const add = (a: V, b: V): Vec3 => [a[0] + b[0], a[1] + b[1], a[2] + b[2]];
/** s · a. */
export const scale = (a: V, s: number): Vec3 => [a[0] * s, a[1] * s, a[2] * s];
/** a · b. */
export const dot = (a: V, b: V): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
/** a × b. */
export const cross = (a: V, b: V): Vec3 => [
	a[1] * b[2] - a[2] * b[1],
	a[2] * b[0] - a[0] * b[2],
	a[0] * b[1] - a[1] * b[0]
];
/** |a| (mm). */
export const norm = (a: V): number => Math.hypot(a[0], a[1], a[2]);
/** |a − b| (mm). */
export const dist = (a: V, b: V): number => norm(sub(a, b));
/** a / |a|; the caller makes sure a is not zero. */
export const unit = (a: V): Vec3 => scale(a, 1 / norm(a));
