// Frame: the file's own axes (units do not change directions); lengths converted to mm.
// Length units of a point file and the span check that catches a wrong unit.

import { IMPORT_LIMITS, UNITS, type LengthUnit } from '../../schemas/import';
import type { Vec3 } from './vec';

/** Millimetres per unit. 1 in = 25.4 mm exactly (international yard and pound agreement, 1959). */
export const MM_PER_UNIT: Record<LengthUnit, number> = { mm: 1, cm: 10, m: 1000, in: 25.4 };

/** Span of a plausible corner in mm, for the unit suggestion (common practice, no source). */
const PLAUSIBLE_SPAN_MM = { min: 100, max: 2500 };

/** A point in `unit` converted to mm. */
export function toMm(p: Vec3, unit: LengthUnit): Vec3 {
	const k = MM_PER_UNIT[unit];
	return [p[0] * k, p[1] * k, p[2] * k];
}

/** The largest side of the points' bounding box (same unit as the points); 0 for fewer than 2. */
export function span(points: Vec3[]): number {
	if (points.length < 2) return 0;
	let best = 0;
	for (let i = 0; i < 3; i++) {
		const v = points.map((p) => p[i]);
		best = Math.max(best, Math.max(...v) - Math.min(...v));
	}
	return best;
}

/** Unit names for messages. */
const UNIT_NAMES: Record<LengthUnit, string> = { mm: 'millimetres', cm: 'centimetres', m: 'metres', in: 'inches' };

/** A warning when the span (file units) does not fit one corner in `unit`, naming units that would; null if fine. */
export function spanWarning(points: Vec3[], unit: LengthUnit): string | null {
	const s = span(points);
	if (points.length < 2 || s === 0) return null;
	const mm = s * MM_PER_UNIT[unit];
	if (mm >= IMPORT_LIMITS.minSpanMm && mm <= IMPORT_LIMITS.maxSpanMm) return null;
	const what = mm < IMPORT_LIMITS.minSpanMm ? 'too small' : 'too large';
	const fits = UNITS.filter((u) => u !== unit && inside(s * MM_PER_UNIT[u]));
	const hint = fits.map((u, i) => `${i ? 'as' : 'read as'} ${UNIT_NAMES[u]} ${i ? '' : 'they would span '}${fmt(s * MM_PER_UNIT[u])}`);
	const tail = hint.length ? `; ${hint.join(', ')}` : '';
	return `the points span ${fmt(mm)} read as ${UNIT_NAMES[unit]}, ${what} for one corner${tail}: check the unit`;
}

/** True when a span (mm) is plausible for one corner. */
function inside(mm: number): boolean {
	return mm >= PLAUSIBLE_SPAN_MM.min && mm <= PLAUSIBLE_SPAN_MM.max;
}

/** A length in mm as text, e.g. "25.4 mm". */
function fmt(mm: number): string {
	return `${Number(mm.toPrecision(4))} mm`;
}
