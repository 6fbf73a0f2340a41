// Frame: output points in ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// The CSV point import as one pure function: bytes + options + context → a preview of the
// corner's points, or one failure naming the field, row and column. Nothing is stored here.
//
// Order: bytes → text → rows → columns → numbers → side → names → unit → axes →
// alignment and mirror → range → preview. Mirror is y → −y in the vehicle frame: after a datum
// alignment (the datum defines the vehicle frame), before a best fit (the fit targets are the
// destination corner's own points, already on the mirrored side).

import { plausibility } from '$lib/plausibility';
import { importOptionsSchema, IMPORT_LIMITS, KNOWN_POINTS, REQUIRED_POINTS_BY_KIND, type ImportOptions } from './options';
import {
	checkBytes,
	decodeText,
	detectDecimalComma,
	detectDelimiter,
	looksLikeHeader,
	parseNumber,
	parseRows,
	type CsvRow,
	type Delimiter
} from './csv';
import { ImportError, type ImportFailure } from './errors';
import { bestFit, datumTransform, type FitPair, type FitResult } from './fit';
import { checkTargets, nameMapper, parseSide, resolveColumns, type ColumnIndexes } from './mapping';
import { MIRROR_Y, symmetryReport, type SymmetryReport } from './mirror';
import { spanWarning, toMm } from './units';
import { isReflection, toIso } from './axes';
import { apply, compose, IDENTITY, type Affine, type Vec3 } from './vec';
import { formatIssue } from '../../schemas/geometry';

export { ImportError, type ImportFailure } from './errors';
export type { SymmetryReport } from './mirror';

/** What the import needs from the app: the corner kind, team aliases, the current revision's points (mm). */
export interface ImportContext {
	kind: keyof typeof REQUIRED_POINTS_BY_KIND;
	aliases?: Record<string, string>;
	currentPoints?: Record<string, Vec3>;
	/** the corner's side, for a warning when wheel.centre lands on the other side */
	cornerSide?: 'left' | 'right';
}

/** The alignment applied: method, RMS and per-point residuals (mm). */
export interface AlignmentReport {
	method: 'datum' | 'best_fit';
	rms: number;
	residuals: Record<string, number>;
	/** names used (our names, or the file's names for datum points that are not ours) */
	points: string[];
}

/** The preview the app shows before saving. */
export interface ImportPreview {
	points: Record<string, Vec3>;
	columns: ColumnIndexes & { headers: string[] | null };
	rows: number;
	detected: { delimiter: Delimiter; decimalComma: boolean; header: boolean };
	warnings: string[];
	alignment?: AlignmentReport;
	symmetry?: SymmetryReport;
	/** file names that map to none of our points (ignored, or usable as datum points) */
	unmatchedNames: string[];
	/** our name → the file's name it came from */
	sourceNames: Record<string, string>;
}

export type ImportResult = { ok: true; preview: ImportPreview } | { ok: false; error: ImportFailure };

/** One point row: 1-based file row, the file's name, its side (if a side column) and coordinates in file units/axes. */
interface PointRecord {
	row: number;
	fileName: string;
	side?: 'left' | 'right';
	raw: Vec3;
}

/** One side's rows by our name and by file name. */
interface SidePoints {
	byOurs: Map<string, PointRecord>;
	byFile: Map<string, PointRecord>;
	unmatched: string[];
}

/** Import a point CSV (bytes) with options (JSON, parsed here) for a corner (context); never throws. */
export function importCorner(bytes: Uint8Array, options: unknown, context: ImportContext): ImportResult {
	try {
		return { ok: true, preview: run(bytes, parseImportOptions(options), context) };
	} catch (e) {
		if (e instanceof ImportError) return { ok: false, error: e.failure };
		throw e;
	}
}

/** Options JSON → ImportOptions; a failure names the field, e.g. `unit: must be 'mm', 'cm', 'm' or 'in'`. */
export function parseImportOptions(options: unknown): ImportOptions {
	const r = importOptionsSchema.safeParse(options ?? {});
	if (r.success) return r.data;
	const first = r.error.issues[0];
	throw new ImportError('options_invalid', formatIssue(r.error), { field: first?.path.map(String).join('.') || undefined });
}

/** The whole import; throws ImportError. */
function run(bytes: Uint8Array, opts: ImportOptions, ctx: ImportContext): ImportPreview {
	checkBytes(bytes);
	const text = decodeText(bytes);
	const delimiter = opts.delimiter === 'auto' ? detectDelimiter(text) : opts.delimiter;
	const all = parseRows(text, delimiter);
	if (all.length === 0) throw new ImportError('file_empty', 'the file is empty', { field: 'file' });
	const header = opts.header === 'auto' ? looksLikeHeader(all[0]) : opts.header;
	const headers = header ? all[0].cells : null;
	const data = header ? all.slice(1) : all;
	if (data.length === 0) throw new ImportError('file_empty', 'the file has a header row but no points', { field: 'file' });
	if (data.length > IMPORT_LIMITS.maxRows)
		throw new ImportError('too_many_rows', `the file has ${data.length} rows; a point list may have at most ${IMPORT_LIMITS.maxRows}`, { field: 'file' });
	// a loop, not Math.max(...cells): spreading a long list as arguments overflows the call stack
	const widest = all.reduce((max, r) => Math.max(max, r.cells.length), 0);
	const columns = resolveColumns(headers, opts.columns, widest);
	const decimalComma = decimalOf(opts, data, columns, delimiter);
	const records = data.map((r) => readRecord(r, columns, decimalComma));
	checkTargets(opts.names, 'names');
	const { kept, other } = splitSides(records, opts, columns);
	const mapName = nameMapper(opts.names, knownOnly(ctx.aliases ?? {}));
	const keptPts = sidePoints(kept, mapName);
	checkRequired(keptPts, ctx.kind);
	const warnings = unitWarnings(kept, opts);
	const { map, alignment } = alignmentMap(keptPts, opts, ctx);
	const points = outputPoints(keptPts, map, opts);
	warnings.push(...sideWarnings(points, ctx));
	// the plausibility checks that need no solve and no tyre (the point table and the API add the others); after a
	// unit warning they would only repeat it point by point (every arm too short when inches were read as mm)
	if (ctx.kind && warnings.length === 0) warnings.push(...plausibility({ kind: ctx.kind, points }).map((w) => w.message));
	return {
		points,
		columns: { ...columns, headers },
		rows: data.length,
		detected: { delimiter, decimalComma, header },
		warnings,
		alignment,
		symmetry: other.length ? symmetryOf(keptPts, sidePoints(other, mapName), map, opts) : undefined,
		unmatchedNames: keptPts.unmatched,
		sourceNames: Object.fromEntries([...keptPts.byOurs].map(([ours, r]) => [ours, r.fileName]))
	};
}

/** Decimal comma: as given, or detected from the x, y, z cells. */
function decimalOf(opts: ImportOptions, data: CsvRow[], c: ColumnIndexes, d: Delimiter): boolean {
	if (opts.decimal !== 'auto') return opts.decimal === ',';
	return detectDecimalComma(data.map((r) => ({ row: r.row, cells: [r.cells[c.x] ?? '', r.cells[c.y] ?? '', r.cells[c.z] ?? ''] })), d);
}

/** One cell as a number; blank or non-numeric names the row and column. */
function readNumber(r: CsvRow, role: 'x' | 'y' | 'z', column: number, decimalComma: boolean): number {
	const cell = r.cells[column] ?? '';
	const where = { field: `columns.${role}`, row: r.row, column };
	if (cell === '') throw new ImportError('blank_value', `row ${r.row}, column ${role}: blank, a number is needed`, where);
	const v = parseNumber(cell, decimalComma);
	if (v === null) throw new ImportError('not_a_number', `row ${r.row}, column ${role}: "${cell}" is not a number`, where);
	return v;
}

/** A data row as a point record (file units and axes). */
function readRecord(r: CsvRow, c: ColumnIndexes, decimalComma: boolean): PointRecord {
	const fileName = r.cells[c.name] ?? '';
	if (fileName === '')
		throw new ImportError('blank_value', `row ${r.row}, column name: blank, a point name is needed`, {
			field: 'columns.name',
			row: r.row,
			column: c.name
		});
	const raw: Vec3 = [readNumber(r, 'x', c.x, decimalComma), readNumber(r, 'y', c.y, decimalComma), readNumber(r, 'z', c.z, decimalComma)];
	const side = c.side === undefined ? undefined : parseSide(r.cells[c.side] ?? '', r.row, c.side);
	return { row: r.row, fileName, side, raw };
}

/** The rows of the chosen side and those of the other side (empty without a side column). */
function splitSides(records: PointRecord[], opts: ImportOptions, c: ColumnIndexes): { kept: PointRecord[]; other: PointRecord[] } {
	if (c.side === undefined) return { kept: records, other: [] };
	const sides = [...new Set(records.map((r) => r.side))];
	const side = opts.side ?? (sides.length === 1 ? sides[0] : undefined);
	if (!side)
		throw new ImportError('side_required', 'the file has left and right rows: choose which side to import (side: "left" or "right")', {
			field: 'side'
		});
	const kept = records.filter((r) => r.side === side);
	if (!kept.length)
		throw new ImportError('side_empty', `the file has no ${side} rows (it has ${sides.join(' and ')} rows only)`, { field: 'side' });
	return { kept, other: records.filter((r) => r.side !== side) };
}

/** Team aliases whose target is one of our names (a stale alias is ignored, not fatal). */
function knownOnly(aliases: Record<string, string>): Record<string, string> {
	return Object.fromEntries(Object.entries(aliases).filter(([, v]) => KNOWN_POINTS.includes(v)));
}

/** Index one side's records by our name and by file name; duplicates are refused. */
function sidePoints(records: PointRecord[], mapName: (f: string) => string | null): SidePoints {
	const out: SidePoints = { byOurs: new Map(), byFile: new Map(), unmatched: [] };
	for (const r of records) {
		const seen = out.byFile.get(r.fileName.toLowerCase());
		if (seen) throw duplicate(r, r.fileName, seen);
		out.byFile.set(r.fileName.toLowerCase(), r);
		const ours = mapName(r.fileName);
		if (!ours) {
			out.unmatched.push(r.fileName);
			continue;
		}
		const taken = out.byOurs.get(ours);
		if (taken) throw duplicate(r, ours, taken);
		out.byOurs.set(ours, r);
	}
	return out;
}

/** The duplicate-point failure for record r whose name clashes with `first`. */
function duplicate(r: PointRecord, name: string, first: PointRecord): ImportError {
	const via = name === r.fileName ? '' : ` ("${first.fileName}" and "${r.fileName}" both map to it)`;
	return new ImportError('duplicate_point', `row ${r.row}: point "${name}" appears twice (rows ${first.row} and ${r.row})${via}`, {
		field: KNOWN_POINTS.includes(name) ? `points.${name}` : 'file',
		row: r.row
	});
}

/** Every point the kind requires is in the file. */
function checkRequired(s: SidePoints, kind: ImportContext['kind']): void {
	const missing = REQUIRED_POINTS_BY_KIND[kind].filter((n) => !s.byOurs.has(n));
	if (missing.length)
		throw new ImportError(
			'point_missing',
			`points.${missing[0]}: missing from the file${missing.length > 1 ? ` (also missing: ${missing.slice(1).join(', ')})` : ''}`,
			{ field: `points.${missing[0]}` }
		);
}

/** Unit and axes warnings from the kept rows (file units). */
function unitWarnings(kept: PointRecord[], opts: ImportOptions): string[] {
	const w: string[] = [];
	const span = spanWarning(kept.map((r) => r.raw), opts.unit);
	if (span) w.push(span);
	if (isReflection(opts.axes)) w.push('the source axes given are left-handed (a mirror image): check the signs of the axis mapping');
	return w;
}

/** A record in mm and ISO 8855 axes (not yet aligned). */
function isoOf(r: PointRecord, opts: ImportOptions): Vec3 {
	return toIso(toMm(r.raw, opts.unit), opts.axes);
}

/** Find a point of the kept side by our name, else by the file's name. */
function findPoint(s: SidePoints, name: string): PointRecord | undefined {
	return s.byOurs.get(name) ?? s.byFile.get(name.toLowerCase());
}

/** The map from ISO-oriented source points to output points, with its alignment report. */
function alignmentMap(s: SidePoints, opts: ImportOptions, ctx: ImportContext): { map: Affine; alignment?: AlignmentReport } {
	const a = opts.alignment;
	const pre = opts.mirror ? MIRROR_Y : IDENTITY;
	if (a.method === 'none') return { map: pre };
	if (a.method === 'datum') {
		const fit = datumFit(s, a.points, a.targets, opts, ctx);
		return { map: compose(pre, fit.map), alignment: report('datum', fit, a.points) };
	}
	const pairs = bestFitPairs(s, a.names, opts, ctx).map((p) => ({ ...p, from: apply(pre, p.from) }));
	const fit = bestFit(pairs);
	return { map: compose(fit.map, pre), alignment: report('best_fit', fit, pairs.map((p) => p.name)) };
}

/** The alignment report of a fit. */
function report(method: AlignmentReport['method'], fit: FitResult, points: string[]): AlignmentReport {
	return { method, rms: fit.rms, residuals: fit.residuals, points };
}

/** The current revision's points, or a failure saying the alignment needs them. */
function currentOf(ctx: ImportContext): Record<string, Vec3> {
	if (ctx.currentPoints && Object.keys(ctx.currentPoints).length) return ctx.currentPoints;
	throw new ImportError('alignment_no_target', 'alignment: the corner has no current revision to align onto', {
		field: 'alignment'
	});
}

/** The failure for an alignment point that is missing from `where` ('the file' or 'the current revision'). */
function notIn(field: string, what: string, where: string): ImportError {
	return new ImportError('alignment_point_missing', `${field}: ${what} is not in ${where}`, { field });
}

type Triple = [Vec3, Vec3, Vec3];

/** Datum alignment from three named points, optionally onto target coordinates (mm) or the current revision's. */
function datumFit(
	s: SidePoints,
	names: [string, string, string],
	targets: 'current' | Triple | undefined,
	opts: ImportOptions,
	ctx: ImportContext
): FitResult {
	const measured = names.map((n, i) => {
		const r = findPoint(s, n);
		if (!r) throw notIn(`alignment.points.${i}`, `datum point "${n}"`, 'the file');
		return isoOf(r, opts);
	}) as Triple;
	if (targets !== 'current') return datumTransform(measured, names, targets);
	const current = currentOf(ctx);
	const t = names.map((n, i) => {
		if (!current[n]) throw notIn(`alignment.points.${i}`, `datum point "${n}"`, 'the current revision');
		return current[n];
	}) as Triple;
	return datumTransform(measured, names, t);
}

/** Pairs (file point in ISO axes, current revision point) for a best fit: the names given, or all common ones. */
function bestFitPairs(s: SidePoints, names: string[] | undefined, opts: ImportOptions, ctx: ImportContext): FitPair[] {
	const current = currentOf(ctx);
	const use = names ?? [...s.byOurs.keys()].filter((n) => current[n]);
	return use.map((name, i) => {
		const r = findPoint(s, name);
		if (!r) throw notIn(`alignment.names.${i}`, `"${name}"`, 'the file');
		if (!current[name]) throw notIn(`alignment.names.${i}`, `"${name}"`, 'the current revision');
		return { name, from: isoOf(r, opts), to: current[name] };
	});
}

/** Our points after the map, each within ±maxCoordinateMm (mm). */
function outputPoints(s: SidePoints, map: Affine, opts: ImportOptions): Record<string, Vec3> {
	const out: Record<string, Vec3> = {};
	for (const [name, r] of s.byOurs) {
		const p = apply(map, isoOf(r, opts));
		const i = p.findIndex((v) => Math.abs(v) > IMPORT_LIMITS.maxCoordinateMm);
		if (i >= 0)
			throw new ImportError(
				'out_of_range',
				`points.${name}: ${'xyz'[i]} = ${p[i].toFixed(1)} mm (row ${r.row}) is beyond ` +
					`±${IMPORT_LIMITS.maxCoordinateMm} mm: check the unit, axes and alignment`,
				{ field: `points.${name}`, row: r.row }
			);
		out[name] = p;
	}
	return out;
}

/** A warning when wheel.centre ends up on the other side of the car than the corner. */
function sideWarnings(points: Record<string, Vec3>, ctx: ImportContext): string[] {
	const w = points['wheel.centre'];
	if (!w || !ctx.cornerSide || w[1] === 0) return [];
	const lands = w[1] > 0 ? 'left' : 'right';
	if (lands === ctx.cornerSide) return [];
	return [`wheel.centre lands on the ${lands} side (y = ${w[1].toFixed(1)} mm) but the corner is a ${ctx.cornerSide} corner: mirror it?`];
}

/** Symmetry of the two measured sides, both through the same map (vehicle frame, mm). */
function symmetryOf(kept: SidePoints, other: SidePoints, map: Affine, opts: ImportOptions): SymmetryReport {
	const place = (s: SidePoints) => Object.fromEntries([...s.byOurs].map(([n, r]) => [n, apply(map, isoOf(r, opts))]));
	return symmetryReport(place(kept), place(other), opts.symmetryThresholdMm);
}
