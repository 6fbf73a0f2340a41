// The measures Linkwright can chart against a sweep, with their units and display precision.
// Keys are the sample fields of the corner-solve/1 contract (shared/geometry-format.md).

/** Sweep kinds of the contract. */
export type SweepKind = 'heave' | 'roll' | 'steer';

/** The sample field that carries each sweep's variable. */
export type SweepKey = 'travel' | 'roll' | 'rack';

/** Sample fields that can be charted. */
export type MeasureKey =
	| 'camber'
	| 'toe'
	| 'caster'
	| 'kpi'
	| 'scrub_radius'
	| 'trail'
	| 'half_track_change'
	| 'rc_height'
	| 'motion_ratio'
	| 'rocker_angle'
	| 'camber_ground';

/** Units a chart axis can carry ('' = dimensionless ratio). */
export type MeasureUnit = '°' | 'mm' | '' | '%';

/** One chartable measure. */
export interface Measure {
	key: MeasureKey;
	/** chart title and read-out name */
	label: string;
	unit: MeasureUnit;
	/** decimals shown in read-outs */
	decimals: number;
	/** the sign convention in words, when it is not obvious */
	sign?: string;
	/** the sweeps in which the measure is defined */
	sweeps: readonly SweepKind[];
}

const ALL: readonly SweepKind[] = ['heave', 'roll', 'steer'];

/** Every chartable measure, in the order the workspace shows them. */
export const MEASURES: readonly Measure[] = [
	{ key: 'camber', label: 'Camber', unit: '°', decimals: 2, sign: '− = top of the wheel inboard', sweeps: ALL },
	{ key: 'toe', label: 'Toe', unit: '°', decimals: 3, sign: '+ = toe-in', sweeps: ALL },
	{ key: 'caster', label: 'Caster', unit: '°', decimals: 2, sign: '+ = top of the axis rearward', sweeps: ALL },
	{ key: 'kpi', label: 'Kingpin inclination', unit: '°', decimals: 2, sign: '+ = top of the axis inboard', sweeps: ALL },
	{ key: 'scrub_radius', label: 'Scrub radius', unit: 'mm', decimals: 1, sign: '+ = axis meets the ground inboard', sweeps: ALL },
	{ key: 'trail', label: 'Trail', unit: 'mm', decimals: 1, sign: '+ = axis meets the ground ahead', sweeps: ALL },
	{ key: 'half_track_change', label: 'Half-track change', unit: 'mm', decimals: 2, sign: '+ = contact point outboard', sweeps: ALL },
	{ key: 'rc_height', label: 'Roll-centre height', unit: 'mm', decimals: 1, sign: '+ = above ground', sweeps: ['heave'] },
	{ key: 'motion_ratio', label: 'Motion ratio', unit: '', decimals: 3, sign: 'spring / wheel travel', sweeps: ALL },
	{ key: 'rocker_angle', label: 'Rocker angle', unit: '°', decimals: 2, sign: '+ = right-handed about pivot A → B', sweeps: ALL },
	{ key: 'camber_ground', label: 'Camber to ground', unit: '°', decimals: 2, sign: '− = top of the wheel inboard', sweeps: ['roll'] }
];

/** The sweep variable of each sweep, with the x-axis wording and unit. */
export const SWEEP_AXES: Record<SweepKind, { key: SweepKey; label: string; unit: 'mm' | '°' }> = {
	heave: { key: 'travel', label: 'Wheel travel, + bump', unit: 'mm' },
	roll: { key: 'roll', label: 'Body roll, + left side down', unit: '°' },
	steer: { key: 'rack', label: 'Rack travel, + to the left', unit: 'mm' }
};

/**
 * The measures defined in a sweep, in display order, less those the corner cannot have (`missing`, from
 * `measuresNotApplying` in $lib/kinds; by default the rocker angle, which only a rocker gives).
 */
export function measuresFor(sweep: SweepKind, missing: ReadonlySet<string> = new Set(['rocker_angle'])): Measure[] {
	return MEASURES.filter((m) => m.sweeps.includes(sweep) && !missing.has(m.key));
}

/** The measure with this key; throws on an unknown key (a programming error). */
export function measure(key: MeasureKey): Measure {
	const m = MEASURES.find((x) => x.key === key);
	if (!m) throw new Error(`unknown measure '${key}'`);
	return m;
}
