// The app's side of the joint angles: request → engine, with the corner's saved settings under the request's.
import { error } from '@sveltejs/kit';
import type { CornerGeometry } from '$lib/schemas/geometry';
import type { z } from 'zod';
import type { jointAnglesInput } from '$lib/schemas/analysis';
import { kindSpec } from '$lib/kinds';
import { jointAngles, jointsOf, type JointSetting } from '$lib/server/kinematics/joint-angles';
import type { SweepKind } from '$lib/server/kinematics/index';

type Input = z.infer<typeof jointAnglesInput>;

/** Every joint's angle through the sweeps asked for; 400 naming the joint for a setting of a joint the corner lacks. */
export function jointAnglesOf(geometry: CornerGeometry, saved: Record<string, Partial<JointSetting>>, input: Input) {
	const joints = new Set(jointsOf(geometry).map((j) => j.point));
	for (const name of Object.keys(input.joints ?? {})) {
		if (!joints.has(name)) error(400, { message: `joints.${name}: not a ball joint or rod end of this corner (it has ${[...joints].join(', ')})`, code: 'invalid', field: `joints.${name}` });
	}
	const settings: Record<string, Partial<JointSetting>> = {};
	for (const name of joints) settings[name] = { ...saved[name], ...input.joints?.[name] };
	const steers = kindSpec(geometry.kind).steers;
	if (input.sweeps?.includes('steer') && !steers) error(400, { message: 'sweeps: this corner kind does not steer (leave steer out)', code: 'invalid', field: 'sweeps' });
	const sweeps: SweepKind[] = input.sweeps ?? (steers ? ['heave', 'roll', 'steer'] : ['heave', 'roll']);
	const results = jointAngles(geometry, settings, { heave: input.heave, roll: input.roll, steer: input.steer }, sweeps);
	return { sweeps, joints: results };
}
