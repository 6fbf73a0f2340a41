// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Design-space exploration against the outside world: Latin hypercube stratification, the Sobol sequence from its
// published direction numbers, the Pareto front against a brute-force dominance check, and chunking that does not
// change a single result.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { CornerInput } from '../../../src/lib/server/kinematics/corner';
import { EXPLORE_MEASURES, exploreEvaluator, paretoFront, paretoFrontN, permuteIndex, solveChunk, sobolPoint, unitSample, variantCount, variantOffsets, type ExploreSpec } from '../../../src/lib/server/studies/explore';

const ROOT = join(import.meta.dirname, '..', '..', '..');
const rackMoved = JSON.parse(readFileSync(join(ROOT, 'fixtures', 'club-fwd-front-left-rack-moved.json'), 'utf8')) as CornerInput;

const spec = (over: Partial<ExploreSpec>): ExploreSpec => ({
	plan: 'lhs',
	coords: [
		{ point: 'steer.inner', axis: 1, from: -10, to: 10 },
		{ point: 'steer.inner', axis: 2, from: -25, to: 5 },
		{ point: 'steer.outer', axis: 2, from: -10, to: 10 }
	],
	variants: 1000,
	levels: 5,
	seed: 42,
	grid: { from: -40, to: 40, step: 2 },
	...over
});

describe('Latin hypercube (McKay, Beckman & Conover, Technometrics 21(2), 1979): each of the N strata of every coordinate is hit exactly once', () => {
	it.each([1000, 997, 2, 10007])('N = %i', (n) => {
		const s = spec({ variants: n, seed: 7 });
		const hits = s.coords.map(() => new Uint32Array(n));
		const u = new Float64Array(s.coords.length);
		for (let i = 0; i < n; i++) {
			unitSample(s, i, u);
			u.forEach((v, j) => {
				expect(v).toBeGreaterThanOrEqual(0);
				expect(v).toBeLessThan(1);
				hits[j][Math.floor(v * n)]++;
			});
		}
		for (const h of hits) expect(h.every((c) => c === 1)).toBe(true);
	});

	it('a different seed gives a different design (the permutation depends on the seed)', () => {
		const a = new Float64Array(3);
		const b = new Float64Array(3);
		let same = 0;
		for (let i = 0; i < 100; i++) {
			unitSample(spec({ seed: 1 }), i, a);
			unitSample(spec({ seed: 2 }), i, b);
			if (Math.floor(a[0] * 1000) === Math.floor(b[0] * 1000)) same++;
		}
		expect(same).toBeLessThan(10);
	});

	it('the index permutation is a bijection of [0, n) for awkward n (Black & Rogaway cycle-walking)', () => {
		for (const n of [3, 5, 17, 1023, 1025]) {
			const seen = new Set<number>();
			for (let i = 0; i < n; i++) seen.add(permuteIndex(i, n, 12345));
			expect(seen.size).toBe(n);
			expect(Math.max(...seen)).toBe(n - 1);
		}
	});
});

describe('Sobol sequence from the direction numbers of Joe & Kuo (SIAM J. Sci. Comput. 30(5), 2008, file new-joe-kuo-6.21201)', () => {
	// Worked by hand from the published numbers: dimension 1 has v_k = 2^-k; dimension 2 (s = 1, a = 0, m_1 = 1) has
	// m_k = 2·m_{k-1} xor m_{k-1}: m = 1, 3, 5, 15 → v = 1/2, 3/4, 5/8, 15/16; dimension 3 (s = 2, a = 1, m = 1, 3)
	// has m_3 = 2·m_2 xor 4·m_1 xor m_1 = 6 xor 4 xor 1 = 3 → v = 1/2, 3/4, 3/8. Point i is the xor of v_k over the
	// set bits k of its Gray code i xor (i >> 1) (Antonov & Saleev, USSR Comput. Maths. Math. Phys. 19, 1979).
	const expected = [
		[0, 0, 0],
		[0.5, 0.5, 0.5],
		[0.75, 0.25, 0.25],
		[0.25, 0.75, 0.75],
		[0.375, 0.375, 0.625],
		[0.875, 0.875, 0.125],
		[0.625, 0.125, 0.875],
		[0.125, 0.625, 0.375]
	];
	it.each(expected.map((p, i) => [i, p] as const))('point %i', (i, p) => {
		expect([0, 1, 2].map((d) => sobolPoint(i, d))).toEqual(p);
	});

	it('each of the 2^m elementary intervals of every dimension holds one of the first 2^m points (a (0, m, 1)-net per dimension)', () => {
		for (let d = 0; d < 10; d++) {
			const bins = new Uint8Array(256);
			for (let i = 0; i < 256; i++) bins[Math.floor(sobolPoint(i, d) * 256)]++;
			expect(bins.every((b) => b === 1)).toBe(true);
		}
	});
});

describe('full factorial', () => {
	it('levels^k variants, each combination of levels once, the ends included', () => {
		const s = spec({ plan: 'factorial', levels: 4, coords: spec({}).coords.slice(0, 2) });
		expect(variantCount(s)).toBe(16);
		const seen = new Set<string>();
		const u = new Float64Array(2);
		for (let i = 0; i < 16; i++) {
			unitSample(s, i, u);
			seen.add(`${u[0]},${u[1]}`);
		}
		expect(seen.size).toBe(16);
		expect(seen.has('0,0') && seen.has('1,1') && seen.has(`${1 / 3},${2 / 3}`)).toBe(true);
	});
});

describe('Pareto front (derived here): a point is on it when no other point is at least as good in both objectives and better in one', () => {
	function bruteForce(xs: number[], ys: number[]): number[] {
		const out: number[] = [];
		for (let i = 0; i < xs.length; i++) {
			let dominated = false;
			for (let j = 0; j < xs.length && !dominated; j++) dominated = j !== i && xs[j] <= xs[i] && ys[j] <= ys[i] && (xs[j] < xs[i] || ys[j] < ys[i]);
			if (!dominated) out.push(i);
		}
		return out;
	}
	it.each([1, 2, 3, 4, 5])('an invented problem, seed %i, with ties on a coarse grid', (seed) => {
		let s = seed * 2654435761;
		const rnd = () => ((s = (Math.imul(s, 1103515245) + 12345) >>> 0) / 2 ** 32);
		const xs = Array.from({ length: 400 }, () => Math.round(rnd() * 30));
		const ys = xs.map((x) => Math.round(30 - x + rnd() * 20));
		expect(paretoFront(xs, ys).sort((a, b) => a - b)).toEqual(bruteForce(xs, ys));
	});
	it('leaves out points without a value (NaN)', () => {
		expect(paretoFront([1, NaN, 0], [1, 0, 2])).toEqual([2, 0]);
	});
});

describe('Pareto front of three objectives (derived here): the non-dominated set against a brute-force dominance check', () => {
	/** Every point no other point is at least as good as in all three objectives and better in one: O(n²), by definition. */
	function bruteForce(o: number[][]): number[] {
		const n = o[0].length;
		const out: number[] = [];
		for (let i = 0; i < n; i++) {
			if (o.some((a) => !Number.isFinite(a[i]))) continue;
			let dominated = false;
			for (let j = 0; j < n && !dominated; j++) {
				if (j === i || o.some((a) => !Number.isFinite(a[j]))) continue;
				dominated = o.every((a) => a[j] <= a[i]) && o.some((a) => a[j] < a[i]);
			}
			if (!dominated) out.push(i);
		}
		return out;
	}
	it.each([1, 2, 3, 4, 5, 6])('an invented problem, seed %i: 500 points on a coarse grid (ties and duplicates), a few without a value', (seed) => {
		let s = seed * 2654435761;
		const rnd = () => ((s = (Math.imul(s, 1103515245) + 12345) >>> 0) / 2 ** 32);
		const xs = Array.from({ length: 500 }, () => Math.round(rnd() * 20));
		const ys = xs.map((x) => Math.round(20 - x + rnd() * 15));
		const zs = xs.map((x, i) => (i % 97 === 5 ? NaN : Math.round(rnd() * 10 + (x + ys[i]) / 4)));
		const front = paretoFrontN([xs, ys, zs]).sort((a, b) => a - b);
		expect(front).toEqual(bruteForce([xs, ys, zs]));
		expect(front.length).toBeGreaterThan(3);
	});
	it('two objectives through the same entry give the two-objective front', () => {
		const xs = [3, 1, 2, 2, 5];
		const ys = [1, 3, 2, 2, 0];
		expect(paretoFrontN([xs, ys]).sort()).toEqual(bruteForce([xs, ys]));
	});
	it('a third objective can only add points to the front of the first two (a point off it may win on the third)', () => {
		const xs = [0, 1, 2];
		const ys = [0, 1, 2];
		const zs = [5, 4, 3];
		expect(paretoFrontN([xs, ys])).toEqual([0]);
		expect(paretoFrontN([xs, ys, zs]).sort()).toEqual([0, 1, 2]);
	});
});

describe('measures chosen per study: only those are solved and stored, with the same values as when all are kept', () => {
	it('toe RMS and roll-centre migration alone equal the full study in those columns; the others stay empty', () => {
		const all = spec({ variants: 200 });
		const some = spec({ variants: 200, measures: ['toe_rms', 'rc_migration'] });
		const a = solveChunk(exploreEvaluator(rackMoved, all), all, 0, 200);
		const b = solveChunk(exploreEvaluator(rackMoved, some), some, 0, 200);
		const m = EXPLORE_MEASURES.length;
		const col = (r: typeof a, j: number) => Array.from({ length: 200 }, (_, v) => r.values[v * m + j]);
		expect(Array.from(b.ok)).toEqual(Array.from(a.ok));
		expect(col(b, 0)).toEqual(col(a, 0));
		expect(col(b, 3)).toEqual(col(a, 3));
		for (const j of [1, 2, 4, 5]) expect(col(b, j).every(Number.isNaN)).toBe(true);
		expect(col(a, 1).filter(Number.isFinite).length).toBeGreaterThan(0);
	});
});

describe('keep-out volumes as a constraint (the volumes of src/lib/server/kinematics/keep-out.ts, as in the fix search)', () => {
	it('a box over the inner tie-rod joint: a variant that raises the joint into it is marked, one that lowers it is clear', () => {
		// steer.inner is at (-130, 358, 156) on the chassis (it does not move in heave with the rack held): the box
		// starts at its height, 10 mm wide around it in x and y; the tie rod runs out to y = 655 nearly level
		const box = { shape: 'box' as const, name: 'rack boot', min: [-140, 353, 156], max: [-120, 363, 300] };
		const s = spec({ coords: [{ point: 'steer.inner', axis: 2, from: -25, to: 5 }], variants: 300, measures: ['toe_rms'], packaging: { volumes: [box], racks: [], moved: ['steer.inner'], ratio: null } });
		const r = solveChunk(exploreEvaluator(rackMoved, s), s, 0, 300);
		expect(r.clear).not.toBeNull();
		let inside = 0;
		let below = 0;
		for (let v = 0; v < 300; v++) {
			if (!r.ok[v]) continue;
			const dz = variantOffsets(s, v)[0];
			if (dz > 0.5) (expect(r.clear![v]).toBe(0), inside++);
			if (dz < -3) (expect(r.clear![v]).toBe(1), below++);
		}
		expect(inside).toBeGreaterThan(10);
		expect(below).toBeGreaterThan(100);
	});
	it('without volumes nothing is marked (clear is null)', () => {
		const s = spec({ variants: 10 });
		expect(solveChunk(exploreEvaluator(rackMoved, s), s, 0, 10).clear).toBeNull();
	});
});

describe('chunks: any split over any number of workers gives the same numbers', () => {
	it('one worker solving 3 chunks in order = two workers (own evaluators) taking them interleaved, bit for bit', () => {
		const s = spec({ variants: 300 });
		const one = exploreEvaluator(rackMoved, s);
		const whole = [0, 1, 2].map((c) => solveChunk(one, s, c * 100, 100));
		const w = [exploreEvaluator(rackMoved, s), exploreEvaluator(rackMoved, s)];
		const split = [solveChunk(w[1], s, 200, 100), solveChunk(w[0], s, 0, 100), solveChunk(w[1], s, 100, 100)];
		const byFirst = split.sort((a, b) => a.first - b.first);
		for (let c = 0; c < 3; c++) {
			expect(Array.from(byFirst[c].ok)).toEqual(Array.from(whole[c].ok));
			expect(Array.from(byFirst[c].values)).toEqual(Array.from(whole[c].values));
		}
		expect(whole.reduce((a, r) => a + r.ok.reduce((x, y) => x + y, 0), 0)).toBeGreaterThan(0);
	});
});
