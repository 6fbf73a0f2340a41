// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// Double wishbone: two A-arms pivoting on the chassis, ball-jointed to the upright; a tie rod steers it.
import type { KindSpec } from './types';

export const doubleWishbone: KindSpec = {
	kind: 'double_wishbone',
	label: 'Double wishbone',
	summary: 'Upper and lower wishbones (A-arms) on chassis pivots, ball-jointed to the upright; a tie rod steers it or holds its toe.',
	points: [
		{ name: 'lower.front', label: 'Lower arm, front pivot', description: 'Chassis bush or joint at the front of the lower wishbone or control arm.', body: 'chassis', diagram: [28, 78], aliases: ['lca front', 'lower wishbone front', 'lower control arm front'] },
		{ name: 'lower.rear', label: 'Lower arm, rear pivot', description: "Chassis bush or joint at the rear of the lower arm; with the front pivot it defines the arm's pivot axis.", body: 'chassis', diagram: [30, 80], aliases: ['lca rear', 'lower wishbone rear', 'lower control arm rear'] },
		{ name: 'lower.outer', label: 'Lower ball joint', description: 'Ball joint of the lower arm on the upright (bottom of the steering axis).', body: 'upright', diagram: [74, 80], aliases: ['lower ball joint', 'lbj', 'lca outer'] },
		{ name: 'upper.front', label: 'Upper arm, front pivot', description: 'Chassis bush or joint at the front of the upper wishbone.', body: 'chassis', diagram: [36, 34], aliases: ['uca front', 'upper wishbone front'] },
		{ name: 'upper.rear', label: 'Upper arm, rear pivot', description: 'Chassis bush or joint at the rear of the upper wishbone.', body: 'chassis', diagram: [38, 36], aliases: ['uca rear', 'upper wishbone rear'] },
		{ name: 'upper.outer', label: 'Upper ball joint', description: 'Ball joint of the upper arm on the upright (top of the steering axis).', body: 'upright', diagram: [68, 32], aliases: ['upper ball joint', 'ubj', 'uca outer'] },
		{ name: 'steer.inner', label: 'Tie rod, inner joint', description: 'Inner joint of the tie rod on the rack (moves with the rack when steering).', body: 'rack', diagram: [30, 64], aliases: ['tie rod inner', 'toe link inner', 'rack end'] },
		{ name: 'steer.outer', label: 'Tie rod, outer joint', description: 'Outer joint of the tie rod on the steering arm of the upright.', body: 'upright', diagram: [70, 64], aliases: ['tie rod outer', 'toe link outer', 'steering arm'] },
		{ name: 'wheel.centre', label: 'Wheel centre', description: "Centre of the wheel on its spin axis, in the wheel's centre plane.", body: 'upright', diagram: [84, 56], aliases: ['wheel center', 'hub centre'] },
		{ name: 'wheel.axis_inner', label: 'Spin axis, inner point', description: "Any point on the wheel's spin axis inboard of the centre; with the centre it sets static camber and toe.", body: 'upright', diagram: [76, 56], aliases: ['spin axis inner', 'hub inner'] }
	],
	joints: [
		{ type: 'pivot', body: 'lower', axis: ['lower.front', 'lower.rear'] },
		{ type: 'pivot', body: 'upper', axis: ['upper.front', 'upper.rear'] },
		{ type: 'ball', body: 'lower', at: 'lower.outer' },
		{ type: 'ball', body: 'upper', at: 'upper.outer' },
		{ type: 'rod', link: 'tie rod', inner: 'steer.inner', outer: 'steer.outer' }
	],
	steeringAxis: { type: 'points', lower: 'lower.outer', upper: 'upper.outer' },
	instantCentres: 'arm-planes',
	springOn: ['lower', 'upper', 'upright'],
	rockerRodOn: ['lower', 'upper', 'upright'],
	steers: true,
	diagram: [
		['lower.front', 'lower.outer'],
		['lower.rear', 'lower.outer'],
		['upper.front', 'upper.outer'],
		['upper.rear', 'upper.outer'],
		['lower.outer', 'upper.outer'],
		['steer.inner', 'steer.outer']
	],
	// Invented: a small front-wheel-drive club car's front left corner.
	template: {
		points: {
			'lower.front': [180, 335, 127],
			'lower.rear': [-220, 345, 133],
			'lower.outer': [0, 695, 120],
			'upper.front': [90, 425, 450],
			'upper.rear': [-170, 425, 432],
			'upper.outer': [-30.6, 633.3, 470],
			'steer.inner': [-130, 358, 176],
			'steer.outer': [-135, 655, 175],
			'wheel.centre': [0, 720, 289.901],
			'wheel.axis_inner': [0.087, 620.034, 287.283],
			'spring.chassis': [-15, 560, 520],
			'spring.body': [-5, 600, 150]
		},
		spring_on: 'lower',
		tyre: { loaded_radius: 290 },
		// invented: a pushrod to a rocker on the chassis, the spring lying across the car
		rocker: { points: { 'rocker.pivot_a': [25, 345, 470], 'rocker.pivot_b': [-25, 345, 470], 'rocker.rod_end': [0, 425, 540], 'rocker.spring_end': [0, 295, 540], 'rocker.rod_outer': [0, 655, 135] }, rod_on: 'lower', spring_chassis: [0, 85, 390] }
	}
};

