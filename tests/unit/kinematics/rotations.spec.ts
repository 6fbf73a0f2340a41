// Frame: ISO 8855 vehicle axes, x forward, y left, z up; angles in radians.
// The engine's rigid-body transforms checked against three.js's Matrix4 and Quaternion
// (an independent, widely used implementation) on seeded random cases.

import { Matrix4, Quaternion, Vector3 } from 'three';
import { describe, expect, it } from 'vitest';
import { axisAngle, mat3, minimalRotation, mul, place, rotate } from '../../../src/lib/server/kinematics/pose';
import { vec3 } from '../../../src/lib/server/kinematics/vec3';

/** mulberry32: a small seeded generator, so every run checks the same cases. */
function rng(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/** A random unit vector from generator r. */
function unit(r: () => number): Vector3 {
	return new Vector3(r() - 0.5, r() - 0.5, r() - 0.5).normalize();
}

/** Our row-major 3x3 against three's Matrix4 (column-major storage). */
function expectSame(ours: Float64Array, theirs: Matrix4): void {
	const e = theirs.elements;
	for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(ours[3 * i + j]).toBeCloseTo(e[4 * j + i], 12);
}

describe('rigid-body transforms vs three.js (seeded random cases)', () => {
	it('axisAngle = Matrix4.makeRotationAxis for 200 random axes and angles', () => {
		const r = rng(8855);
		for (let k = 0; k < 200; k++) {
			const n = unit(r);
			const angle = (r() - 0.5) * 4 * Math.PI;
			expectSame(axisAngle(mat3(), vec3(n.x, n.y, n.z), angle), new Matrix4().makeRotationAxis(n, angle));
		}
	});

	it('minimalRotation = Quaternion.setFromUnitVectors, and maps u onto v', () => {
		const r = rng(670);
		for (let k = 0; k < 200; k++) {
			const u = unit(r);
			const v = unit(r);
			const m = mat3();
			expect(minimalRotation(m, vec3(u.x, u.y, u.z), vec3(v.x, v.y, v.z))).toBe(true);
			expectSame(m, new Matrix4().makeRotationFromQuaternion(new Quaternion().setFromUnitVectors(u, v)));
			const out = rotate(vec3(), m, vec3(u.x, u.y, u.z));
			expect(out[0]).toBeCloseTo(v.x, 12);
			expect(out[1]).toBeCloseTo(v.y, 12);
			expect(out[2]).toBeCloseTo(v.z, 12);
		}
	});

	it('minimalRotation refuses opposite vectors (typed failure, no NaN)', () => {
		const m = mat3();
		expect(minimalRotation(m, vec3(1, 0, 0), vec3(-1, 0, 0))).toBe(false);
		expect(Array.from(m).every(Number.isFinite)).toBe(true);
	});

	it('mul and place = Matrix4.multiply then applyMatrix4 with a translation', () => {
		const r = rng(3);
		for (let k = 0; k < 100; k++) {
			const a = unit(r);
			const b = unit(r);
			const ta = (r() - 0.5) * 6;
			const tb = (r() - 0.5) * 6;
			const ours = mul(mat3(), axisAngle(mat3(), vec3(a.x, a.y, a.z), ta), axisAngle(mat3(), vec3(b.x, b.y, b.z), tb));
			const theirs = new Matrix4().multiplyMatrices(new Matrix4().makeRotationAxis(a, ta), new Matrix4().makeRotationAxis(b, tb));
			expectSame(ours, theirs);
			const p = new Vector3((r() - 0.5) * 1000, (r() - 0.5) * 1000, (r() - 0.5) * 1000);
			const origin = new Vector3((r() - 0.5) * 1000, (r() - 0.5) * 1000, (r() - 0.5) * 1000);
			const placed = place(vec3(), ours, vec3(p.x, p.y, p.z), vec3(origin.x, origin.y, origin.z));
			const expected = p.clone().applyMatrix4(theirs.clone().setPosition(origin));
			expect(placed[0]).toBeCloseTo(expected.x, 9);
			expect(placed[1]).toBeCloseTo(expected.y, 9);
			expect(placed[2]).toBeCloseTo(expected.z, 9);
		}
	});
});
