// The compare page's chosen travel positions: "-50, -25, 0, 25, 50" in mm of heave travel (+ bump).
import { z } from 'zod';

export const DEFAULT_POSITIONS = [-50, -25, 0, 25, 50];
export const MAX_POSITIONS = 9;
/** mm: the furthest travel a position may ask for, either way */
export const POSITION_LIMIT = 200;

/** Splits on commas, semicolons or spaces; accepts the typographic minus sign. */
function splitPositions(text: string): string[] {
	return text
		.replace(/[−–]/g, '-')
		.split(/[,;\s]+/)
		.filter((t) => t !== '');
}

/** Parses, checks, rounds to 0.1 mm, sorts and de-duplicates the positions; messages name the field "at". */
export const positionsText = z
	.string()
	.max(200, 'at: too long; give at most 9 positions')
	.transform((text, ctx) => {
		const parts = splitPositions(text);
		if (parts.length === 0) {
			ctx.addIssue({ code: 'custom', message: 'at: give at least one travel position in mm, e.g. "-50, -25, 0, 25, 50"' });
			return z.NEVER;
		}
		const values: number[] = [];
		for (const part of parts) {
			const v = Number(part);
			if (!Number.isFinite(v)) {
				ctx.addIssue({ code: 'custom', message: `at: "${part}" is not a number of mm` });
				return z.NEVER;
			}
			if (Math.abs(v) > POSITION_LIMIT) {
				ctx.addIssue({ code: 'custom', message: `at: ${part} mm is beyond ±${POSITION_LIMIT} mm of travel` });
				return z.NEVER;
			}
			values.push(Math.round(v * 10) / 10 || 0);
		}
		const unique = [...new Set(values)].sort((a, b) => a - b);
		if (unique.length > MAX_POSITIONS) {
			ctx.addIssue({ code: 'custom', message: `at: at most ${MAX_POSITIONS} positions, not ${unique.length}` });
			return z.NEVER;
		}
		return unique;
	});

/** The positions as the field shows them: "−50, −25, 0, +25, +50" style without the plus. */
export function positionsToText(values: number[]): string {
	return values.join(', ');
}
