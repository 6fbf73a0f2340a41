// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// Semi-trailing arm: one arm pivoting about an axis on the chassis carries the upright rigidly
// (a trailing arm when the axis is parallel to y). It does not steer.
import type { KindSpec } from './types';

export const semiTrailing: KindSpec = {
	kind: 'semi_trailing',
	label: 'Semi-trailing arm',
	summary: 'One arm pivoting about an axis on the chassis carries the upright; a trailing arm when the axis is square to the car. It does not steer.',
	points: [
		{ name: 'arm.front', label: 'Trailing arm, front pivot', description: "The forward chassis bush of the arm; with the rear one it sets the arm's pivot axis.", body: 'chassis', diagram: [54, 68], aliases: ['trailing arm pivot front', 'trailing arm front', 'semi trailing arm front', 'trailing arm pivot outer'] },
		{ name: 'arm.rear', label: 'Trailing arm, rear pivot', description: 'The rearward chassis bush of the arm (inboard on a semi-trailing arm).', body: 'chassis', diagram: [30, 70], aliases: ['trailing arm pivot rear', 'trailing arm rear', 'semi trailing arm rear', 'trailing arm pivot inner'] },
		{ name: 'wheel.centre', label: 'Wheel centre', description: "Centre of the wheel on its spin axis, in the wheel's centre plane.", body: 'arm', diagram: [84, 56], aliases: ['wheel center', 'hub centre'] },
		{ name: 'wheel.axis_inner', label: 'Spin axis, inner point', description: "Any point on the wheel's spin axis inboard of the centre; with the centre it sets static camber and toe.", body: 'arm', diagram: [76, 56], aliases: ['spin axis inner', 'hub inner'] }
	],
	joints: [
		{ type: 'pivot', body: 'arm', axis: ['arm.front', 'arm.rear'] },
		{ type: 'rigid', body: 'arm' }
	],
	steeringAxis: { type: 'none' },
	instantCentres: 'motion',
	springOn: ['arm', 'upright'],
	rockerRodOn: ['arm', 'upright'],
	steers: false,
	diagram: [
		['arm.front', 'arm.rear'],
		['arm.front', 'wheel.axis_inner'],
		['arm.rear', 'wheel.axis_inner']
	],
	// Invented: a road car's rear left corner.
	template: {
		points: {
			'arm.front': [-2250, 560, 290],
			'arm.rear': [-2350, 150, 285],
			'wheel.centre': [-2600, 740, 299.934],
			'wheel.axis_inner': [-2600.262, 640.022, 297.84],
			'spring.chassis': [-2520, 560, 560],
			'spring.body': [-2500, 580, 250]
		},
		spring_on: 'arm',
		tyre: { loaded_radius: 300 },
		// invented: a pushrod to a rocker on the chassis, the spring lying across the car
		rocker: { points: { 'rocker.pivot_a': [-2475, 360, 500], 'rocker.pivot_b': [-2525, 360, 500], 'rocker.rod_end': [-2500, 440, 570], 'rocker.spring_end': [-2500, 310, 570], 'rocker.rod_outer': [-2500, 620, 260] }, rod_on: 'arm', spring_chassis: [-2500, 100, 420] }
	}
};
