// Plausibility warnings (issue 19, item 3): each triggered by an invented corner made for it, none on the demo and
// fixture corners. The limits are common practice, no source (see src/lib/plausibility.ts).
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { plausibility } from '../../../src/lib/plausibility';
import { solveSweep } from '../../../src/lib/server/kinematics/index';

const ROOT = join(import.meta.dirname, '..', '..', '..');
type Corner = { kind: string; points: Record<string, [number, number, number]>; rocker?: object | null; tyre: { loaded_radius: number } };
const club = (): Corner => JSON.parse(readFileSync(join(ROOT, 'fixtures', 'club-fwd-front-left.json'), 'utf8'));
const designMr = (c: Corner) => solveSweep(c as never, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0].motion_ratio;

/** Every corner file among the fixtures (corner files, axle files' measured sides, the car file's corners). */
function fixtureCorners(): [string, Corner][] {
	const out: [string, Corner][] = [];
	for (const dir of ['fixtures', join('fixtures', 'demo')]) {
		for (const f of readdirSync(join(ROOT, dir)).filter((n) => n.endsWith('.json'))) {
			const j = JSON.parse(readFileSync(join(ROOT, dir, f), 'utf8'));
			if (j.format === 'corner-geometry/1' && f !== 'cannot-assemble.json') out.push([`${dir}/${f}`, j]);
			if (j.format === 'car-model/1') for (const [p, c] of Object.entries(j.corners)) out.push([`${dir}/${f} ${p}`, c as Corner]);
			if (j.format === 'axle-geometry/1') for (const s of ['left', 'right']) if (j[s] && typeof j[s] === 'object') out.push([`${dir}/${f} ${s}`, j[s]]);
		}
	}
	return out;
}

describe('plausibility warnings', () => {
	it('none on the demo and fixture corners', () => {
		const corners = fixtureCorners();
		expect(corners.length).toBeGreaterThan(10);
		for (const [name, c] of corners) expect(plausibility(c, designMr(c)), name).toEqual([]);
	});

	it('a tie-rod outer joint 180 mm outboard of the wheel centre: outside the wheel, named by its label', () => {
		const c = club();
		c.points['steer.outer'][1] = c.points['wheel.centre'][1] + 180;
		const w = plausibility(c);
		expect(w.map((x) => x.rule)).toEqual(['outside_wheel']);
		expect(w[0].message).toMatch(/^Tie rod, outer joint \(steer\.outer\) is 1[78]\d mm outboard of the wheel centre plane/);
	});

	it('a joint beyond the tyre’s radius from the spin axis: outside the wheel', () => {
		const c = club();
		c.points['upper.outer'][2] = c.points['wheel.centre'][2] + 320; // more than the 290 mm loaded radius above the axis
		expect(plausibility(c).map((x) => x.rule)).toContain('outside_wheel');
	});

	it('a pivot with y of the wrong sign: on the other side of the car', () => {
		const c = club();
		c.points['upper.rear'][1] = -c.points['upper.rear'][1];
		const w = plausibility(c);
		expect(w.map((x) => x.rule)).toEqual(['side']);
		expect(w[0].message).toContain('Upper arm, rear pivot (upper.rear)');
	});

	it('two pivots typed at one place: a member of a few millimetres', () => {
		const c = club();
		c.points['lower.rear'] = [c.points['lower.front'][0] - 5, c.points['lower.front'][1], c.points['lower.front'][2]];
		expect(plausibility(c).map((x) => x.rule)).toEqual(['short_member']);
	});

	it('upper ball joint outboard of the lower: the steering axis leans the wrong way', () => {
		const c = club();
		c.points['upper.outer'][1] = c.points['lower.outer'][1] + 20;
		expect(plausibility(c).map((x) => x.rule)).toContain('axis_leans_out');
	});

	it('a spring that lengthens in bump (motion ratio < 0 from the solve), and none when it shortens', () => {
		const c = club();
		expect(designMr(c)).toBeGreaterThan(0);
		// the spring's chassis end moved below its moving end: now the spring stretches as the wheel rises
		c.points['spring.chassis'] = [c.points['spring.body'][0], c.points['spring.body'][1] - 40, c.points['spring.body'][2] - 300];
		const mr = designMr(c);
		expect(mr).toBeLessThan(0);
		expect(plausibility(c, mr).map((x) => x.rule)).toEqual(['spring_lengthens']);
	});

	it('a wheel centre 40 mm off the loaded radius above the ground', () => {
		const c = club();
		c.points['wheel.centre'][2] += 40;
		c.points['wheel.axis_inner'][2] += 40;
		expect(plausibility(c).map((x) => x.rule)).toContain('wheel_height');
	});
});
