// Ride height and rake of the whole car: the front corners lowered (or raised) by one amount, the rear by another.
// Each corner with a revision is solved at its new design position (kinematics/ride-height.ts, as the corner's own
// ride-height page does); the rake is the body's pitch that the two changes make over the wheelbase.
import { error } from '@sveltejs/kit';
import { cornerGeometrySchema, type CornerGeometry } from '$lib/schemas/geometry';
import { rideHeightChange, type DesignFigures } from '$lib/server/analysis/ride-height';
import { rakeAngle, wheelbaseOf } from '$lib/server/kinematics/ride-height';
import { db } from '$lib/server/db';
import { cornersOfCar, latestRevision } from '$lib/server/db/queries/corners';
import type { Car, Corner } from '$lib/server/db/schema';

export interface CornerChange {
	corner: Pick<Corner, 'id' | 'position' | 'kind'>;
	revision: { id: string; number: number; label: string };
	change: number;
	before: DesignFigures;
	after: DesignFigures;
	geometry: CornerGeometry;
}

/** Every corner's figures before and after, and the rake (+ = nose down, degrees) over the wheelbase. */
export async function carRideHeight(car: Car, front: number, rear: number) {
	const corners = (await cornersOfCar(db, car.id)).filter((c) => c.revisionCount > 0);
	if (corners.length === 0) error(400, { message: 'front: the car has no corner with a revision to change', code: 'invalid', field: 'front' });
	const rows: CornerChange[] = [];
	for (const c of corners) {
		const rev = (await latestRevision(db, c.id))!;
		const geometry = cornerGeometrySchema.parse(rev.geometry);
		const change = c.position.startsWith('front') ? front : rear;
		const field = c.position.startsWith('front') ? 'front' : 'rear';
		let result;
		if (change === 0) {
			const same = rideHeightChange(geometry, 1);
			// no change at this axle: the figures as they are (the 1 mm solve only reads the design figures)
			result = { before: same.before, after: same.before, geometry };
		} else {
			try {
				result = rideHeightChange(geometry, change);
			} catch (e) {
				const body = (e as { body?: { message?: string } }).body;
				if (body?.message) error(400, { message: `${field}: ${c.position.replace('_', ' ')} corner: ${body.message.replace(/^change: /, '')}`, code: 'invalid', field });
				throw e;
			}
		}
		rows.push({ corner: { id: c.id, position: c.position, kind: c.kind }, revision: { id: rev.id, number: rev.number, label: rev.label }, change, before: result.before, after: result.after, geometry: result.geometry as CornerGeometry });
	}
	const centres = (axle: string) => rows.filter((r) => r.corner.position.startsWith(axle)).map((r) => r.geometry.points['wheel.centre']);
	const wheelbase = car.wheelbaseMm ?? wheelbaseOf(centres('front'), centres('rear'));
	const noseDown = wheelbase ? rakeAngle(front, rear, wheelbase) : null;
	return { front, rear, wheelbase, wheelbaseFrom: car.wheelbaseMm ? 'car' : wheelbase ? 'wheel centres' : null, noseDown, corners: rows };
}
