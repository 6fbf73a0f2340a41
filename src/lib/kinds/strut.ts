// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// Strut: a lower arm and a strut fixed to the upright that slides through a top mount on the chassis.
import type { KindSpec } from './types';

export const strut: KindSpec = {
	kind: 'strut',
	label: 'Strut',
	summary: 'A lower arm and a telescopic strut fixed to the upright, sliding through a top mount on the chassis; a tie rod steers it.',
	points: [
		{ name: 'lower.front', label: 'Lower arm, front pivot', description: 'Chassis bush or joint at the front of the lower arm.', body: 'chassis', diagram: [28, 78], aliases: ['lca front', 'lower control arm front'] },
		{ name: 'lower.rear', label: 'Lower arm, rear pivot', description: "Chassis bush or joint at the rear of the lower arm; with the front pivot it defines the arm's pivot axis.", body: 'chassis', diagram: [30, 80], aliases: ['lca rear', 'lower control arm rear'] },
		{ name: 'lower.outer', label: 'Lower ball joint', description: 'Ball joint of the lower arm on the upright (bottom of the steering axis).', body: 'upright', diagram: [74, 80], aliases: ['lower ball joint', 'lbj'] },
		{ name: 'strut.top', label: 'Strut top mount', description: 'Where the strut meets the chassis; the strut axis slides through it (top of the steering axis).', body: 'chassis', diagram: [60, 8], aliases: ['top mount', 'strut mount'] },
		{ name: 'strut.lower', label: 'Strut axis, lower point', description: 'Any second point on the strut axis, fixed to the upright (for example the strut-to-upright clamp).', body: 'upright', diagram: [68, 48], aliases: ['strut clamp', 'strut bottom'] },
		{ name: 'steer.inner', label: 'Tie rod, inner joint', description: 'Inner joint of the tie rod on the rack (moves with the rack when steering).', body: 'rack', diagram: [30, 64], aliases: ['tie rod inner', 'rack end'] },
		{ name: 'steer.outer', label: 'Tie rod, outer joint', description: 'Outer joint of the tie rod on the steering arm of the upright.', body: 'upright', diagram: [70, 64], aliases: ['tie rod outer', 'steering arm'] },
		{ name: 'wheel.centre', label: 'Wheel centre', description: "Centre of the wheel on its spin axis, in the wheel's centre plane.", body: 'upright', diagram: [84, 56], aliases: ['wheel center', 'hub centre'] },
		{ name: 'wheel.axis_inner', label: 'Spin axis, inner point', description: "Any point on the wheel's spin axis inboard of the centre; with the centre it sets static camber and toe.", body: 'upright', diagram: [76, 56], aliases: ['spin axis inner', 'hub inner'] }
	],
	joints: [
		{ type: 'pivot', body: 'lower', axis: ['lower.front', 'lower.rear'] },
		{ type: 'ball', body: 'lower', at: 'lower.outer' },
		{ type: 'slider', top: 'strut.top', lower: 'strut.lower' },
		{ type: 'rod', link: 'tie rod', inner: 'steer.inner', outer: 'steer.outer' }
	],
	steeringAxis: { type: 'points', lower: 'lower.outer', upper: 'strut.top' },
	instantCentres: 'arm-planes',
	springOn: ['lower', 'upright'],
	rockerRodOn: [],
	steers: true,
	diagram: [
		['lower.front', 'lower.outer'],
		['lower.rear', 'lower.outer'],
		['strut.lower', 'strut.top'],
		['lower.outer', 'strut.lower'],
		['steer.inner', 'steer.outer']
	],
	// Invented: a road car's front left strut.
	template: {
		points: {
			'lower.front': [20, 360, 120],
			'lower.rear': [-330, 380, 125],
			'lower.outer': [0, 700, 110],
			'strut.top': [-42.6, 570.3, 720],
			'strut.lower': [-20, 625, 330],
			'steer.inner': [-150, 310, 194],
			'steer.outer': [-140, 670, 190],
			'wheel.centre': [0, 740, 299.971],
			'wheel.axis_inner': [-0.087, 640.01, 298.575],
			'spring.chassis': [-42.6, 570.3, 720],
			'spring.body': [-28.5, 606.8, 470]
		},
		spring_on: 'upright',
		tyre: { loaded_radius: 300 }
	}
};
