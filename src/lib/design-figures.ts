// The figures at design that a ride-height change moves, in display order: key, label, unit, decimals. Shared by the
// corner's and the car's ride-height pages. Client-safe.
export const DESIGN_FIGURE_ROWS: readonly (readonly [key: string, label: string, unit: string, decimals: number])[] = [
	['camber', 'Camber', '°', 3],
	['toe', 'Toe', '°', 3],
	['caster', 'Caster', '°', 2],
	['kpi', 'Kingpin inclination', '°', 2],
	['scrub_radius', 'Scrub radius', 'mm', 1],
	['trail', 'Trail', 'mm', 1],
	['rc_height', 'Roll-centre height', 'mm', 1],
	['anti_dive', 'Anti-dive', '%', 1],
	['anti_squat', 'Anti-squat', '%', 1],
	['motion_ratio', 'Motion ratio', '', 3],
	['wheel_centre_z', 'Wheel centre height', 'mm', 1]
];
