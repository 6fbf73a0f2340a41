// Car revisions: saving one (the one path for the page and the API) and analysing one (figures and axle sweeps).
// A car revision pins a revision of each corner; saving refuses what cannot be analysed, naming the field, and
// writes nothing then.
import { error } from '@sveltejs/kit';
import { carModelSchema, type CarModel, type CarRevisionInput } from '$lib/schemas/car-model';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { appendCarRevision, cornerRevisionsOfCar, latestCornerRevisions } from '$lib/server/db/queries/car-revisions';
import type { Car } from '$lib/server/db/schema';
import { AxleSolver, barFigures, type AxleSweepOptions } from '$lib/server/kinematics/axle';
import { axleInput, carFigures, CarModelError, pitchSweep, vehicleOf, type AxleName, type CarCorners, type Position } from '$lib/server/kinematics/car';
import { CornerGeometryError, SweepOptionsError } from '$lib/server/kinematics/index';
import { solveSolidAxle, SolidSweepOptionsError } from '$lib/server/kinematics/solid-axle';

type CarRow = Pick<Car, 'id' | 'teamId' | 'frontBrakeFraction' | 'driveLayout'>;

/** 400 naming the field. */
function invalid(field: string, message: string): never {
	error(400, { message: `${field}: ${message}`, code: 'invalid', field });
}

/** The pinned corners' geometries, checked: each id a revision of this car at that position. */
async function pinnedCorners(carId: string, pins: Record<string, string>): Promise<CarCorners> {
	const found = await cornerRevisionsOfCar(db, carId, Object.values(pins));
	const out: CarCorners = {};
	for (const [position, id] of Object.entries(pins)) {
		const row = found.get(id);
		if (!row) invalid(`corners.${position}`, 'not a revision of this car');
		if (row.position !== position) invalid(`corners.${position}`, `that revision belongs to the ${row.position.replace('_', '-')} corner`);
		const parsed = cornerGeometrySchema.safeParse(row.geometry);
		if (!parsed.success) invalid(`corners.${position}`, `revision ${row.number} no longer parses: ${parsed.error.issues[0].message}`);
		out[position as Position] = parsed.data;
	}
	return out;
}

/** The car's figures (what the page and the API show of a car revision), or 400 naming the field. */
export function figuresOrInvalid(model: CarModel, corners: CarCorners) {
	try {
		return carFigures(model, corners);
	} catch (e) {
		if (e instanceof CarModelError) invalid(e.field, e.message.slice(e.field.length + 2));
		if (e instanceof CornerGeometryError || e instanceof SweepOptionsError) invalid('corners', e.message);
		throw e;
	}
}

/** Saves a new car revision (the newest corner revisions unless pinned), refusing one that cannot be analysed. */
export async function saveCarRevision(car: CarRow, userId: string, input: CarRevisionInput, parentId: string | null) {
	const latest = await latestCornerRevisions(db, car.id);
	const pins: Record<string, string> = Object.fromEntries(Object.entries(latest).map(([p, r]) => [p, r.id]));
	Object.assign(pins, input.corners ?? {});
	const corners = await pinnedCorners(car.id, pins);
	const figures = figuresOrInvalid(input.model, corners);
	const row = await appendCarRevision(db, { carId: car.id, label: input.label, note: input.note, model: input.model as unknown as Record<string, unknown>, cornerRevisions: pins, parentId, authorId: userId }, async (tx, r) => {
		await recordAudit(tx, { teamId: car.teamId, actorId: userId, action: 'car.revision_saved', subjectType: 'car', subjectId: car.id, detail: { number: r.number, carRevisionId: r.id } });
	});
	return { revision: row, figures };
}

/** A stored car revision's model and corners, parsed. */
export async function loadCarRevision(row: { carId: string; model: unknown; cornerRevisions: Record<string, string> }) {
	const model = carModelSchema.parse(row.model);
	const corners = await pinnedCorners(row.carId, row.cornerRevisions);
	return { model, corners };
}

/** An axle of a car revision, solved as asked; the vehicle block comes from the car's own figures. */
export function axleSweep(car: CarRow, model: CarModel, corners: CarCorners, axle: AxleName, options: AxleSweepOptions) {
	const figures = figuresOrInvalid(model, corners);
	const vehicle = vehicleOf(figures, axle, { frontBrakeFraction: car.frontBrakeFraction, driveLayout: car.driveLayout });
	const solid = axle === 'rear' ? model.rear.solid : null;
	if (solid) {
		if (options.sweep === 'steer') invalid('sweep', 'a solid axle does not steer (use heave or roll)');
		try {
			const v = vehicle && { wheelbase: vehicle.wheelbase, cg_height: vehicle.cg_height, axle: 'rear' as const, rear_drive_fraction: vehicle.rear_drive_fraction };
			const result = solveSolidAxle(solid, v, { sweep: options.sweep as 'heave' | 'roll', from: options.from, to: options.to, step: options.step, points: options.points });
			// the roll centre as [y, z] like the independent axle's: on the centreline, at the lateral locator's height
			const samples = result.samples.map((x) => ({ ...x, rc: x.rc_height === null ? null : ([0, x.rc_height] as [number, number]) }));
			return { format: 'axle-solve/1' as const, axle, sweep: options.sweep, track: figures.axles.rear.track, kinds: ['solid_axle', 'solid_axle'], anti_roll_bar: null, samples, error: result.error };
		} catch (e) {
			if (e instanceof SolidSweepOptionsError) invalid(e.message.split(':')[0], e.message.split(':').slice(1).join(':').trim());
			throw e;
		}
	}
	try {
		const solver = new AxleSolver(axleInput(model, corners, axle, vehicle));
		const result = solver.sweep(options);
		return { format: 'axle-solve/1' as const, axle, sweep: options.sweep, track: solver.track, kinds: [solver.left.model.kind, solver.right.model.kind], anti_roll_bar: barFigures(solver), ...result };
	} catch (e) {
		if (e instanceof SweepOptionsError) invalid(e.message.split(':')[0], e.message.split(':').slice(1).join(':').trim());
		if (e instanceof CarModelError) invalid(e.field, e.message.slice(e.field.length + 2));
		throw e;
	}
}


/** The car's pitch sweep (body about the CG's lateral axis) with both axles; failures named as 400s. */
export function carPitchSweep(car: CarRow, model: CarModel, corners: CarCorners, grid: { from: number; to: number; step: number }) {
	figuresOrInvalid(model, corners);
	try {
		return { format: 'car-pitch/1' as const, ...pitchSweep(model, corners, { frontBrakeFraction: car.frontBrakeFraction, driveLayout: car.driveLayout }, grid) };
	} catch (e) {
		if (e instanceof CarModelError) invalid(e.field, e.message.slice(e.field.length + 2));
		throw e;
	}
}
