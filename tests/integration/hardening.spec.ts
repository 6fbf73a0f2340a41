// Headers, the API's error shape, outage answers and API clients without a browser, against the built app.
// A second app instance runs behind a TCP relay to PostgreSQL that the test can cut, black-hole and restore
// (the shared test database itself is never stopped), with ORIGIN set to https for the Secure-cookie rule and
// demo mode off.
import net from 'node:net';
import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { hashToken, newToken } from '../../src/lib/server/auth/tokens';
import { createApiToken } from '../../src/lib/server/db/queries/users';
import { databaseUrl, pgPort, testDatabase } from '../../scripts/db.mjs';
import { Client, DEMO_CAR_ID, baseUrl, closeDb, freshAccount, testDb } from './helpers';

const FRONT_LEFT = '00000000-0000-4000-8000-0000000000f1';

/** A bearer token of a fresh account with its own team. */
async function tokenOf(prefix: string) {
	const account = await freshAccount(prefix);
	const token = newToken('lw_');
	await createApiToken(testDb(), account.user.id, 'test', hashToken(token));
	return { ...account, token };
}

describe('security headers (OWASP Secure Headers Project; W3C CSP Level 3)', () => {
	test('pages carry a CSP without unsafe-inline scripts, frame-ancestors none, nosniff, a referrer and a permissions policy', async () => {
		for (const path of ['/signin', '/signup', '/docs/api', '/password/forgot']) {
			const res = await fetch(baseUrl() + path);
			expect(res.status, path).toBe(200);
			const csp = res.headers.get('content-security-policy') ?? '';
			expect(csp, path).toContain("frame-ancestors 'none'");
			expect(csp, path).toMatch(/script-src 'self'( 'sha256-[A-Za-z0-9+/=]+')+;/);
			expect(csp, path).not.toMatch(/script-src[^;]*'unsafe-(inline|eval)'/);
			expect(res.headers.get('x-content-type-options')).toBe('nosniff');
			expect(res.headers.get('x-frame-options')).toBe('DENY');
			expect(res.headers.get('referrer-policy')).toMatch(/^(same-origin|no-referrer)$/);
			expect(res.headers.get('permissions-policy')).toContain('camera=()');
		}
	});

	test('API answers, errors, redirects and health checks carry them too', async () => {
		const answers = [
			await fetch(`${baseUrl()}/api/v1/cars`),
			await fetch(`${baseUrl()}/api/v1/nothing-here`),
			await fetch(`${baseUrl()}/cars/${DEMO_CAR_ID}`, { redirect: 'manual' }),
			await fetch(`${baseUrl()}/healthz`)
		];
		for (const res of answers) {
			expect(res.headers.get('content-security-policy')).toContain("frame-ancestors 'none'");
			expect(res.headers.get('x-content-type-options')).toBe('nosniff');
			expect(res.headers.get('permissions-policy')).toBeTruthy();
		}
	});

	test('share pages and their CSV send no referrer', async () => {
		const { client } = await freshAccount('share-headers');
		const car = await (await client.json('/api/v1/cars', 'POST', { name: 'Header car' })).json();
		const corner = await (await client.json(`/api/v1/cars/${car.id}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json();
		const geometry = (await import('../../fixtures/club-fwd-front-left.json')).default;
		const rev = await (await client.json(`/api/v1/corners/${corner.id}/revisions`, 'POST', { label: '', note: '', geometry })).json();
		const share = await (await client.json(`/api/v1/revisions/${rev.id}/shares`, 'POST', {})).json();
		const path = new URL(share.url).pathname;
		for (const p of [path, `${path}/csv`, '/s/not-a-token']) {
			const res = await fetch(baseUrl() + p);
			expect(res.headers.get('referrer-policy'), p).toBe('no-referrer');
		}
	});
});

describe('the API answers JSON for every error', () => {
	test('a malformed id (parameter matcher), an unknown path and a wrong method', async () => {
		const { token } = await tokenOf('json-errors');
		const auth = { authorization: `Bearer ${token}` };
		const cases: [string, string, number][] = [
			['GET', '/api/v1/revisions/not-a-uuid/solve', 404],
			['GET', '/api/v1/cars/123', 404],
			['GET', '/api/v1/no-such-thing', 404],
			['GET', '/api/v2/cars', 404],
			['GET', '/api', 404],
			['PATCH', '/api/v1/cars', 405]
		];
		for (const [method, path, status] of cases) {
			const res = await fetch(baseUrl() + path, { method, headers: auth });
			expect(res.status, `${method} ${path}`).toBe(status);
			expect(res.headers.get('content-type'), path).toContain('application/json');
			const body = await res.json();
			expect(body.error.code, path).toMatch(/^[a-z_]+$/);
			expect(body.error.message, path).toBeTruthy();
		}
	});
});

describe('API clients without a browser (issue 21, item 5)', () => {
	test('a bearer token and no Origin, like curl -F: the multipart import is accepted', async () => {
		const { token } = await tokenOf('curl');
		// The demo corner is not this account's: use its own car.
		const headers = { authorization: `Bearer ${token}` };
		const car = await (await fetch(`${baseUrl()}/api/v1/cars`, { method: 'POST', headers: { ...headers, 'content-type': 'application/json' }, body: JSON.stringify({ name: 'Curl car' }) })).json();
		const corner = await (await fetch(`${baseUrl()}/api/v1/cars/${car.id}/corners`, { method: 'POST', headers: { ...headers, 'content-type': 'application/json' }, body: JSON.stringify({ position: 'front_left', kind: 'double_wishbone' }) })).json();
		const form = new FormData();
		const { readFileSync } = await import('node:fs');
		form.set('file', new File([readFileSync('fixtures/club-fwd-front-left-scan-inches.csv')], 'scan.csv', { type: 'text/csv' }));
		form.set('options', JSON.stringify({ unit: 'in' }));
		form.set('dryRun', 'true');
		const res = await fetch(`${baseUrl()}/api/v1/corners/${corner.id}/import`, { method: 'POST', headers, body: form });
		expect(res.status).not.toBe(403);
		expect(res.headers.get('content-type')).toContain('application/json');
	});

	test('a form post with a cookie and no Origin, or an unknown token, is refused in the API shape', async () => {
		const { client } = await freshAccount('csrf');
		const form = new FormData();
		form.set('file', new File(['a,1,2,3'], 'a.csv'));
		const cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
		const withCookie = await fetch(`${baseUrl()}/api/v1/corners/${FRONT_LEFT}/import`, { method: 'POST', headers: { cookie }, body: form });
		expect(withCookie.status).toBe(403);
		expect((await withCookie.json()).error.code).toBe('cross_site');
		const unknown = await fetch(`${baseUrl()}/api/v1/corners/${FRONT_LEFT}/import`, { method: 'POST', headers: { authorization: 'Bearer lw_not-a-token' }, body: form });
		expect(unknown.status).toBe(403);
		const crossSite = await fetch(`${baseUrl()}/cars/new`, { method: 'POST', headers: { cookie, origin: 'https://evil.example.test', 'content-type': 'application/x-www-form-urlencoded' }, body: 'name=x' });
		expect(crossSite.status).toBe(403);
	});

	test('JSON sent as text/plain or application/xml is refused with 415 naming the content type', async () => {
		const { token, client } = await tokenOf('types');
		const car = await (await client.json('/api/v1/cars', 'POST', { name: 'Type car' })).json();
		const corner = await (await client.json(`/api/v1/cars/${car.id}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json();
		for (const type of ['text/plain', 'application/xml', 'application/x-www-form-urlencoded']) {
			const res = await fetch(`${baseUrl()}/api/v1/cars`, { method: 'POST', headers: { authorization: `Bearer ${token}`, 'content-type': type }, body: JSON.stringify({ name: 'Typed car' }) });
			expect(res.status, type).toBe(415);
			const body = await res.json();
			expect(body.error.field).toBe('content-type');
			expect(body.error.message).toContain(type);
		}
		const csv = await fetch(`${baseUrl()}/api/v1/corners/${corner.id}/import`, { method: 'POST', headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' }, body: '{}' });
		expect(csv.status).toBe(415);
		expect((await csv.json()).error.field).toBe('content-type');
	});

	test('a body over the size limit gets 413 saying so, for JSON and for multipart', async () => {
		const { token, client } = await tokenOf('size');
		const car = await (await client.json('/api/v1/cars', 'POST', { name: 'Size car' })).json();
		const corner = await (await client.json(`/api/v1/cars/${car.id}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json();
		// BODY_SIZE_LIMIT is 25 MB under `npm test` (scripts/setup.mjs).
		const big = 'x'.repeat(26 * 1024 * 1024);
		const json = await fetch(`${baseUrl()}/api/v1/cars`, { method: 'POST', headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' }, body: JSON.stringify({ name: big }) });
		expect(json.status).toBe(413);
		expect((await json.json()).error.message).toMatch(/larger than the server accepts/);
		const form = new FormData();
		form.set('file', new File([big], 'big.csv'));
		const multipart = await fetch(`${baseUrl()}/api/v1/corners/${corner.id}/import`, { method: 'POST', headers: { authorization: `Bearer ${token}` }, body: form });
		expect(multipart.status).toBe(413);
		expect((await multipart.json()).error.code).toBe('too_large');
	});
});

/** A TCP relay to PostgreSQL that can cut every connection, refuse, black-hole new ones, and come back. */
function relay(target: number) {
	const sockets = new Set<net.Socket>();
	let mode: 'up' | 'blackhole' = 'up';
	const server = net.createServer((inbound) => {
		sockets.add(inbound);
		inbound.on('close', () => sockets.delete(inbound));
		inbound.on('error', () => {});
		if (mode === 'blackhole') return; // accepted, never answered: the app's connect timeout has to end it
		const outbound = net.connect(target, '127.0.0.1');
		sockets.add(outbound);
		outbound.on('close', () => sockets.delete(outbound));
		outbound.on('error', () => inbound.destroy());
		inbound.pipe(outbound).pipe(inbound);
	});
	let port = 0;
	return {
		listen: () => new Promise<number>((r) => server.listen(port, '127.0.0.1', () => r((port = (server.address() as net.AddressInfo).port)))),
		/** Cuts every connection and stops listening (new connections are refused). */
		down: () => new Promise<void>((r) => { for (const s of sockets) s.destroy(); server.close(() => r()); }),
		blackhole: () => { mode = 'blackhole'; for (const s of sockets) s.destroy(); },
		up: () => { mode = 'up'; },
		close: () => { for (const s of sockets) s.destroy(); server.close(); }
	};
}

describe('outage answers: 503 with Retry-After, /healthz, reconnection (RFC 9110 §15.6.4)', () => {
	const pg = relay(pgPort);
	let app: ChildProcess;
	const port = Number(process.env.LW_TEST_PORT ?? 3100) + 60;
	const base = `http://127.0.0.1:${port}`;
	const origin = `https://127.0.0.1:${port}`;
	let token = '';
	let sharePath = '';

	beforeAll(async () => {
		const relayPort = await pg.listen();
		const url = new URL(databaseUrl(testDatabase) as string);
		url.port = String(relayPort);
		const { waitForHttp } = await import('../../scripts/setup.mjs');
		// This instance believes it is served over https (a TLS proxy in front): its cookies must be Secure.
		const { spawn } = await import('node:child_process');
		const { appEnv } = await import('../../scripts/setup.mjs');
		app = spawn(process.execPath, ['scripts/serve.mjs'], {
			env: { ...process.env, ...appEnv({ databaseUrl: url.toString(), port, smtpPort: Number(process.env.LW_SMTP_PORT ?? 2526) }), ORIGIN: origin, LW_DEMO: 'false' },
			stdio: ['ignore', 'ignore', 'ignore']
		});
		await waitForHttp(`${base}/signin`);
		const account = await tokenOf('outage');
		token = account.token;
		const car = await (await account.client.json('/api/v1/cars', 'POST', { name: 'Outage car' })).json();
		const corner = await (await account.client.json(`/api/v1/cars/${car.id}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json();
		const geometry = (await import('../../fixtures/club-fwd-front-left.json')).default;
		const rev = await (await account.client.json(`/api/v1/corners/${corner.id}/revisions`, 'POST', { label: '', note: '', geometry })).json();
		sharePath = new URL((await (await account.client.json(`/api/v1/revisions/${rev.id}/shares`, 'POST', {})).json()).url).pathname;
	}, 60_000);

	afterAll(async () => {
		app?.kill('SIGKILL');
		pg.close();
		await closeDb();
	});

	test('with ORIGIN https every cookie is Secure (and plain http sign-in is not, on the main instance)', async () => {
		const account = await freshAccount('secure');
		const body = new URLSearchParams({ email: account.email, password: account.password, callbackUrl: '/' });
		const res = await fetch(`${base}/auth/callback/credentials`, { method: 'POST', body, redirect: 'manual', headers: { origin } });
		const session = res.headers.getSetCookie().find((c) => c.includes('authjs.session-token'));
		expect(session).toMatch(/^__Secure-authjs\.session-token=/);
		expect(session).toMatch(/;\s*Secure/i);
		// Plain http (the main instance's ORIGIN): the sign-in cookie and its renewal carry no Secure flag.
		const plain = new Client();
		await plain.signIn(account.email, account.password);
		expect(plain.signedIn).toBe(true);
		const renewed = await plain.fetch('/api/v1/cars');
		const cookies = renewed.headers.getSetCookie().filter((c) => c.includes('authjs.session-token'));
		expect(cookies.length).toBeGreaterThan(0);
		for (const c of cookies) expect(c).not.toMatch(/;\s*Secure/i);
	});

	test('outside demo mode the /dev pages are 404 (issue 20, item 1)', async () => {
		for (const p of ['/dev/charts', '/dev/linkage', '/dev/mail', '/dev/mail/messages.json']) {
			expect((await fetch(base + p)).status, p).toBe(404);
		}
	});

	test('healthy: /healthz says app and database are up', async () => {
		const res = await fetch(`${base}/healthz`);
		expect(res.status).toBe(200);
		expect(await res.json()).toMatchObject({ app: 'up', database: 'up' });
	});

	test('database refused: API, pages, share sheet and /healthz answer 503 with Retry-After; then it comes back by itself', async () => {
		await pg.down();
		const api = await fetch(`${base}/api/v1/cars`, { headers: { authorization: `Bearer ${token}` } });
		expect(api.status).toBe(503);
		expect(Number(api.headers.get('retry-after'))).toBeGreaterThan(0);
		expect((await api.json()).error).toMatchObject({ code: 'unavailable', message: expect.stringMatching(/database is unavailable/) });
		const sheet = await fetch(base + sharePath);
		expect(sheet.status).toBe(503);
		expect(sheet.headers.get('retry-after')).toBeTruthy();
		expect(await sheet.text()).toContain('database is unavailable');
		const page = await fetch(`${base}/cars/${DEMO_CAR_ID}`, { headers: { authorization: `Bearer ${token}` } });
		expect(page.status).toBe(503);
		const health = await fetch(`${base}/healthz`);
		expect(health.status).toBe(503);
		expect(await health.json()).toMatchObject({ app: 'up', database: 'down' });

		await pg.listen();
		// The pool reconnects by itself: poll (bounded) until the API answers again.
		let status = 0;
		for (let i = 0; i < 60 && status !== 200; i++) {
			status = (await fetch(`${base}/api/v1/cars`, { headers: { authorization: `Bearer ${token}` } })).status;
			if (status !== 200) await new Promise((r) => setTimeout(r, 250));
		}
		expect(status).toBe(200);
		expect((await fetch(`${base}/healthz`)).status).toBe(200);
	}, 40_000);

	test('database stalled (connections accepted, never answered): the request ends in a 503, not a hang', async () => {
		pg.blackhole();
		// Let the pool see its connections closed, so the next query has to open a new one into the black hole.
		await new Promise((r) => setTimeout(r, 300));
		const t0 = performance.now();
		const res = await fetch(`${base}/api/v1/cars`, { headers: { authorization: `Bearer ${token}` }, signal: AbortSignal.timeout(25_000) });
		expect(res.status).toBe(503);
		console.log(`stalled database: 503 after ${Math.round(performance.now() - t0)} ms (connect timeout 3 s; printed, not asserted)`);
		pg.up();
		let status = 0;
		for (let i = 0; i < 60 && status !== 200; i++) {
			status = (await fetch(`${base}/api/v1/cars`, { headers: { authorization: `Bearer ${token}` } })).status;
			if (status !== 200) await new Promise((r) => setTimeout(r, 250));
		}
		expect(status).toBe(200);
	}, 40_000);
});
