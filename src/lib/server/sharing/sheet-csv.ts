// The share sheet's table as CSV (pure: no database), mm at 0.1 (or inches at 0.001) as on the sheet, ISO 8855 axes.
import { toCsv } from '$lib/csv';
import { lengthText, type LengthUnit } from '$lib/units';

export interface SheetRow {
	name: string;
	label: string;
	/** mm, vehicle axes */
	xyz: [number, number, number];
	/** mm from the baseline, null when the point did not move or there is no other baseline */
	delta: { dx: number; dy: number; dz: number; d: number } | null;
	/** adopted ± tolerance, null when none was set for this point */
	tolerance: { mm: number; mode: 'axis' | 'sphere' } | null;
}

/**
 * The sheet's table as CSV: point, x, y, z, the move from the baseline and the tolerance (ISO 8855 axes), in mm at
 * 0.1 as on the sheet, or in inches at 0.001 with the columns named `_in`; never "-0.0".
 */
export function sheetCsv(rows: SheetRow[], withTolerance: boolean, unit: LengthUnit = 'mm') {
	const u = unit;
	const len = (v: number) => lengthText(v, unit, 1);
	const head = ['point', 'description', `x_${u}`, `y_${u}`, `z_${u}`, `dx_${u}`, `dy_${u}`, `dz_${u}`, ...(withTolerance ? [`tolerance_${u}`, 'tolerance_mode'] : [])];
	const lines = rows.map((r) => {
		const d = r.delta ? [r.delta.dx, r.delta.dy, r.delta.dz].map(len) : ['', '', ''];
		const t = withTolerance ? (r.tolerance ? [unit === 'mm' ? String(Math.round(r.tolerance.mm * 100) / 100) : lengthText(r.tolerance.mm, unit, 2), r.tolerance.mode] : ['', '']) : [];
		return [r.name, r.label, ...r.xyz.map(len), ...d, ...t];
	});
	return toCsv([head, ...lines]);
}

/** The axle sheet's points: side, point, description, x, y, z at 0.1 mm, or (`unit` 'in') at 0.001 in in columns named `_in`. */
export function axleSheetCsv(rows: { side: string; name: string; label: string; xyz: number[] }[], unit: LengthUnit = 'mm') {
	const len = (v: number) => lengthText(v, unit, 1);
	return toCsv([['side', 'point', 'description', `x_${unit}`, `y_${unit}`, `z_${unit}`], ...rows.map((r) => [r.side, r.name, r.label, ...r.xyz.map(len)])]);
}
