// Length units for display: every length is stored in millimetres (vehicle axes); a user may read and type them in
// inches instead (1 in = 25.4 mm exactly: the international inch, NIST SP 811 appendix B). Client-safe.
import { getContext, setContext } from 'svelte';
import { fixed } from './format';

export const LENGTH_UNITS = ['mm', 'in'] as const;
export type LengthUnit = (typeof LENGTH_UNITS)[number];
export const MM_PER_INCH = 25.4;
export const UNIT_WORDS: Record<LengthUnit, string> = { mm: 'millimetres', in: 'inches' };

/** Millimetres per display unit. */
export const mmPer = (unit: LengthUnit) => (unit === 'in' ? MM_PER_INCH : 1);

/** A length in mm shown in `unit`. */
export const toUnit = (mm: number, unit: LengthUnit) => mm / mmPer(unit);

/** A length typed in `unit`, in mm. */
export const fromUnit = (value: number, unit: LengthUnit) => value * mmPer(unit);

/** Decimals in `unit` for a figure shown to `mmDecimals` in mm: two more in inches (0.1 mm ≈ 0.004 in). */
export const decimalsIn = (mmDecimals: number, unit: LengthUnit) => (unit === 'in' ? mmDecimals + 2 : mmDecimals);

/** A length in mm written in `unit` (minus signs as typed by a keyboard), e.g. "12.300" in, "312.4" mm. */
export function lengthText(mm: number, unit: LengthUnit, mmDecimals = 1): string {
	const d = decimalsIn(mmDecimals, unit);
	const s = toUnit(mm, unit).toFixed(d);
	return Number(s) === 0 ? (0).toFixed(d) : s;
}

/** A length in mm as a number to put in an input in `unit`: mm as they are, inches to a micro-inch (no visible rounding). */
export const editValue = (mm: number, unit: LengthUnit) => (unit === 'mm' ? mm : Number(toUnit(mm, unit).toFixed(6)));

/** A value typed in an input in `unit` (a decimal comma accepted), in mm; blank is null, anything else not a number NaN. */
export function typedLength(text: string | number | null | undefined, unit: LengthUnit): number | null {
	if (text === null || text === undefined) return null;
	const t = String(text).trim().replace(',', '.');
	return t === '' ? null : fromUnit(Number(t), unit);
}

/** The unit to show beside a sweep or chart axis: a length axis in the user's unit, any other (°, %) as it is. */
export const shownUnit = (axisUnit: string, unit: LengthUnit) => (axisUnit === 'mm' ? unit : axisUnit);

/** A figure of a measure whose own unit is `figUnit`, to `d` decimals: a length (mm) in `unit`, anything else as it is. */
export function figureText(v: number, figUnit: string, d: number, unit: LengthUnit): string {
	return figUnit === 'mm' ? lengthText(v, unit, d) : fixed(v, d);
}

/** A travel position (mm) as a column heading in `unit`: "+25", "−1.5" in mm, "+1", "−0.5" in inches. */
export function travelHeading(mm: number, unit: LengthUnit): string {
	const v = Number(toUnit(mm, unit).toFixed(unit === 'mm' ? 1 : 3));
	return v > 0 ? `+${v}` : String(v);
}

const KEY = Symbol('lw-length-unit');

/** Sets the page's length unit for the components below (the layout does it from the signed-in user). */
export function provideLengthUnit(get: () => LengthUnit) {
	setContext(KEY, get);
}

/** The length unit the components below show (mm when none was provided). */
export function lengthUnit(): () => LengthUnit {
	return getContext<(() => LengthUnit) | undefined>(KEY) ?? (() => 'mm');
}
