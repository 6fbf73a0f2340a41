// Compare's figures list only the measures the two corners have: a semi-trailing arm has no steering axis (contract:
// caster, KPI, scrub radius and trail are null), a corner without a rocker no rocker angle.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { CornerGeometry } from '../../src/lib/schemas/geometry';
import { compareRevisions } from '../../src/lib/server/corners/compare';

const fixture = (n: string) => JSON.parse(readFileSync(join(import.meta.dirname, '..', '..', 'fixtures', `${n}.json`), 'utf8')) as CornerGeometry;

describe('compare figures by kind', () => {
	it('a semi-trailing arm: no axis figures and no rocker angle, the rest kept', () => {
		const r = compareRevisions(fixture('road-rear-left-semi-trailing'), fixture('road-rear-left-semi-trailing-inner-pivot-down'), []);
		const keys = r.figures.map((f) => f.key);
		for (const k of ['caster', 'kpi', 'scrub_radius', 'trail', 'rocker_angle']) expect(keys).not.toContain(k);
		for (const k of ['camber', 'toe', 'half_track_change', 'rc_height', 'motion_ratio']) expect(keys).toContain(k);
	});

	it('a pushrod corner keeps the rocker angle; a plain double wishbone does not show it', () => {
		const push = compareRevisions(fixture('single-seater-front-left-pushrod'), fixture('single-seater-front-left-pushrod-softer'), []);
		expect(push.figures.map((f) => f.key)).toContain('rocker_angle');
		const plain = compareRevisions(fixture('club-fwd-front-left'), fixture('club-fwd-front-left-rack-moved'), []);
		expect(plain.figures.map((f) => f.key)).not.toContain('rocker_angle');
		expect(plain.figures.map((f) => f.key)).toContain('caster');
	});
});
