// Saving revisions: the one path every save takes (editor, API, import), so the rules hold everywhere.
import { error } from '@sveltejs/kit';
import type { CornerGeometry } from '$lib/schemas/geometry';
import { POSITION_LABELS } from '$lib/schemas/corner';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import {
	appendRevision,
	latestRevision,
	revisionOfCorner,
	setCornerKind,
	type NewUpload
} from '$lib/server/db/queries/corners';
import { insertPointSources, type NewPointSource } from '$lib/server/db/queries/scans';
import type { Car, Corner } from '$lib/server/db/schema';

/** Stops with 400 when the geometry's side (sign of wheel.centre y) or axle disagrees with the corner. */
export function checkCornerFits(geometry: CornerGeometry, corner: Corner, field = 'geometry') {
	const left = corner.position.endsWith('left');
	const y = geometry.points['wheel.centre'][1];
	if (left !== y > 0) {
		const where = POSITION_LABELS[corner.position].toLowerCase();
		error(400, {
			message: `${field}.points.wheel.centre: y = ${y} mm puts the wheel on the ${y > 0 ? 'left' : 'right'}, but this is the ${where} corner`,
			code: 'invalid',
			field: `${field}.points.wheel.centre`
		});
	}
	const axle = geometry.vehicle?.axle;
	if (axle && axle !== corner.position.split('_')[0]) {
		error(400, {
			message: `${field}.vehicle.axle: '${axle}' does not match the ${POSITION_LABELS[corner.position].toLowerCase()} corner`,
			code: 'invalid',
			field: `${field}.vehicle.axle`
		});
	}
}

/** The vehicle block the solver needs for anti-dive / anti-squat, from the car's data, or null. */
export function vehicleFromCar(car: Car, corner: Corner): CornerGeometry['vehicle'] {
	const axle = corner.position.startsWith('front') ? 'front' : 'rear';
	if (!car.wheelbaseMm || !car.cgHeightMm) return null;
	if (axle === 'front' && car.frontBrakeFraction === null) return null;
	return {
		axle,
		wheelbase: car.wheelbaseMm,
		cg_height: car.cgHeightMm,
		...(axle === 'front' ? { front_brake_fraction: car.frontBrakeFraction! } : {})
	};
}

export interface SaveRevision {
	car: Car;
	corner: Corner;
	userId: string;
	geometry: CornerGeometry;
	label: string;
	note: string;
	parentId?: string | null;
	upload?: NewUpload;
	source: 'editor' | 'api' | 'import' | 'fix' | 'scan';
	/** where captured points came from (scan, fit, residual), written with the revision */
	pointSources?: NewPointSource[];
}

/** The audit event of a new revision, written in the revision's transaction. */
function auditCreated(tx: typeof db, input: SaveRevision, row: { id: string; number: number }) {
	return recordAudit(tx, {
		teamId: input.car.teamId,
		actorId: input.userId,
		action: 'revision.created',
		subjectType: 'revision',
		subjectId: row.id,
		detail: { corner: input.corner.position, number: row.number, source: input.source, car: input.car.name }
	});
}

/** Saves a new immutable revision; returns it with the newest number the parent had been superseded by, if any. */
export async function saveRevision(input: SaveRevision) {
	const { corner, userId, geometry } = input;
	checkCornerFits(geometry, corner);
	const parentId = input.parentId ?? (await latestRevision(db, corner.id))?.id ?? null;
	if (input.parentId && !(await revisionOfCorner(db, corner.id, input.parentId))) {
		error(400, { message: 'parentId: not a revision of this corner', code: 'invalid', field: 'parentId' });
	}
	const before = await latestRevision(db, corner.id);
	// The revision, the corner's kind and the audit event commit together or not at all.
	const revision = await appendRevision(
		db,
		{ cornerId: corner.id, kind: geometry.kind, geometry, label: input.label, note: input.note, parentId, authorId: userId },
		input.upload,
		async (tx, row) => {
			if (corner.kind !== geometry.kind) await setCornerKind(tx, corner.id, geometry.kind);
			if (input.pointSources) await insertPointSources(tx, row.id, input.pointSources);
			await auditCreated(tx, input, row);
		}
	);
	// Someone saved after the revision this one started from: the editor says so.
	const supersededBy = before && parentId && before.id !== parentId ? before.number : null;
	return { revision, supersededBy };
}

/**
 * Saves one new revision on each of several corners of a car, all in one transaction: every revision or none (a
 * change made to the whole car, such as its ride height, is never half-saved).
 */
export async function saveRevisionsTogether(inputs: SaveRevision[]) {
	for (const input of inputs) checkCornerFits(input.geometry, input.corner, `corners.${input.corner.position}`);
	return db.transaction(async (tx) => {
		const out = [];
		for (const input of inputs) {
			const { corner, userId, geometry } = input;
			const parentId = input.parentId ?? (await latestRevision(tx as unknown as typeof db, corner.id))?.id ?? null;
			const revision = await appendRevision(
				tx as unknown as typeof db,
				{ cornerId: corner.id, kind: geometry.kind, geometry, label: input.label, note: input.note, parentId, authorId: userId },
				undefined,
				async (inner, row) => {
					if (corner.kind !== geometry.kind) await setCornerKind(inner, corner.id, geometry.kind);
					await auditCreated(inner, input, row);
				}
			);
			out.push({ corner, revision });
		}
		return out;
	});
}
