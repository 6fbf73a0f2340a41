// The compare page's chosen travel positions: "-50, -25, 0, 25, 50" in mm of heave travel (+ bump).
import { z } from 'zod';
import { MM_PER_INCH, mmPer, type LengthUnit } from '$lib/units';

export const DEFAULT_POSITIONS = [-50, -25, 0, 25, 50];
/** in: the defaults for a user who works in inches */
export const DEFAULT_POSITIONS_IN = [-2, -1, 0, 1, 2];
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

/**
 * Parses, checks, rounds (to 0.1 mm, or 0.001 in), sorts and de-duplicates the positions typed in `unit`, giving mm;
 * messages name the field "at" and speak the unit typed.
 */
export function positionsTextIn(unit: LengthUnit) {
	const per = mmPer(unit);
	const limit = unit === 'mm' ? `${POSITION_LIMIT} mm` : `${(POSITION_LIMIT / per).toFixed(2)} in (${POSITION_LIMIT} mm)`;
	const example = (unit === 'mm' ? DEFAULT_POSITIONS : DEFAULT_POSITIONS_IN).join(', ');
	const scale = unit === 'mm' ? 10 : 1000;
	return z
		.string()
		.max(200, 'at: too long; give at most 9 positions')
		.transform((text, ctx) => {
			const parts = splitPositions(text);
			if (parts.length === 0) {
				ctx.addIssue({ code: 'custom', message: `at: give at least one travel position in ${unit}, e.g. "${example}"` });
				return z.NEVER;
			}
			const values: number[] = [];
			for (const part of parts) {
				const v = Number(part);
				if (!Number.isFinite(v)) {
					ctx.addIssue({ code: 'custom', message: `at: "${part}" is not a number of ${unit}` });
					return z.NEVER;
				}
				if (Math.abs(v * per) > POSITION_LIMIT) {
					ctx.addIssue({ code: 'custom', message: `at: ${part} ${unit} is beyond ±${limit} of travel` });
					return z.NEVER;
				}
				values.push((Math.round(v * scale) / scale) * per || 0);
			}
			const unique = [...new Set(values)].sort((a, b) => a - b);
			if (unique.length > MAX_POSITIONS) {
				ctx.addIssue({ code: 'custom', message: `at: at most ${MAX_POSITIONS} positions, not ${unique.length}` });
				return z.NEVER;
			}
			return unique;
		});
}

/** The positions typed in mm. */
export const positionsText = positionsTextIn('mm');

/** The default positions for a user who works in `unit`, in mm (±2 in is ±50.8 mm). */
export const defaultPositions = (unit: LengthUnit) => (unit === 'mm' ? DEFAULT_POSITIONS : DEFAULT_POSITIONS_IN.map((v) => v * MM_PER_INCH));

/** The positions (mm) as the field shows them in `unit`: "-50, -25, 0, 25, 50", inches to 0.001 in. */
export function positionsToText(values: number[], unit: LengthUnit = 'mm'): string {
	return values.map((v) => (unit === 'mm' ? v : Number((v / MM_PER_INCH).toFixed(3)))).join(', ');
}
