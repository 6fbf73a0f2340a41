// Frame: none (raw text cells); numbers are in the file's own unit and axes.
// Reading the bytes of a point-list CSV: size, empty and binary checks, text decoding (byte-order
// mark, Windows line endings), delimiter, header and decimal-comma detection, strict numbers.

import Papa from 'papaparse';
import { IMPORT_LIMITS } from '../../schemas/import';
import { ImportError } from './errors';

export type Delimiter = ',' | ';' | '\t';

/** One non-blank, non-comment line of the file: its 1-based line number and trimmed cells. */
export interface CsvRow {
	row: number;
	cells: string[];
}

const MB = 1024 * 1024;
/** share of control bytes above which a file is taken as binary (common practice, no source) */
const CONTROL_SHARE = 0.01;

/** Refuse a file over the size limit, an empty one, or one with binary content (bytes). */
export function checkBytes(bytes: Uint8Array): void {
	if (bytes.length > IMPORT_LIMITS.maxFileBytes)
		throw new ImportError(
			'file_too_large',
			`the file is ${(bytes.length / MB).toFixed(1)} MB; the limit is ${IMPORT_LIMITS.maxFileBytes / MB} MB`,
			{ field: 'file' }
		);
	if (bytes.length === 0) throw new ImportError('file_empty', 'the file is empty', { field: 'file' });
	const nul = bytes.indexOf(0);
	if (nul >= 0) throw binary(nul);
	const head = bytes.subarray(0, 8192);
	let control = 0;
	for (const b of head) if (isControl(b)) control++;
	if (control > CONTROL_SHARE * head.length) throw binary(head.findIndex(isControl));
}

/** A control byte that text files do not contain (tab, line feed, form feed, carriage return are text). */
function isControl(b: number): boolean {
	return (b < 0x20 && b !== 9 && b !== 10 && b !== 12 && b !== 13) || b === 0x7f;
}

/** The binary-file failure naming the first suspicious byte offset (0-based). */
function binary(at: number): ImportError {
	return new ImportError('file_binary', `the file is not a text CSV (binary content at byte ${at})`, { field: 'file' });
}

/** Bytes to text: UTF-8 (else Windows-1252, as older exports use), byte-order mark removed. */
export function decodeText(bytes: Uint8Array): string {
	let text: string;
	try {
		text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
	} catch {
		text = new TextDecoder('windows-1252').decode(bytes);
	}
	text = text.replace(/^\uFEFF/, '');
	if (text.trim() === '') throw new ImportError('file_empty', 'the file is empty', { field: 'file' });
	return text;
}

/**
 * The delimiter: tab, then ';', then ',' when it appears in every line (first 50). A ';' or tab
 * wins over ',' because a European export writes decimal commas between ';' (common practice).
 */
export function detectDelimiter(text: string): Delimiter {
	const lines = text
		.split(/\r\n|\n|\r/)
		.filter((l) => l.trim() !== '' && !l.trimStart().startsWith('#'))
		.slice(0, 50);
	for (const d of ['\t', ';', ','] as const) if (lines.every((l) => l.includes(d))) return d;
	return ',';
}

/** Split text into rows of trimmed cells with papaparse; blank and `#` lines dropped. */
export function parseRows(text: string, delimiter: Delimiter): CsvRow[] {
	const parsed = Papa.parse<string[]>(text, { delimiter, header: false, skipEmptyLines: false, dynamicTyping: false });
	const rows: CsvRow[] = [];
	parsed.data.forEach((cells, i) => {
		const trimmed = cells.map((c) => c.trim());
		if (trimmed.every((c) => c === '') || trimmed[0].startsWith('#')) return;
		rows.push({ row: i + 1, cells: trimmed });
	});
	return rows;
}

/** True when the first row is a header: fewer than three of its cells are numbers. */
export function looksLikeHeader(first: CsvRow): boolean {
	return first.cells.filter((c) => parseNumber(c, false) !== null || parseNumber(c, true) !== null).length < 3;
}

/** True when the number cells use a decimal comma (only possible with ';' or tab). */
export function detectDecimalComma(rows: CsvRow[], delimiter: Delimiter): boolean {
	if (delimiter === ',') return false;
	const cells = rows.flatMap((r) => r.cells);
	const comma = cells.some((c) => /^[+-]?(\d+,\d*|,\d+)([eE][+-]?\d+)?$/.test(c));
	const point = cells.some((c) => /^[+-]?(\d+\.\d*|\.\d+)([eE][+-]?\d+)?$/.test(c));
	return comma && !point;
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** A strict number from a cell ('.' or ',' decimal, optional exponent); null when it is not one. */
export function parseNumber(cell: string, decimalComma: boolean): number | null {
	const s = cell.trim();
	if (decimalComma ? s.includes('.') : s.includes(',')) return null;
	const normal = decimalComma ? s.replace(',', '.') : s;
	if (!NUMBER.test(normal)) return null;
	const v = Number(normal);
	return Number.isFinite(v) ? v : null;
}
