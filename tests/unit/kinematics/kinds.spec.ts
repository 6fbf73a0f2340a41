// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// The general model's kinds (contract: "More kinds (general model)" and "Rocker") against
// constructions made here, independently of the engine's chains.

import { describe, expect, it } from 'vitest';
import { CORNER_KINDS, KIND_SPECS, kindSpec, splitRocker, templateFor } from '../../../src/lib/kinds';
import { parseCornerGeometry } from '../../../src/lib/schemas/geometry';
import { CornerGeometryError, solveSweep, SweepOptionsError, type CornerInput, type Sample, type SweepKind } from '../../../src/lib/server/kinematics/index';
import { clone, DEG, fixture, planarCorner } from './helpers';

/** A corner of `kind` from its template. */
function template(kind: string): CornerInput {
	const t = kindSpec(kind).template;
	return { kind, points: clone(t.points), spring_on: t.spring_on as CornerInput['spring_on'], tyre: { ...t.tyre } };
}

/** The stock club front corner with its spring on the upright (a five-link's spring can only ride there). */
function wishbone(): CornerInput {
	const c = fixture('club-fwd-front-left');
	c.spring_on = 'upright';
	return c;
}

/** The same corner as a five-link: both lower links end at the lower ball joint, both upper at the upper one. */
function disguised(dw: CornerInput): CornerInput {
	const p = dw.points;
	return {
		kind: 'multi_link',
		points: {
			'lower_front.inner': p['lower.front'],
			'lower_front.outer': p['lower.outer'],
			'lower_rear.inner': p['lower.rear'],
			'lower_rear.outer': p['lower.outer'],
			'upper_front.inner': p['upper.front'],
			'upper_front.outer': p['upper.outer'],
			'upper_rear.inner': p['upper.rear'],
			'upper_rear.outer': p['upper.outer'],
			'steer.inner': p['steer.inner'],
			'steer.outer': p['steer.outer'],
			'wheel.centre': p['wheel.centre'],
			'wheel.axis_inner': p['wheel.axis_inner'],
			'spring.chassis': p['spring.chassis'],
			'spring.body': p['spring.body']
		},
		spring_on: 'upright',
		tyre: { ...dw.tyre },
		vehicle: dw.vehicle
	};
}

/** The measures that do not depend on how instant centres are constructed (contract: test the equivalence on these). */
const SHARED: (keyof Sample)[] = ['camber', 'toe', 'caster', 'kpi', 'scrub_radius', 'trail', 'half_track_change', 'wheelbase_change', 'camber_ground', 'motion_ratio'];

describe('five-link built as a disguised double wishbone (derived here: two rods meeting at one ball joint hold it on the arm\'s circle)', () => {
	const sweeps: [SweepKind, number, number, number][] = [
		['heave', -80, 80, 5],
		['roll', -3, 3, 0.5],
		['steer', -40, 40, 5]
	];
	for (const [sweep, from, to, step] of sweeps) {
		it(`matches the double wishbone over ${sweep} to 1e-9 in every shared measure`, () => {
			const dw = solveSweep(wishbone(), { sweep, from, to, step });
			const ml = solveSweep(disguised(wishbone()), { sweep, from, to, step });
			expect(dw.error).toBeNull();
			expect(ml.error).toBeNull();
			expect(ml.samples.length).toBe(dw.samples.length);
			dw.samples.forEach((d, i) => {
				const m = ml.samples[i];
				for (const key of SHARED) {
					const a = d[key] as number | null;
					const b = m[key] as number | null;
					if (a === null) expect(b).toBeNull();
					else expect(Math.abs((b as number) - a), `${sweep} ${key} at sample ${i}`).toBeLessThan(1e-9);
				}
				for (let k = 0; k < 3; k++) {
					expect(Math.abs(m.wheel_centre[k] - d.wheel_centre[k])).toBeLessThan(1e-9);
					expect(Math.abs(m.contact_patch[k] - d.contact_patch[k])).toBeLessThan(1e-9);
				}
			});
		});
	}

	it('without bump steer (planar motion) the motion instant centres are the arm planes\' ones, at full bump and rebound too', () => {
		// the planar corner of helpers.ts turns only about x: the upright's instant centre in the front view is where
		// the two arm lines meet (Kennedy's theorem of three centres), which the double wishbone constructs from arm planes
		const dw = planarCorner();
		dw.spring_on = 'upright';
		const a = solveSweep(dw, { sweep: 'heave', from: -60, to: 60, step: 30 });
		const b = solveSweep(disguised(dw), { sweep: 'heave', from: -60, to: 60, step: 30 });
		expect(a.samples.length).toBe(5);
		a.samples.forEach((s, i) => {
			const m = b.samples[i];
			expect(Math.abs(m.fvic![0] - s.fvic![0]), `fvic y at ${s.travel}`).toBeLessThan(1e-6);
			expect(Math.abs(m.fvic![1] - s.fvic![1]), `fvic z at ${s.travel}`).toBeLessThan(1e-6);
			expect(Math.abs(m.rc_height! - s.rc_height!)).toBeLessThan(1e-6);
		});
		// design: the arm lines were built to meet at (-1500, 0) (helpers.ts)
		expect(Math.abs(b.samples[2].fvic![0] + 1500)).toBeLessThan(1e-6);
		expect(Math.abs(b.samples[2].fvic![1])).toBeLessThan(1e-6);
	});
});

/** Rodrigues' rotation formula (Rodrigues, 1840): v rotated by angle t (rad) about unit axis k. */
function rodrigues(v: number[], k: number[], t: number): number[] {
	const c = Math.cos(t);
	const s = Math.sin(t);
	const kv = k[0] * v[0] + k[1] * v[1] + k[2] * v[2];
	const kxv = [k[1] * v[2] - k[2] * v[1], k[2] * v[0] - k[0] * v[2], k[0] * v[1] - k[1] * v[0]];
	return [0, 1, 2].map((i) => v[i] * c + kxv[i] * s + k[i] * kv * (1 - c));
}

describe('semi-trailing arm against the closed-form rotation about its pivot axis', () => {
	const c = template('semi_trailing');
	const F = c.points['arm.front'];
	const Rr = c.points['arm.rear'];
	const W0 = c.points['wheel.centre'];
	const A0 = c.points['wheel.axis_inner'];
	const axis = [Rr[0] - F[0], Rr[1] - F[1], Rr[2] - F[2]];
	const l = Math.hypot(axis[0], axis[1], axis[2]);
	const e = axis.map((v) => v / l);
	const turned = (p: number[], t: number) => {
		const r = rodrigues([p[0] - F[0], p[1] - F[1], p[2] - F[2]], e, t);
		return [r[0] + F[0], r[1] + F[1], r[2] + F[2]];
	};
	/** The arm angle that lifts the wheel centre by `travel` (bisection on the closed form). */
	const angleFor = (travel: number) => {
		let lo = -1;
		let hi = 1;
		const f = (t: number) => turned(W0, t)[2] - W0[2] - travel;
		const rising = f(0.01) > f(-0.01);
		for (let i = 0; i < 200; i++) {
			const mid = 0.5 * (lo + hi);
			if (f(mid) > 0 === rising) hi = mid;
			else lo = mid;
		}
		return 0.5 * (lo + hi);
	};
	/** Where the pivot axis pierces the plane `coord` = value. */
	const pierce = (coord: number, value: number) => {
		const t = (value - F[coord]) / e[coord];
		return [F[0] + t * e[0], F[1] + t * e[1], F[2] + t * e[2]];
	};

	it('camber and toe at each travel', () => {
		const r = solveSweep(c, { sweep: 'heave', from: -80, to: 80, step: 10 });
		expect(r.error).toBeNull();
		for (const s of r.samples) {
			const t = angleFor(s.travel!);
			const W = turned(W0, t);
			const A = turned(A0, t);
			const a = [W[0] - A[0], W[1] - A[1], W[2] - A[2]];
			const n = Math.hypot(a[0], a[1], a[2]);
			const camber = -Math.asin(a[2] / n) * DEG;
			const toe = Math.atan2(a[0] / n, Math.abs(a[1] / n)) * DEG;
			expect(Math.abs(s.camber - camber)).toBeLessThan(1e-8);
			expect(Math.abs(s.toe - toe)).toBeLessThan(1e-8);
			for (let k = 0; k < 3; k++) expect(Math.abs(s.wheel_centre[k] - W[k])).toBeLessThan(1e-8);
		}
	});

	it('instant centres where the pivot axis pierces the view planes, at full bump and rebound too', () => {
		const r = solveSweep(c, { sweep: 'heave', from: -80, to: 80, step: 40 });
		for (const s of r.samples) {
			const fv = pierce(0, s.wheel_centre[0]);
			const sv = pierce(1, s.wheel_centre[1]);
			expect(Math.abs(s.fvic![0] - fv[1])).toBeLessThan(1e-6);
			expect(Math.abs(s.fvic![1] - fv[2])).toBeLessThan(1e-6);
			expect(Math.abs(s.svic![0] - sv[0])).toBeLessThan(1e-6);
			expect(Math.abs(s.svic![1] - sv[2])).toBeLessThan(1e-6);
		}
	});

	it('no steering axis: caster, KPI, scrub and trail are null; a steer sweep is refused naming sweep', () => {
		const s = solveSweep(c, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
		expect([s.caster, s.kpi, s.scrub_radius, s.trail]).toEqual([null, null, null, null]);
		expect(() => solveSweep(c, { sweep: 'steer', from: -10, to: 10, step: 10 })).toThrow(/^sweep:/);
		expect(() => solveSweep(c, { sweep: 'steer', from: -10, to: 10, step: 10 })).toThrow(SweepOptionsError);
	});

	it('a pure trailing arm (axis along y) has no front-view centre and puts the roll centre at the contact height', () => {
		const t = clone(c);
		t.points['arm.front'] = [-2300, 100, 300];
		t.points['arm.rear'] = [-2300, 500, 300];
		const s = solveSweep(t, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
		expect(s.fvic).toBeNull();
		expect(Math.abs(s.rc_height! - s.contact_patch[2])).toBeLessThan(1e-9);
	});
});

describe('rocker (pushrod) on a trailing arm, all in the plane y = const (derived by hand here)', () => {
	// Trailing arm about an axis along +y through (0, ·, 300); wheel 400 mm behind. The rod runs from
	// the arm (O) up to the rocker (E); the rocker turns about an axis along +y through c; the spring
	// runs from the rocker's spring end (S) to the chassis (K). Every velocity is in the x–z plane, so
	// each step is a ratio of lever arms (signed perpendicular distances in that plane):
	//   dW_z/dθ = −(W_x − p_x)               (arm: W turns about p)
	//   û·dO/dθ = û_x (O_z − p_z) − û_z (O_x − p_x)   (rod outer end along the rod)
	//   dβ = (û·dO) / h_rod,  h_rod = û·(e × (E − c))  (rocker turned by the rod)
	//   dS = dβ · h_spring,   h_spring = ŝ·(e × (S − c)) (spring end along the spring)
	//   motion ratio = −dS / dW_z.
	const y = 600;
	const corner: CornerInput = {
		kind: 'semi_trailing',
		points: {
			'arm.front': [0, y - 300, 300],
			'arm.rear': [0, y + 50, 300],
			'wheel.centre': [-400, 700, 300],
			'wheel.axis_inner': [-400, 600, 300],
			'spring.chassis': [-150, y, 720]
		},
		tyre: { loaded_radius: 300 },
		rocker: { pivot_a: [-200, y - 20, 500], pivot_b: [-200, y + 20, 500], rod_end: [-140, y, 520], spring_end: [-200, y, 580], rod_outer: [-250, y, 320], rod_on: 'arm' }
	};

	it('the corner file is valid', () => {
		const r = parseCornerGeometry({ format: 'corner-geometry/1', ...corner });
		expect(r.ok ? '' : r.message).toBe('');
	});

	it('motion ratio equals the product of the lever-arm ratios at each pose', () => {
		const r = solveSweep(corner, { sweep: 'heave', from: -30, to: 30, step: 10, points: true });
		expect(r.error).toBeNull();
		for (const s of r.samples) {
			const P = s.points!;
			const W = P['wheel.centre'];
			const O = P['rocker.rod_outer'];
			const E = P['rocker.rod_end'];
			const S = P['rocker.spring_end'];
			const K = P['spring.chassis'];
			const c = [-200, y, 500];
			const p = [0, y, 300];
			const ul = Math.hypot(E[0] - O[0], E[2] - O[2]);
			const ux = (E[0] - O[0]) / ul;
			const uz = (E[2] - O[2]) / ul;
			const sl = Math.hypot(S[0] - K[0], S[2] - K[2]);
			const sx = (S[0] - K[0]) / sl;
			const sz = (S[2] - K[2]) / sl;
			// e × r for e = +y and r = (rx, 0, rz) is (rz, 0, −rx)
			const dWz = -(W[0] - p[0]);
			const dO = ux * (O[2] - p[2]) - uz * (O[0] - p[0]);
			const hRod = ux * (E[2] - c[2]) - uz * (E[0] - c[0]);
			const hSpring = sx * (S[2] - c[2]) - sz * (S[0] - c[0]);
			const expected = -((dO / hRod) * hSpring) / dWz;
			expect(Math.abs(s.motion_ratio! - expected), `travel ${s.travel}`).toBeLessThan(1e-7);
		}
	});

	it('rocker_angle is zero at design and negative in bump here (right-handed about +y carries +x toward −z; the rod lifts a point ahead of the pivot)', () => {
		const r = solveSweep(corner, { sweep: 'heave', from: -20, to: 20, step: 20 });
		const [reb, design, bump] = r.samples;
		expect(Math.abs(design.rocker_angle!)).toBeLessThan(1e-9);
		expect(bump.rocker_angle!).toBeLessThan(0);
		expect(reb.rocker_angle!).toBeGreaterThan(0);
	});

	it('every sample of every kind carries rocker_angle, null without a rocker', () => {
		const s = solveSweep(fixture('club-fwd-front-left'), { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
		expect(s).toHaveProperty('rocker_angle', null);
	});

	it('a rod that cannot reach stops the sweep naming pushrod and the position', () => {
		const short = clone(corner);
		// an 18 mm lever: the rod's outer end rises further than the rocker's rod end can follow
		short.rocker!.rod_end = [-185, y, 510];
		const r = solveSweep(short, { sweep: 'heave', from: -120, to: 120, step: 10 });
		expect(r.error?.link).toBe('pushrod');
		expect(r.error?.message).toMatch(/^pushrod cannot be assembled at travel -?\d+ mm$/);
	});
});

describe('bad input for the new kinds names the field', () => {
	const base = template('multi_link');
	const file = (c: CornerInput) => ({ format: 'corner-geometry/1', ...c });
	const cases: [string, (c: CornerInput) => void, RegExp][] = [
		['a missing point of the kind', (c) => delete c.points['upper_rear.outer'], /^points\.upper_rear\.outer: missing/],
		['a rod of zero length', (c) => (c.points['lower_front.outer'] = [...c.points['lower_front.inner']]), /^points\.lower_front\.outer: coincides with lower_front\.inner/],
		['a rocker on a strut', () => undefined, /^rocker: a strut takes no rocker/],
		['a degenerate rocker axis', (c) => (c.rocker = { pivot_a: [0, 300, 500], pivot_b: [0, 300, 500], rod_end: [0, 340, 540], spring_end: [0, 260, 560], rod_outer: [-2700, 560, 150], rod_on: 'upright' }), /^rocker\.pivot_b: coincides with pivot_a/],
		['a rocker rod on an arm a five-link does not have', (c) => (c.rocker = { pivot_a: [0, 300, 500], pivot_b: [20, 300, 500], rod_end: [0, 340, 540], spring_end: [0, 260, 560], rod_outer: [-2700, 560, 150], rod_on: 'lower' }), /^rocker\.rod_on: must be 'upright'/],
		['a spring on a body the kind does not have', (c) => (c.spring_on = 'lower'), /^spring_on: a five-link has no body 'lower'/]
	];
	for (const [what, change, message] of cases) {
		it(what, () => {
			const c = what === 'a rocker on a strut' ? { ...template('strut'), rocker: { pivot_a: [0, 300, 500], pivot_b: [20, 300, 500], rod_end: [0, 340, 540], spring_end: [0, 260, 560], rod_outer: [0, 600, 150], rod_on: 'lower' } } : clone(base);
			change(c as CornerInput);
			const r = parseCornerGeometry(file(c as CornerInput));
			expect(r.ok ? '' : r.message).toMatch(message);
		});
	}

	it('the engine refuses a rocker on a strut by itself too', () => {
		const c = { ...template('strut'), rocker: { pivot_a: [0, 300, 500], pivot_b: [20, 300, 500], rod_end: [0, 340, 540], spring_end: [0, 260, 560], rod_outer: [0, 600, 150], rod_on: 'lower' } } as CornerInput;
		expect(() => solveSweep(c, { sweep: 'heave', from: 0, to: 0, step: 1 })).toThrow(CornerGeometryError);
	});

	it('a five-link link that cannot reach stops the sweep naming that link', () => {
		const c = clone(base);
		// pull the lower front link's chassis joint outboard: the link is then too short for full bump
		c.points['lower_front.inner'] = [-2640, 480, -20];
		const r = solveSweep(c, { sweep: 'heave', from: -100, to: 100, step: 5 });
		expect(r.error).not.toBeNull();
		expect(r.error!.message).toMatch(/^(lower_front|lower_rear|upper_front|upper_rear) link cannot be assembled at travel -?\d+ mm$/);
		expect(r.samples.length).toBeGreaterThan(0);
		for (const s of r.samples) expect(Number.isFinite(s.camber)).toBe(true);
	});
});

describe('every kind\'s template solves over ±60 mm of heave and ±3° of roll', () => {
	for (const kind of ['double_wishbone', 'strut', 'multi_link', 'semi_trailing']) {
		it(kind, () => {
			const c = template(kind);
			const v = parseCornerGeometry({ format: 'corner-geometry/1', ...c });
			expect(v.ok ? '' : v.message).toBe('');
			expect(solveSweep(c, { sweep: 'heave', from: -60, to: 60, step: 5 }).error).toBeNull();
			expect(solveSweep(c, { sweep: 'roll', from: -3, to: 3, step: 0.5 }).error).toBeNull();
		});
	}
});

describe('templates placed for a corner', () => {
	for (const kind of ['double_wishbone', 'multi_link', 'semi_trailing']) {
		it(`${kind}: with its rocker, on the rear right of a 2500 mm car, it is valid and solves; mirrored and moved as asked`, () => {
			const t = templateFor(kind, 'rear_right', 2500, true);
			expect(t.points['wheel.centre'][0]).toBe(-2500);
			expect(t.points['wheel.centre'][1]).toBeLessThan(0);
			const { points, rocker } = splitRocker(t.points, t.rod_on);
			const file = { format: 'corner-geometry/1', kind, points, rocker, tyre: t.tyre };
			const v = parseCornerGeometry(file);
			expect(v.ok ? '' : v.message).toBe('');
			const r = solveSweep(file as CornerInput, { sweep: 'heave', from: -50, to: 50, step: 10 });
			expect(r.error).toBeNull();
			for (const s of r.samples) {
				expect(s.motion_ratio).toBeGreaterThan(0.3);
				expect(s.motion_ratio).toBeLessThan(1);
			}
		});
	}
});

describe('the list of kinds', () => {
	it('CORNER_KINDS (the literal list zod and the database need) names the descriptions, in their order', () => {
		expect([...CORNER_KINDS]).toEqual(KIND_SPECS.map((k) => k.kind));
	});
});
