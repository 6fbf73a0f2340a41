import { spawnSync } from 'node:child_process';
import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, test } from 'vitest';
import { cars, corners, revisions } from '../../src/lib/server/db/schema';
import { DEMO_TEAM_ID, closeDb, freshAccount, testDb } from './helpers';

afterAll(closeDb);

describe('the database script', () => {
	test('is idempotent: a second start reuses the running server', () => {
		const first = spawnSync('node', ['scripts/db.mjs', 'start'], { encoding: 'utf8' });
		const second = spawnSync('node', ['scripts/db.mjs', 'start'], { encoding: 'utf8' });
		expect(first.status).toBe(0);
		expect(second.status).toBe(0);
		expect(second.stdout).toContain('already running');
		expect(second.stdout).not.toContain('initdb');
	});

	test('listens on loopback only', () => {
		const status = spawnSync('node', ['scripts/db.mjs', 'status'], { encoding: 'utf8' });
		expect(status.stdout).toContain('running on 127.0.0.1:');
	});
});

/** The database's own message for a refused statement (Drizzle wraps it as the cause). */
async function refusal(statement: PromiseLike<unknown>): Promise<string> {
	try {
		await statement;
	} catch (e) {
		const err = e as { message: string; cause?: { message?: string; constraint_name?: string } };
		return `${err.cause?.message ?? ''} ${err.cause?.constraint_name ?? ''} ${err.message}`;
	}
	return 'accepted';
}

describe('schema rules', () => {
	/** Inserts a car, a corner and a first revision; returns the revision id and corner id. */
	async function revision() {
		const db = testDb();
		const [car] = await db.insert(cars).values({ teamId: DEMO_TEAM_ID, name: 'Schema test car' }).returning();
		const [corner] = await db.insert(corners).values({ carId: car.id, position: 'front_left', kind: 'strut' }).returning();
		const [rev] = await db
			.insert(revisions)
			.values({ cornerId: corner.id, number: 1, kind: 'strut', geometry: { format: 'corner-geometry/1' } })
			.returning();
		return { rev, corner, car };
	}

	test('a revision cannot be changed once written', async () => {
		const { rev } = await revision();
		expect(await refusal(testDb().update(revisions).set({ note: 'edited' }).where(eq(revisions.id, rev.id)))).toMatch(/immutable/);
	});

	test('two revisions of a corner cannot share a number', async () => {
		const { corner } = await revision();
		expect(await refusal(testDb().insert(revisions).values({ cornerId: corner.id, number: 1, kind: 'strut', geometry: {} }))).toMatch(/revisions_corner_number_key/);
	});

	test('a role outside owner/engineer/viewer is refused by a check constraint', async () => {
		const { user } = await freshAccount('role-check');
		expect(await refusal(testDb().execute(`insert into memberships (team_id, user_id, role) values ('${DEMO_TEAM_ID}', '${user.id}', 'admin')`))).toMatch(/memberships_role_check/);
	});

	test('a corner position outside the four is refused', async () => {
		const { car } = await revision();
		expect(await refusal(testDb().execute(`insert into corners (car_id, position, kind) values ('${car.id}', 'middle', 'strut')`))).toMatch(/corners_position_check/);
	});
});
