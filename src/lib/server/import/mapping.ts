// Frame: none (names and column positions only).
// Column mapping (point name, x, y, z, optional side) with a guess from the header, point-name
// mapping from the file's names to ours (team aliases, this import's names, common spellings),
// and the side column (L/R, left/right).

import { KIND_SPECS, ROCKER_POINTS, SPRING_POINTS } from '../../kinds';
import { KNOWN_POINTS, type ColumnRef, type ColumnsOption } from '../../schemas/import';
import { ImportError } from './errors';

export type Role = 'name' | 'x' | 'y' | 'z' | 'side';
/** Resolved 0-based column index of each role. */
export type ColumnIndexes = { name: number; x: number; y: number; z: number; side?: number };

/** Normalised header text: lower case, a trailing unit like "(mm)" or "[in]" dropped, only a–z0–9. */
function normHeader(h: string): string {
	return h
		.toLowerCase()
		.replace(/[([{].*?[)\]}]/g, '')
		.replace(/[^a-z0-9]/g, '');
}

/** Header spellings taken for each role in a guess (common practice, no source). */
const HEADER_GUESS: Record<Role, readonly string[]> = {
	name: ['name', 'point', 'pointname', 'pointid', 'label', 'id', 'pt', 'tag', 'description'],
	x: ['x', 'xmm', 'xin', 'posx', 'coordx', 'xcoord', 'px', 'xcoordinate'],
	y: ['y', 'ymm', 'yin', 'posy', 'coordy', 'ycoord', 'py', 'ycoordinate'],
	z: ['z', 'zmm', 'zin', 'posz', 'coordz', 'zcoord', 'pz', 'zcoordinate'],
	side: ['side', 'lr', 'hand', 'leftright', 'lh', 'corner']
};

/** The index of a header whose normalised text is one of `spellings`, or -1. */
function findHeader(headers: string[], spellings: readonly string[]): number {
	return headers.findIndex((h) => spellings.includes(normHeader(h)));
}

/** Resolve one column reference (header name or 0-based index) against the headers / row width. */
function resolveRef(role: Role, ref: ColumnRef, headers: string[] | null, width: number): number {
	if (typeof ref === 'number') {
		if (ref < width) return ref;
		throw new ImportError('column_missing', `column ${role}: index ${ref} is beyond the file's ${width} columns`, {
			field: `columns.${role}`,
			column: ref
		});
	}
	const i = headers ? headers.findIndex((h) => h.trim().toLowerCase() === ref.trim().toLowerCase()) : -1;
	if (i >= 0) return i;
	const known = headers ? headers.map((h) => JSON.stringify(h)).join(', ') : 'none (no header row)';
	throw new ImportError('column_missing', `column ${role}: no column "${ref}" in the header (columns: ${known})`, {
		field: `columns.${role}`
	});
}

/** Column indexes from the options, else guessed from the header; width: cells per row. */
export function resolveColumns(headers: string[] | null, given: ColumnsOption | undefined, width: number): ColumnIndexes {
	if (given) {
		const out: ColumnIndexes = {
			name: resolveRef('name', given.name, headers, width),
			x: resolveRef('x', given.x, headers, width),
			y: resolveRef('y', given.y, headers, width),
			z: resolveRef('z', given.z, headers, width)
		};
		if (given.side !== undefined) out.side = resolveRef('side', given.side, headers, width);
		return out;
	}
	if (!headers)
		throw new ImportError(
			'no_header_no_mapping',
			'the file has no header row and no column mapping was given: map the name, x, y and z columns by index',
			{ field: 'columns' }
		);
	return guessColumns(headers);
}

/** Guess the columns from header names; a missing name, x, y or z column is an error. */
export function guessColumns(headers: string[]): ColumnIndexes {
	const find = (role: Role): number => {
		const i = findHeader(headers, HEADER_GUESS[role]);
		if (i < 0 && role !== 'side') {
			const list = headers.map((h) => JSON.stringify(h)).join(', ');
			throw new ImportError('column_missing', `column ${role}: not found in the header (columns: ${list}); map it by name or index`, {
				field: `columns.${role}`
			});
		}
		return i;
	};
	const out: ColumnIndexes = { name: find('name'), x: find('x'), y: find('y'), z: find('z') };
	const side = find('side');
	if (side >= 0) out.side = side;
	return out;
}

/** Word spellings read as our name parts (common practice, no source). */
const WORDS: Record<string, string> = {
	lower: 'lower', lwr: 'lower', low: 'lower', lca: 'lower', bottom: 'lower', bot: 'lower',
	upper: 'upper', upr: 'upper', up: 'upper', uca: 'upper',
	front: 'front', frt: 'front', fr: 'front', fwd: 'front', forward: 'front', fore: 'front',
	rear: 'rear', rr: 'rear', aft: 'rear', back: 'rear',
	outer: 'outer', out: 'outer', outboard: 'outer', ob: 'outer', bj: 'outer', balljoint: 'outer',
	inner: 'inner', in: 'inner', inboard: 'inner', ib: 'inner',
	steer: 'steer', steering: 'steer', tie: 'steer', tierod: 'steer', toe: 'steer', track: 'steer', rack: 'steer',
	wheel: 'wheel', hub: 'wheel', wc: 'wheel', centre: 'centre', center: 'centre', ctr: 'centre',
	axis: 'axis', spin: 'axis', strut: 'strut', top: 'top', mount: 'top',
	spring: 'spring', damper: 'spring', shock: 'spring', chassis: 'chassis', body: 'body'
};

/** The canonical word set of a name, sorted and joined, e.g. "LWR_ARM_FRT" → "front lower". */
function wordKey(name: string): string {
	const words = name
		.toLowerCase()
		.split(/[^a-z0-9]+/)
		.map((w) => WORDS[w])
		.filter((w): w is string => w !== undefined);
	return [...new Set(words)].sort().join(' ');
}

/** Our names by word key, plus the wheel spin-axis point reachable as "wheel axis inner". */
const GUESS_BY_KEY: Map<string, string> = new Map(
	// a key of one word or none (the rocker's points, the trailing arm's) would catch unrelated names: those go by alias
	KNOWN_POINTS.map((p) => [wordKey(p.replace('_', ' ')), p] as const).filter(([k]) => k.includes(' '))
);

/** A name reduced to lower-case words separated by single spaces. */
function words(name: string): string {
	return name
		.toLowerCase()
		.split(/[^a-z0-9]+/)
		.filter(Boolean)
		.join(' ');
}

/** The trade's names of every kind's points (the kinds' `aliases`), as words → our name. */
const BY_ALIAS: Map<string, string> = new Map(
	[...KIND_SPECS.flatMap((k) => k.points), ...SPRING_POINTS, ...ROCKER_POINTS].flatMap((p) => (p.aliases ?? []).map((a) => [words(a), p.name] as const))
);

/** Our point name for a file name by spelling alone (case, separators, the trade's names, common words); null if none. */
export function guessPointName(fileName: string): string | null {
	const direct = fileName.trim().toLowerCase().replace(/[\s_-]+/g, '.');
	const exact = KNOWN_POINTS.find((p) => p === direct || p.replace('_', '.') === direct);
	if (exact) return exact;
	return BY_ALIAS.get(words(fileName)) ?? GUESS_BY_KEY.get(wordKey(fileName)) ?? null;
}

/** Check that every mapping target is one of our point names; `from` names the option ('names' or 'aliases'). */
export function checkTargets(map: Record<string, string>, from: string): void {
	for (const [file, ours] of Object.entries(map))
		if (!KNOWN_POINTS.includes(ours))
			throw new ImportError(
				'unknown_point',
				`${from}.${file}: "${ours}" is not a point name (known: ${KNOWN_POINTS.join(', ')})`,
				{ field: `${from}.${file}` }
			);
}

/** A lookup file name → our name: this import's names, then team aliases (case-insensitive), then the guess. */
export function nameMapper(names: Record<string, string>, aliases: Record<string, string>): (f: string) => string | null {
	const lower = (m: Record<string, string>) => new Map(Object.entries(m).map(([k, v]) => [k.trim().toLowerCase(), v]));
	const own = lower(names);
	const team = lower(aliases);
	return (f) => {
		const k = f.trim().toLowerCase();
		return own.get(k) ?? team.get(k) ?? guessPointName(f);
	};
}

/** The side of a side-column cell (L, R, left, right, LH, RH; any case); row: 1-based file row. */
export function parseSide(cell: string, row: number, column: number): 'left' | 'right' {
	const s = cell.trim().toLowerCase();
	if (['l', 'left', 'lh', 'lhs'].includes(s)) return 'left';
	if (['r', 'right', 'rh', 'rhs'].includes(s)) return 'right';
	throw new ImportError('side_unknown', `row ${row}, column side: "${cell}" is not a side (L, R, left or right)`, {
		field: 'columns.side',
		row,
		column
	});
}
