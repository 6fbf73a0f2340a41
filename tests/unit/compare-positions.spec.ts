// The compare page's chosen travel positions: parsing and the messages that name the field.
import { describe, expect, it } from 'vitest';
import { positionsText } from '../../src/lib/schemas/compare';

const parse = (text: string) => positionsText.safeParse(text);
const message = (text: string) => {
	const r = parse(text);
	return r.success ? null : r.error.issues[0].message;
};

describe('compare travel positions', () => {
	it('reads commas, spaces and the typographic minus, rounds to 0.1 mm, sorts and drops repeats', () => {
		expect(parse('50, −25 0;25  -50').data).toEqual([-50, -25, 0, 25, 50]);
		expect(parse('37.54, -12.06, 37.5').data).toEqual([-12.1, 37.5]);
	});

	it('names the field and the bad entry', () => {
		expect(message('')).toBe('at: give at least one travel position in mm, e.g. "-50, -25, 0, 25, 50"');
		expect(message('10, ten')).toBe('at: "ten" is not a number of mm');
		expect(message('250')).toBe('at: 250 mm is beyond ±200 mm of travel');
		expect(message('1,2,3,4,5,6,7,8,9,10')).toBe('at: at most 9 positions, not 10');
	});
});
