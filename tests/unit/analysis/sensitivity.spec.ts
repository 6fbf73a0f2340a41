// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Sensitivities against closed forms of the contract's own definitions (shared/geometry-format.md):
// caster = atan2(−(U_x − L_x), U_z − L_z), so ∂caster/∂U_x = −(U_z − L_z) / ((U_x − L_x)² + (U_z − L_z)²) rad/mm;
// kpi = atan2(−s (U_y − L_y), U_z − L_z), so ∂kpi/∂U_y = −s (U_z − L_z) / ((U_y − L_y)² + (U_z − L_z)²) rad/mm.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { CornerInput } from '../../../src/lib/server/kinematics/corner';
import { CornerEvaluator } from '../../../src/lib/server/studies/evaluate';
import { curveDerivatives, sensitivity } from '../../../src/lib/server/studies/sensitivity';

const ROOT = join(import.meta.dirname, '..', '..', '..');
const stock = JSON.parse(readFileSync(join(ROOT, 'fixtures', 'demo', 'front-left-stock.json'), 'utf8')) as CornerInput;
const DEG = 180 / Math.PI;
const grid = { from: -40, to: 40, step: 2 };

describe('sensitivity (closed forms of the contract definitions)', () => {
	const r = sensitivity(stock, grid);
	const deriv = (key: string, point: string, axis: string) => r.rankings.find((k) => k.key === key)!.ranked.find((c) => c.point === point && c.axis === axis)!.derivative;
	const [Lx, Ly, Lz] = stock.points['lower.outer'];
	const [Ux, Uy, Uz] = stock.points['upper.outer'];

	it('∂caster/∂upper.outer x matches the closed form within 1e-6 °/mm', () => {
		const closed = (-(Uz - Lz) / ((Ux - Lx) ** 2 + (Uz - Lz) ** 2)) * DEG;
		expect(Math.abs(deriv('caster', 'upper.outer', 'x') - closed)).toBeLessThan(1e-6);
	});

	it('∂kpi/∂upper.outer y (left corner, s = +1) matches the closed form within 1e-6 °/mm', () => {
		const closed = (-(Uz - Lz) / ((Uy - Ly) ** 2 + (Uz - Lz) ** 2)) * DEG;
		expect(Math.abs(deriv('kpi', 'upper.outer', 'y') - closed)).toBeLessThan(1e-6);
	});

	it('both pivots of an arm slid along their own axis change nothing (the arm still turns about the same line)', () => {
		const [fx, fy, fz] = stock.points['lower.front'];
		const [rx, ry, rz] = stock.points['lower.rear'];
		const l = Math.hypot(rx - fx, ry - fy, rz - fz);
		const e = [(rx - fx) / l, (ry - fy) / l, (rz - fz) / l];
		const coords = (['lower.front', 'lower.rear'] as const).flatMap((point) => ([0, 1, 2] as const).map((axis) => ({ point, axis })));
		const ev = new CornerEvaluator(stock, grid, ['toe', 'camber']);
		const base = new Float64Array(2 * ev.count);
		const slid = new Float64Array(2 * ev.count);
		ev.evaluate([], [], base);
		expect(ev.evaluate(coords, [...e, ...e].map((v) => 25 * v), slid)).toBe(true);
		for (let i = 0; i < base.length; i++) expect(Math.abs(slid[i] - base[i])).toBeLessThan(1e-9);
		// while one pivot alone moved 1 mm does change the toe curve
		const d = curveDerivatives(stock, grid, ['toe'], [{ point: 'lower.front', axis: 2 }]);
		expect(Math.max(...Array.from(d.d).map(Math.abs))).toBeGreaterThan(1e-4);
	});

	it('rankings are sorted by magnitude and cover every linkage coordinate', () => {
		for (const k of r.rankings) {
			expect(k.ranked).toHaveLength(24); // 8 linkage points × 3 axes on a double wishbone
			for (let i = 1; i < k.ranked.length; i++) expect(Math.abs(k.ranked[i - 1].derivative)).toBeGreaterThanOrEqual(Math.abs(k.ranked[i].derivative));
		}
		expect(r.failed).toEqual([]);
	});
});
