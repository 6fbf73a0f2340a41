// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// Five-link: five rods, each with a ball joint at both ends, locate the upright; the fifth is the
// tie rod or toe link. The steering axis is virtual (contract: "More kinds (general model)").
import type { KindSpec, PointSpec } from './types';

/** Inner and outer joint of one link, with the trade's names as aliases. */
function link(key: string, words: string, x: number, aliases: readonly string[]): PointSpec[] {
	const [vert, fore] = key.split('_');
	return [
		{ name: `${key}.inner`, label: `${words} link, inner joint`, description: `Chassis joint of the ${words.toLowerCase()} link.`, body: 'chassis', diagram: [vert === 'upper' ? 36 + x : 28 + x, vert === 'upper' ? 34 + x : 78 + x], aliases: aliases.map((a) => `${a} inner`) },
		{ name: `${key}.outer`, label: `${words} link, outer joint`, description: `Upright joint of the ${words.toLowerCase()} link (${fore} of the pair).`, body: 'upright', diagram: [vert === 'upper' ? 68 + x : 74 + x, vert === 'upper' ? 32 + x : 80 + x], aliases: aliases.map((a) => `${a} outer`) }
	];
}

export const multiLink: KindSpec = {
	kind: 'multi_link',
	label: 'Five-link',
	summary: 'Five separate rods with a ball joint at each end (two upper, two lower, a tie rod or toe link) locate the upright; the steering axis is virtual.',
	points: [
		...link('upper_front', 'Upper front', 0, ['upper front link', 'upper forward link', 'ufl']),
		...link('upper_rear', 'Upper rear', 3, ['upper rear link', 'upper aft link', 'url']),
		...link('lower_front', 'Lower front', 0, ['lower front link', 'lower forward link', 'lfl']),
		...link('lower_rear', 'Lower rear', 3, ['lower rear link', 'lower aft link', 'lrl']),
		{ name: 'steer.inner', label: 'Tie rod or toe link, inner joint', description: 'Inner joint of the tie rod or toe link (on the rack when the corner steers).', body: 'rack', diagram: [30, 64], aliases: ['toe link inner', 'tie rod inner', 'track rod inner'] },
		{ name: 'steer.outer', label: 'Tie rod or toe link, outer joint', description: 'Outer joint of the tie rod or toe link on the upright.', body: 'upright', diagram: [70, 64], aliases: ['toe link outer', 'tie rod outer', 'track rod outer'] },
		{ name: 'wheel.centre', label: 'Wheel centre', description: "Centre of the wheel on its spin axis, in the wheel's centre plane.", body: 'upright', diagram: [84, 56], aliases: ['wheel center', 'hub centre'] },
		{ name: 'wheel.axis_inner', label: 'Spin axis, inner point', description: "Any point on the wheel's spin axis inboard of the centre; with the centre it sets static camber and toe.", body: 'upright', diagram: [76, 56], aliases: ['spin axis inner', 'hub inner'] }
	],
	joints: [
		{ type: 'rod', link: 'upper_front link', inner: 'upper_front.inner', outer: 'upper_front.outer' },
		{ type: 'rod', link: 'upper_rear link', inner: 'upper_rear.inner', outer: 'upper_rear.outer' },
		{ type: 'rod', link: 'lower_front link', inner: 'lower_front.inner', outer: 'lower_front.outer' },
		{ type: 'rod', link: 'lower_rear link', inner: 'lower_rear.inner', outer: 'lower_rear.outer' },
		{ type: 'rod', link: 'tie rod', inner: 'steer.inner', outer: 'steer.outer' }
	],
	steeringAxis: { type: 'virtual', lower: ['lower_front', 'lower_rear'], upper: ['upper_front', 'upper_rear'] },
	instantCentres: 'motion',
	springOn: ['upright'],
	rockerRodOn: ['upright'],
	steers: true,
	diagram: [
		['upper_front.inner', 'upper_front.outer'],
		['upper_rear.inner', 'upper_rear.outer'],
		['lower_front.inner', 'lower_front.outer'],
		['lower_rear.inner', 'lower_rear.outer'],
		['steer.inner', 'steer.outer'],
		['lower_front.outer', 'upper_front.outer']
	],
	// Invented: a small single-seater's rear left corner (toe link on the chassis).
	template: {
		points: {
			'upper_front.inner': [-2480, 280, 340],
			'upper_front.outer': [-2680, 560, 385],
			'upper_rear.inner': [-2860, 285, 350],
			'upper_rear.outer': [-2735, 560, 395],
			'lower_front.inner': [-2450, 230, 115],
			'lower_front.outer': [-2660, 580, 105],
			'lower_rear.inner': [-2850, 240, 90],
			'lower_rear.outer': [-2740, 585, 110],
			'steer.inner': [-2840, 218, 141],
			'steer.outer': [-2830, 590, 160],
			'wheel.centre': [-2700, 610, 279.904],
			'wheel.axis_inner': [-2700.174, 510.034, 277.286],
			'spring.chassis': [-2720, 260, 430],
			'spring.body': [-2705, 540, 150]
		},
		spring_on: 'upright',
		tyre: { loaded_radius: 280 },
		// invented: a pushrod to a rocker on the chassis, the spring lying across the car
		rocker: { points: { 'rocker.pivot_a': [-2675, 260, 470], 'rocker.pivot_b': [-2725, 260, 470], 'rocker.rod_end': [-2700, 340, 540], 'rocker.spring_end': [-2700, 210, 540], 'rocker.rod_outer': [-2700, 560, 160] }, rod_on: 'upright', spring_chassis: [-2700, 0, 390] }
	}
};
