import { json } from '@sveltejs/kit';
import { jointSettingsInput } from '$lib/schemas/analysis';
import { kindSpec, ROCKER_POINTS, SPRING_POINTS } from '$lib/kinds';
import { endpoint, invalid, parseBody } from '$lib/server/api';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { setJointSettings } from '$lib/server/db/queries/corners';
import { requireCorner } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// The corner's joint settings: per joint (point name) the misalignment limit (degrees) and the stud or bolt axis.
export const GET = endpoint<RequestEvent>(async (event) => {
	const { corner } = await requireCorner(event, event.params.cornerId, 'view');
	return json({ joints: corner.jointSettings ?? {} });
});

// Replaces them (edit); every revision of the corner is judged by them.
export const PUT = endpoint<RequestEvent>(async (event) => {
	const { corner, car } = await requireCorner(event, event.params.cornerId, 'edit');
	const { joints } = await parseBody(event, jointSettingsInput);
	const known = new Set([...kindSpec(corner.kind).points, ...SPRING_POINTS, ...ROCKER_POINTS].map((p) => p.name));
	for (const name of Object.keys(joints)) if (!known.has(name)) invalid(`joints.${name}`, `not a point of a ${kindSpec(corner.kind).label.toLowerCase()} corner`);
	// keep only what was set: an entry with neither a limit nor an axis other than auto says nothing
	const kept = Object.fromEntries(
		Object.entries(joints)
			.map(([name, s]) => [name, { ...(s.limit !== undefined ? { limit: s.limit } : {}), ...(s.axis && s.axis !== 'auto' ? { axis: s.axis } : {}) }] as const)
			.filter(([, s]) => Object.keys(s).length > 0)
	);
	await setJointSettings(db, corner.id, kept);
	await recordAudit(db, { teamId: car.teamId, actorId: event.locals.user!.id, action: 'corner.joint_limits_set', subjectType: 'corner', subjectId: corner.id, detail: { corner: corner.position, car: car.name, joints: Object.keys(kept).length } });
	return json({ joints: kept });
});
