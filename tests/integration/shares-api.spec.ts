// Share links over HTTP: create, list, mail, open signed out, CSV, revoke, expiry, permissions, rate limit,
// and that a token opens exactly one revision and nothing else.
import { readFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { eq, and } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { auditEvents, shareLinks, studies } from '../../src/lib/server/db/schema';
import { Client, closeDb, freshAccount, testDb } from './helpers';

const stock = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
// The proposal: the rack's inner tie-rod joint 20 mm up and 15 mm back (x −15, z +20); nothing else moves.
const moved = structuredClone(stock);
moved.points['steer.inner'] = [stock.points['steer.inner'][0] - 15, stock.points['steer.inner'][1], stock.points['steer.inner'][2] + 20];

const engineer = new Client();
const viewer = new Client();
let cornerId = '';
let stockId = '';
let movedId = '';

/** The token part of a share URL. */
const tokenOf = (url: string) => new URL(url).pathname.split('/')[2];

/** A fresh link to the moved revision as the engineer; returns the API's answer. */
async function share(body: Record<string, unknown> = {}, revisionId = movedId) {
	const res = await engineer.json(`/api/v1/revisions/${revisionId}/shares`, 'POST', body);
	expect(res.status).toBe(201);
	return (await res.json()) as { id: string; url: string; expiresAt: string; mail: { to: string; sent: boolean; message?: string } | null };
}

/** The path of a share URL on the test server. */
const pathOf = (url: string) => new URL(url).pathname;

beforeAll(async () => {
	await engineer.signIn('engineer@linkwright.test');
	await viewer.signIn('viewer@linkwright.test');
	const car = await (await engineer.json('/api/v1/cars', 'POST', { name: 'Sharing test car' })).json();
	const corner = await engineer.json(`/api/v1/cars/${car.id}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' });
	cornerId = (await corner.json()).id;
	stockId = (await (await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'stock', note: '', geometry: stock })).json()).id;
	movedId = (await (await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'rack moved', note: '', geometry: moved })).json()).id;
	expect((await engineer.json(`/api/v1/corners/${cornerId}/baseline`, 'PUT', { revisionId: stockId })).status).toBe(200);
});
afterAll(closeDb);

describe('creating a link', () => {
	test('answers 201 with id, url and an expiry 30 days out by default; only a SHA-256 hash of a 256-bit token is stored', async () => {
		const before = Date.now();
		const created = await share({ note: 'Weld the new rack brackets' });
		const token = tokenOf(created.url);
		expect(created.url).toMatch(/\/s\/[A-Za-z0-9_-]{43}$/);
		// 43 URL-safe base64 characters carry 258 bits, of which 256 are the random bytes (RFC 4648 §5).
		expect(Buffer.from(token, 'base64url')).toHaveLength(32);
		const days = (Date.parse(created.expiresAt) - before) / 86_400_000;
		expect(days).toBeGreaterThan(29.99);
		expect(days).toBeLessThan(30.01);
		const [row] = await testDb().select().from(shareLinks).where(eq(shareLinks.id, created.id));
		expect(row.tokenHash).toBe(createHash('sha256').update(token).digest('hex'));
		expect(JSON.stringify(row)).not.toContain(token);
	});

	test('bad input is refused naming the field', async () => {
		const days = await engineer.json(`/api/v1/revisions/${movedId}/shares`, 'POST', { expiresInDays: 0 });
		expect(days.status).toBe(400);
		expect((await days.json()).error.field).toBe('expiresInDays');
		const mail = await engineer.json(`/api/v1/revisions/${movedId}/shares`, 'POST', { email: 'not an address' });
		expect(mail.status).toBe(400);
		expect((await mail.json()).error.field).toBe('email');
	});

	test('a viewer gets 403 to create, list and revoke; another team gets 404', async () => {
		const link = await share();
		expect((await viewer.json(`/api/v1/revisions/${movedId}/shares`, 'POST', {})).status).toBe(403);
		expect((await viewer.fetch(`/api/v1/revisions/${movedId}/shares`)).status).toBe(403);
		expect((await viewer.fetch(`/api/v1/shares/${link.id}`, { method: 'DELETE' })).status).toBe(403);
		const stranger = await freshAccount('stranger');
		expect((await stranger.client.json(`/api/v1/revisions/${movedId}/shares`, 'POST', {})).status).toBe(404);
		expect((await stranger.client.fetch(`/api/v1/shares/${link.id}`, { method: 'DELETE' })).status).toBe(404);
		expect((await new Client().json(`/api/v1/revisions/${movedId}/shares`, 'POST', {})).status).toBe(401);
	});
});

describe('the mailed link', () => {
	test('arrives in the fake SMTP server with a plain-text and an HTML part holding the link', async () => {
		const to = `fabricator-${Date.now()}@example.test`;
		const created = await share({ email: to, note: 'Brackets for the new rack' });
		expect(created.mail).toEqual({ to, sent: true });
		const { messages } = await (await new Client().fetch(`/dev/mail/messages.json?to=${encodeURIComponent(to)}`)).json();
		expect(messages).toHaveLength(1);
		expect(messages[0].subject).toContain('Sharing test car');
		expect(messages[0].text).toContain(created.url);
		expect(messages[0].text).toContain('Brackets for the new rack');
		expect(messages[0].html).toContain(`href="${created.url}"`);
	});

	test('a refused address keeps the link and says so', async () => {
		const created = await share({ email: 'nobody@fail.example.test' });
		expect(created.mail).toMatchObject({ sent: false, message: expect.stringContaining('refused the address nobody@fail.example.test') });
		expect(created.mail!.message).toContain('The link was created');
		expect((await new Client().fetch(pathOf(created.url))).status).toBe(200);
	});
});

describe('opening a link signed out', () => {
	test('shows the coordinates at 0.1 mm, the moves from the baseline, units, frame and the caution, and no team links', async () => {
		const created = await share({ note: 'Weld the new rack brackets' });
		const res = await new Client().fetch(pathOf(created.url));
		expect(res.status).toBe(200);
		expect(res.headers.get('referrer-policy')).toBe('no-referrer');
		const html = await res.text();
		for (const [x, y, z] of Object.values(moved.points) as [number, number, number][]) {
			for (const v of [x, y, z]) expect(html).toContain(`>${(Math.round(v * 10) / 10).toFixed(1)}<`);
		}
		// steer.inner moved x −15, z +20 from the baseline (set up above), the rest is unchanged.
		expect(html).toMatch(/data-point="steer\.inner"[\s\S]*?>-15\.0<[\s\S]*?>0\.0<[\s\S]*?>\+20\.0</);
		expect(html).toContain('1 point moved from the baseline r1');
		expect(html).toContain('25.0 mm'); // √(15² + 20²) = 25
		expect(html).toContain('ISO 8855');
		expect(html).toContain('millimetres');
		expect(html).toContain('Weld the new rack brackets');
		expect(html).toContain('Structural and welded changes are for qualified fabricators');
		expect(html).not.toMatch(/href="\/(cars|corners|revisions|team|api|account|signin|signup|docs)?["/?]/);
		expect(html).not.toContain('Demo Motorsport Club');
	});

	test('the CSV holds the same table, through the token only', async () => {
		const created = await share();
		const res = await new Client().fetch(`${pathOf(created.url)}/csv`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toContain('text/csv');
		const lines = (await res.text()).trim().split('\r\n');
		expect(lines[0]).toBe('point,description,x_mm,y_mm,z_mm,dx_mm,dy_mm,dz_mm');
		expect(lines).toContain('steer.inner,"Tie rod, inner joint",-145.0,358.0,196.0,-15.0,0.0,20.0');
		expect(lines).toContain('lower.front,"Lower arm, front pivot",180.0,335.0,127.0,,,');
		expect(lines).toHaveLength(1 + Object.keys(moved.points).length);
	});

	test('the list shows each link with creation, expiry, last opened and open count', async () => {
		const created = await share();
		const link = new Client();
		await link.fetch(pathOf(created.url));
		await link.fetch(pathOf(created.url));
		const { shares } = await (await engineer.fetch(`/api/v1/revisions/${movedId}/shares`)).json();
		const mine = shares.find((s: { id: string }) => s.id === created.id);
		expect(mine).toMatchObject({ openCount: 2, status: 'active', createdByName: 'Demo Engineer' });
		expect(Date.parse(mine.lastOpenedAt)).toBeGreaterThan(Date.parse(mine.createdAt));
		expect(mine.expiresAt).toBe(created.expiresAt);
		expect(JSON.stringify(shares)).not.toContain(tokenOf(created.url));
	});

	test('revoking works at once: the same URL and its CSV are 404, a second revoke is 404', async () => {
		const created = await share();
		const path = pathOf(created.url);
		expect((await new Client().fetch(path)).status).toBe(200);
		expect((await engineer.fetch(`/api/v1/shares/${created.id}`, { method: 'DELETE' })).status).toBe(204);
		expect((await new Client().fetch(path)).status).toBe(404);
		expect((await new Client().fetch(`${path}/csv`)).status).toBe(404);
		expect((await engineer.fetch(`/api/v1/shares/${created.id}`, { method: 'DELETE' })).status).toBe(404);
	});

	test('an expired link answers 410 "this link has expired"; an unknown one 404', async () => {
		const created = await share();
		await testDb().update(shareLinks).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(shareLinks.id, created.id));
		const res = await new Client().fetch(pathOf(created.url));
		expect(res.status).toBe(410);
		expect(await res.text()).toContain('This link has expired');
		expect((await new Client().fetch(`/s/${'A'.repeat(43)}`)).status).toBe(404);
	});

	test('opening one link too often from one address is refused with 429', async () => {
		const created = await share();
		const path = `${pathOf(created.url)}/csv`;
		const statuses: number[] = [];
		for (let i = 0; i < 61; i++) statuses.push((await new Client().fetch(path)).status);
		expect(statuses.slice(0, 60).every((s) => s === 200)).toBe(true);
		expect(statuses[60]).toBe(429);
	});
});

describe('a token reaches one revision and nothing else', () => {
	test('as an API bearer token it opens nothing; ids added to the link are ignored', async () => {
		const created = await share();
		const token = tokenOf(created.url);
		const bearer = { headers: { authorization: `Bearer ${token}` } };
		for (const path of [`/api/v1/revisions/${stockId}`, `/api/v1/revisions/${movedId}`, `/api/v1/revisions/${stockId}/export?format=csv`, '/api/v1/cars']) {
			expect((await new Client().fetch(path, bearer)).status).toBe(401);
		}
		const csv = await (await new Client().fetch(`${pathOf(created.url)}/csv?revisionId=${stockId}&revision=${stockId}`)).text();
		expect(csv).toContain('steer.inner,"Tie rod, inner joint",-145.0');
		expect((await new Client().fetch(`${pathOf(created.url)}/${stockId}`)).status).toBe(404);
		expect((await new Client().fetch(`/s/${stockId}`)).status).toBe(404);
	});
});

describe('tolerances on the sheet', () => {
	test('come from the newest study that adopted them for this revision; points without one show a dash', async () => {
		const noTolerance = await (await new Client().fetch(pathOf((await share({}, stockId)).url))).text();
		expect(noTolerance).not.toContain('Tolerance (mm)');
		const db = testDb();
		const rows = [
			{ name: 'tolerances old', at: '2026-01-01T10:00:00Z', revisionId: movedId, mm: 9 },
			{ name: 'tolerances new', at: '2026-01-02T10:00:00+02:00', revisionId: movedId, mm: 0.5 },
			{ name: 'tolerances other revision', at: '2026-03-01T10:00:00Z', revisionId: stockId, mm: 7 }
		];
		for (const r of rows) {
			await db.insert(studies).values({
				cornerId,
				name: r.name,
				settings: {},
				results: { tolerances: { revisionId: r.revisionId, updatedAt: r.at, points: { 'steer.inner': { mm: r.mm, mode: 'axis' }, 'steer.outer': { mm: 1.25, mode: 'sphere' } } } }
			});
		}
		const created = await share();
		const html = await (await new Client().fetch(pathOf(created.url))).text();
		expect(html).toContain('Tolerance (mm)');
		expect(html).toContain('±0.5 each axis');
		expect(html).toContain('within 1.25 (sphere)');
		expect(html).not.toContain('±9 each axis');
		expect(html).toMatch(/data-point="lower\.front"[\s\S]*?—/);
		const csv = (await (await new Client().fetch(`${pathOf(created.url)}/csv`)).text()).split('\r\n');
		expect(csv[0]).toBe('point,description,x_mm,y_mm,z_mm,dx_mm,dy_mm,dz_mm,tolerance_mm,tolerance_mode');
		expect(csv).toContain('steer.inner,"Tie rod, inner joint",-145.0,358.0,196.0,-15.0,0.0,20.0,0.5,axis');
		await db.delete(studies).where(and(eq(studies.cornerId, cornerId)));
	});
});

describe('the audit log', () => {
	test('records the link created, mailed, opened and revoked, with who', async () => {
		const created = await share({ email: `audit-${Date.now()}@example.test` });
		await new Client().fetch(pathOf(created.url));
		await new Client().fetch(pathOf(created.url));
		await engineer.fetch(`/api/v1/shares/${created.id}`, { method: 'DELETE' });
		const events = await testDb().select().from(auditEvents).where(eq(auditEvents.subjectId, created.id));
		const actions = events.map((e) => e.action).sort();
		// Two openings in a row write one "opened" event (one per half hour per link).
		expect(actions).toEqual(['share.created', 'share.mailed', 'share.opened', 'share.revoked']);
		expect(events.find((e) => e.action === 'share.opened')!.actorId).toBeNull();
		expect(events.find((e) => e.action === 'share.created')!.actorId).not.toBeNull();
	});
});
