// The one way the app writes CSV (every download: share sheet, revision export, chart data): papaparse's
// unparse with formula cells neutralised. Client-safe.
import Papa from 'papaparse';

/** A CSV cell: text, or a number already formatted for the file. */
export type CsvCell = string | number | null;

/**
 * A cell a spreadsheet would run as a formula: one that begins with `=`, `+`, `-`, `@`, tab or carriage return
 * (OWASP, "CSV Injection", https://owasp.org/www-community/attacks/CSV_Injection). A cell that is a plain
 * decimal number (`-12.5`, `+3`, `-1e-7`) is a value, not a formula, and is left alone, so coordinates stay numbers.
 */
export const FORMULA_START = /^[=+\-@\t\r](?![0-9]+(?:\.[0-9]+)?(?:[eE][+-]?[0-9]+)?$)/;

/**
 * Rows to CSV text (comma, CRLF, a final CRLF). Cells that hold the delimiter, a quote or a line break are quoted;
 * formula cells get a leading `'` and are quoted, as OWASP's guidance says, so the spreadsheet shows them as text.
 */
export function toCsv(rows: readonly (readonly CsvCell[])[]): string {
	if (rows.length === 0) return '';
	return Papa.unparse(rows as CsvCell[][], { escapeFormulae: FORMULA_START, newline: '\r\n', quotes: false }) + '\r\n';
}
