import { describe, expect, test } from 'vitest';
import { describeTarget, judge, targetSchema } from '../../src/lib/schemas/targets';

// Invented sweep for the test: toe rises 0.01° per mm of travel from -0.05° at design.
const samples = Array.from({ length: 21 }, (_, i) => {
	const travel = -50 + 5 * i;
	return { travel, toe: -0.05 + 0.01 * travel };
});
const toeBand = targetSchema.parse({ measure: 'toe', min: -0.1, max: 0.1, from: -40, to: 40 });

describe('targets', () => {
	test('a change band compares against the value at design', () => {
		const r = judge(samples, toeBand);
		expect(r.lo).toBeCloseTo(-0.4, 12);
		expect(r.hi).toBeCloseTo(0.4, 12);
		expect(r.pass).toBe(false);
	});

	test('a narrow range inside the band passes', () => {
		expect(judge(samples, { ...toeBand, from: -10, to: 10 }).pass).toBe(true);
	});

	test('a sweep that stops short of the range fails as incomplete', () => {
		const r = judge(samples.filter((s) => s.travel <= 20), { ...toeBand, from: -10, to: 30 });
		expect(r.incomplete).toBe(true);
		expect(r.pass).toBe(false);
	});

	test('a value band judges the value itself', () => {
		expect(judge(samples, { ...toeBand, basis: 'value', min: -0.5, max: 0.4 }).pass).toBe(true);
	});

	test('reads as plain words', () => {
		expect(describeTarget(toeBand)).toBe('Toe change within ±0.10° over -40…40 mm');
	});

	test('min above max is refused naming the field', () => {
		const r = targetSchema.safeParse({ measure: 'toe', min: 1, max: 0, from: -40, to: 40 });
		expect(r.success).toBe(false);
		expect(r.error?.issues[0].path).toEqual(['min']);
	});
});
