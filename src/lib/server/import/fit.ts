// Frame: measured points in ISO-oriented source axes (mm) → ISO 8855 vehicle frame, x forward,
// y left, z up (mm). Rigid transforms only (rotation + translation, no scale).
//
// Datum convention (three points A, B, C): A is the origin, A→B is +x, C lies in the x–y plane
// on the +y side, z = x × y. With target coordinates for A, B, C, the measured A, B, C frame
// is mapped onto the frame built the same way from the targets (frame-to-frame transform).
// Best fit: Kabsch's least-squares rotation via SVD (ml-matrix) with the reflection fix.

import { Matrix, SingularValueDecomposition, determinant } from 'ml-matrix';
import { IMPORT_LIMITS } from '../../schemas/import';
import { ImportError } from './errors';
import { apply, compose, cross, dist, dot, norm, scale, sub, type Affine, type Vec3 } from './vec';

/** A named measured point and the point it should land on (mm). */
export interface FitPair {
	name: string;
	from: Vec3;
	to: Vec3;
}

/** A fitted transform with its RMS and per-point residuals |T(from) − to| (mm). */
export interface FitResult {
	map: Affine;
	rms: number;
	residuals: Record<string, number>;
}

/** The datum frame of A, B, C (mm) as a map p ↦ coordinates in that frame; names: for messages. */
export function datumFrame(a: Vec3, b: Vec3, c: Vec3, names: [string, string, string]): Affine {
	const ab = sub(b, a);
	const lab = norm(ab);
	if (lab < IMPORT_LIMITS.collinearMm)
		throw new ImportError('alignment_degenerate', `alignment: datum points ${names[0]} and ${names[1]} coincide`, {
			field: 'alignment.points'
		});
	const ex = scale(ab, 1 / lab);
	const ac = sub(c, a);
	const perp = sub(ac, scale(ex, dot(ac, ex)));
	const lp = norm(perp);
	if (lp < IMPORT_LIMITS.collinearMm)
		throw new ImportError('alignment_degenerate', `alignment: datum points ${names.join(', ')} lie on one line`, {
			field: 'alignment.points'
		});
	const ey = scale(perp, 1 / lp);
	const R: Affine['R'] = [ex, ey, cross(ex, ey)];
	return { R, t: scale([dot(R[0], a), dot(R[1], a), dot(R[2], a)], -1) };
}

/** The inverse of a rigid map (Rᵀ, −Rᵀt). */
export function invertRigid(m: Affine): Affine {
	const R: Affine['R'] = [0, 1, 2].map((j) => [m.R[0][j], m.R[1][j], m.R[2][j]]) as Affine['R'];
	const t = apply({ R, t: [0, 0, 0] }, m.t);
	return { R, t: scale(t, -1) };
}

/** Datum alignment: measured A, B, C → their datum frame, or onto targets' same frame when given (mm). */
export function datumTransform(measured: [Vec3, Vec3, Vec3], names: [string, string, string], targets?: [Vec3, Vec3, Vec3]): FitResult {
	const frame = datumFrame(measured[0], measured[1], measured[2], names);
	const map = targets ? compose(invertRigid(datumFrame(targets[0], targets[1], targets[2], names)), frame) : frame;
	return { map, ...residualsOf(map, targets ? names.map((name, i) => ({ name, from: measured[i], to: targets[i] })) : []) };
}

/** RMS and per-point residuals of a map over the pairs (mm); rms 0 for no pairs. */
export function residualsOf(map: Affine, pairs: FitPair[]): { rms: number; residuals: Record<string, number> } {
	const residuals: Record<string, number> = {};
	let sum = 0;
	for (const p of pairs) {
		const r = dist(apply(map, p.from), p.to);
		residuals[p.name] = r;
		sum += r * r;
	}
	return { rms: pairs.length ? Math.sqrt(sum / pairs.length) : 0, residuals };
}

/** Centroid of points (mm). */
function centroid(ps: Vec3[]): Vec3 {
	const c: Vec3 = [0, 0, 0];
	for (const p of ps) for (let i = 0; i < 3; i++) c[i] += p[i] / ps.length;
	return c;
}

/** Refuse fewer than 3 points, or points all within `collinearMm` of one line (mm). */
function checkSpread(ps: Vec3[], names: string[]): void {
	if (ps.length < 3)
		throw new ImportError(
			'alignment_point_missing',
			`alignment: best fit needs at least 3 common points, found ${ps.length} (${names.join(', ') || 'none'})`,
			{ field: 'alignment.names' }
		);
	const c = centroid(ps);
	const far = ps.reduce((a, p) => (dist(p, c) > dist(a, c) ? p : a), ps[0]);
	const u = sub(far, c);
	const lu = norm(u);
	const off = lu === 0 ? 0 : Math.max(...ps.map((p) => norm(cross(sub(p, c), u)) / lu));
	if (off < IMPORT_LIMITS.collinearMm)
		throw new ImportError(
			'alignment_degenerate',
			`alignment: the common points ${names.join(', ')} lie on one line; best fit needs 3 points not on a line`,
			{ field: 'alignment.names' }
		);
}

/** Best-fit rigid map (Kabsch, no scale) of pairs' `from` onto `to`; ≥ 3 non-collinear points (mm). */
export function bestFit(pairs: FitPair[]): FitResult {
	const names = pairs.map((p) => p.name);
	checkSpread(pairs.map((p) => p.from), names);
	const cp = centroid(pairs.map((p) => p.from));
	const cq = centroid(pairs.map((p) => p.to));
	const P = new Matrix(pairs.map((p) => sub(p.from, cp)));
	const Q = new Matrix(pairs.map((p) => sub(p.to, cq)));
	const svd = new SingularValueDecomposition(P.transpose().mmul(Q), { autoTranspose: false });
	const U = svd.leftSingularVectors;
	const V = svd.rightSingularVectors;
	// Reflection fix: flip the least singular direction when V Uᵀ would be a reflection.
	const d = Math.sign(determinant(V.mmul(U.transpose()))) || 1;
	const Rm = V.mmul(Matrix.diag([1, 1, d])).mmul(U.transpose());
	const R = Rm.to2DArray() as Affine['R'];
	const rot: Affine = { R, t: [0, 0, 0] };
	const map: Affine = { R, t: sub(cq, apply(rot, cp)) };
	return { map, ...residualsOf(map, pairs) };
}
