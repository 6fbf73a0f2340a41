// A starting solid rear axle for the page's editor: an invented four-link live axle (the points of
// fixtures/invented-solid-rear-axle.json and its Watt's variant), placed on the car's rear axle line. Demo-grade
// numbers, to be replaced by the car's measured points.
// Frame: ISO 8855 vehicle axes, x forward, y left, z up, mm; z = 0 the ground.
import type { SolidAxle, SolidLateral } from '$lib/schemas/solid-axle';
import { SOLID_LATERAL_POINTS } from '$lib/schemas/solid-axle';

type Pt = [number, number, number];

/** Points about the axle centre (x = 0 on the wheel centres' line). */
const COMMON: Record<string, Pt> = {
	'lower_left.chassis': [500, 560, 227.5],
	'lower_left.axle': [0, 560, 190],
	'lower_right.chassis': [500, -560, 227.5],
	'lower_right.axle': [0, -560, 190],
	'upper_left.chassis': [320, 470, 449.8],
	'upper_left.axle': [-10, 470, 430],
	'upper_right.chassis': [320, -470, 449.8],
	'upper_right.axle': [-10, -470, 430],
	'wheel_left.centre': [0, 740, 300],
	'wheel_left.axis_inner': [0, 640, 300],
	'wheel_right.centre': [0, -740, 300],
	'wheel_right.axis_inner': [0, -640, 300],
	'pinion.front': [260, 0, 312],
	'spring_left.chassis': [-60, 600, 640],
	'spring_left.axle': [-60, 600, 260],
	'spring_right.chassis': [-60, -600, 640],
	'spring_right.axle': [-60, -600, 260]
};

const LATERAL: Record<SolidLateral, Record<string, Pt>> = {
	panhard: { 'panhard.chassis': [-90, -580, 335], 'panhard.axle': [-90, 530, 305] },
	watt: {
		'watt.pivot': [-120, 0, 300],
		'watt.upper_end': [-120, 0, 380],
		'watt.lower_end': [-120, 0, 220],
		'watt.upper_chassis': [-120, -420, 380],
		'watt.lower_chassis': [-120, 420, 220]
	}
};

const shift = (points: Record<string, Pt>, x: number) => Object.fromEntries(Object.entries(points).map(([n, p]) => [n, [p[0] + x, p[1], p[2]] as Pt]));

/** The invented solid axle with its wheel centres at x = `axleX` (mm). */
export function solidTemplate(axleX: number, lateral: SolidLateral = 'panhard'): SolidAxle {
	return { kind: 'solid_axle', lateral, points: shift({ ...COMMON, ...LATERAL[lateral] }, axleX), tyre: { loaded_radius: 300 } };
}

/** The same axle with the other lateral locator: the old locator's points go, the new one's come from the template at the axle's x. */
export function withLateral(axle: SolidAxle, lateral: SolidLateral): SolidAxle {
	const points = { ...axle.points };
	for (const n of SOLID_LATERAL_POINTS[axle.lateral]) delete points[n];
	const x = (points['wheel_left.centre'][0] + points['wheel_right.centre'][0]) / 2;
	return { ...axle, lateral, points: { ...points, ...shift(LATERAL[lateral], x) } };
}
