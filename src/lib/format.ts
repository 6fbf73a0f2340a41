// Number formatting for tables: fixed decimals, and never "-0.0".

/** v with the given decimals; a value that rounds to zero prints without a minus sign. */
export function fixed(v: number, digits = 1): string {
	const s = v.toFixed(digits);
	return Number(s) === 0 ? (0).toFixed(digits) : s;
}
