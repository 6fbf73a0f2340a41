// The study report of a corner: revision B (against A, or alone), everything the team keeps on record: the points and
// what moved, the figures through heave, roll and steer, the targets judged, the joint angles and the caution. The
// page prints it through the browser (Chromium prints it as it prints the share sheet).
import { joinRocker, kindSpec, measuresNotApplying } from '$lib/kinds';
import type { CornerGeometry } from '$lib/schemas/geometry';
import type { Target } from '$lib/schemas/targets';
import { jointAngles, type JointSetting } from '$lib/server/kinematics/joint-angles';
import { compareRevisions } from './compare';
import { solveCorner } from './solve';
import { defaultPositions } from '$lib/schemas/compare';
import type { LengthUnit } from '$lib/units';

/** `unit`: the reader's length unit (the travel positions ±1, ±2 in and the summaries in it; every number stays mm). */
export function cornerReport(a: CornerGeometry, b: CornerGeometry, targets: Target[], jointSettings: Record<string, Partial<JointSetting>>, unit: LengthUnit = 'mm') {
	const compare = compareRevisions(a, b, targets, defaultPositions(unit), unit);
	const steers = kindSpec(b.kind).steers && kindSpec(a.kind).steers;
	const roll = { from: -3, to: 3, step: 0.25 };
	const steer = { from: -40, to: 40, step: 2 };
	const joints = jointAngles(b, jointSettings).map(({ sweeps: _sweeps, ...j }) => j);
	return {
		...compare,
		points: { a: joinRocker(a.points, a.rocker), b: joinRocker(b.points, b.rocker) },
		missing: [...measuresNotApplying(b.kind, joinRocker(b.points, b.rocker))],
		roll: { a: solveCorner(a, { sweep: 'roll', ...roll }), b: solveCorner(b, { sweep: 'roll', ...roll }) },
		steer: steers ? { a: solveCorner(a, { sweep: 'steer', ...steer }), b: solveCorner(b, { sweep: 'steer', ...steer }) } : null,
		joints
	};
}
