// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// Datum and best-fit alignment against a rotation and translation built with three.js
// (Matrix4 / Quaternion, an independent general 3-D library), and the fixture of issue 4.

import { Matrix4, Quaternion, Vector3 } from 'three';
import { describe, expect, it } from 'vitest';
import { importCorner, type ImportPreview, type ImportResult } from '../../../src/lib/server/import/index';
import { bestFit } from '../../../src/lib/server/import/fit';
import { bytes, csvOf, distance, fixtureBytes, fixturePoints, maxError, STOCK, type P } from './helpers';

const ctx = { kind: 'double_wishbone' as const, currentPoints: STOCK };

/** The preview of a result (fails the test when the import failed). */
function preview(r: ImportResult): ImportPreview {
	if (!r.ok) throw new Error(`expected success, got ${r.error.message}`);
	return r.preview;
}

/** A scanner pose built with three.js: rotation about a tilted axis and a translation (mm). */
function threePose(): Matrix4 {
	const q = new Quaternion().setFromAxisAngle(new Vector3(0.3, -0.5, 0.81).normalize(), 2.1);
	return new Matrix4().compose(new Vector3(1234.5, -876.25, 402.75), q, new Vector3(1, 1, 1));
}

/** Points moved by a three.js matrix (mm). */
function moved(points: Record<string, P>, m: Matrix4): Record<string, P> {
	return Object.fromEntries(Object.entries(points).map(([n, p]) => [n, new Vector3(...p).applyMatrix4(m).toArray() as P]));
}

/** The scanner's point names (an invented team alias dictionary) and their file. */
const ALIASES: Record<string, string> = {
	LWR_ARM_FRT: 'lower.front', LWR_ARM_RR: 'lower.rear', LWR_BJ: 'lower.outer',
	UPR_ARM_FRT: 'upper.front', UPR_ARM_RR: 'upper.rear', UPR_BJ: 'upper.outer',
	TIE_ROD_IN: 'steer.inner', TIE_ROD_OUT: 'steer.outer', HUB_CTR: 'wheel.centre',
	HUB_AXIS_IN: 'wheel.axis_inner', SPRING_TOP: 'spring.chassis', SPRING_BOT: 'spring.body'
};

describe('alignment against three.js (Matrix4.compose, Quaternion.setFromAxisAngle)', () => {
	const scan = moved(STOCK, threePose());

	it('the scan really is moved far from the stock points (the test can fail)', () => {
		expect(maxError(scan, STOCK)).toBeGreaterThan(500);
		const p = preview(importCorner(bytes(csvOf(scan)), { unit: 'mm' }, ctx));
		expect(maxError(p.points, STOCK)).toBeGreaterThan(500);
	});

	it('best fit recovers the original points within 1e-6 mm', () => {
		const p = preview(importCorner(bytes(csvOf(scan)), { unit: 'mm', alignment: { method: 'best_fit' } }, ctx));
		expect(maxError(p.points, STOCK)).toBeLessThan(1e-6);
		expect(p.alignment?.method).toBe('best_fit');
		expect(p.alignment?.rms).toBeLessThan(1e-6);
		expect(Object.keys(p.alignment?.residuals ?? {})).toHaveLength(12);
	});

	it('best fit on three named points recovers all of them within 1e-6 mm', () => {
		const names = ['lower.front', 'lower.rear', 'upper.outer'];
		const p = preview(importCorner(bytes(csvOf(scan)), { unit: 'mm', alignment: { method: 'best_fit', names } }, ctx));
		expect(maxError(p.points, STOCK)).toBeLessThan(1e-6);
		expect(Object.keys(p.alignment?.residuals ?? {})).toEqual(names);
	});

	it('datum alignment onto target coordinates recovers the original within 1e-6 mm', () => {
		const a = { method: 'datum', points: ['lower.front', 'lower.rear', 'upper.front'], targets: [STOCK['lower.front'], STOCK['lower.rear'], STOCK['upper.front']] };
		const p = preview(importCorner(bytes(csvOf(scan)), { unit: 'mm', alignment: a }, ctx));
		expect(maxError(p.points, STOCK)).toBeLessThan(1e-6);
		const current = preview(importCorner(bytes(csvOf(scan)), { unit: 'mm', alignment: { ...a, targets: 'current' } }, ctx));
		expect(maxError(current.points, STOCK)).toBeLessThan(1e-6);
	});

	it('datum points off the car (scanner targets by file name) with known vehicle coordinates', () => {
		const targets: P[] = [[600, 0, 0], [-600, 0, 0], [0, 400, 0]];
		const withTargets = { ...scan, ...moved({ TGT_1: targets[0], TGT_2: targets[1], TGT_3: targets[2] }, threePose()) };
		const a = { method: 'datum', points: ['TGT_1', 'TGT_2', 'TGT_3'], targets };
		const p = preview(importCorner(bytes(csvOf(withTargets)), { unit: 'mm', alignment: a }, ctx));
		expect(maxError(p.points, STOCK)).toBeLessThan(1e-6);
		expect(p.unmatchedNames).toEqual(['TGT_1', 'TGT_2', 'TGT_3']);
	});

	it('datum without targets: A at the origin, B on +x, C in the x–y plane on +y (the convention)', () => {
		const [A, B, C] = ['lower.front', 'lower.rear', 'upper.front'];
		const p = preview(importCorner(bytes(csvOf(scan)), { unit: 'mm', alignment: { method: 'datum', points: [A, B, C] } }, ctx));
		const q = p.points;
		expect(distance(q[A], [0, 0, 0])).toBeLessThan(1e-9);
		expect(Math.abs(q[B][1]) + Math.abs(q[B][2])).toBeLessThan(1e-9);
		expect(q[B][0]).toBeCloseTo(distance(STOCK[A], STOCK[B]), 9);
		expect(Math.abs(q[C][2])).toBeLessThan(1e-9);
		expect(q[C][1]).toBeGreaterThan(0);
		// Rigid: every distance between two points is kept (by hand from the stock points).
		for (const m of Object.keys(STOCK)) for (const n of Object.keys(STOCK)) expect(distance(q[m], q[n])).toBeCloseTo(distance(STOCK[m], STOCK[n]), 8);
	});

	it('a residual shows a moved point, largest where the point moved', () => {
		const bent = { ...scan, 'upper.outer': new Vector3(...STOCK['upper.outer']).add(new Vector3(0, 0, 5)).applyMatrix4(threePose()).toArray() as P };
		const p = preview(importCorner(bytes(csvOf(bent)), { unit: 'mm', alignment: { method: 'best_fit' } }, ctx));
		const r = p.alignment?.residuals ?? {};
		const worst = Object.entries(r).sort((a, b) => b[1] - a[1])[0];
		expect(worst[0]).toBe('upper.outer');
		expect(p.alignment?.rms).toBeGreaterThan(0.5);
		expect(p.alignment?.rms).toBeLessThan(5);
	});
});

describe('alignment failures', () => {
	it('fewer than three common points', () => {
		const r = importCorner(bytes(csvOf(STOCK)), { unit: 'mm', alignment: { method: 'best_fit' } }, { ...ctx, currentPoints: { 'lower.front': STOCK['lower.front'], 'lower.rear': STOCK['lower.rear'] } });
		expect(r.ok ? null : r.error).toEqual({
			code: 'alignment_point_missing',
			message: 'alignment: best fit needs at least 3 common points, found 2 (lower.front, lower.rear)',
			field: 'alignment.names'
		});
	});

	it('collinear common points', () => {
		const line: Record<string, P> = { 'lower.front': [0, 0, 0], 'lower.rear': [100, 0, 0], 'upper.front': [250, 0, 0] };
		const current = { ...STOCK, ...line };
		const r = importCorner(bytes(csvOf({ ...STOCK, ...line })), { unit: 'mm', alignment: { method: 'best_fit', names: Object.keys(line) } }, { ...ctx, currentPoints: current });
		expect(r.ok ? null : r.error.message).toBe('alignment: the common points lower.front, lower.rear, upper.front lie on one line; best fit needs 3 points not on a line');
	});

	it('collinear datum points', () => {
		const line = { ...STOCK, 'upper.front': [580, 325, 121] as P }; // by hand: lower.front + (lower.front − lower.rear), on the line lower.rear → lower.front, extended
		const r = importCorner(bytes(csvOf(line)), { unit: 'mm', alignment: { method: 'datum', points: ['lower.front', 'lower.rear', 'upper.front'] } }, ctx);
		expect(r.ok ? null : r.error).toEqual({
			code: 'alignment_degenerate',
			message: 'alignment: datum points lower.front, lower.rear, upper.front lie on one line',
			field: 'alignment.points'
		});
	});

	it('a datum point not in the file', () => {
		const r = importCorner(bytes(csvOf(STOCK)), { unit: 'mm', alignment: { method: 'datum', points: ['lower.front', 'DATUM_9', 'upper.front'] } }, ctx);
		expect(r.ok ? null : r.error).toEqual({
			code: 'alignment_point_missing',
			message: 'alignment.points.1: datum point "DATUM_9" is not in the file',
			field: 'alignment.points.1'
		});
	});

	it('best fit with no current revision', () => {
		const r = importCorner(bytes(csvOf(STOCK)), { unit: 'mm', alignment: { method: 'best_fit' } }, { kind: 'double_wishbone' });
		expect(r.ok ? null : r.error).toEqual({
			code: 'alignment_no_target',
			message: 'alignment: the corner has no current revision to align onto',
			field: 'alignment'
		});
	});

	it('the reflection fix: a mirror image is fitted by a rotation, not a reflection', () => {
		// Kabsch (1976) with the sign correction: det R must be +1 even when a reflection fits better.
		const pairs = Object.entries(STOCK).map(([name, p]) => ({ name, from: [p[0], -p[1], p[2]] as P, to: p }));
		const { map, rms } = bestFit(pairs);
		const m = new Matrix4().set(...map.R[0], 0, ...map.R[1], 0, ...map.R[2], 0, 0, 0, 0, 1);
		expect(m.determinant()).toBeCloseTo(1, 12);
		expect(rms).toBeGreaterThan(100);
	});
});

describe('the fixture of issue 4 (fixtures/README.md)', () => {
	it('the inch, scanner-frame CSV with best fit onto the stock revision recovers the stock points within 0.1 mm (and 1e-6)', () => {
		const r = importCorner(
			fixtureBytes('club-fwd-front-left-scan-inches.csv'),
			{ unit: 'in', axes: 'iso8855', alignment: { method: 'best_fit' } },
			{ kind: 'double_wishbone', aliases: ALIASES, currentPoints: fixturePoints('club-fwd-front-left') }
		);
		const p = preview(r);
		expect(maxError(p.points, STOCK)).toBeLessThan(0.1);
		expect(maxError(p.points, STOCK)).toBeLessThan(1e-6);
		expect(p.unmatchedNames).toEqual(['TGT_1', 'TGT_2']);
		expect(p.warnings).toEqual([]);
	});

	it('the same file made into the right corner: mirror, then best fit onto the stock right revision', () => {
		const right = fixturePoints('club-fwd-front-right');
		const p = preview(
			importCorner(
				fixtureBytes('club-fwd-front-left-scan-inches.csv'),
				{ unit: 'in', mirror: true, alignment: { method: 'best_fit' } },
				{ kind: 'double_wishbone', aliases: ALIASES, currentPoints: right, cornerSide: 'right' }
			)
		);
		expect(maxError(p.points, right)).toBeLessThan(1e-6);
		expect(p.warnings).toEqual([]);
	});

	it('the scanner datum targets TGT_1, TGT_2 (on the centreline, z = 0) align it with a datum', () => {
		// TGT_1 = (600, 0, 0), TGT_2 = (−600, 0, 0) in the vehicle frame; wheel.centre gives the +y side.
		const targets: P[] = [[600, 0, 0], [-600, 0, 0], STOCK['wheel.centre']];
		const p = preview(
			importCorner(
				fixtureBytes('club-fwd-front-left-scan-inches.csv'),
				{ unit: 'in', alignment: { method: 'datum', points: ['TGT_1', 'TGT_2', 'wheel.centre'], targets } },
				{ kind: 'double_wishbone', aliases: ALIASES }
			)
		);
		expect(maxError(p.points, STOCK)).toBeLessThan(1e-6);
	});
});
