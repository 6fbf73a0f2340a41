// The route × role matrix, generated from the route tree: every +server.ts method, every page (GET) and every
// form action under src/routes, asked by nine principals, against the expected outcome in TABLE below.
// A route found in the tree without an entry in TABLE (or an entry for a route that is gone) fails the first test,
// so a new route cannot be forgotten. Writes are sent with an invalid body: a principal that passes the permission
// check gets a validation answer (400/415) and nothing is written, one that does not gets 401/303, 403 or 404.
// The rules follow DEVELOPERS.md ("How a request flows") and the OWASP ASVS 4.0 V4 access-control requirements:
// deny by default, another team's object is indistinguishable from a missing one (404).
import fs from 'node:fs';
import path from 'node:path';
import { eq, inArray, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { hashToken, newToken } from '../../src/lib/server/auth/tokens';
import { createAxleShareLink, createShareLink } from '../../src/lib/server/db/queries/shares';
import { createApiToken } from '../../src/lib/server/db/queries/users';
import { PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { encodePreview } from '../../src/lib/mesh/preview';
import { encodeTiles } from '../../src/lib/mesh/tiles';
import { explorations, revisions, scans, studies, users } from '../../src/lib/server/db/schema';
import { Client, DEMO_CAR_ID, DEMO_TEAM_ID, baseUrl, closeDb, freshAccount, testDb } from './helpers';

const FRONT_LEFT = '00000000-0000-4000-8000-0000000000f1';
/** The single-seater's seeded car revision (scripts/seed.ts, DEMO_CAR_REVISION_ID), of the demo team. */
const DEMO_CAR_REVISION = '00000000-0000-4000-8000-0000000c0201';
const PRINCIPALS = ['anonymous', 'viewer', 'engineer', 'owner', 'outsider', 'token:viewer', 'token:engineer', 'token:owner', 'share-holder'] as const;
type Principal = (typeof PRINCIPALS)[number];

/**
 * Outcomes: ok = allowed (GET 2xx; a write with a bad body 400/415, or 2xx/303 elsewhere than sign-in),
 * signin = API 401 / page 303 to /signin, forbidden = 403, hidden = 404, gone = 410, redirect = 3xx elsewhere (signed-in users
 * sent away from sign-in pages).
 */
type Outcome = 'ok' | 'signin' | 'forbidden' | 'hidden' | 'gone' | 'redirect';

/** Per principal in PRINCIPALS order; single letters keep the table readable. */
const O: Record<string, Outcome> = { o: 'ok', s: 'signin', f: 'forbidden', h: 'hidden', g: 'gone', r: 'redirect' };
const row = (letters: string) => {
	if (letters.length !== PRINCIPALS.length) throw new Error(`a row needs ${PRINCIPALS.length} letters: ${letters}`);
	return rowOf(letters);
};
const rowOf = (letters: string) => Object.fromEntries(PRINCIPALS.map((p, i) => [p, O[letters[i]]])) as Record<Principal, Outcome>;

// The recurring rules, as letters for: anonymous viewer engineer owner outsider token:viewer token:engineer token:owner share-holder
const TEAM_VIEW = 'sooohooos'; // an object of the demo team, read
const TEAM_EDIT = 'sfoohfoos'; // written by engineer/owner; viewer 403; another team 404
const TEAM_SHARE = TEAM_EDIT; // share links: engineer and owner
const OWN_VIEW = 'sooooooos'; // the caller's own current team, read (another team's owner reads their own)
const OWN_EDIT = 'sfooofoos'; // the caller's own team, write
const OWN_MANAGE = 'sffooffos'; // owners only, of their own team
const SIGNED_IN = 'sooooooos'; // any signed-in caller
const PUBLIC = 'ooooooooo';
const GUEST_PAGE = 'orrrrrrro'; // sign-in and sign-up: a signed-in caller is sent on
const DEMO_ONLY = PUBLIC; // /dev/*: demo mode is on in tests (LW_DEMO=true); off, they are 404 (hardening.spec.ts)
const NOT_FOUND = 'hhhhhhhhh';
const GONE = 'ggggggggg';
const SHARE_HOLDER = PUBLIC; // /s/{token}: the token is the permission

/** Query strings that GET entries need to be answered 200 by an allowed caller. */
const QUERIES: Record<string, string> = {
	'GET /api/v1/scans/[scanId=id]/patch': '?x=0&y=0&z=0&r=0.2'
};

/** Every route entry of the tree: "METHOD /route/id" and "POST /route/id ?/action". */
const TABLE: Record<string, string> = {
	'GET /': OWN_VIEW,
	'GET /account': SIGNED_IN,
	'POST /account ?/createToken': SIGNED_IN,
	'POST /account ?/revokeToken': SIGNED_IN,
	'POST /account ?/setUnit': SIGNED_IN,
	// Ends every session of the caller and sends the browser to sign in: refused or done, the answer is the sign-in page.
	// Run after everything else (it signs the demo accounts out).
	'POST /account ?/signOutEverywhere': 'sssssssss',
	'GET /api/v1/cars': OWN_VIEW,
	// The team comes from the body, so the body is read before the team's permission: a viewer's invalid body is a
	// 400 like anyone's (a viewer's valid one is 403: cars-api.spec.ts, "a viewer gets 403 creating a car").
	'POST /api/v1/cars': SIGNED_IN,
	'GET /api/v1/cars/[carId=id]': TEAM_VIEW,
	'PATCH /api/v1/cars/[carId=id]': TEAM_EDIT,
	'GET /api/v1/cars/[carId=id]/corners': TEAM_VIEW,
	'POST /api/v1/cars/[carId=id]/corners': TEAM_EDIT,
	'GET /api/v1/cars/[carId=id]/revisions': TEAM_VIEW,
	'POST /api/v1/cars/[carId=id]/revisions': TEAM_EDIT,
	'GET /api/v1/car-revisions/[carRevisionId=id]': TEAM_VIEW,
	'GET /api/v1/car-revisions/[carRevisionId=id]/axles/[axle=axle]': TEAM_VIEW,
	'GET /api/v1/car-revisions/[carRevisionId=id]/pitch': TEAM_VIEW,
	'GET /api/v1/car-revisions/[carRevisionId=id]/shares': TEAM_SHARE,
	'POST /api/v1/car-revisions/[carRevisionId=id]/shares': TEAM_SHARE,
	'GET /api/v1/car-revisions/[carRevisionId=id]/changes': TEAM_VIEW,
	'PUT /api/v1/corners/[cornerId=id]/baseline': TEAM_EDIT,
	'POST /api/v1/corners/[cornerId=id]/import': TEAM_EDIT,
	'GET /api/v1/corners/[cornerId=id]/revisions': TEAM_VIEW,
	'POST /api/v1/corners/[cornerId=id]/revisions': TEAM_EDIT,
	'GET /api/v1/corners/[cornerId=id]/studies': TEAM_VIEW,
	'POST /api/v1/corners/[cornerId=id]/studies': TEAM_EDIT,
	'GET /api/v1/corners/[cornerId=id]/studies/[studyId=id]/tolerances': TEAM_VIEW,
	'PUT /api/v1/corners/[cornerId=id]/studies/[studyId=id]/tolerances': TEAM_EDIT,
	'GET /api/v1/revisions/[revisionId=id]': TEAM_VIEW,
	'GET /api/v1/revisions/[revisionId=id]/export': TEAM_VIEW,
	// Running an analysis is read-only (any member); storing it needs edit (checked after the body is read).
	'POST /api/v1/revisions/[revisionId=id]/fix-search': TEAM_VIEW,
	'POST /api/v1/revisions/[revisionId=id]/moves': TEAM_EDIT,
	// Design-space exploration: starting one is a write (rows and queued jobs); its results are read by any member.
	'POST /api/v1/revisions/[revisionId=id]/explore': TEAM_EDIT,
	'GET /api/v1/explorations/[explorationId=id]': TEAM_VIEW,
	// server-sent events; the matrix's exploration is finished, so the stream sends its state once and ends
	'GET /api/v1/explorations/[explorationId=id]/events': TEAM_VIEW,
	'POST /api/v1/explorations/[explorationId=id]/cancel': TEAM_EDIT,
	'GET /api/v1/explorations/[explorationId=id]/variants': TEAM_VIEW,
	'GET /api/v1/explorations/[explorationId=id]/pareto': TEAM_VIEW,
	'GET /api/v1/explorations/[explorationId=id]/matrix': TEAM_VIEW,
	'POST /api/v1/explorations/[explorationId=id]/save': TEAM_EDIT,
	'POST /api/v1/revisions/[revisionId=id]/sensitivity': TEAM_VIEW,
	'POST /api/v1/revisions/[revisionId=id]/ride-height': TEAM_VIEW,
	'POST /api/v1/revisions/[revisionId=id]/joint-angles': TEAM_VIEW,
	'GET /api/v1/corners/[cornerId=id]/joint-limits': TEAM_VIEW,
	'PUT /api/v1/corners/[cornerId=id]/joint-limits': TEAM_EDIT,
	'GET /corners/[cornerId=id]/joints': TEAM_VIEW,
	'POST /api/v1/revisions/[revisionId=id]/map': TEAM_VIEW,
	'GET /corners/[cornerId=id]/maps': TEAM_VIEW,
	'GET /corners/[cornerId=id]/report': TEAM_VIEW,
	'POST /api/v1/cars/[carId=id]/ride-height': TEAM_VIEW,
	'GET /cars/[carId=id]/ride-height': TEAM_VIEW,
	'GET /corners/[cornerId=id]/ride-height': TEAM_VIEW,
	'GET /api/v1/revisions/[revisionId=id]/shares': TEAM_SHARE,
	'POST /api/v1/revisions/[revisionId=id]/shares': TEAM_SHARE,
	'GET /api/v1/revisions/[revisionId=id]/solve': TEAM_VIEW,
	'POST /api/v1/revisions/[revisionId=id]/tolerance-study': TEAM_VIEW,
	'DELETE /api/v1/shares/[shareId=id]': TEAM_SHARE,
	// scans: team data under the revisions' rules (each request gets a fresh scan, since DELETE removes it)
	'GET /api/v1/cars/[carId=id]/scans': TEAM_VIEW,
	'POST /api/v1/cars/[carId=id]/scans': TEAM_EDIT,
	'GET /api/v1/scans/[scanId=id]': TEAM_VIEW,
	'DELETE /api/v1/scans/[scanId=id]': TEAM_EDIT,
	'POST /api/v1/scans/[scanId=id]/complete': TEAM_EDIT,
	// no body: allowed callers get 400 (the scan is ready, not uploading)
	'POST /api/v1/scans/[scanId=id]/cancel': TEAM_EDIT,
	'GET /api/v1/scans/[scanId=id]/preview': TEAM_VIEW,
	'GET /api/v1/scans/[scanId=id]/patch': TEAM_VIEW,
	'PUT /api/v1/scans/[scanId=id]/alignment': TEAM_EDIT,
	'POST /api/v1/scans/[scanId=id]/capture': TEAM_EDIT,
	'GET /scans/[scanId=id]': TEAM_VIEW,
	'POST /api/v1/solve': SIGNED_IN,
	'GET /cars/[carId=id]': TEAM_VIEW,
	'POST /cars/[carId=id] ?/addTarget': TEAM_EDIT,
	'POST /cars/[carId=id] ?/removeTarget': TEAM_EDIT,
	'POST /cars/[carId=id] ?/addCorner': TEAM_EDIT,
	'GET /cars/[carId=id]/edit': TEAM_EDIT,
	'GET /cars/[carId=id]/model': TEAM_VIEW,
	'POST /cars/[carId=id]/model ?/save': TEAM_EDIT,
	'POST /cars/[carId=id]/edit': TEAM_EDIT,
	'GET /cars/new': OWN_EDIT,
	'POST /cars/new': OWN_EDIT,
	'GET /corners/[cornerId=id]': TEAM_VIEW,
	'POST /corners/[cornerId=id] ?/save': TEAM_EDIT,
	'POST /corners/[cornerId=id] ?/baseline': TEAM_EDIT,
	'GET /corners/[cornerId=id]/compare': TEAM_VIEW,
	'GET /corners/[cornerId=id]/fix': TEAM_VIEW,
	'GET /corners/[cornerId=id]/explore': TEAM_VIEW,
	'GET /corners/[cornerId=id]/import': TEAM_EDIT,
	'GET /corners/[cornerId=id]/tolerance': TEAM_VIEW,
	'GET /dev/charts': DEMO_ONLY,
	'GET /dev/linkage': DEMO_ONLY,
	'GET /dev/mail': DEMO_ONLY,
	'GET /dev/mail/[messageId]': NOT_FOUND, // no such message
	'GET /dev/mail/messages.json': DEMO_ONLY,
	'GET /docs/api': PUBLIC,
	'GET /healthz': PUBLIC,
	// An unknown invitation or reset token (the matrix has none): 404, and 410 for a reset link (used or expired).
	'GET /invite/[token=token]': NOT_FOUND,
	'POST /invite/[token=token] ?/join': NOT_FOUND,
	'POST /invite/[token=token] ?/create': NOT_FOUND,
	'GET /password/forgot': PUBLIC,
	'POST /password/forgot': PUBLIC,
	'GET /password/reset/[token=token]': GONE,
	'POST /password/reset/[token=token]': GONE,
	'GET /revisions/[revisionId=id]': TEAM_VIEW,
	'POST /revisions/[revisionId=id] ?/createShare': TEAM_SHARE,
	'POST /revisions/[revisionId=id] ?/revokeShare': TEAM_SHARE,
	'GET /s/[token=token]': SHARE_HOLDER,
	'GET /s/[token=token]/csv': SHARE_HOLDER,
	'GET /s/axle/[token=token]': SHARE_HOLDER,
	'GET /s/axle/[token=token]/csv': SHARE_HOLDER,
	'GET /signin': GUEST_PAGE,
	'POST /signin': PUBLIC,
	'GET /signout': PUBLIC,
	'POST /signout': PUBLIC,
	'GET /signup': GUEST_PAGE,
	'POST /signup': PUBLIC,
	'GET /team/audit': OWN_MANAGE,
	'GET /team/members': OWN_MANAGE,
	'POST /team/members ?/invite': OWN_MANAGE,
	'POST /team/members ?/resend': OWN_MANAGE,
	'POST /team/members ?/cancel': OWN_MANAGE,
	'POST /team/members ?/role': OWN_MANAGE,
	'POST /team/members ?/remove': OWN_MANAGE,
	'POST /teams/switch': SIGNED_IN
};

/** Form actions for which an empty form is valid: an invalid one instead, so the matrix writes nothing. */
const INVALID_FORMS: Record<string, string> = {
	'POST /revisions/[revisionId=id] ?/createShare': 'expiresInDays=0',
	'POST /cars/[carId=id] ?/removeTarget': 'index=999'
};

const ROUTES = path.resolve('src/routes');

/** The entries of the route tree: pages (GET), their form actions, and +server.ts methods. */
function routeTree(): string[] {
	const found: string[] = [];
	const walk = (dir: string) => {
		for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
			if (entry.isDirectory()) walk(path.join(dir, entry.name));
		}
		const id = '/' + path.relative(ROUTES, dir).split(path.sep).filter(Boolean).join('/');
		const read = (f: string) => (fs.existsSync(path.join(dir, f)) ? fs.readFileSync(path.join(dir, f), 'utf8') : null);
		if (read('+page.svelte') !== null) found.push(`GET ${id}`);
		const server = read('+page.server.ts');
		const actionsAt = server?.indexOf('export const actions') ?? -1;
		if (server && actionsAt >= 0) {
			const block = server.slice(actionsAt);
			const names = [...block.matchAll(/^\t(\w+): (?:async )?\(?/gm)].map((m) => m[1]);
			if (/\{\s*default:/.test(block)) names.push('default');
			for (const name of new Set(names)) found.push(name === 'default' ? `POST ${id}` : `POST ${id} ?/${name}`);
		}
		const endpoint = read('+server.ts');
		if (endpoint) {
			for (const m of endpoint.matchAll(/export (?:const|async function|function) (GET|POST|PUT|PATCH|DELETE)\b/g)) found.push(`${m[1]} ${id}`);
		}
	};
	walk(ROUTES);
	return found.sort();
}

describe('the route tree and the table', () => {
	test('every route of the tree has an entry, and every entry a route', () => {
		const tree = routeTree();
		expect(tree.length).toBeGreaterThan(60);
		expect(tree.filter((r) => !(r in TABLE)), 'routes without an entry in TABLE').toEqual([]);
		expect(Object.keys(TABLE).filter((r) => !tree.includes(r)), 'entries for routes that are gone').toEqual([]);
	});
});

interface Ids {
	revisionId: string;
	studyId: string;
	explorationId: string;
	shareToken: string;
	axleShareToken: string;
	tokens: Record<'viewer' | 'engineer' | 'owner', string>;
}

describe('route × role', () => {
	const clients = {} as Record<'viewer' | 'engineer' | 'owner' | 'outsider', Client>;
	const ids = {} as Ids;

	beforeAll(async () => {
		const db = testDb();
		for (const role of ['viewer', 'engineer', 'owner'] as const) {
			clients[role] = new Client();
			await clients[role].signIn(`${role}@linkwright.test`);
		}
		clients.outsider = (await freshAccount('matrix-outsider')).client;
		const demoUsers = await db.select().from(users).where(inArray(users.email, ['viewer@linkwright.test', 'engineer@linkwright.test', 'owner@linkwright.test']));
		ids.tokens = {} as Ids['tokens'];
		for (const u of demoUsers) {
			const token = newToken('lw_');
			await createApiToken(db, u.id, 'matrix', hashToken(token));
			ids.tokens[u.email.split('@')[0] as 'viewer'] = token;
		}
		const [rev] = await db.select().from(revisions).where(eq(revisions.cornerId, FRONT_LEFT)).limit(1);
		ids.revisionId = rev.id;
		const [study] = await db.insert(studies).values({ cornerId: FRONT_LEFT, name: 'Matrix study', settings: {}, results: {} }).returning();
		ids.studyId = study.id;
		const spec = { plan: 'lhs', coords: [{ point: 'steer.inner', axis: 2, from: -5, to: 5 }], variants: 10, levels: 5, seed: 1, grid: { from: -40, to: 40, step: 2 } };
		const [exploration] = await db.insert(explorations).values({ cornerId: FRONT_LEFT, revisionId: rev.id, spec, variants: 10, chunkSize: 2000, chunks: 1, status: 'done' }).returning();
		ids.explorationId = exploration.id;
		ids.shareToken = newToken();
		await createShareLink(db, { teamId: DEMO_TEAM_ID, revisionId: rev.id, tokenHash: hashToken(ids.shareToken), note: '', showRevisionNote: false, expiresAt: new Date(Date.now() + 86400_000), createdBy: demoUsers[0].id });
		ids.axleShareToken = newToken();
		await createAxleShareLink(db, { teamId: DEMO_TEAM_ID, carRevisionId: DEMO_CAR_REVISION, axle: 'front', tokenHash: hashToken(ids.axleShareToken), note: '', showRevisionNote: false, expiresAt: new Date(Date.now() + 86400_000), createdBy: demoUsers[0].id });
	});

	afterAll(closeDb);

	/** A fresh share link of the demo team (DELETE revokes it, so each request gets its own). */
	async function freshShareId() {
		const [u] = await testDb().select().from(users).where(eq(users.email, 'owner@linkwright.test'));
		const link = await createShareLink(testDb(), { teamId: DEMO_TEAM_ID, revisionId: ids.revisionId, tokenHash: hashToken(newToken()), note: '', showRevisionNote: false, expiresAt: new Date(Date.now() + 86400_000), createdBy: u.id });
		return link.id;
	}

	/** A fresh ready scan of the demo car's front left with a one-triangle preview and its points in the bucket (the local fake). */
	async function freshScanId() {
		const id = crypto.randomUUID();
		const objectKey = `teams/${DEMO_TEAM_ID}/scans/${id}/original.stl`;
		const previewKey = `${objectKey}.preview.lwpv`;
		const s3 = new S3Client({ endpoint: process.env.S3_ENDPOINT, region: process.env.S3_REGION ?? 'us-east-1', forcePathStyle: true, credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID ?? 'S3RVER', secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? 'S3RVER' } });
		const body = encodePreview({ positions: new Float32Array([0, 0, 0, 1, 0, 0, 0, 1, 0]), indices: new Uint32Array([0, 1, 2]), bounds: { min: [0, 0, 0], max: [1, 1, 0] } });
		await s3.send(new PutObjectCommand({ Bucket: process.env.S3_BUCKET ?? 'linkwright-scans', Key: previewKey, Body: body }));
		await s3.send(new PutObjectCommand({ Bucket: process.env.S3_BUCKET ?? 'linkwright-scans', Key: `${objectKey}.points.lwpt`, Body: encodeTiles(new Float32Array([0, 0, 0, 1, 0, 0, 0, 1, 0])) }));
		await testDb().insert(scans).values({ id, carId: DEMO_CAR_ID, cornerId: FRONT_LEFT, name: 'matrix.stl', format: 'stl', sizeBytes: 84, objectKey, previewKey, status: 'ready', unit: 'mm', stats: { triangles: 1 } });
		return id;
	}

	/** The concrete path of a route id with the demo team's objects. */
	async function concrete(routeId: string) {
		const values: Record<string, string | (() => Promise<string>)> = {
			'[carId=id]': DEMO_CAR_ID,
			'[cornerId=id]': FRONT_LEFT,
			'[carRevisionId=id]': DEMO_CAR_REVISION,
			'[axle=axle]': 'front',
			'[revisionId=id]': ids.revisionId,
			'[studyId=id]': ids.studyId,
			'[explorationId=id]': ids.explorationId,
			'[shareId=id]': freshShareId,
			'[scanId=id]': freshScanId,
			'[messageId]': 'no-such-message',
			'[token=token]': routeId.startsWith('/s/axle/') ? ids.axleShareToken : routeId.startsWith('/s/') ? ids.shareToken : newToken()
		};
		let out = routeId;
		for (const [param, value] of Object.entries(values)) {
			if (out.includes(param)) out = out.replace(param, typeof value === 'function' ? await value() : value);
		}
		return out;
	}

	/** Sends one entry as one principal; returns status and Location. */
	async function ask(entry: string, who: Principal) {
		const [method, routeId, action] = entry.split(' ');
		const target = (await concrete(routeId)) + (action ?? QUERIES[entry] ?? '');
		const isApi = routeId.startsWith('/api/');
		const headers: Record<string, string> = {};
		let body: string | undefined;
		if (method !== 'GET') {
			// An invalid body: a JSON array for the API (every schema wants an object), an empty form for actions.
			headers['content-type'] = isApi ? 'application/json' : 'application/x-www-form-urlencoded';
			// A browser's form post (not SvelteKit's enhanced JSON answer): real statuses and redirects.
			if (!isApi) headers.accept = 'text/html';
			body = isApi ? '[]' : (INVALID_FORMS[entry] ?? '');
		}
		if (who.startsWith('token:')) headers.authorization = `Bearer ${ids.tokens[who.slice(6) as 'viewer']}`;
		let res: Response;
		if (who in clients) res = await clients[who as keyof typeof clients].fetch(target, { method, headers, body });
		else {
			if (method !== 'GET' && !who.startsWith('token:')) headers.origin = baseUrl();
			res = await fetch(baseUrl() + target, { method, headers, body, redirect: 'manual' });
		}
		await res.arrayBuffer();
		return { status: res.status, location: res.headers.get('location') ?? '' };
	}

	/** The outcome class of an answer. */
	function outcome(entry: string, status: number, location: string): Outcome | `status ${number}` {
		const write = !entry.startsWith('GET ');
		if (status === 401 || ((status === 303 || status === 302) && location.startsWith('/signin'))) return 'signin';
		if (status === 403) return 'forbidden';
		if (status === 404) return 'hidden';
		if (status === 410) return 'gone';
		if (status >= 200 && status < 300) return 'ok';
		if (write && (status === 400 || status === 415 || status === 303 || status === 302)) return 'ok';
		if (status >= 300 && status < 400) return 'redirect';
		return `status ${status}`;
	}

	/** The demo team's rows the matrix must leave as they were (share links excepted: DELETE gets fresh ones). */
	async function demoState() {
		const db = testDb();
		const [row] = await db.execute<Record<string, unknown>>(sql`select
			(select count(*) from cars where team_id = ${DEMO_TEAM_ID})::int as cars,
			(select count(*) from corners c join cars k on k.id = c.car_id where k.team_id = ${DEMO_TEAM_ID})::int as corners,
			(select count(*) from revisions r join corners c on c.id = r.corner_id join cars k on k.id = c.car_id where k.team_id = ${DEMO_TEAM_ID})::int as revisions,
			(select count(*) from invitations where team_id = ${DEMO_TEAM_ID})::int as invitations,
			(select count(*) from memberships where team_id = ${DEMO_TEAM_ID})::int as memberships,
			(select targets from cars where id = ${DEMO_CAR_ID}) as targets,
			(select baseline_revision_id from corners where id = ${FRONT_LEFT}) as baseline`);
		return JSON.stringify(row);
	}

	test('every entry answers every principal as the table says (the sign-outs last)', { timeout: 240_000 }, async () => {
		const before = await demoState();
		const last = (e: string) => (e.includes('signOutEverywhere') ? 2 : e.includes('/signout') ? 1 : 0);
		const entries = routeTree().sort((a, b) => last(a) - last(b));
		const wrong: string[] = [];
		let asked = 0;
		for (const entry of entries) {
			const expected = row(TABLE[entry]);
			for (const who of PRINCIPALS) {
				const { status, location } = await ask(entry, who);
				asked++;
				const got = outcome(entry, status, location);
				if (status >= 500 || got !== expected[who]) wrong.push(`${entry} as ${who}: expected ${expected[who]}, got ${got} (${status}${location ? ` → ${location}` : ''})`);
			}
		}
		expect(asked).toBeGreaterThan(600);
		expect(wrong).toEqual([]);
		// Invalid bodies only: the demo team's cars, corners, revisions, targets, baseline and members are untouched.
		expect(await demoState()).toBe(before);
	});
});
