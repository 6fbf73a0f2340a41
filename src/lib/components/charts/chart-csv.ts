// The chart's data as CSV (the chart's download). Its own module, loaded when a download is asked for, so the
// workspace's first load carries no CSV writer.
import { toCsv, type CsvCell } from '$lib/csv';
import { SAME_X, xGrid, type Series } from './chart-data';

/** Options of a CSV export. */
export interface CsvOptions {
	xLabel: string;
	xUnit: string;
	yLabel: string;
	yUnit: string;
	series: readonly Series[];
}

/** CSV text: one row per sweep position, the x column then one column per series (empty where a series has no sample); units in the header. */
export function buildCsv({ xLabel, xUnit, yLabel, yUnit, series }: CsvOptions): string {
	const header = [`${xLabel} (${csvUnit(xUnit)})`, ...series.map((s) => `${s.label}: ${yLabel} (${csvUnit(yUnit)})`)];
	const lines: CsvCell[][] = [header];
	const cursor = series.map(() => 0);
	for (const x of xGrid(series)) {
		const row = [csvNumber(x)];
		series.forEach((s, i) => {
			const pts = s.points;
			while (cursor[i] < pts.length && pts[cursor[i]].x < x - SAME_X) cursor[i]++;
			const p = pts[cursor[i]];
			row.push(p && Math.abs(p.x - x) <= SAME_X && p.y !== null ? csvNumber(p.y) : '');
		});
		lines.push(row);
	}
	return toCsv(lines);
}

/** A unit spelled in ASCII so every spreadsheet reads the header. */
function csvUnit(unit: string): string {
	return unit === '°' ? 'deg' : unit === '' ? '-' : unit;
}

/** A number for CSV: up to 6 decimals, no trailing zeros, no "-0". */
function csvNumber(v: number): string {
	const r = Number(v.toFixed(6));
	return String(r === 0 ? 0 : r);
}
