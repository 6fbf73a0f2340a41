// A car's targets: a band per measure over a travel range, e.g. "toe change within ±0.10° over ±40 mm".
// Client-safe: zod only. Degrees and mm as the solve output.
import { z } from 'zod';
import { lengthText, toUnit, type LengthUnit } from '$lib/units';

export const TARGET_MEASURES = ['camber', 'toe', 'caster', 'kpi', 'scrub_radius', 'trail', 'half_track_change', 'rc_height', 'motion_ratio', 'rocker_angle'] as const;
export type TargetMeasure = (typeof TARGET_MEASURES)[number];

export const targetSchema = z
	.object({
		measure: z.enum(TARGET_MEASURES, { message: 'measure must be one of the chartable measures' }),
		/** 'change': the value minus its value at design; 'value': the value itself */
		basis: z.enum(['change', 'value'], { message: "basis must be 'change' or 'value'" }).default('change'),
		min: z.number({ message: 'min must be a number' }),
		max: z.number({ message: 'max must be a number' }),
		/** heave travel range (mm) over which the band applies */
		from: z.number({ message: 'from must be a number (mm)' }),
		to: z.number({ message: 'to must be a number (mm)' })
	})
	.refine((t) => t.min <= t.max, { path: ['min'], message: 'min must be <= max' })
	.refine((t) => t.from < t.to, { path: ['from'], message: 'from must be < to' });

export const targetsSchema = z.array(targetSchema).max(40, 'at most 40 targets');
export type Target = z.infer<typeof targetSchema>;

export interface TargetResult {
	target: Target;
	pass: boolean;
	/** smallest and largest value (or change) over the range; null when no sample falls in it */
	lo: number | null;
	hi: number | null;
	/** true when the sweep did not reach the whole range (cannot be assembled there) */
	incomplete: boolean;
}

type Sample = { travel?: number } & Partial<Record<TargetMeasure, number | null>>;

/** Judges one heave sweep against one target. */
export function judge(samples: readonly Sample[], target: Target): TargetResult {
	const design = samples.find((s) => s.travel === 0)?.[target.measure] ?? null;
	const inRange = samples.filter((s) => s.travel !== undefined && s.travel >= target.from - 1e-9 && s.travel <= target.to + 1e-9);
	const values = inRange
		.map((s) => s[target.measure])
		.filter((v): v is number => typeof v === 'number')
		.map((v) => (target.basis === 'change' ? (design === null ? NaN : v - design) : v))
		.filter(Number.isFinite);
	const travels = inRange.map((s) => s.travel as number);
	const incomplete = !travels.length || Math.min(...travels) > target.from + 1e-9 || Math.max(...travels) < target.to - 1e-9;
	if (!values.length) return { target, pass: false, lo: null, hi: null, incomplete: true };
	const lo = Math.min(...values);
	const hi = Math.max(...values);
	return { target, pass: !incomplete && lo >= target.min - 1e-12 && hi <= target.max + 1e-12, lo, hi, incomplete };
}

const WORDS: Record<TargetMeasure, [string, string]> = {
	camber: ['Camber', '°'], toe: ['Toe', '°'], caster: ['Caster', '°'], kpi: ['Kingpin inclination', '°'],
	scrub_radius: ['Scrub radius', 'mm'], trail: ['Trail', 'mm'], half_track_change: ['Half-track change', 'mm'],
	rc_height: ['Roll-centre height', 'mm'], motion_ratio: ['Motion ratio', ''], rocker_angle: ['Rocker angle', '°']
};

/** The measure's label and unit. */
export function measureWords(m: TargetMeasure) {
	return { label: WORDS[m][0], unit: WORDS[m][1] };
}

/** A measure's change from design in words: "Toe change", "Half-track change" (not "… change change"). */
export function changeLabel(m: TargetMeasure) {
	const { label } = measureWords(m);
	return /change$/i.test(label) ? label : `${label} change`;
}

/**
 * A judged target as a chart band in absolute values (around the design value of `samples` for a change target), with
 * its words and verdict.
 */
export function targetBand(result: TargetResult, samples: readonly Sample[], lengthUnit: LengthUnit = 'mm') {
	const { target } = result;
	const design = samples.find((s) => s.travel === 0)?.[target.measure] ?? 0;
	const base = target.basis === 'change' ? (design ?? 0) : 0;
	return { x0: target.from, x1: target.to, y0: base + target.min, y1: base + target.max, label: describeTarget(target, lengthUnit), pass: result.pass };
}

/** A target in plain words, e.g. "Toe change within ±0.10° over −40…40 mm"; lengths in `lengthUnit` (the target stays mm). */
export function describeTarget(t: Target, lengthUnit: LengthUnit = 'mm') {
	const { label, unit } = measureWords(t.measure);
	const d = unit === '°' ? 2 : unit === '' ? 3 : 1;
	const value = (v: number) => (unit === 'mm' ? lengthText(v, lengthUnit, d) : v.toFixed(d));
	const suffix = unit === 'mm' && lengthUnit === 'in' ? ' in' : unit;
	const band = t.min === -t.max ? `within ±${value(t.max)}${suffix}` : `between ${value(t.min)} and ${value(t.max)}${suffix}`;
	const travel = (v: number) => (lengthUnit === 'mm' ? String(v) : String(Number(toUnit(v, lengthUnit).toFixed(3))));
	return `${t.basis === 'change' ? changeLabel(t.measure) : label} ${band} over ${travel(t.from)}…${travel(t.to)} ${lengthUnit}`;
}
