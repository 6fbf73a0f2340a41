// The share sheet's table as CSV (pure: no database), mm at 0.1 as on the sheet, ISO 8855 vehicle axes.
import { toCsv } from '$lib/csv';

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

/** mm at 0.1, as on the sheet, never "-0.0". */
function tenth(v: number) {
	const s = v.toFixed(1);
	return Number(s) === 0 ? '0.0' : s;
}

/** The sheet's table as CSV: point, x, y, z, the move from the baseline and the tolerance (mm, ISO 8855 axes). */
export function sheetCsv(rows: SheetRow[], withTolerance: boolean) {
	const head = ['point', 'description', 'x_mm', 'y_mm', 'z_mm', 'dx_mm', 'dy_mm', 'dz_mm', ...(withTolerance ? ['tolerance_mm', 'tolerance_mode'] : [])];
	const lines = rows.map((r) => {
		const d = r.delta ? [r.delta.dx, r.delta.dy, r.delta.dz].map(tenth) : ['', '', ''];
		const t = withTolerance ? (r.tolerance ? [String(Math.round(r.tolerance.mm * 100) / 100), r.tolerance.mode] : ['', '']) : [];
		return [r.name, r.label, ...r.xyz.map(tenth), ...d, ...t];
	});
	return toCsv([head, ...lines]);
}
