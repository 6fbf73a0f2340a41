// The point table's state: one row of x, y, z cells per point, full precision kept beside what was typed.
import type { PointInfo } from '$lib/points';

export interface Cell {
	/** full-precision value in mm, or null when blank */
	value: number | null;
	/** what the user typed, while editing */
	text: string;
	error: string | null;
}
export type Rows = Record<string, [Cell, Cell, Cell]>;
export type Point = [number, number, number];

export const MAX_ABS_MM = 5000;

/** Parses a typed value, in mm or (with mmPerUnit 25.4) inches, into mm: a decimal comma is accepted; blank is null. */
export function parseCell(text: string, mmPerUnit = 1): { value: number | null; error: string | null } {
	const t = text.trim().replace(',', '.');
	if (t === '') return { value: null, error: null };
	const v = Number(t) * mmPerUnit;
	if (!Number.isFinite(v)) return { value: null, error: `"${text.trim()}" is not a number` };
	if (Math.abs(v) > MAX_ABS_MM) return { value: null, error: `more than ${MAX_ABS_MM} mm${mmPerUnit === 1 ? '' : ` (${(MAX_ABS_MM / mmPerUnit).toFixed(1)} in)`} from the origin: check the units` };
	return { value: v, error: null };
}

/** Rows for the given points, filled from a revision's points where present. */
export function rowsFrom(points: PointInfo[], values: Record<string, Point> = {}): Rows {
	const rows: Rows = {};
	for (const p of points) {
		const v = values[p.name];
		rows[p.name] = [0, 1, 2].map((i) => ({ value: v ? v[i] : null, text: v ? String(v[i]) : '', error: null })) as [Cell, Cell, Cell];
	}
	return rows;
}

/** The complete points of the rows (a row with a blank or bad cell is left out), and the first problem. */
export function pointsFrom(rows: Rows): { points: Record<string, Point>; problem: string | null } {
	const points: Record<string, Point> = {};
	let problem: string | null = null;
	for (const [name, cells] of Object.entries(rows)) {
		const bad = cells.find((c) => c.error);
		if (bad) problem ??= `points.${name}: ${bad.error}`;
		const filled = cells.filter((c) => c.value !== null).length;
		if (filled === 3 && !bad) points[name] = cells.map((c) => c.value) as Point;
		else if (filled > 0 && !bad) problem ??= `points.${name}: x, y and z are all needed`;
	}
	return { points, problem };
}
