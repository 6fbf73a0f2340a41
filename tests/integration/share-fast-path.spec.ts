// Issue 15: the share sheet's fast path (scripts/serve.mjs → sharing/sheet-cache.ts `shareFastPath`) answers a kept
// sheet before SvelteKit. It must answer exactly as SvelteKit's path does: two instances of the server entry on the
// test database, one with the fast path (the default) and one with LW_SHARE_FAST_PATH=off, are compared byte for
// byte; refusals (revoked, rate-limited) and counting must hold on the fast one; SIGTERM flushes its counts. At
// shutdown the entry prints how many requests the fast path answered, which must be exactly the ones counted
// below as served from memory (so a fast path that silently never answers fails here).
import { spawn, type ChildProcess } from 'node:child_process';
import http from 'node:http';
import { readFileSync } from 'node:fs';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { databaseUrl, testDatabase } from '../../scripts/db.mjs';
import { appEnv, waitForHttp } from '../../scripts/setup.mjs';
import { auditEvents, shareLinks } from '../../src/lib/server/db/schema';
import { Client, closeDb, testDb } from './helpers';

const stock = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
const fastPort = Number(process.env.LW_TEST_PORT ?? 3100) + 65;
const slowPort = fastPort + 1;
const fastBase = `http://127.0.0.1:${fastPort}`;
const slowBase = `http://127.0.0.1:${slowPort}`;

/** Requests the fast instance should have answered from memory (kept page or 304), counted as they are made. */
let servedFromMemory = 0;
let fast: ChildProcess;
let slow: ChildProcess;
let fastOutput = '';
const engineer = new Client();
let revisionId = '';

/** The server entry on port, against the test database; fastPath false sets LW_SHARE_FAST_PATH=off. */
function serve(port: number, fastPath: boolean) {
	const env = { ...process.env, ...appEnv({ databaseUrl: databaseUrl(testDatabase), port, smtpPort: Number(process.env.LW_SMTP_PORT ?? 2526) }), LW_DEMO: 'true', LW_SHARE_FAST_PATH: fastPath ? 'on' : 'off' };
	return spawn(process.execPath, ['scripts/serve.mjs'], { env, stdio: ['ignore', 'pipe', 'inherit'] });
}

interface Answer {
	status: number;
	headers: Record<string, string>;
	body: Buffer;
}

/** One GET from a given loopback address (the rate limit is per link and address), body read to the end. */
function get(base: string, path: string, { address = '127.0.0.1', headers = {} as Record<string, string> } = {}) {
	return new Promise<Answer>((resolve, reject) => {
		const req = http.get(base + path, { localAddress: address, headers, agent: false }, (res) => {
			const chunks: Buffer[] = [];
			res.on('data', (c) => chunks.push(c));
			res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers as Record<string, string>, body: Buffer.concat(chunks) }));
		});
		req.on('error', reject);
	});
}

/** The headers an answer carries, without the connection's own (date, keep-alive, framing). */
function own(a: Answer) {
	const skip = new Set(['date', 'connection', 'keep-alive', 'transfer-encoding', 'content-length']);
	return Object.fromEntries(Object.entries(a.headers).filter(([k]) => !skip.has(k)).sort(([x], [y]) => x.localeCompare(y)));
}

/** A new share link to the test revision, created through the API on the main test app; returns its path and id. */
async function newLink() {
	const res = await engineer.json(`/api/v1/revisions/${revisionId}/shares`, 'POST', {});
	expect(res.status).toBe(201);
	const { id, url } = await res.json();
	return { id: id as string, path: new URL(url).pathname };
}

/** The link's open count as stored in the database, polled until it equals want or 15 s pass (flushes run every 3 s). */
async function storedOpens(id: string, want: number) {
	let count = -1;
	for (let i = 0; i < 60 && count !== want; i++) {
		if (i) await new Promise((r) => setTimeout(r, 250));
		[{ count }] = await testDb().select({ count: shareLinks.openCount }).from(shareLinks).where(eq(shareLinks.id, id));
	}
	return count;
}

beforeAll(async () => {
	fast = serve(fastPort, true);
	fast.stdout!.on('data', (d) => (fastOutput += d));
	slow = serve(slowPort, false);
	await engineer.signIn('engineer@linkwright.test');
	const car = await (await engineer.json('/api/v1/cars', 'POST', { name: 'Fast path car' })).json();
	const corner = await (await engineer.json(`/api/v1/cars/${car.id}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json();
	revisionId = (await (await engineer.json(`/api/v1/corners/${corner.id}/revisions`, 'POST', { label: 'stock', note: '', geometry: stock })).json()).id;
	await waitForHttp(`${fastBase}/signin`);
	await waitForHttp(`${slowBase}/signin`);
});

afterAll(async () => {
	for (const child of [fast, slow]) if (child && child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
	await closeDb();
});

describe('the share sheet before SvelteKit answers as SvelteKit does', () => {
	test('a kept sheet: the same status, headers and bytes; the security headers are all there', async () => {
		const { path } = await newLink();
		const rendered = await get(fastBase, path); // rendered by SvelteKit and kept
		const kept = await get(fastBase, path); // from memory, before SvelteKit
		servedFromMemory++;
		await get(slowBase, path, { address: '127.0.0.2' }); // the slow instance renders and keeps it
		const slowKept = await get(slowBase, path, { address: '127.0.0.2' }); // kept, served inside SvelteKit's guard
		for (const a of [rendered, kept, slowKept]) expect(a.status).toBe(200);
		expect(own(kept)).toEqual(own(slowKept));
		expect(own(kept)).toEqual(own(rendered));
		expect(kept.body.equals(slowKept.body)).toBe(true);
		expect(kept.body.equals(rendered.body)).toBe(true);
		expect(Number(kept.headers['content-length'])).toBe(kept.body.length);
		// The headers of issue 15 item 1, on the answer from memory:
		// W3C CSP Level 3: the page's policy (kit.csp), framing forbidden (frame-ancestors, and X-Frame-Options for older browsers)
		expect(kept.headers['content-security-policy']).toContain("frame-ancestors 'none'");
		expect(kept.headers['content-security-policy']).toContain("script-src 'self' 'sha256-");
		expect(kept.headers['x-frame-options']).toBe('DENY');
		// OWASP HTTP Headers Cheat Sheet: nosniff; the token in the path must not leave in a Referer
		expect(kept.headers['x-content-type-options']).toBe('nosniff');
		expect(kept.headers['referrer-policy']).toBe('no-referrer');
		expect(kept.headers['permissions-policy']).toContain('camera=()');
		// RFC 9111 §5.2.2: private, revalidated each time
		expect(kept.headers['cache-control']).toBe('private, no-cache');
		expect(kept.headers['content-type']).toMatch(/^text\/html/);
		expect(kept.headers.etag).toMatch(/^"[^"]+"$/);
	});

	test('304 on a matching If-None-Match (strong or weak, RFC 9110 §13.1.2), the same headers on both paths, no body', async () => {
		const { path } = await newLink();
		const { etag } = (await get(fastBase, path)).headers;
		await get(slowBase, path, { address: '127.0.0.2' });
		for (const inm of [etag, `W/${etag}`, `"other", ${etag}`]) {
			const a = await get(fastBase, path, { headers: { 'if-none-match': inm } });
			servedFromMemory++;
			const b = await get(slowBase, path, { address: '127.0.0.2', headers: { 'if-none-match': inm } });
			expect(a.status).toBe(304);
			expect(b.status).toBe(304);
			expect(a.body.length).toBe(0);
			expect(own(a)).toEqual(own(b));
			expect(a.headers.etag).toBe(etag);
			expect(a.headers['referrer-policy']).toBe('no-referrer');
			expect(a.headers['content-security-policy']).toBe("default-src 'none'; frame-ancestors 'none'");
			expect(a.headers['x-content-type-options']).toBe('nosniff');
		}
		// an ETag of another version is not a match: the whole page
		const other = await get(fastBase, path, { headers: { 'if-none-match': '"not-this-one"' } });
		servedFromMemory++;
		expect(other.status).toBe(200);
	});

	test('a link revoked through the API is refused at once, from memory or not (404, also with its ETag)', async () => {
		const { id, path } = await newLink();
		await get(fastBase, path);
		const kept = await get(fastBase, path);
		servedFromMemory++;
		expect(kept.status).toBe(200);
		const cookie = [...engineer.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
		const revoked = await fetch(`${fastBase}/api/v1/shares/${id}`, { method: 'DELETE', headers: { cookie, origin: fastBase } });
		expect(revoked.status).toBe(204);
		const after = await get(fastBase, path);
		expect(after.status).toBe(404);
		expect(after.body.toString()).toContain('does not exist or was revoked');
		expect((await get(fastBase, path, { headers: { 'if-none-match': kept.headers.etag } })).status).toBe(404);
	});

	test('the rate limit still applies: the 61st opening from one address in 10 minutes is 429, another address is served', async () => {
		const { path } = await newLink();
		const statuses: number[] = [];
		for (let i = 0; i < 61; i++) statuses.push((await get(fastBase, path, { address: '127.0.0.3' })).status);
		servedFromMemory += 59; // the first is rendered, the 61st refused
		expect(statuses.slice(0, 60).every((s) => s === 200)).toBe(true);
		expect(statuses[60]).toBe(429);
		const etag = (await get(fastBase, path, { address: '127.0.0.4' })).headers.etag;
		servedFromMemory++;
		const refused = await get(fastBase, path, { address: '127.0.0.3', headers: { 'if-none-match': etag } });
		expect(refused.status).toBe(429);
		expect(refused.body.toString()).toContain('opened too often');
	});

	test('openings answered from memory reach the database at the next flush, with one "opened" audit event', async () => {
		const { id, path } = await newLink();
		const first = await get(fastBase, path);
		for (let i = 0; i < 3; i++) await get(fastBase, path);
		await get(fastBase, path, { headers: { 'if-none-match': first.headers.etag } });
		servedFromMemory += 4;
		expect(await storedOpens(id, 5)).toBe(5);
		const events = await testDb().select().from(auditEvents).where(and(eq(auditEvents.subjectId, id), eq(auditEvents.action, 'share.opened')));
		expect(events).toHaveLength(1);
	});

	test('SIGTERM: openings not yet flushed are written before the process exits; the fast path answered every opening counted above', async () => {
		const { id, path } = await newLink();
		await get(fastBase, path);
		for (let i = 0; i < 4; i++) await get(fastBase, path);
		servedFromMemory += 4;
		// sent right after the openings: the periodic flush (every 3 s) is unlikely to have written them yet
		const exited = new Promise<number | null>((resolve) => fast.once('exit', (code) => resolve(code)));
		fast.kill('SIGTERM');
		expect(await exited).toBe(0);
		expect(await storedOpens(id, 5)).toBe(5);
		expect(fastOutput).toContain(`the share fast path answered ${servedFromMemory} requests`);
	});
});
