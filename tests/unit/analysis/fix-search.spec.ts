// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Fix search against the outside world: the textbook zero-bump-steer construction, and the demo car's rack move.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { CornerInput } from '../../../src/lib/server/kinematics/corner';
import { CornerEvaluator, toChange } from '../../../src/lib/server/studies/evaluate';
import { fixSearch, movesNote, startingPoints } from '../../../src/lib/server/studies/fix-search';
import { constructedInner, offTieRodLine, textbookCorner } from './textbook-corner';

const ROOT = join(import.meta.dirname, '..', '..', '..');
const demo = (name: string) => JSON.parse(readFileSync(join(ROOT, 'fixtures', 'demo', `${name}.json`), 'utf8')) as CornerInput;
const INNER_YZ = (bound: number) => [
	{ point: 'steer.inner', axis: 1 as const, min: -bound, max: bound },
	{ point: 'steer.inner', axis: 2 as const, min: -bound, max: bound }
];

/** Search the textbook corner (inner joint started off the construction by dy, dz) for zero toe change over ±10 mm. */
function searchTextbook(layout: 'parallel' | 'skewed', dy: number, dz: number) {
	const corner = textbookCorner(layout, dy, dz);
	const r = fixSearch({ corner, grid: { from: -10, to: 10, step: 1 }, free: INNER_YZ(10), measures: [{ key: 'toe', weight: 1 }], starts: 5 });
	const [, y, z] = corner.points['steer.inner'];
	return { y: y + r.free[0].move, z: z + r.free[1].move, r };
}

describe('fix search lands on the classical zero-bump-steer construction (Milliken & Milliken, Race Car Vehicle Dynamics, ch. 17)', () => {
	// Arm pivot axes parallel to x, tie-rod outer joint on the steering axis in the front view; the search moves only
	// the tie-rod inner joint in y and z (±10 mm) for zero toe change over ±10 mm of travel.
	it.each([
		[4, -5],
		[-6, 3],
		[7, 6]
	])('started %d mm, %d mm off: within 1 mm of the constructed inner joint', (dy, dz) => {
		const { y, z, r } = searchTextbook('parallel', dy, dz);
		const [cy, cz] = constructedInner('parallel');
		expect(Math.hypot(y - cy, z - cz)).toBeLessThan(1);
		expect(r.measures[0].maxBefore).toBeGreaterThan(0.01); // the start really had bump steer
		expect(r.measures[0].maxAfter).toBeLessThan(0.001);
	});

	// The construction's first condition (tie-rod line through the instant centre) is exact to first order in any
	// layout; where the inner pivots' line is skewed against the steering axis, the second condition (inner joint on
	// that line) is only approximate, so there only the first is checked.
	it('skewed inner pivots: the found joint lies on the tie-rod line through the instant centre within 1 mm', () => {
		const { y, z } = searchTextbook('skewed', 4, -5);
		expect(offTieRodLine('skewed', y, z)).toBeLessThan(1);
	});
});

describe('demo car: the search restores the rack-moved corner with the tie-rod joints', () => {
	// Bounds a fabricator can make (common practice, no published source): the inner tie-rod end ±10 mm longer or
	// shorter (y), the steering arm ±10 mm (outer joint x), and a spacer or a new arm moving the outer joint
	// −5…+30 mm (z). The rack itself stays where the exhaust pushed it.
	const FREE = [
		{ point: 'steer.inner', axis: 1 as const, min: -10, max: 10 },
		{ point: 'steer.outer', axis: 0 as const, min: -10, max: 10 },
		{ point: 'steer.outer', axis: 2 as const, min: -5, max: 30 }
	];
	const grid = { from: -40, to: 40, step: 2 };

	/** Toe change of a corner over the grid, degrees, as an independent check of the search's own report. */
	function toeChange(c: CornerInput): Float64Array {
		const ev = new CornerEvaluator(c, grid, ['toe']);
		const out = new Float64Array(ev.count);
		ev.evaluate([], [], out);
		return toChange(out, 1, ev.count, ev.design);
	}

	it('toe change over ±40 mm within 0.05° of stock, camber kept', () => {
		const stock = toeChange(demo('front-left-stock'));
		const moved = demo('front-left-rack-moved');
		const r = fixSearch({ corner: moved, grid, free: FREE, measures: [{ key: 'toe', weight: 1, target: stock }, { key: 'camber', weight: 0.2 }], starts: 5 });
		// Apply the moves to a copy and solve it afresh: the figure does not come from the search's own numbers.
		const fixed = structuredClone(moved);
		r.free.forEach((f) => (fixed.points[f.point][f.axis] += f.move));
		const after = toeChange(fixed);
		const worst = Math.max(...after.map((v, k) => Math.abs(v - stock[k])));
		const before = Math.max(...toeChange(moved).map((v, k) => Math.abs(v - stock[k])));
		expect(before).toBeGreaterThan(1); // the rack move spoilt it by over a degree
		expect(worst).toBeLessThan(0.05);
		for (const f of r.free) expect(f.move).toBeGreaterThanOrEqual(f.min - 1e-9), expect(f.move).toBeLessThanOrEqual(f.max + 1e-9);
	});
});

describe('fix search mechanics', () => {
	it('moves that cannot be assembled are rejected, not crashed on', () => {
		// Bounds that bring the tie-rod outer joint within 2…9 mm of the inner one: no such tie rod follows the wheel
		// over ±40 mm of travel. Every start is rejected; the search still answers, with the corner left as it is.
		const corner = JSON.parse(readFileSync(join(ROOT, 'fixtures', 'club-fwd-front-left.json'), 'utf8')) as CornerInput;
		const r = fixSearch({
			corner,
			grid: { from: -40, to: 40, step: 5 },
			free: [{ point: 'steer.outer', axis: 1, min: -295, max: -288 }],
			measures: [{ key: 'toe', weight: 1 }],
			starts: 4
		});
		expect(r.rejected).toBe(4);
		expect(r.starts.every((s) => s.rms === null)).toBe(true);
		expect(r.free[0].move).toBe(0);
		expect(Number.isFinite(r.measures[0].maxAfter)).toBe(true);
	});

	it('a search whose bounds reach an unassemblable corner keeps to the starts that assemble', () => {
		const corner = JSON.parse(readFileSync(join(ROOT, 'fixtures', 'club-fwd-front-left.json'), 'utf8')) as CornerInput;
		const r = fixSearch({
			corner,
			grid: { from: -40, to: 40, step: 5 },
			free: [{ point: 'steer.outer', axis: 1, min: -295, max: 20 }],
			measures: [{ key: 'toe', weight: 1 }],
			starts: 8
		});
		expect(r.starts.some((s) => s.rms !== null)).toBe(true);
		expect(Number.isFinite(r.measures[0].maxAfter)).toBe(true);
		expect(r.measures[0].maxAfter).toBeLessThanOrEqual(r.measures[0].maxBefore + 1e-9);
	});

	it('starting points: no move first, then spread inside 80 % of the bounds', () => {
		const s = startingPoints([{ point: 'a', axis: 0, min: -10, max: 10 }, { point: 'a', axis: 1, min: -5, max: 20 }], 6);
		expect(s[0]).toEqual([0, 0]);
		expect(new Set(s.map((p) => p.join())).size).toBe(6);
		for (const p of s) expect(Math.abs(p[0])).toBeLessThanOrEqual(8), expect(p[1]).toBeGreaterThanOrEqual(-2.5), expect(p[1]).toBeLessThanOrEqual(17.5);
	});

	it('the note names every move that rounds to something', () => {
		expect(movesNote([{ point: 'steer.inner', axis: 1, move: 3.24 }, { point: 'steer.inner', axis: 2, move: -1.04 }, { point: 'steer.outer', axis: 0, move: 0.01 }])).toBe('steer.inner y +3.2 mm, z −1.0 mm');
	});
});
