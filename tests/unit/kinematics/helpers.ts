// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Shared helpers for the kinematics tests: fixtures and small hand-built corners.

import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { CornerInput, PointTuple } from '../../../src/lib/server/kinematics/index';

export const ROOT = join(import.meta.dirname, '..', '..', '..');

/** A fixture corner by file name (without .json). */
export function fixture(name: string): CornerInput {
	return JSON.parse(readFileSync(join(ROOT, 'fixtures', `${name}.json`), 'utf8')) as CornerInput;
}

/** A deep copy of a corner, for variants. */
export function clone<T>(c: T): T {
	return structuredClone(c);
}

/** Sub, dot, norm on plain tuples (independent of the engine's vec3). */
export const sub = (a: number[], b: number[]): PointTuple => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
export const dot = (a: number[], b: number[]): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
export const norm = (a: number[]): number => Math.sqrt(dot(a, a));
export const DEG = 180 / Math.PI;

/**
 * A planar double wishbone (all pivot axes parallel to x, arms in the plane x = 0) whose
 * front-view arm lines meet at (y, z) = (-1500, 0), i.e. on the ground; camber 0, caster 0.
 * The tie rod is parallel to the lower arm and as long, 120 mm behind it, so the upright
 * turns only about x (no bump steer).
 */
export function planarCorner(): CornerInput {
	const lowerZ = (y: number) => (120 * (y + 1500)) / 2150; // line through (-1500, 0) and (650, 120)
	const upperZ = (y: number) => (420 * (y + 1500)) / 2140; // line through (-1500, 0) and (640, 420)
	return {
		kind: 'double_wishbone',
		points: {
			'lower.front': [150, 250, lowerZ(250)],
			'lower.rear': [-150, 250, lowerZ(250)],
			'lower.outer': [0, 650, 120],
			'upper.front': [130, 350, upperZ(350)],
			'upper.rear': [-130, 350, upperZ(350)],
			'upper.outer': [0, 640, 420],
			'steer.inner': [-120, 250, lowerZ(250)],
			'steer.outer': [-120, 650, 120],
			'wheel.centre': [0, 740, 300],
			'wheel.axis_inner': [0, 640, 300],
			'spring.chassis': [0, 500, 550],
			'spring.body': [0, 560, lowerZ(560)]
		},
		spring_on: 'lower',
		tyre: { loaded_radius: 300 }
	};
}
