// Seeds the invented demo team: three accounts (owner, engineer, viewer) and a demo car. Safe to run again.
// Usage: tsx scripts/seed.ts [DATABASE_URL]
import { eq } from 'drizzle-orm';
import { connect } from '../src/lib/server/db/connect';
import { cars, memberships, teams, users, type Role } from '../src/lib/server/db/schema';
import { hashPassword } from '../src/lib/server/auth/passwords';

export const DEMO_PASSWORD = 'linkwright-demo';
export const DEMO_TEAM_ID = '00000000-0000-4000-8000-00000000d3e0';
export const DEMO_CAR_ID = '00000000-0000-4000-8000-00000000ca01';
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
					name: 'Club racer demo',
					series: 'Invented club series, front-wheel drive',
					wheelbaseMm: 2400,
					cgHeightMm: 420,
					frontBrakeFraction: 0.65,
					driveLayout: 'fwd',
					notes: 'An invented car for trying Linkwright out. Its figures are made up.'
				})
				.onConflictDoNothing();
		});
	} finally {
		await client.end();
	}
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
