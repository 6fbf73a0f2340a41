// Seeds the invented demo team: three accounts (owner, engineer, viewer) and a demo car. Safe to run again.
// Usage: tsx scripts/seed.ts [DATABASE_URL]
import { readFileSync } from 'node:fs';
import { eq } from 'drizzle-orm';
import { connect, type Database } from '../src/lib/server/db/connect';
import { appendRevision, setBaseline } from '../src/lib/server/db/queries/corners';
import { appendCarRevision } from '../src/lib/server/db/queries/car-revisions';
import type { CarModel } from '../src/lib/schemas/car-model';
import { carRevisions, cars, corners, memberships, revisions, teams, users, type Role } from '../src/lib/server/db/schema';
import { hashPassword } from '../src/lib/server/auth/passwords';

export const DEMO_PASSWORD = 'linkwright-demo';
export const DEMO_TEAM_ID = '00000000-0000-4000-8000-00000000d3e0';
export const DEMO_CAR_ID = '00000000-0000-4000-8000-00000000ca01';
const DEMO_CAR_NOTES =
	'An invented small front-wheel-drive hillclimb car for trying Linkwright out; its figures are made up. The steering rack has to move up and back to clear a new exhaust header.';
export const DEMO_FRONT_LEFT_ID = '00000000-0000-4000-8000-0000000000f1';
export const DEMO_FRONT_RIGHT_ID = '00000000-0000-4000-8000-0000000000f2';

type Geometry = { name: string; points: Record<string, [number, number, number]>; [k: string]: unknown };

// The second invented demo car: a small rear-wheel-drive single-seater, pushrod front, five-link rear.
export const DEMO_SINGLE_SEATER_ID = '00000000-0000-4000-8000-00000000ca02';
// The third: an invented road car's semi-trailing rear, for a roll-centre change.
export const DEMO_ROAD_CAR_ID = '00000000-0000-4000-8000-00000000ca03';

/** Demo cars of the general model's kinds: each corner a stock revision (the baseline) and one proposed change. */
const MORE_CARS = [
	{
		id: DEMO_SINGLE_SEATER_ID,
		name: 'Single-seater demo car',
		series: 'Invented single-seater class, rear-wheel drive',
		wheelbaseMm: 2700,
		cgHeightMm: 300,
		frontBrakeFraction: 0.6,
		driveLayout: 'rwd',
		notes: 'An invented small single-seater: pushrod and rocker double wishbones at the front, five-link rear. Its figures are made up.',
		targets: [{ measure: 'motion_ratio', basis: 'value', min: 0.55, max: 0.8, from: -40, to: 40 }],
		corners: [
			{
				id: '00000000-0000-4000-8000-0000000002f1',
				position: 'front_left',
				kind: 'double_wishbone',
				steps: [
					{ file: 'single-seater-front-left-pushrod', label: 'stock', note: 'As drawn: pushrod to the lower wishbone, rocker on the chassis top.' },
					{ file: 'single-seater-front-left-pushrod-softer', label: 'rod end out 10 mm', note: 'Rod joint 10 mm further out on the rocker for a softer wheel rate with the same spring.' }
				]
			},
			{
				id: '00000000-0000-4000-8000-0000000002e1',
				position: 'rear_left',
				kind: 'multi_link',
				steps: [
					{ file: 'single-seater-rear-left-five-link', label: 'stock', note: 'Five-link rear as drawn; toe link on the gearbox side plate.' },
					{ file: 'single-seater-rear-left-five-link-toe-link-up', label: 'toe link up 8 mm', note: 'New side plate puts the toe link inner joint 8 mm higher: bump steer appears.' }
				]
			}
		]
	},
	{
		id: DEMO_ROAD_CAR_ID,
		name: 'Road car demo',
		series: 'Invented road car, rear-wheel drive',
		wheelbaseMm: 2600,
		cgHeightMm: 540,
		frontBrakeFraction: 0.72,
		driveLayout: 'rwd',
		notes: 'An invented road car with a semi-trailing arm rear; the owner wants a higher rear roll centre. Its figures are made up.',
		targets: [],
		corners: [
			{
				id: '00000000-0000-4000-8000-0000000003e1',
				position: 'rear_left',
				kind: 'semi_trailing',
				steps: [
					{ file: 'road-rear-left-semi-trailing', label: 'stock', note: 'As measured on the jig.' },
					{ file: 'road-rear-left-semi-trailing-inner-pivot-down', label: 'rear pivot down 15 mm', note: 'Lowering the rear (inboard) pivot 15 mm changes the arm axis: roll centre and toe curve move.' }
				]
			}
		]
	}
] as const;

/** A corner file from fixtures/. */
function kindFixture(name: string): Geometry {
	return JSON.parse(readFileSync(new URL(`../fixtures/${name}.json`, import.meta.url), 'utf8'));
}

/** A demo corner file from fixtures/demo. */
function fixture(name: string): Geometry {
	return JSON.parse(readFileSync(new URL(`../fixtures/demo/${name}.json`, import.meta.url), 'utf8'));
}

/** The same corner on the other side of the car (y → −y). */
function mirrored(g: Geometry, name: string): Geometry {
	const points = Object.fromEntries(Object.entries(g.points).map(([k, [x, y, z]]) => [k, [x, -y, z]])) as Geometry['points'];
	return { ...g, name, points };
}

// The invented demo story: the rack must move up and back to clear a new exhaust header.
const STORY = [
	{ file: 'front-left-stock', label: 'stock', note: 'As built, measured on the jig.' },
	{ file: 'front-left-rack-moved', label: 'rack moved', note: 'Rack 20 mm up and 15 mm back to clear the new exhaust header. Bump steer is far worse.' },
	{ file: 'front-left-partial-fix', label: 'spacer 12 mm', note: 'First try: 12 mm spacer under the outer tie-rod joint. About half the bump steer is gone.' }
];
export const DEMO_ACCOUNTS: { email: string; name: string; role: Role }[] = [
	{ email: 'owner@linkwright.test', name: 'Demo Owner', role: 'owner' },
	{ email: 'engineer@linkwright.test', name: 'Demo Engineer', role: 'engineer' },
	{ email: 'viewer@linkwright.test', name: 'Demo Viewer', role: 'viewer' }
];

/** Writes the demo team into the database at url. */
export async function seed(url: string) {
	const { db, client } = connect(url, 1);
	try {
		const passwordHash = await hashPassword(DEMO_PASSWORD);
		await db.transaction(async (tx) => {
			await tx.insert(teams).values({ id: DEMO_TEAM_ID, name: 'Demo Motorsport Club' }).onConflictDoNothing();
			for (const account of DEMO_ACCOUNTS) {
				await tx
					.insert(users)
					.values({ email: account.email, name: account.name, passwordHash })
					.onConflictDoUpdate({ target: users.email, set: { passwordHash } });
				const [user] = await tx.select({ id: users.id }).from(users).where(eq(users.email, account.email));
				await tx
					.insert(memberships)
					.values({ teamId: DEMO_TEAM_ID, userId: user.id, role: account.role })
					.onConflictDoUpdate({ target: [memberships.teamId, memberships.userId], set: { role: account.role } });
			}
			await tx
				.insert(cars)
				.values({
					id: DEMO_CAR_ID,
					teamId: DEMO_TEAM_ID,
					name: 'Hillclimb demo car',
					series: 'Invented hillclimb class, front-wheel drive',
					wheelbaseMm: 2400,
					cgHeightMm: 480,
					frontBrakeFraction: 0.7,
					driveLayout: 'fwd',
					notes: DEMO_CAR_NOTES,
					// The team's bump-steer target: toe change within ±0.10° over ±40 mm of travel.
					targets: [{ measure: 'toe', basis: 'change', min: -0.1, max: 0.1, from: -40, to: 40 }]
				})
				.onConflictDoUpdate({ target: cars.id, set: { name: 'Hillclimb demo car', notes: DEMO_CAR_NOTES } });
		});
		const engineer = (await db.select({ id: users.id }).from(users).where(eq(users.email, 'engineer@linkwright.test')))[0].id;
		await seedCorners(db, engineer);
		await seedMoreCars(db, engineer);
		await seedCarModel(db, engineer);
	} finally {
		await client.end();
	}
}

/** The demo car's front corners and their revisions, written once. */
async function seedCorners(db: Database, authorId: string) {
	await db
		.insert(corners)
		.values([
			{ id: DEMO_FRONT_LEFT_ID, carId: DEMO_CAR_ID, position: 'front_left', kind: 'double_wishbone' },
			{ id: DEMO_FRONT_RIGHT_ID, carId: DEMO_CAR_ID, position: 'front_right', kind: 'double_wishbone' }
		])
		.onConflictDoNothing();
	const existing = await db.select({ id: revisions.id }).from(revisions).where(eq(revisions.cornerId, DEMO_FRONT_LEFT_ID)).limit(1);
	if (existing.length) return;
	let parentId: string | null = null;
	let baseline: string | null = null;
	for (const step of STORY) {
		const geometry = fixture(step.file);
		const rev = await appendRevision(db, { cornerId: DEMO_FRONT_LEFT_ID, kind: 'double_wishbone', geometry, label: step.label, note: step.note, parentId, authorId });
		parentId = rev.id;
		baseline ??= rev.id;
	}
	await setBaseline(db, DEMO_FRONT_LEFT_ID, baseline);
	const right = mirrored(fixture('front-left-stock'), 'Hillclimb demo, front right, stock');
	const rev = await appendRevision(db, { cornerId: DEMO_FRONT_RIGHT_ID, kind: 'double_wishbone', geometry: right, label: 'stock', note: 'Mirror of the front left.', parentId: null, authorId });
	await setBaseline(db, DEMO_FRONT_RIGHT_ID, rev.id);
}

/** The demo cars of the general model's kinds, written once each. */
async function seedMoreCars(db: Database, authorId: string) {
	for (const car of MORE_CARS) {
		const { corners: list, ...fields } = car;
		await db
			.insert(cars)
			.values({ ...fields, teamId: DEMO_TEAM_ID, targets: [...fields.targets] as never })
			.onConflictDoNothing();
		for (const corner of list) {
			await db.insert(corners).values({ id: corner.id, carId: car.id, position: corner.position, kind: corner.kind }).onConflictDoNothing();
			const existing = await db.select({ id: revisions.id }).from(revisions).where(eq(revisions.cornerId, corner.id)).limit(1);
			if (existing.length) continue;
			let parentId: string | null = null;
			let baseline: string | null = null;
			for (const step of corner.steps) {
				const rev = await appendRevision(db, { cornerId: corner.id, kind: corner.kind, geometry: kindFixture(step.file), label: step.label, note: step.note, parentId, authorId });
				parentId = rev.id;
				baseline ??= rev.id;
			}
			await setBaseline(db, corner.id, baseline);
		}
	}
}

/**
 * The single-seater's car model: invented mass items, springs, a front anti-roll bar to the lower wishbone and the
 * steering; the car revision pins each corner's stock revision.
 */
export const DEMO_SINGLE_SEATER_MODEL: CarModel = {
	format: 'car-model/1',
	mass_items: [
		{ name: 'Chassis and bodywork', mass: 175, x: -1250, y: 0, z: 290 },
		{ name: 'Engine and gearbox', mass: 105, x: -1950, y: 0, z: 250 },
		{ name: 'Driver', mass: 72, x: -1150, y: 0, z: 240 },
		{ name: 'Fuel', mass: 28, x: -1500, y: 0, z: 200 },
		{ name: 'Ballast', mass: 10, x: -900, y: 0, z: 60 }
	],
	front: {
		unsprung_mass: 14,
		spring_rate: 90,
		tyre_rate: 250,
		right: 'mirror',
		steering: { rack_travel_per_turn: 60, rack_left_turn: '+y' },
		anti_roll_bar: { pivot: [-130, 420, 260], arm_end: [20, 420, 260], link_end: [20, 420, 112], link_on: 'lower', torsional_stiffness: 30 }
	},
	rear: { unsprung_mass: 16, spring_rate: 110, tyre_rate: 260, right: 'mirror', steering: null, anti_roll_bar: null },
	keep_out: [
		// invented: a 13-inch rim's barrel with 8 mm kept clear of the brake caliper's outer edge, and the gearbox casing
		{ shape: 'rim', name: 'Front rim barrel', axle: 'front', barrel_radius: 150, clearance: 8, inboard: 75, outboard: 60 },
		{ shape: 'box', name: 'Gearbox casing', min: [-2400, -170, 120], max: [-2050, 170, 330] }
	]
};
export const DEMO_CAR_REVISION_ID = '00000000-0000-4000-8000-0000000c0201';

/** The single-seater's first car revision, written once. */
async function seedCarModel(db: Database, authorId: string) {
	const existing = await db.select({ id: carRevisions.id }).from(carRevisions).where(eq(carRevisions.carId, DEMO_SINGLE_SEATER_ID)).limit(1);
	if (existing.length) return;
	const pins: Record<string, string> = {};
	for (const corner of MORE_CARS[0].corners) {
		const [first] = await db.select({ id: revisions.id }).from(revisions).where(eq(revisions.cornerId, corner.id)).orderBy(revisions.number).limit(1);
		pins[corner.position] = first.id;
	}
	await appendCarRevision(db, {
		id: DEMO_CAR_REVISION_ID,
		carId: DEMO_SINGLE_SEATER_ID,
		label: 'stock masses',
		note: 'Weighed with the driver seated and half a tank; ballast under the seat.',
		model: DEMO_SINGLE_SEATER_MODEL as unknown as Record<string, unknown>,
		cornerRevisions: pins,
		parentId: null,
		authorId
	});
}

if (process.argv[1]?.endsWith('seed.ts')) {
	const url = process.argv[2] ?? process.env.DATABASE_URL;
	if (!url) {
		console.error('usage: tsx scripts/seed.ts DATABASE_URL (or set DATABASE_URL)');
		process.exit(1);
	}
	await seed(url);
	console.log('[seed] demo team ready');
}
