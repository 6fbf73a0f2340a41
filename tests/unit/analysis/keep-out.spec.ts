// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Keep-out volumes and the steering ratio in the fix search (issue 16, item 7). The depths are checked against
// closed-form distances (point to plane, point to line: Pythagoras) and a dense scan written here; the fixes found
// are re-solved through the public sweep and measured by this file's own geometry, never read back from the search.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { keepOutListSchema } from '../../../src/lib/schemas/keep-out';
import { fixSearchInput } from '../../../src/lib/schemas/analysis';
import { solveSweep, type CornerInput } from '../../../src/lib/server/kinematics';
import { depthOfPoint, depthOfSegment, type Volume } from '../../../src/lib/server/kinematics/keep-out';
import { CornerEvaluator, toChange } from '../../../src/lib/server/studies/evaluate';
import { fixSearch, type FixSearchInput } from '../../../src/lib/server/studies/fix-search';

const ROOT = join(import.meta.dirname, '..', '..', '..');
const demo = (name: string) => JSON.parse(readFileSync(join(ROOT, 'fixtures', 'demo', `${name}.json`), 'utf8')) as CornerInput;
type V3 = [number, number, number];
const GRID = { from: -40, to: 40, step: 4 };

// ---- the test's own geometry ----------------------------------------------------------------------------------

/** Box depth by the nearest point (clamp): outside the distance to it, inside the nearest face's distance. */
function boxDepth(min: V3, max: V3, p: V3): number {
	const q = p.map((v, i) => Math.min(max[i], Math.max(min[i], v)));
	const out = Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]);
	if (out > 0) return -out;
	return Math.min(...p.map((v, i) => Math.min(v - min[i], max[i] - v)));
}

/** Distance from p to the line through c along unit u, and the position along it. */
function axial(c: V3, u: V3, p: V3): { t: number; r: number } {
	const d = [p[0] - c[0], p[1] - c[1], p[2] - c[2]];
	const t = d[0] * u[0] + d[1] * u[1] + d[2] * u[2];
	return { t, r: Math.hypot(d[0] - t * u[0], d[1] - t * u[1], d[2] - t * u[2]) };
}

/** Largest depth of segment a–b by a scan of 20 001 points. */
function scan(depth: (p: V3) => number, a: V3, b: V3): number {
	let best = -Infinity;
	for (let i = 0; i <= 20_000; i++) {
		const s = i / 20_000;
		best = Math.max(best, depth([a[0] + s * (b[0] - a[0]), a[1] + s * (b[1] - a[1]), a[2] + s * (b[2] - a[2])]));
	}
	return best;
}

/** Deterministic pseudo-random numbers in [0, 1) (a linear congruential generator, Numerical Recipes' constants). */
function lcg(seed: number) {
	let x = seed >>> 0;
	return () => {
		x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
		return x / 2 ** 32;
	};
}

describe('depth in a keep-out volume against closed-form distances', () => {
	const box: Volume = { shape: 'box', name: 'b', min: [0, 0, 0], max: [100, 200, 300] };
	it('a box: the centre is half the smallest size deep; beyond an edge the clearance is Pythagoras', () => {
		expect(depthOfPoint(box, 50, 100, 150, null)).toBeCloseTo(50, 12);
		expect(depthOfPoint(box, 103, 204, 150, null)).toBeCloseTo(-5, 12); // 3-4-5 beyond the x and y faces
		expect(depthOfPoint(box, 50, 100, 310, null)).toBeCloseTo(-10, 12);
	});
	it('a cylinder: on the axis half-way the depth is the radius (when shorter than half the length); off an end cap it is the axial gap', () => {
		const c: Volume = { shape: 'cylinder', name: 'c', from: [0, 0, 0], to: [0, 0, 400], radius: 30 };
		expect(depthOfPoint(c, 0, 0, 200, null)).toBeCloseTo(30, 12);
		expect(depthOfPoint(c, 18, 24, 200, null)).toBeCloseTo(0, 12); // on the surface: 18² + 24² = 30²
		expect(depthOfPoint(c, 0, 0, 410, null)).toBeCloseTo(-10, 12);
		expect(depthOfPoint(c, 70, 0, 430, null)).toBeCloseTo(-50, 12); // 40 out radially, 30 beyond the end: 3-4-5
	});
	it('a rim: inside the wheel the clearance is the inner radius less the distance from the spin axis', () => {
		const rim: Volume = { shape: 'rim', name: 'r', barrel_radius: 200, clearance: 10, inboard: 80, outboard: 60 };
		const wheel = { centre: [0, 700, 300], axis: [0, 1, 0] };
		expect(depthOfPoint(rim, 0, 680, 150, wheel)).toBeCloseTo(150 - 190, 12);
		expect(depthOfPoint(rim, 0, 680, 300 - 195, wheel)).toBeCloseTo(5, 12); // 5 mm into the barrel
		expect(depthOfPoint(rim, 0, 700 - 83, 300 - 194, wheel)).toBeCloseTo(-Math.hypot(3, 0), 12); // 3 mm inboard of the edge, beyond the radius
	});

	it('the deepest point of a segment matches a dense scan (box, cylinder, rim; 60 random segments each)', () => {
		const rnd = lcg(7);
		const pt = (): V3 => [-100 + 400 * rnd(), -100 + 400 * rnd(), -100 + 500 * rnd()];
		const cyl = { from: [20, 30, 40] as V3, to: [180, 150, 350] as V3, radius: 45 };
		const u = ((d) => d.map((v) => v / Math.hypot(...d)) as V3)([cyl.to[0] - cyl.from[0], cyl.to[1] - cyl.from[1], cyl.to[2] - cyl.from[2]]);
		const L = Math.hypot(cyl.to[0] - cyl.from[0], cyl.to[1] - cyl.from[1], cyl.to[2] - cyl.from[2]);
		const cylDepth = (p: V3) => {
			const { t, r } = axial(cyl.from, u, p);
			if (t >= 0 && t <= L && r <= cyl.radius) return Math.min(cyl.radius - r, t, L - t);
			return -Math.hypot(Math.max(r - cyl.radius, 0), Math.max(-t, t - L, 0));
		};
		const wheel = { centre: [100, 100, 150] as V3, axis: [0, 0.6, 0.8] as V3 };
		const rimDepth = (p: V3) => {
			const { t, r } = axial(wheel.centre, wheel.axis, p);
			if (t >= -80 && t <= 60) return r >= 120 ? Math.min(r - 120, t + 80, 60 - t) : r - 120;
			return -Math.hypot(t < -80 ? -80 - t : t - 60, Math.max(120 - r, 0));
		};
		const at = new Float64Array(1);
		// the scan's points are under 0.04 mm apart and depth changes at most 1 mm per mm, so it may fall short of the
		// true deepest point by 0.02 mm; the search must never fall short of the scan (box, cylinder: convex, exact)
		const cases: [Volume, (p: V3) => number, typeof wheel | null, number][] = [
			[{ shape: 'box', name: 'b', min: [0, 20, 40], max: [150, 120, 260] }, (p) => boxDepth([0, 20, 40], [150, 120, 260], p), null, 1e-9],
			[{ shape: 'cylinder', name: 'c', ...cyl }, cylDepth, null, 1e-9],
			// a rim is not convex: the search samples every 1/8 of the segment and refines, so it is held to 0.5 mm
			[{ shape: 'rim', name: 'r', barrel_radius: 130, clearance: 10, inboard: 80, outboard: 60 }, rimDepth, wheel, 0.5]
		];
		for (const [v, ref, w, short] of cases) {
			for (let i = 0; i < 60; i++) {
				const a = pt();
				const b = pt();
				const found = depthOfSegment(v, a, b, w, at);
				const scanned = scan(ref, a, b);
				expect(found, `${v.shape} segment ${i}`).toBeGreaterThan(scanned - short);
				expect(found, `${v.shape} segment ${i}`).toBeLessThan(scanned + 0.02);
			}
		}
	});
});

describe('bad keep-out volumes are refused naming the field', () => {
	it.each([
		[{ shape: 'box', name: 'Gearbox', min: [0, 0, 0], max: [100, 0, 50] }, '0.max.1', /zero size along y/],
		[{ shape: 'cylinder', name: 'Shaft', from: [0, 0, 0], to: [0, 0, 0], radius: 20 }, '0.to', /zero length/],
		[{ shape: 'cylinder', name: 'Shaft', from: [0, 0, 0], to: [0, 100, 0], radius: 0 }, '0.radius', /zero radius/],
		[{ shape: 'rim', name: 'Rim', axle: 'front', barrel_radius: 180, clearance: 0, inboard: 0, outboard: 0 }, '0.outboard', /zero width/],
		[{ shape: 'sphere', name: 'Ball' }, '0.shape', /box', 'cylinder' or 'rim'/]
	])('%o → %s', (volume, path, message) => {
		const r = keepOutListSchema.safeParse([volume]);
		expect(r.success).toBe(false);
		const issue = r.error!.issues[0];
		expect(issue.path.join('.')).toBe(path);
		expect(issue.message).toMatch(message);
	});
	it('a rack that does not move is refused naming steering.rackTravelPerTurn', () => {
		const r = fixSearchInput.safeParse({ free: [{ point: 'steer.outer', axis: 'z', bound: 10 }], target: { kind: 'zero' }, measures: [{ key: 'toe', weight: 1 }], steering: { rackTravelPerTurn: 0 } });
		expect(r.success).toBe(false);
		expect(r.error!.issues[0].path.join('.')).toBe('steering.rackTravelPerTurn');
	});
});

/** The demo's rack-moved corner fitted to stock toe with `free`, and the packaging given. */
function demoSearch(free: FixSearchInput['free'], packaging?: FixSearchInput['packaging']) {
	const ev = new CornerEvaluator(demo('front-left-stock'), GRID, ['toe']);
	const target = new Float64Array(ev.count);
	ev.evaluate([], [], target);
	toChange(target, 1, ev.count, ev.design);
	const corner = demo('front-left-rack-moved');
	return { corner, result: fixSearch({ corner, grid: GRID, free, measures: [{ key: 'toe', weight: 1, target }], starts: 5, packaging }) };
}

/** The corner with the search's moves applied. */
function moved(corner: CornerInput, free: { point: string; axis: 0 | 1 | 2; move: number }[]): CornerInput {
	const points = structuredClone(corner.points);
	for (const f of free) points[f.point][f.axis] += f.move;
	return { ...corner, points };
}

/** The tie rod's deepest reach into `depth` through the travel, re-solved through the public sweep. */
function tieRodReach(corner: CornerInput, depth: (p: V3, pts: Record<string, V3>) => number, rack = 0): number {
	const { samples, error } = solveSweep(corner, { sweep: 'heave', from: GRID.from, to: GRID.to, step: GRID.step, rack, points: true });
	expect(error).toBeNull();
	let deepest = -Infinity;
	for (const s of samples) {
		const pts = s.points as Record<string, V3>;
		deepest = Math.max(deepest, scan((p) => depth(p, pts), pts['steer.inner'], pts['steer.outer']));
	}
	return deepest;
}

describe('the fix search keeps the tie rod out of keep-out volumes', () => {
	const free = [
		{ point: 'steer.outer', axis: 0 as const, min: -10, max: 10 },
		{ point: 'steer.outer', axis: 2 as const, min: -30, max: 30 }
	];
	// a chassis-fixed box just above the tie rod's outer half: raising the outer joint (the fit's first answer) enters it
	const BOX = { min: [-220, 560, 192] as V3, max: [-40, 640, 260] as V3 };
	const boxVolume: Volume = { shape: 'box', name: 'Brake line bracket', ...BOX };

	it('without the box the fit raises the outer joint into it; with it, the fix found stays clear through the travel', () => {
		const free0 = demoSearch(free);
		const into = tieRodReach(moved(free0.corner, free0.result.free), (p) => boxDepth(BOX.min, BOX.max, p));
		expect(into).toBeGreaterThan(1); // the unconstrained fix reaches > 1 mm into the box
		const held = demoSearch(free, { spec: { volumes: [boxVolume], racks: [], moved: ['steer.outer'], ratio: null }, ratioBand: null, ratioWeight: 1 });
		const after = tieRodReach(moved(held.corner, held.result.free), (p) => boxDepth(BOX.min, BOX.max, p));
		expect(after).toBeLessThanOrEqual(0);
		expect(held.result.packaging!.blocked).toBeNull();
		expect(held.result.packaging!.members).toEqual(['steer.inner–steer.outer']);
	});

	it('when every move within the bounds leaves the tie rod in the rim, the search names the rim as what stops it', () => {
		// the demo's outer tie-rod joint is 177 mm from the spin axis, 65 mm inboard of the wheel centre; a barrel of
		// 180 mm less 8 mm of clearance takes everything beyond 172 mm, and ±3 mm of joint height cannot leave it
		const corner = demo('front-left-rack-moved');
		const c = corner.points['wheel.centre'] as V3;
		const inner = corner.points['wheel.axis_inner'] as V3;
		const len = Math.hypot(c[0] - inner[0], c[1] - inner[1], c[2] - inner[2]);
		const u = [0, 1, 2].map((i) => (c[i] - inner[i]) / len) as V3;
		expect(axial(c, u, corner.points['steer.outer'] as V3).r).toBeGreaterThan(175);
		const rim: Volume = { shape: 'rim', name: 'Rim barrel', barrel_radius: 180, clearance: 8, inboard: 90, outboard: 60 };
		const { result } = demoSearch([{ point: 'steer.outer', axis: 2, min: -3, max: 3 }], { spec: { volumes: [rim], racks: [], moved: ['steer.outer'], ratio: null }, ratioBand: null, ratioWeight: 1 });
		const p = result.packaging!;
		expect(p.blocked).not.toBeNull();
		expect(p.blocked!.volume).toBe('Rim barrel');
		expect(p.blocked!.member).toBe('steer.inner–steer.outer');
		expect(p.blocked!.depth).toBeGreaterThan(0);
		expect(p.volumes[0].status).toBe('collides');
		expect(result.starts.every((s) => s.rms === null || s.collides!.includes('Rim barrel'))).toBe(true);
	});
});

describe('the fix search holds the steering ratio in a band', () => {
	const PER_TURN = 60; // mm of rack per steering-wheel turn (invented)
	/** This wheel's ratio at rack r: central difference over ±1° of steering wheel, through the public steer sweep. */
	function ratioAt(corner: CornerInput, rack: number): number {
		const h = PER_TURN / 360;
		const toe = (r: number) => solveSweep(corner, { sweep: 'steer', from: r, to: r, step: 1 }).samples[0].toe;
		return 2 / Math.abs(toe(rack + h) - toe(rack - h));
	}
	const free = [
		{ point: 'steer.outer', axis: 0 as const, min: -10, max: 10 },
		{ point: 'steer.outer', axis: 2 as const, min: -30, max: 30 },
		{ point: 'steer.inner', axis: 1 as const, min: -10, max: 10 }
	];
	it('the free fit slows the steering past 13.45:1 at centre; with the band 11.5–13.4 it stays inside through ±180°', () => {
		const free0 = demoSearch(free);
		expect(ratioAt(moved(free0.corner, free0.result.free), 0)).toBeGreaterThan(13.45);
		const held = demoSearch(free, { spec: { volumes: [], racks: [], moved: ['steer.outer', 'steer.inner'], ratio: { perTurn: PER_TURN, lockRack: 30 } }, ratioBand: [11.5, 13.4], ratioWeight: 10 });
		const fixed = moved(held.corner, held.result.free);
		for (const rack of [-30, -15, 0, 15, 30]) {
			const r = ratioAt(fixed, rack);
			expect(r, `rack ${rack} mm`).toBeGreaterThan(11.5 - 0.02);
			expect(r, `rack ${rack} mm`).toBeLessThan(13.4 + 0.02);
		}
		expect(held.result.packaging!.ratio!.angles).toEqual([-180, -135, -90, -45, 0, 45, 90, 135, 180]);
	});
});
