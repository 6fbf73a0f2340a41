// The analyses on the general model's kinds: they work with what a corner has and refuse, naming the field, a
// measure it does not have (a semi-trailing arm has no steering axis: contract, "More kinds").
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { fixSearchInput } from '../../../src/lib/schemas/analysis';
import type { CornerGeometry } from '../../../src/lib/schemas/geometry';
import { runFixSearch } from '../../../src/lib/server/analysis/run';
import { sensitivity } from '../../../src/lib/server/studies/sensitivity';

const fixture = (n: string) => JSON.parse(readFileSync(join(import.meta.dirname, '..', '..', '..', 'fixtures', `${n}.json`), 'utf8')) as CornerGeometry;

describe('analyses by kind', () => {
	it('sensitivity of a semi-trailing arm ranks the figures it has, not caster or KPI', () => {
		const r = sensitivity(fixture('road-rear-left-semi-trailing'), { from: -40, to: 40, step: 10 });
		const keys = r.rankings.map((k) => k.key);
		expect(keys).toContain('camber_change');
		expect(keys).not.toContain('caster');
		expect(keys).not.toContain('kpi');
		expect(r.failed).toEqual([]);
		// lowering the rear pivot tilts the arm's axis in side view, which steers the wheel as it rises: toe change
		// over the range must depend on arm.rear z (the demo's 15 mm move changes it by about 0.3°, npm run -s solve)
		const toe = r.rankings.find((k) => k.key === 'toe_change')!;
		expect(Math.abs(toe.ranked.find((c) => c.point === 'arm.rear' && c.axis === 'z')!.derivative)).toBeGreaterThan(1e-3);
	});

	it('a fix search fitting caster on a semi-trailing arm is refused naming measures.0.key', () => {
		const input = fixSearchInput.parse({ free: [{ point: 'arm.rear', axis: 'z', bound: 10 }], target: { kind: 'zero' }, measures: [{ key: 'caster', weight: 1 }], travel: { from: -40, to: 40, step: 10 } });
		expect(() => runFixSearch(fixture('road-rear-left-semi-trailing'), input, null, 'rear')).toThrow(expect.objectContaining({ status: 400, body: expect.objectContaining({ field: 'measures.0.key' }) }));
	});
});
