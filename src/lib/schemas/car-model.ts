// Frame: ISO 8855 vehicle axes, x forward, y left, z up; mm, kg, N/mm, N·m/deg.
// A car revision's own data (`car-model/1`): the mass items that set the centre of gravity, and per axle the
// springs, unsprung mass, tyre rate, steering system and anti-roll bar; the corners' points stay in their own
// revisions, which a car revision pins. Client-safe: imports only zod.
import { z } from 'zod';
import { antiRollBarSchema, steeringSchema } from './axle';
import { solidAxleSchema } from './solid-axle';
import { keepOutListSchema } from './keep-out';
import { formatIssue, parseCornerGeometry, type CornerGeometry } from './geometry';

const mm = (what: string) => z.number({ error: `must be a number (mm, ${what})` }).refine((v) => Math.abs(v) <= 100_000, 'is implausibly large (mm expected)');

export const massItemSchema = z.object({
	name: z.string({ error: 'must be text' }).trim().min(1, 'must not be empty').max(60, 'at most 60 characters'),
	mass: z.number({ error: 'must be a number (kg)' }).gt(0, 'must be > 0 kg').max(20_000, 'must be at most 20 000 kg'),
	x: mm('x forward'),
	y: mm('y left'),
	z: mm('z up').refine((v) => v >= 0, 'must be at or above the ground (z ≥ 0)')
});
export type MassItemInput = z.infer<typeof massItemSchema>;

export const axleModelSchema = z.object({
	/** mass of one corner's wheel, tyre, upright, brake and half the links (kg) */
	unsprung_mass: z.number({ error: 'must be a number (kg per corner)' }).min(0, 'must be ≥ 0 kg').max(500, 'must be at most 500 kg per corner'),
	spring_rate: z.number({ error: 'must be a number (N/mm)' }).gt(0, 'must be > 0 N/mm').max(2000, 'must be at most 2000 N/mm'),
	tyre_rate: z.number({ error: 'must be a number (N/mm)' }).gt(0, 'must be > 0 N/mm').max(5000, 'must be at most 5000 N/mm').nullable().optional(),
	/** the right corner: its own revision, or the left one mirrored */
	right: z.enum(['measured', 'mirror'], { error: "must be 'measured' or 'mirror'" }).default('mirror'),
	steering: steeringSchema.nullable().optional(),
	anti_roll_bar: antiRollBarSchema.nullable().optional(),
	/** a solid axle's points (rear only), in place of the axle's corners */
	solid: solidAxleSchema.nullable().optional()
});
export type AxleModel = z.infer<typeof axleModelSchema>;

export const carModelSchema = z.object({
	format: z.literal('car-model/1', { error: "must be 'car-model/1'" }).default('car-model/1'),
	mass_items: z
		.array(massItemSchema, { error: 'must be a list of mass items' })
		.min(1, 'at least one mass item (the sprung body)')
		.max(50, 'at most 50 mass items')
		.refine((items) => new Set(items.map((i) => i.name.toLowerCase())).size === items.length, 'two mass items have the same name'),
	front: axleModelSchema.refine((a) => !a.solid, { path: ['solid'], message: 'a solid axle is taken on the rear axle only' }),
	rear: axleModelSchema,
	/** space the suspension must stay out of (packaging): the fix search keeps moved points and their rods out of it */
	keep_out: keepOutListSchema.default([])
});
export type CarModel = z.infer<typeof carModelSchema>;

/** A car revision as the API takes it: the model, a label and note, and optionally which corner revision to pin per position. */
export const carRevisionInput = z.object({
	label: z.string().trim().max(120, 'at most 120 characters').default(''),
	note: z.string().trim().max(4000, 'at most 4000 characters').default(''),
	model: carModelSchema,
	corners: z.record(z.enum(['front_left', 'front_right', 'rear_left', 'rear_right'], { error: 'must be front_left, front_right, rear_left or rear_right' }), z.uuid({ error: 'must be a revision id' })).optional()
});
export type CarRevisionInput = z.infer<typeof carRevisionInput>;

/** A starting model for a car without one: an invented small single-seater's masses (demo-grade numbers). */
export function starterModel(wheelbase = 2600, cgHeight = 400): CarModel {
	return {
		format: 'car-model/1',
		mass_items: [
			{ name: 'Sprung body', mass: 300, x: -wheelbase * 0.55, y: 0, z: cgHeight },
			{ name: 'Driver', mass: 75, x: -wheelbase * 0.45, y: 0, z: cgHeight * 0.8 }
		],
		front: { unsprung_mass: 20, spring_rate: 60, tyre_rate: null, right: 'mirror', steering: { rack_travel_per_turn: 50, rack_left_turn: '-y' }, anti_roll_bar: null },
		rear: { unsprung_mass: 22, spring_rate: 70, tyre_rate: null, right: 'mirror', steering: null, anti_roll_bar: null },
		keep_out: []
	};
}

const POSITIONS = ['front_left', 'front_right', 'rear_left', 'rear_right'] as const;

/**
 * A car file for the solve command: a car model with its corners inside (corner-geometry/1 each; the right ones
 * only where measured), and the brake and drive shares anti-dive and anti-squat need.
 */
export const carFileSchema = carModelSchema.extend({
	corners: z.partialRecord(z.enum(POSITIONS, { error: 'must be front_left, front_right, rear_left or rear_right' }), z.unknown(), { error: 'must be an object of corner files by position' }),
	front_brake_fraction: z.number({ error: 'must be a number in [0, 1]' }).min(0, 'must be in [0, 1]').max(1, 'must be in [0, 1]').nullable().optional(),
	drive: z.enum(['fwd', 'rwd', 'awd'], { error: "must be 'fwd', 'rwd' or 'awd'" }).nullable().optional()
});

/** Validates a car file: the model, each corner file (named under `corners.<position>.`) and the settings. */
export function parseCarFile(input: unknown):
	| { ok: true; car: { model: CarModel; corners: Partial<Record<(typeof POSITIONS)[number], CornerGeometry>>; settings: { frontBrakeFraction: number | null; driveLayout: 'fwd' | 'rwd' | 'awd' | null } } }
	| { ok: false; message: string } {
	const r = carFileSchema.safeParse(input);
	if (!r.success) return { ok: false, message: formatIssue(r.error) };
	const { corners: raw, front_brake_fraction, drive, ...model } = r.data;
	const corners: Partial<Record<(typeof POSITIONS)[number], CornerGeometry>> = {};
	for (const position of POSITIONS) {
		if (raw[position] === undefined) continue;
		const c = parseCornerGeometry(raw[position]);
		if (!c.ok) return { ok: false, message: `corners.${position}.${c.message}` };
		corners[position] = c.corner;
	}
	return { ok: true, car: { model, corners, settings: { frontBrakeFraction: front_brake_fraction ?? null, driveLayout: drive ?? null } } };
}
