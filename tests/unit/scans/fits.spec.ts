// Feature fits against surfaces constructed here with known values and seeded noise (tests/unit/scans).
// Sphere: Coope (1993), "Circle fitting by linear and nonlinear least squares", J. Optim. Theory Appl. 76(2):
// linear least squares on 2c·x + (r² − |c|²) = |x|², then Gauss–Newton on the geometric distances.
// The 0.02 mm centre tolerance at 0.05 mm noise is issue 17's requirement.
import { describe, expect, it } from 'vitest';
import { fitCylinder, fitPlaneCircle, fitSphere, patchAround, FitError } from '../../../src/lib/fits';
import { Random } from '../../../src/lib/server/studies/random';

const rng = new Random(17);

/** Points on a sphere cap (polar angle up to capDeg) with Gaussian noise of sd along the normal. */
function spherePoints(c: number[], r: number, sd: number, n: number, capDeg = 120) {
	const out: number[] = [];
	const cosMax = Math.cos((capDeg * Math.PI) / 180);
	while (out.length < 3 * n) {
		const z = cosMax + (1 - cosMax) * rng.uniform();
		const phi = 2 * Math.PI * rng.uniform();
		const s = Math.sqrt(1 - z * z);
		const rr = r + sd * rng.normal();
		// the cap opens towards −y (a ball joint seen from one side)
		out.push(c[0] + rr * s * Math.cos(phi), c[1] - rr * z, c[2] + rr * s * Math.sin(phi));
	}
	return Float64Array.from(out);
}

describe('sphere fit (Coope 1993, then Gauss–Newton)', () => {
	const centre = [1234.5, -612.25, 287.75];
	const radius = 11.1125; // a 7/8 in ball
	it('recovers a tessellated ball joint with 0.05 mm noise: centre within 0.02 mm, radius within 0.02 mm', () => {
		const pts = spherePoints(centre, radius, 0.05, 4000);
		const fit = fitSphere(pts);
		expect(fit.method).toBe('coope-linear+gauss-newton');
		expect(Math.hypot(fit.centre[0] - centre[0], fit.centre[1] - centre[1], fit.centre[2] - centre[2])).toBeLessThan(0.02);
		expect(Math.abs(fit.radius - radius)).toBeLessThan(0.02);
		// the residual RMS estimates the noise it was made with
		expect(fit.rms).toBeGreaterThan(0.04);
		expect(fit.rms).toBeLessThan(0.06);
		expect(fit.used).toBe(4000);
	});
	it('the linear step alone is exact on noise-free points', () => {
		const pts = spherePoints(centre, radius, 0, 50, 60);
		const fit = fitSphere(pts, { refine: false });
		expect(fit.method).toBe('coope-linear');
		expect(Math.hypot(fit.centre[0] - centre[0], fit.centre[1] - centre[1], fit.centre[2] - centre[2])).toBeLessThan(1e-6);
	});
	it('refuses points on a plane, and fewer than four', () => {
		expect(() => fitSphere([0, 0, 0, 1, 0, 0, 0, 1, 0, 1, 1, 0, 2, 3, 0])).toThrow(FitError);
		expect(() => fitSphere([0, 0, 0, 1, 0, 0, 0, 1, 0])).toThrow(/at least 4 points/);
	});
});

describe('cylinder fit (bush)', () => {
	it('recovers a bush bore of radius 8 mm, 40 mm long, on a tilted axis, with 0.02 mm noise', () => {
		const axis = [0.8, 0.36, 0.48]; // |axis| = 1
		const u = [0.6, -0.48, -0.64]; // ⊥ axis, unit
		const v = [axis[1] * u[2] - axis[2] * u[1], axis[2] * u[0] - axis[0] * u[2], axis[0] * u[1] - axis[1] * u[0]];
		const mid = [400, 350, 180];
		const pts: number[] = [];
		for (let i = 0; i < 3000; i++) {
			const t = -20 + 40 * rng.uniform();
			const phi = 2 * Math.PI * rng.uniform();
			const r = 8 + 0.02 * rng.normal();
			for (let k = 0; k < 3; k++) pts.push(mid[k] + t * axis[k] + r * (Math.cos(phi) * u[k] + Math.sin(phi) * v[k]));
		}
		const fit = fitCylinder(pts);
		expect(Math.abs(fit.radius - 8)).toBeLessThan(0.01);
		expect(Math.abs(Math.abs(fit.axis[0] * axis[0] + fit.axis[1] * axis[1] + fit.axis[2] * axis[2]) - 1)).toBeLessThan(1e-5);
		// the pivot midway along the patch: within 0.1 mm (the patch's ends are random samples)
		expect(Math.hypot(fit.centre[0] - mid[0], fit.centre[1] - mid[1], fit.centre[2] - mid[2])).toBeLessThan(0.1);
		expect(fit.length).toBeGreaterThan(39.5);
		expect(fit.rms).toBeLessThan(0.03);
	});
});

describe('plane with circle (hub face)', () => {
	it('recovers the wheel centre and spin axis of a flat disc of radius 70 mm', () => {
		// disc in the plane x = 760 mm (a hub face looking along y would be y = const; here tilted by 2° camber)
		const c = [0, 760, 300];
		const cam = (2 * Math.PI) / 180;
		const n = [0, Math.cos(cam), Math.sin(cam)];
		const e1 = [1, 0, 0];
		const e2 = [0, -Math.sin(cam), Math.cos(cam)];
		const pts: number[] = [];
		for (let i = 0; i < 5000; i++) {
			const rr = 70 * Math.sqrt(rng.uniform());
			const phi = 2 * Math.PI * rng.uniform();
			const h = 0.01 * rng.normal();
			for (let k = 0; k < 3; k++) pts.push(c[k] + rr * Math.cos(phi) * e1[k] + rr * Math.sin(phi) * e2[k] + h * n[k]);
		}
		const fit = fitPlaneCircle(pts);
		expect(Math.abs(Math.abs(fit.normal[0] * n[0] + fit.normal[1] * n[1] + fit.normal[2] * n[2]) - 1)).toBeLessThan(1e-6);
		expect(Math.hypot(fit.centre[0] - c[0], fit.centre[1] - c[1], fit.centre[2] - c[2])).toBeLessThan(0.5);
		expect(Math.abs(fit.radius - 70)).toBeLessThan(0.5);
		expect(fit.planeRms).toBeLessThan(0.02);
	});
});

describe('patch around a pick', () => {
	it('keeps the points within the radius only', () => {
		const patch = patchAround([0, 0, 0, 1, 0, 0, 3, 0, 0, 0, 2.5, 0], [0, 0, 0], 2.5);
		expect(Array.from(patch)).toEqual([0, 0, 0, 1, 0, 0, 0, 2.5, 0]);
	});
});
