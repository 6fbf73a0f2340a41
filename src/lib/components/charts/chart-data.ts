// Pure helpers for the measure charts: points from solve samples, ticks, read-out values, paths, CSV.
// Client-safe: no DOM, no Svelte. Units as in shared/geometry-format.md (mm, degrees).

import { scaleLinear } from 'd3-scale';
import { area, line } from 'd3-shape';
import type { MeasureKey, SweepKey } from './measures';

/** One plotted point; y null = no value (a gap in the line). */
export interface ChartPoint {
	x: number;
	y: number | null;
}

/** One line on a chart. */
export interface Series {
	id: string;
	label: string;
	/** ascending in x */
	points: ChartPoint[];
	/** drawn dashed and translucent (a reference revision) */
	ghost?: boolean;
	/** drawn dotted instead (a target: told apart from a dashed reference by its stroke, not its colour alone) */
	dotted?: boolean;
	/** any CSS colour; default from the chart palette */
	colour?: string;
}

/** A target band: the curve should stay inside y0…y1 over x0…x1. */
export interface Band {
	x0: number;
	x1: number;
	y0: number;
	y1: number;
	label?: string;
	/** true = met, false = broken, undefined = not judged */
	pass?: boolean;
}

/** A spread of values per sweep position (e.g. a tolerance study): the min–max and 5–95 % envelopes. */
export interface Spread {
	/** legend text, e.g. "2000 samples" */
	label?: string;
	/** ascending in x */
	points: SpreadPoint[];
}

export interface SpreadPoint {
	x: number;
	min: number;
	max: number;
	p5: number;
	p95: number;
}

/** Two x values closer than this are the same sweep position (mm or degrees). */
export const SAME_X = 1e-9;

/** The {x, y} points of `measureKey` against `sweepKey` from contract samples; non-finite or missing y becomes null. */
export function samplesToPoints<S extends object>(samples: readonly S[], sweepKey: SweepKey, measureKey: MeasureKey): ChartPoint[] {
	const out: ChartPoint[] = [];
	for (const s of samples) {
		const row = s as Record<string, unknown>;
		const x = row[sweepKey];
		if (typeof x !== 'number' || !Number.isFinite(x)) continue;
		const y = row[measureKey];
		out.push({ x, y: typeof y === 'number' && Number.isFinite(y) ? y : null });
	}
	return out.sort((a, b) => a.x - b.x);
}

/** lo…hi widened to whole nice steps (d3-scale's `nice`); a zero-width range is opened up around its value first. */
export function niceDomain(lo: number, hi: number, count = 5): [number, number] {
	if (hi < lo) [lo, hi] = [hi, lo];
	if (hi - lo < 1e-12) {
		const pad = Math.abs(lo) > 1e-9 ? Math.abs(lo) * 0.1 : 1;
		lo -= pad;
		hi += pad;
	}
	const [a, b] = scaleLinear().domain([lo, hi]).nice(count).domain();
	return [a, b];
}

/** The nice tick values inside lo…hi (inclusive), about `count` intervals apart (d3-scale's `ticks`: 1, 2 or 5 × 10ⁿ). */
export function ticks(lo: number, hi: number, count = 5): number[] {
	if (!(hi > lo) || !Number.isFinite(lo) || !Number.isFinite(hi)) return Number.isFinite(lo) ? [lo] : [];
	return scaleLinear().domain([lo, hi]).ticks(count);
}

/** Decimals needed to print ticks `step` apart without losing a digit. */
export function tickDecimals(step: number): number {
	if (!(step > 0)) return 0;
	for (let d = 0; d < 10; d++) if (Math.abs(Math.round(step * 10 ** d) - step * 10 ** d) < 1e-6) return d;
	return 10;
}

/** y of `points` (ascending x) at x by linear interpolation; null outside the points' range or across a gap. */
export function valueAt(points: readonly ChartPoint[], x: number): number | null {
	const n = points.length;
	if (n === 0 || !Number.isFinite(x)) return null;
	if (x < points[0].x - SAME_X || x > points[n - 1].x + SAME_X) return null;
	let lo = 0;
	let hi = n - 1;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (points[mid].x <= x) lo = mid;
		else hi = mid;
	}
	const a = points[lo];
	const b = points[hi];
	if (Math.abs(a.x - x) <= SAME_X) return a.y;
	if (Math.abs(b.x - x) <= SAME_X) return b.y;
	if (a.y === null || b.y === null) return null;
	return a.y + ((b.y - a.y) * (x - a.x)) / (b.x - a.x);
}

/** The sorted, de-duplicated x positions of every series. */
export function xGrid(series: readonly Series[]): number[] {
	const xs = series.flatMap((s) => s.points.map((p) => p.x)).sort((a, b) => a - b);
	const out: number[] = [];
	for (const x of xs) if (out.length === 0 || x - out[out.length - 1] > SAME_X) out.push(x);
	return out;
}

/**
 * `prev` when `next` holds the same values in the same order, else `next`: a domain, grid or colour list that
 * did not change keeps its identity, so what is drawn from it (scales, ticks, axes, other curves) is not
 * redrawn when only one curve moved.
 */
export function keepIfSame<T extends readonly unknown[]>(prev: T | undefined, next: T): T {
	if (!prev || prev.length !== next.length) return next;
	for (let i = 0; i < next.length; i++) if (!Object.is(prev[i], next[i])) return next;
	return prev;
}

/** The value of sorted `grid` nearest to x; null for an empty grid. */
export function nearest(grid: readonly number[], x: number): number | null {
	if (grid.length === 0) return null;
	let lo = 0;
	let hi = grid.length - 1;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (grid[mid] <= x) lo = mid;
		else hi = mid;
	}
	return Math.abs(grid[lo] - x) <= Math.abs(grid[hi] - x) ? grid[lo] : grid[hi];
}

/** [min, max] of the finite values, or null when there are none. */
export function extent(values: Iterable<number | null>): [number, number] | null {
	let lo = Infinity;
	let hi = -Infinity;
	for (const v of values) {
		if (v === null || !Number.isFinite(v)) continue;
		if (v < lo) lo = v;
		if (v > hi) hi = v;
	}
	return lo <= hi ? [lo, hi] : null;
}

/** True when the series has at least one plottable point. */
export function hasData(series: readonly Series[]): boolean {
	return series.some((s) => s.points.some((p) => p.y !== null && Number.isFinite(p.y)));
}

/** SVG path data of points through the scales sx, sy (px, 2 decimals); a null y breaks the line (d3-shape's `line`). */
export function linePath(points: readonly ChartPoint[], sx: (x: number) => number, sy: (y: number) => number): string {
	const path = line<ChartPoint>()
		.defined((p) => p.y !== null)
		.x((p) => sx(p.x))
		.y((p) => sy(p.y!))
		.digits(2);
	return path(points) ?? '';
}

/** A closed SVG area between lo(p) and hi(p) over the spread's points (d3-shape's `area`: along hi, back along lo); '' when empty. */
export function areaPath(points: readonly SpreadPoint[], sx: (x: number) => number, sy: (y: number) => number, lo: (p: SpreadPoint) => number, hi: (p: SpreadPoint) => number): string {
	const ok = points.filter((p) => Number.isFinite(lo(p)) && Number.isFinite(hi(p)));
	if (ok.length < 2) return '';
	const path = area<SpreadPoint>()
		.x((p) => sx(p.x))
		.y0((p) => sy(lo(p)))
		.y1((p) => sy(hi(p)))
		.digits(2);
	return path(ok) ?? '';
}

/** Whether every value of `points` with x in the band's x0…x1 lies in y0…y1; false when none fall in range or any is null. */
export function withinBand(points: readonly ChartPoint[], band: Band): boolean {
	const [x0, x1] = band.x0 <= band.x1 ? [band.x0, band.x1] : [band.x1, band.x0];
	const [y0, y1] = band.y0 <= band.y1 ? [band.y0, band.y1] : [band.y1, band.y0];
	let seen = 0;
	for (const p of points) {
		if (p.x < x0 - SAME_X || p.x > x1 + SAME_X) continue;
		if (p.y === null || p.y < y0 - 1e-12 || p.y > y1 + 1e-12) return false;
		seen++;
	}
	return seen > 0;
}

/** Default read-out decimals for a unit. */
export function defaultDecimals(unit: string): number {
	return unit === '°' ? 2 : unit === 'mm' ? 1 : unit === '%' ? 1 : 3;
}

/** v with fixed decimals, a true minus sign, and never "−0.00". */
export function formatNumber(v: number, decimals: number): string {
	const s = v.toFixed(decimals);
	if (Number(s) === 0) return (0).toFixed(decimals);
	return s.startsWith('-') ? `\u2212${s.slice(1)}` : s;
}

/** v with its unit for display ("−0.052°", "12.5 mm", "0.707", "24.1%"); "–" for null. */
export function formatValue(v: number | null, unit: string, decimals = defaultDecimals(unit)): string {
	if (v === null || !Number.isFinite(v)) return '–';
	const n = formatNumber(v, decimals);
	if (unit === '') return n;
	return unit === 'mm' || unit === 'in' ? `${n} ${unit}` : `${n}${unit}`;
}

/** An axis title with its unit in brackets; a dimensionless quantity shows "(–)". */
export function axisTitle(label: string, unit: string): string {
	return `${label} (${unit === '' ? '–' : unit})`;
}

/** A lower-case, hyphenated id made from a title ("Toe, bump steer" → "toe-bump-steer"). */
export function slugify(title: string): string {
	return (
		title
			.normalize('NFKD')
			.replace(/[\u0300-\u036f]/g, '')
			.toLowerCase()
			.replace(/[^a-z0-9]+/g, '-')
			.replace(/^-+|-+$/g, '') || 'chart'
	);
}

/** A target band's legend text ("Target: met", "… not met", or the label alone when not judged). */
export function bandLabel(b: Band): string {
	const what = b.label ?? 'Target';
	return b.pass === undefined ? what : `${what}: ${b.pass ? 'met' : 'not met'}`;
}

/** A band's colour from the theme: good when met, bad when not, muted when not judged; optionally translucent. */
export function bandColour(b: Band, alpha = 1): string {
	const token = b.pass === undefined ? '--lw-muted' : b.pass ? '--lw-good' : '--lw-bad';
	return `rgb(var(${token}) / ${alpha})`;
}

/**
 * The cursor after a key on a chart's read-out (sorted `grid`, the cursor now at `at`): ←/→ (and ↑/↓) one sample,
 * PageUp/PageDown ten, Home/End the ends, Escape hides it (null); undefined for a key the chart does not take.
 */
export function cursorAfterKey(grid: readonly number[], at: number | null, key: string): number | null | undefined {
	if (grid.length === 0) return undefined;
	const i = grid.indexOf(at ?? grid[0]);
	const move: Record<string, number> = { ArrowRight: 1, ArrowUp: 1, ArrowLeft: -1, ArrowDown: -1, PageUp: 10, PageDown: -10 };
	if (key in move) return grid[Math.min(grid.length - 1, Math.max(0, (i < 0 ? 0 : i) + move[key]))];
	if (key === 'Home') return grid[0];
	if (key === 'End') return grid[grid.length - 1];
	if (key === 'Escape') return null;
	return undefined;
}
