// Frame: ISO 8855 vehicle axes (x forward, y left, z up). The axle and car figures (issue 16), printed, never asserted:
// an axle roll sweep of both sides (61 positions) against one corner's (target: within 2.5×), a steer sweep with
// its steering-ratio grids, and the car's figures from a car model.
import { readFileSync } from 'node:fs';
import { parseAxleGeometry } from '../src/lib/schemas/axle';
import { carModelSchema } from '../src/lib/schemas/car-model';
import { parseCornerGeometry } from '../src/lib/schemas/geometry';
import { AxleSolver } from '../src/lib/server/kinematics/axle';
import { carFigures } from '../src/lib/server/kinematics/car';
import { CornerSolver } from '../src/lib/server/kinematics/index';
import { DEMO_SINGLE_SEATER_MODEL } from '../scripts/seed';

const json = (f: string) => JSON.parse(readFileSync(f, 'utf8'));

/** Median of fn's time in µs over runs after warm-up. */
function medianUs(fn: () => void, warm = 200, runs = 600): number {
	for (let i = 0; i < warm; i++) fn();
	const t: number[] = [];
	for (let i = 0; i < runs; i++) {
		const t0 = performance.now();
		fn();
		t.push((performance.now() - t0) * 1000);
	}
	t.sort((a, b) => a - b);
	return t[Math.floor(t.length / 2)];
}

export async function run(): Promise<void> {
	const parsed = parseAxleGeometry(json('fixtures/club-front-axle.json'));
	if (!parsed.ok) throw new Error(parsed.message);
	const axle = new AxleSolver(parsed.axle);
	const corner = new CornerSolver(parsed.axle.left);
	const ROLL = { sweep: 'roll' as const, from: -3, to: 3, step: 0.1 }; // 61 positions
	const one = medianUs(() => corner.sweep(ROLL));
	const both = medianUs(() => axle.sweep(ROLL));
	const ratio = both / one;
	console.log(`  one corner, roll sweep 61 positions, median     ${one.toFixed(1)} µs`);
	console.log(`  axle (both sides + roll centre), same sweep     ${both.toFixed(1)} µs  = ${ratio.toFixed(2)}× one corner (target ≤ 2.5×) → ${ratio <= 2.5 ? 'within target' : 'OVER target'}`);
	console.log(`  axle steer sweep ±360° by 10° (73 + 2×73 for the ratio)  ${medianUs(() => axle.sweep({ sweep: 'steer', from: -360, to: 360, step: 10 }), 50, 200).toFixed(1)} µs`);
	const corner1 = (f: string) => {
		const r = parseCornerGeometry({ format: 'corner-geometry/1', ...json(f) });
		if (!r.ok) throw new Error(r.message);
		return r.corner;
	};
	const corners = { front_left: corner1('fixtures/single-seater-front-left-pushrod.json'), rear_left: corner1('fixtures/single-seater-rear-left-five-link.json') };
	const model = carModelSchema.parse(DEMO_SINGLE_SEATER_MODEL);
	console.log(`  car figures of the demo single-seater (both axles, bar reach ±50 mm)  ${medianUs(() => carFigures(model, corners), 20, 100).toFixed(0)} µs`);
}
