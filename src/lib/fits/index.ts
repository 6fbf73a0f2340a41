// Feature fits on a patch of scan points (client-safe, pure TypeScript): the ball joint's sphere, the bush's
// cylinder and the hub face's plane with its circle. Points come as flat xyz (mm). Every fit reports its residual
// RMS (mm, geometric distances) and the number of points used.
//
// Sphere: I. D. Coope, "Circle fitting by linear and nonlinear least squares", Journal of Optimization Theory and
// Applications 76(2), 1993: |x − c|² = r² rewritten as 2 c·x + (r² − |c|²) = |x|², linear in (c, r² − |c|²),
// solved by linear least squares (here on centred coordinates for conditioning); then optional Gauss–Newton on the
// geometric residuals |x − c| − r from that start (the nonlinear problem of the same paper).
// Plane: total least squares through the centroid, the normal being the eigenvector of the scatter matrix with the
// least eigenvalue (Pearson's orthogonal regression). Circle in the plane: Coope's linear fit in 2-D, then
// Gauss–Newton, on the rim (the convex hull of the in-plane points of the patch).
// Cylinder: Gauss–Newton on the distances to the axis minus the radius, started from each principal direction of
// the patch, the best kept (common practice; no single published start).
import { cross, dot, norm, unit } from '../vec';
import { NormalEquations, solve, symmetricEigen3 } from './linear';

export type V3 = [number, number, number];

export interface SphereFit {
	kind: 'sphere';
	centre: V3;
	radius: number;
	rms: number;
	used: number;
	method: 'coope-linear' | 'coope-linear+gauss-newton';
}

export interface CylinderFit {
	kind: 'cylinder';
	/** the bush's pivot: on the axis, midway between the patch's ends along it */
	centre: V3;
	axis: V3;
	radius: number;
	length: number;
	rms: number;
	used: number;
}

export interface PlaneCircleFit {
	kind: 'plane_circle';
	/** the circle's centre in the plane (the wheel centre on a hub face) */
	centre: V3;
	/** the plane's unit normal (the spin axis) */
	normal: V3;
	radius: number;
	planeRms: number;
	circleRms: number;
	rms: number;
	used: number;
	rimPoints: number;
}

/** A fit that could not be made, with the reason for the page. */
export class FitError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'FitError';
	}
}

function count(points: ArrayLike<number>, least: number, what: string) {
	const n = Math.floor(points.length / 3);
	if (n < least) throw new FitError(`${what} needs at least ${least} points; the patch has ${n}`);
	return n;
}

/** Centroid of flat xyz points. */
export function centroid(points: ArrayLike<number>): V3 {
	const n = points.length / 3;
	const c: V3 = [0, 0, 0];
	for (let i = 0; i < points.length; i += 3) {
		c[0] += points[i];
		c[1] += points[i + 1];
		c[2] += points[i + 2];
	}
	return [c[0] / n, c[1] / n, c[2] / n];
}

/** Scatter matrix about a point. */
function scatter(points: ArrayLike<number>, c: V3): number[][] {
	const S = [
		[0, 0, 0],
		[0, 0, 0],
		[0, 0, 0]
	];
	for (let i = 0; i < points.length; i += 3) {
		const d = [points[i] - c[0], points[i + 1] - c[1], points[i + 2] - c[2]];
		for (let r = 0; r < 3; r++) for (let k = 0; k < 3; k++) S[r][k] += d[r] * d[k];
	}
	return S;
}

function sphereRms(points: ArrayLike<number>, c: V3, r: number) {
	let s = 0;
	for (let i = 0; i < points.length; i += 3) {
		const d = Math.hypot(points[i] - c[0], points[i + 1] - c[1], points[i + 2] - c[2]) - r;
		s += d * d;
	}
	return Math.sqrt(s / (points.length / 3));
}

/** Sphere by Coope's linear least squares (1993), refined by Gauss–Newton unless `refine` is false. */
export function fitSphere(points: ArrayLike<number>, { refine = true, iterations = 20 } = {}): SphereFit {
	const n = count(points, 4, 'a sphere');
	const m = centroid(points);
	const spread = symmetricEigen3(scatter(points, m)).values;
	if (spread[0] <= 1e-10 * spread[2]) throw new FitError('the points lie on a plane or a line; a sphere needs a curved patch');
	// Coope: unknowns y = (c − m, r² − |c − m|²); rows [2dx, 2dy, 2dz, 1] · y = |d|²
	const ne = new NormalEquations(4);
	const row = [0, 0, 0, 1];
	for (let i = 0; i < points.length; i += 3) {
		const dx = points[i] - m[0];
		const dy = points[i + 1] - m[1];
		const dz = points[i + 2] - m[2];
		row[0] = 2 * dx;
		row[1] = 2 * dy;
		row[2] = 2 * dz;
		ne.add(row, dx * dx + dy * dy + dz * dz);
	}
	const y = ne.solve();
	if (!y) throw new FitError('the points do not span a sphere (they lie on a plane or a line)');
	let c: V3 = [y[0], y[1], y[2]];
	const r2 = y[3] + dot(c, c);
	if (!(r2 > 0)) throw new FitError('the points do not span a sphere');
	let r = Math.sqrt(r2);
	let method: SphereFit['method'] = 'coope-linear';
	if (refine) {
		method = 'coope-linear+gauss-newton';
		for (let it = 0; it < iterations; it++) {
			const gn = new NormalEquations(4);
			const J = [0, 0, 0, -1];
			for (let i = 0; i < points.length; i += 3) {
				const d = [points[i] - m[0] - c[0], points[i + 1] - m[1] - c[1], points[i + 2] - m[2] - c[2]];
				const l = norm(d) || 1e-12;
				// residual f = |x − c| − r; ∂f/∂c = −d/l, ∂f/∂r = −1; step solves J δ = −f
				J[0] = -d[0] / l;
				J[1] = -d[1] / l;
				J[2] = -d[2] / l;
				gn.add(J, -(l - r));
			}
			const step = gn.solve();
			if (!step) break;
			c = [c[0] + step[0], c[1] + step[1], c[2] + step[2]];
			r += step[3];
			if (Math.hypot(step[0], step[1], step[2], step[3]) < 1e-10 * (1 + r)) break;
		}
	}
	const centre: V3 = [c[0] + m[0], c[1] + m[1], c[2] + m[2]];
	return { kind: 'sphere', centre, radius: Math.abs(r), rms: sphereRms(points, centre, Math.abs(r)), used: n, method };
}

/** Plane through the points (orthogonal regression): centroid, unit normal, RMS distance. */
export function fitPlane(points: ArrayLike<number>) {
	const n = count(points, 3, 'a plane');
	const c = centroid(points);
	const { vectors, values } = symmetricEigen3(scatter(points, c));
	if (values[1] < 1e-18 * (values[2] + 1e-300)) throw new FitError('the points lie on a line; a plane needs a patch with area');
	const normal = unit(vectors[0]);
	return { centroid: c, normal, rms: Math.sqrt(Math.max(values[0], 0) / n), used: n, axes: [vectors[1], vectors[2]] as [number[], number[]] };
}

/** 2-D circle by Coope's linear fit then Gauss–Newton; points as [u, v] pairs. */
export function fitCircle2(uv: [number, number][]): { centre: [number, number]; radius: number; rms: number } {
	if (uv.length < 3) throw new FitError(`a circle needs at least 3 rim points; found ${uv.length}`);
	const mu = uv.reduce((a, p) => a + p[0], 0) / uv.length;
	const mv = uv.reduce((a, p) => a + p[1], 0) / uv.length;
	const ne = new NormalEquations(3);
	for (const [u0, v0] of uv) {
		const u = u0 - mu;
		const v = v0 - mv;
		ne.add([2 * u, 2 * v, 1], u * u + v * v);
	}
	const y = ne.solve();
	if (!y) throw new FitError('the rim points lie on a line');
	let cu = y[0];
	let cv = y[1];
	let r = Math.sqrt(Math.max(y[2] + cu * cu + cv * cv, 0));
	for (let it = 0; it < 20; it++) {
		const gn = new NormalEquations(3);
		for (const [u0, v0] of uv) {
			const du = u0 - mu - cu;
			const dv = v0 - mv - cv;
			const l = Math.hypot(du, dv) || 1e-12;
			gn.add([-du / l, -dv / l, -1], -(l - r));
		}
		const s = gn.solve();
		if (!s) break;
		cu += s[0];
		cv += s[1];
		r += s[2];
		if (Math.hypot(s[0], s[1], s[2]) < 1e-10 * (1 + r)) break;
	}
	let sum = 0;
	for (const [u, v] of uv) sum += (Math.hypot(u - mu - cu, v - mv - cv) - r) ** 2;
	return { centre: [cu + mu, cv + mv], radius: Math.abs(r), rms: Math.sqrt(sum / uv.length) };
}

/** Convex hull of 2-D points (Andrew's monotone chain); returns the hull's vertices. */
function hull2(pts: [number, number][]): [number, number][] {
	const p = [...pts].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
	const turn = (o: number[], a: number[], b: number[]) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
	const lower: [number, number][] = [];
	for (const q of p) {
		while (lower.length >= 2 && turn(lower[lower.length - 2], lower[lower.length - 1], q) <= 0) lower.pop();
		lower.push(q);
	}
	const upper: [number, number][] = [];
	for (let i = p.length - 1; i >= 0; i--) {
		const q = p[i];
		while (upper.length >= 2 && turn(upper[upper.length - 2], upper[upper.length - 1], q) <= 0) upper.pop();
		upper.push(q);
	}
	return lower.slice(0, -1).concat(upper.slice(0, -1));
}

/**
 * Hub face: the plane of the patch's points, then the circle of its rim (the convex hull of the points within
 * `planeToleranceMm` of the plane, projected into it). Centre = wheel centre on the face, normal = spin axis.
 */
export function fitPlaneCircle(points: ArrayLike<number>, { planeToleranceMm = 0.5 } = {}): PlaneCircleFit {
	let plane = fitPlane(points);
	// keep the points on the face (a hub's bore or studs may be in the patch), refit once
	const on: number[] = [];
	for (let i = 0; i < points.length; i += 3) {
		const d = (points[i] - plane.centroid[0]) * plane.normal[0] + (points[i + 1] - plane.centroid[1]) * plane.normal[1] + (points[i + 2] - plane.centroid[2]) * plane.normal[2];
		if (Math.abs(d) <= Math.max(planeToleranceMm, 3 * plane.rms)) on.push(points[i], points[i + 1], points[i + 2]);
	}
	if (on.length / 3 >= 3 && on.length < points.length) plane = fitPlane(on);
	const e1 = unit(plane.axes[1]);
	const e2 = cross(plane.normal, e1);
	const uv: [number, number][] = [];
	for (let i = 0; i < on.length; i += 3) {
		const d = [on[i] - plane.centroid[0], on[i + 1] - plane.centroid[1], on[i + 2] - plane.centroid[2]];
		uv.push([dot(d, e1), dot(d, e2)]);
	}
	const rim = hull2(uv);
	const circle = fitCircle2(rim);
	const centre: V3 = [0, 1, 2].map((k) => plane.centroid[k] + circle.centre[0] * e1[k] + circle.centre[1] * e2[k]) as V3;
	return {
		kind: 'plane_circle',
		centre,
		normal: plane.normal,
		radius: circle.radius,
		planeRms: plane.rms,
		circleRms: circle.rms,
		rms: Math.hypot(plane.rms, circle.rms),
		used: on.length / 3,
		rimPoints: rim.length
	};
}

/** Distance RMS of points to a cylinder (axis through p along unit d, radius r). */
function cylinderRms(points: ArrayLike<number>, p: V3, d: V3, r: number) {
	let s = 0;
	for (let i = 0; i < points.length; i += 3) {
		const x = [points[i] - p[0], points[i + 1] - p[1], points[i + 2] - p[2]];
		s += (norm(cross(x, d)) - r) ** 2;
	}
	return Math.sqrt(s / (points.length / 3));
}

/** Gauss–Newton on (axis point, axis direction, radius) from a start axis direction; numeric Jacobian. */
function refineCylinder(points: ArrayLike<number>, c: V3, d0: V3, iterations = 40) {
	let d = unit(d0);
	let p: V3 = [...c];
	// start radius: mean distance to the start axis
	let r = 0;
	for (let i = 0; i < points.length; i += 3) r += norm(cross([points[i] - p[0], points[i + 1] - p[1], points[i + 2] - p[2]], d));
	r /= points.length / 3;
	let lambda = 1e-3;
	let rms = cylinderRms(points, p, d, r);
	for (let it = 0; it < iterations; it++) {
		// local frame: u, v ⊥ d; parameters (a, b) tilt d, (e, f) move p, g changes r
		const u = unit(Math.abs(d[0]) < 0.9 ? cross(d, [1, 0, 0]) : cross(d, [0, 1, 0]));
		const v = cross(d, u);
		const ne = new NormalEquations(5);
		const J = [0, 0, 0, 0, 0];
		for (let i = 0; i < points.length; i += 3) {
			const x = [points[i] - p[0], points[i + 1] - p[1], points[i + 2] - p[2]];
			const xu = dot(x, u);
			const xv = dot(x, v);
			const xd = dot(x, d);
			const rho = Math.hypot(xu, xv) || 1e-12;
			// f = sqrt(xu² + xv²) − r; tilting d by a·u, b·v changes xu by −a·xd, xv by −b·xd; moving p by e·u, f·v
			// changes xu by −e, xv by −f
			J[0] = (-xd * xu) / rho;
			J[1] = (-xd * xv) / rho;
			J[2] = -xu / rho;
			J[3] = -xv / rho;
			J[4] = -1;
			ne.add(J, -(rho - r));
		}
		const s = ne.solve(lambda);
		if (!s) break;
		const dn = unit([d[0] + s[0] * u[0] + s[1] * v[0], d[1] + s[0] * u[1] + s[1] * v[1], d[2] + s[0] * u[2] + s[1] * v[2]]);
		const pn: V3 = [p[0] + s[2] * u[0] + s[3] * v[0], p[1] + s[2] * u[1] + s[3] * v[1], p[2] + s[2] * u[2] + s[3] * v[2]];
		const rn = r + s[4];
		const rmsN = cylinderRms(points, pn, dn, rn);
		if (rmsN <= rms) {
			d = dn;
			p = pn;
			r = rn;
			lambda = Math.max(lambda / 10, 1e-9);
			const done = rms - rmsN < 1e-12 * (1 + rms);
			rms = rmsN;
			if (done) break;
		} else lambda *= 10;
		if (lambda > 1e6) break;
	}
	return { p, d, r: Math.abs(r), rms };
}

/** Cylinder on a patch of a bush's bore or outer surface; the pivot is midway along the axis over the patch. */
export function fitCylinder(points: ArrayLike<number>): CylinderFit {
	const n = count(points, 6, 'a cylinder');
	const c = centroid(points);
	const { vectors } = symmetricEigen3(scatter(points, c));
	let best: ReturnType<typeof refineCylinder> | null = null;
	for (const v of vectors) {
		const f = refineCylinder(points, c, v as V3);
		if (Number.isFinite(f.rms) && (!best || f.rms < best.rms)) best = f;
	}
	if (!best) throw new FitError('no cylinder fits these points');
	let lo = Infinity;
	let hi = -Infinity;
	for (let i = 0; i < points.length; i += 3) {
		const t = (points[i] - best.p[0]) * best.d[0] + (points[i + 1] - best.p[1]) * best.d[1] + (points[i + 2] - best.p[2]) * best.d[2];
		lo = Math.min(lo, t);
		hi = Math.max(hi, t);
	}
	const mid = (lo + hi) / 2;
	const centre: V3 = [best.p[0] + mid * best.d[0], best.p[1] + mid * best.d[1], best.p[2] + mid * best.d[2]];
	return { kind: 'cylinder', centre, axis: best.d, radius: best.r, length: hi - lo, rms: best.rms, used: n };
}

/** The points of `positions` (flat xyz) within `radius` of `at`, as a new flat array. */
export function patchAround(positions: ArrayLike<number>, at: ArrayLike<number>, radius: number): Float64Array {
	const out: number[] = [];
	const r2 = radius * radius;
	for (let i = 0; i < positions.length; i += 3) {
		const dx = positions[i] - at[0];
		const dy = positions[i + 1] - at[1];
		const dz = positions[i + 2] - at[2];
		if (dx * dx + dy * dy + dz * dz <= r2) out.push(positions[i], positions[i + 1], positions[i + 2]);
	}
	return Float64Array.from(out);
}

void solve;
