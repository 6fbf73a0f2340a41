// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Sign conventions of ISO 8855 / SAE J670 as the contract states them: top of the wheel
// inboard is negative camber; front of the wheel toward the centreline is toe-in (positive);
// mirroring a corner y → −y leaves every angle, scrub and trail unchanged.

import { Euler, Matrix4, Vector3 } from 'three';
import { describe, expect, it } from 'vitest';
import { solveSweep, type CornerInput, type Sample } from '../../../src/lib/server/kinematics/index';
import { clone, DEG, fixture } from './helpers';
import { byContract, type ByHand } from './independent';

/**
 * Pose the club corner's wheel by three.js rotations: the wheel's forward direction turned
 * toward the centreline by `toeInDeg` and its top tilted outboard by `camberDeg` (deg, ISO sign).
 */
function posedWheel(side: 1 | -1, camberDeg: number, toeInDeg: number): { corner: CornerInput; top: Vector3; front: Vector3 } {
	const base = fixture('club-fwd-front-left');
	const corner = clone(base);
	const R = 290;
	// rotate the upright wheel (axis along +y·side) about x for camber, then about z for toe
	const toe = new Matrix4().makeRotationZ((-side * toeInDeg) / DEG);
	const camber = new Matrix4().makeRotationX((-side * camberDeg) / DEG);
	const m = new Matrix4().multiplyMatrices(toe, camber); // camber about x first, then toe about z
	const axis = new Vector3(0, side, 0).applyMatrix4(m);
	const up = new Vector3(0, 0, 1).applyMatrix4(m);
	const fwd = new Vector3(1, 0, 0).applyMatrix4(m);
	const W = new Vector3(0, side * 720, R * Math.cos(camberDeg / DEG));
	for (const [k, p] of Object.entries(base.points)) corner.points[k] = [p[0], side * p[1], p[2]];
	corner.points['wheel.centre'] = [W.x, W.y, W.z];
	corner.points['wheel.axis_inner'] = [W.x - 100 * axis.x, W.y - 100 * axis.y, W.z - 100 * axis.z];
	return { corner, top: W.clone().addScaledVector(up, R), front: W.clone().addScaledVector(fwd, R) };
}

/** The design sample (travel 0) of a corner. */
const design = (c: CornerInput): Sample => solveSweep(c, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];

describe('ISO 8855 / SAE J670 signs', () => {
	for (const side of [1, -1] as const) {
		const name = side === 1 ? 'left' : 'right';
		it(`${name} wheel, top inboard: camber negative, and equal to the posed angle`, () => {
			const { corner, top } = posedWheel(side, -2, 0);
			expect(Math.abs(top.y)).toBeLessThan(720); // the top really leans inboard
			expect(design(corner).camber).toBeCloseTo(-2, 9);
			expect(design(corner).toe).toBeCloseTo(0, 9);
		});
		it(`${name} wheel, front toward the centreline: toe positive (toe-in), equal to the posed angle`, () => {
			const { corner, front } = posedWheel(side, 0, 0.5);
			expect(Math.abs(front.y)).toBeLessThan(720); // the front really points inboard
			expect(design(corner).toe).toBeCloseTo(0.5, 9);
			expect(design(corner).camber).toBeCloseTo(0, 9);
		});
		it(`${name} wheel posed at camber -1.5°, toe-out 0.3°: both read back`, () => {
			const s = design(posedWheel(side, -1.5, -0.3).corner);
			expect(s.camber).toBeCloseTo(-1.5, 9);
			expect(s.toe).toBeCloseTo(-0.3, 9);
		});
	}

	it('steering axis posed with three.js at caster 6°, KPI 11°: both read back', () => {
		const c = fixture('club-fwd-front-left');
		const L = c.points['lower.outer'];
		// top of the axis rearward (caster +) and inboard (KPI +) for a left corner
		const dir = new Vector3(0, 0, 1).applyEuler(new Euler(11 / DEG, -6 / DEG, 0, 'YXZ'));
		const u = dir.multiplyScalar(350 / dir.z);
		const expectedCaster = Math.atan2(-u.x, u.z) * DEG;
		const expectedKpi = Math.atan2(-u.y, u.z) * DEG;
		c.points['upper.outer'] = [L[0] + u.x, L[1] + u.y, L[2] + u.z];
		const s = design(c);
		expect(u.x).toBeLessThan(0);
		expect(u.y).toBeLessThan(0);
		expect(s.caster).toBeCloseTo(expectedCaster, 9);
		expect(s.kpi).toBeCloseTo(expectedKpi, 9);
		expect(expectedCaster).toBeGreaterThan(5);
		expect(expectedKpi).toBeGreaterThan(10);
	});
});

describe('mirror y → −y: the right fixture against the left side\'s independent values, mirrored by hand', () => {
	// Expected values of the right corner are derived here, not by running the engine on the left: the left
	// corner's pose from the independent general-purpose solver (mathjs), its measures by the contract's wording
	// (independent.ts), then mirrored by hand across y = 0. ISO 8855 as the contract defines the signs (s = −1 on
	// the right): camber (top inboard negative), toe (toe-in positive), caster, KPI (top inboard positive), scrub
	// (axis meets the ground inboard positive), trail, half-track change (outboard positive) are the same on both
	// sides; every y coordinate (wheel centre, contact point, fvic's y) changes sign; svic [x, z] is unchanged.
	// A bug that hit both sides alike would fail the left side's own check in contract-definitions.spec.ts and here.
	const left = fixture('club-fwd-front-left');
	const right = fixture('club-fwd-front-right');
	const same = ['camber', 'toe', 'caster', 'kpi', 'scrub_radius', 'trail', 'half_track_change', 'wheelbase_change', 'fvsa', 'rc_height', 'anti_dive'] as const;

	/** The engine's right sample b against the left side's independent values x, mirrored here. */
	function expectMirrored(b: Sample, x: ByHand, where: string): void {
		for (const k of same) {
			if (x[k] === null) expect(b[k], `${k} ${where}`).toBeNull();
			else expect(Math.abs((b[k] as number) - (x[k] as number)), `${k} ${where}`).toBeLessThan(1e-6);
		}
		const mirrored: [number[], number[]][] = [
			[b.fvic!, [-x.fvic![0], x.fvic![1]]],
			[b.svic!, [x.svic![0], x.svic![1]]],
			[b.wheel_centre, [x.wheel_centre[0], -x.wheel_centre[1], x.wheel_centre[2]]],
			[b.contact_patch, [x.contact_patch[0], -x.contact_patch[1], x.contact_patch[2]]]
		];
		for (const [got, want] of mirrored) want.forEach((v, i) => expect(Math.abs(got[i] - v), `${where}: ${got} vs ${want}`).toBeLessThan(1e-5 + 1e-9 * Math.abs(v)));
	}

	it('the right fixture is the left one with every y negated (mirrored here)', () => {
		for (const [k, p] of Object.entries(left.points)) expect(right.points[k]).toEqual([p[0], p[1] === 0 ? 0 : -p[1], p[2]]);
		expect(Object.keys(right.points).sort()).toEqual(Object.keys(left.points).sort());
	});

	it('heave at full rebound, design and full bump: the same travel', () => {
		const b = solveSweep(right, { sweep: 'heave', from: -50, to: 50, step: 50 }).samples;
		expect(b).toHaveLength(3);
		for (const s of b) expectMirrored(s, byContract(left, 'heave', s.travel!), `travel ${s.travel}`);
	});

	it('roll: right at +r against left at −r (positive roll puts the left side down); camber_ground = camber − r on the right', () => {
		const b = solveSweep(right, { sweep: 'roll', from: -3, to: 3, step: 3 }).samples;
		for (const s of b) {
			const x = byContract(left, 'roll', -s.roll!);
			expectMirrored(s, x, `roll ${s.roll}`);
			expect(Math.abs(s.camber_ground! - (x.camber - s.roll!))).toBeLessThan(1e-6);
		}
		// the two ends differ, so a sweep read the wrong way round would fail
		expect(Math.abs(b[0].camber - b[2].camber)).toBeGreaterThan(0.1);
	});

	it('steer: right at rack +r against left at rack −r (a rack moving +y moves toward the left corner, away from the right)', () => {
		const b = solveSweep(right, { sweep: 'steer', from: -40, to: 40, step: 40 }).samples;
		for (const s of b) expectMirrored(s, byContract(left, 'steer', -s.rack!), `rack ${s.rack}`);
		expect(Math.abs(b[0].toe - b[2].toe)).toBeGreaterThan(1);
	});
});
