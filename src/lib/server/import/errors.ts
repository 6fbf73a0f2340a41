// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// The one failure type of the import. Helpers throw it; only `importCorner` (index.ts) catches
// it and turns it into `{ ok: false, error }`, so every step can stay a plain function.

/** Machine-readable failure codes of the import. */
export type ImportErrorCode =
	| 'options_invalid'
	| 'file_too_large'
	| 'file_empty'
	| 'too_many_rows'
	| 'file_binary'
	| 'no_header_no_mapping'
	| 'column_missing'
	| 'blank_value'
	| 'not_a_number'
	| 'duplicate_point'
	| 'unknown_point'
	| 'point_missing'
	| 'out_of_range'
	| 'side_required'
	| 'side_unknown'
	| 'side_empty'
	| 'alignment_point_missing'
	| 'alignment_degenerate'
	| 'alignment_no_target';

/** What the app reports: code, one human message, and where (field path, 1-based file row, 0-based column). */
export interface ImportFailure {
	code: ImportErrorCode;
	message: string;
	field?: string;
	row?: number;
	column?: number;
}

/** Thrown inside the import; `where` names the field, row and column of the problem. */
export class ImportError extends Error {
	readonly failure: ImportFailure;
	/** code: failure code; message: human sentence; where: field/row/column. */
	constructor(code: ImportErrorCode, message: string, where: Omit<ImportFailure, 'code' | 'message'> = {}) {
		super(message);
		this.failure = { code, message, ...where };
	}
}
