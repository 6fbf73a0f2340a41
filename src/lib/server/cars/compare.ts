// What changed between two car revisions, as a plain list: mass items added, removed, moved or re-weighed (matched
// by name, case-insensitive), the corner revisions each pins, and every axle setting (springs, tyres, unsprung
// mass, right side, rack, anti-roll bar, a solid axle's type and points), and the keep-out volumes (matched by
// name). carChanges is pure; changesBetween reads
// the pinned corner revisions' numbers.
// Frame: ISO 8855 vehicle axes, x forward, y left, z up; mm, kg, N/mm, N·m/°.
import { describeKeepOut, type KeepOut } from '$lib/schemas/keep-out';
import { carModelSchema, type CarModel } from '$lib/schemas/car-model';
import { db } from '$lib/server/db';
import { cornerRevisionsOfCar } from '$lib/server/db/queries/car-revisions';

type Vec3 = [number, number, number];

export type CarChange =
	| { what: 'mass_item'; change: 'added' | 'removed'; name: string; mass: number; at: Vec3 }
	| { what: 'mass_item'; change: 'changed'; name: string; dx: number; dy: number; dz: number; dmass: number; mass: number; at: Vec3 }
	| { what: 'corner'; position: string; was: number | null; now: number | null }
	| { what: 'setting'; field: string; label: string; was: string; now: string; delta: number | null; unit: string };

/** A revision as compared: its model and, per position, the number of the corner revision it pins. */
export interface ComparedRevision {
	model: CarModel;
	corners: Record<string, number | null>;
}

/** Axle settings in the trade's words, by path below the axle; anything else is listed under its path. */
const SETTINGS: Record<string, { label: string; unit: string }> = {
	spring_rate: { label: 'spring rate', unit: 'N/mm' },
	tyre_rate: { label: 'tyre rate', unit: 'N/mm' },
	unsprung_mass: { label: 'unsprung mass per corner', unit: 'kg' },
	right: { label: 'right corner', unit: '' },
	'steering.rack_travel_per_turn': { label: 'rack travel per steering-wheel turn', unit: 'mm' },
	'steering.rack_left_turn': { label: 'rack moves for a left turn', unit: '' },
	'anti_roll_bar.torsional_stiffness': { label: 'anti-roll bar stiffness', unit: 'N·m/°' },
	'anti_roll_bar.link_on': { label: 'anti-roll bar drop link on', unit: '' },
	'anti_roll_bar.pivot': { label: 'anti-roll bar pivot', unit: 'mm' },
	'anti_roll_bar.arm_end': { label: 'anti-roll bar arm end', unit: 'mm' },
	'anti_roll_bar.link_end': { label: 'anti-roll bar drop-link end', unit: 'mm' },
	'solid.lateral': { label: 'solid axle lateral locator', unit: '' },
	'solid.tyre.loaded_radius': { label: 'solid axle loaded radius', unit: 'mm' }
};

const EPS = 1e-9;
const isVec = (v: unknown): v is Vec3 => Array.isArray(v) && v.length === 3 && v.every((n) => typeof n === 'number');
const show = (v: unknown): string => (v === undefined || v === null ? '—' : isVec(v) ? `(${v.join(', ')})` : String(v));

/** Leaves of a settings object by dotted path; points ([x, y, z]) are leaves. */
function leaves(o: unknown, prefix = '', out = new Map<string, unknown>()): Map<string, unknown> {
	if (o && typeof o === 'object' && !Array.isArray(o)) {
		for (const [k, v] of Object.entries(o)) leaves(v, prefix ? `${prefix}.${k}` : k, out);
	} else if (prefix) out.set(prefix, o);
	return out;
}

/** A solid axle's points are named with dots themselves: label them by their own name. */
function settingLabel(path: string): { label: string; unit: string } {
	if (SETTINGS[path]) return SETTINGS[path];
	const point = /^solid\.points\.(.+)$/.exec(path);
	if (point) return { label: `solid axle point ${point[1]}`, unit: 'mm' };
	return { label: path.replace(/_/g, ' '), unit: '' };
}

function axleChanges(axle: 'front' | 'rear', was: CarModel['front'], now: CarModel['front']): CarChange[] {
	const a = leaves(was);
	const b = leaves(now);
	const out: CarChange[] = [];
	for (const path of new Set([...a.keys(), ...b.keys()])) {
		const x = a.get(path) ?? null;
		const y = b.get(path) ?? null;
		if (JSON.stringify(x) === JSON.stringify(y)) continue;
		const { label, unit } = settingLabel(path);
		let delta: number | null = null;
		if (typeof x === 'number' && typeof y === 'number') delta = y - x;
		else if (isVec(x) && isVec(y)) delta = Math.hypot(y[0] - x[0], y[1] - x[1], y[2] - x[2]);
		out.push({ what: 'setting', field: `${axle}.${path}`, label: `${axle === 'front' ? 'Front' : 'Rear'} ${label}`, was: show(x), now: show(y), delta, unit });
	}
	return out;
}

/** The changes from `was` to `now`, mass items first, then corner pins, then the axles' settings. */
export function carChanges(was: ComparedRevision, now: ComparedRevision): CarChange[] {
	const out: CarChange[] = [];
	const key = (n: string) => n.trim().toLowerCase();
	const before = new Map(was.model.mass_items.map((i) => [key(i.name), i]));
	const after = new Map(now.model.mass_items.map((i) => [key(i.name), i]));
	for (const [k, i] of after) {
		const o = before.get(k);
		if (!o) {
			out.push({ what: 'mass_item', change: 'added', name: i.name, mass: i.mass, at: [i.x, i.y, i.z] });
			continue;
		}
		const d = { dx: i.x - o.x, dy: i.y - o.y, dz: i.z - o.z, dmass: i.mass - o.mass };
		if (Object.values(d).some((v) => Math.abs(v) > EPS)) out.push({ what: 'mass_item', change: 'changed', name: i.name, ...d, mass: i.mass, at: [i.x, i.y, i.z] });
	}
	for (const [k, o] of before) if (!after.has(k)) out.push({ what: 'mass_item', change: 'removed', name: o.name, mass: o.mass, at: [o.x, o.y, o.z] });
	for (const position of ['front_left', 'front_right', 'rear_left', 'rear_right']) {
		const x = was.corners[position] ?? null;
		const y = now.corners[position] ?? null;
		if (x !== y) out.push({ what: 'corner', position, was: x, now: y });
	}
	out.push(...axleChanges('front', was.model.front, now.model.front), ...axleChanges('rear', was.model.rear, now.model.rear));
	out.push(...keepOutChanges(was.model.keep_out ?? [], now.model.keep_out ?? []));
	return out;
}

/** Keep-out volumes matched by name: added, removed, or each field that changed. */
function keepOutChanges(was: KeepOut[], now: KeepOut[]): CarChange[] {
	const key = (n: string) => n.trim().toLowerCase();
	const before = new Map(was.map((v) => [key(v.name), v]));
	const after = new Map(now.map((v) => [key(v.name), v]));
	const out: CarChange[] = [];
	const setting = (v: KeepOut, path: string, x: string, y: string, delta: number | null, unit: string): CarChange => ({ what: 'setting', field: `keep_out.${v.name}${path ? `.${path}` : ''}`, label: `Keep-out “${v.name}”${path ? ` ${path.replace(/_/g, ' ')}` : ''}`, was: x, now: y, delta, unit });
	for (const [k, v] of after) {
		const o = before.get(k);
		if (!o) {
			out.push(setting(v, '', '—', describeKeepOut(v), null, ''));
			continue;
		}
		const a = leaves(o);
		const b = leaves(v);
		for (const path of new Set([...a.keys(), ...b.keys()])) {
			if (path === 'name') continue;
			const x = a.get(path) ?? null;
			const y = b.get(path) ?? null;
			if (JSON.stringify(x) === JSON.stringify(y)) continue;
			const delta = typeof x === 'number' && typeof y === 'number' ? y - x : isVec(x) && isVec(y) ? Math.hypot(y[0] - x[0], y[1] - x[1], y[2] - x[2]) : null;
			out.push(setting(v, path, show(x), show(y), delta, typeof x === 'number' || isVec(x) ? 'mm' : ''));
		}
	}
	for (const [k, o] of before) if (!after.has(k)) out.push(setting(o, '', describeKeepOut(o), '—', null, ''));
	return out;
}

type RevisionRow = { carId: string; model: unknown; cornerRevisions: Record<string, string> };

/** The changes between two stored revisions of one car (each pinned corner revision by its number). */
export async function changesBetween(was: RevisionRow, now: RevisionRow): Promise<CarChange[]> {
	const ids = [...Object.values(was.cornerRevisions), ...Object.values(now.cornerRevisions)];
	const found = await cornerRevisionsOfCar(db, now.carId, [...new Set(ids)]);
	const numbers = (pins: Record<string, string>) => Object.fromEntries(Object.entries(pins).map(([p, id]) => [p, found.get(id)?.number ?? null]));
	return carChanges({ model: carModelSchema.parse(was.model), corners: numbers(was.cornerRevisions) }, { model: carModelSchema.parse(now.model), corners: numbers(now.cornerRevisions) });
}
