// The share sheet under many readers: 200 readers, each from its own loopback address (127.0.0.2 …), open one
// link 10 times at once with the others. Two rounds: readers that behave like a browser (the first opening
// fetches the page, each reopening revalidates with If-None-Match and gets 304), and readers that fetch the whole
// page every time (curl, a browser with its cache off), after an unmeasured warm-up round. Prints p50/p95 beside
// the target and the machine's load average; asserts nothing.
import http from 'node:http';
import { randomUUID } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { databaseUrl, testDatabase } from '../scripts/db.mjs';
import { hashPassword } from '../src/lib/server/auth/passwords';
import { connect } from '../src/lib/server/db/connect';
import { createUserWithTeam } from '../src/lib/server/db/queries/users';
import { ensureBuild, waitForHttp } from '../scripts/setup.mjs';
import { startTestMailServer, startTestServer } from '../scripts/test-server.mjs';

export const READERS = 200;
export const OPENS = 10;
/** The target for this bench (issue 15): p95 at or under 100 ms with no errors. */
export const TARGET_P95_MS = 100;

/** The p-th percentile of sorted values. */
export const percentile = (sorted: number[], p: number) => (sorted.length ? sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)] : NaN);

/** One GET from a given local address; resolves to status, ETag and milliseconds (body read to the end). */
function get(agent: http.Agent, url: string, headers: Record<string, string>) {
	return new Promise<{ status: number; etag: string; ms: number }>((resolve) => {
		const t0 = performance.now();
		const req = http.get(url, { agent, headers }, (res) => {
			res.on('data', () => {});
			res.on('end', () => resolve({ status: res.statusCode ?? 0, etag: String(res.headers.etag ?? ''), ms: performance.now() - t0 }));
			res.on('error', () => resolve({ status: 0, etag: '', ms: performance.now() - t0 }));
		});
		req.on('error', () => resolve({ status: 0, etag: '', ms: performance.now() - t0 }));
	});
}

export interface LoadFigures {
	times: number[];
	errors: number;
	statuses: Record<number, number>;
	seconds: number;
	/** the server's CPU time per request (µs), when known */
	serverCpuUs?: number;
}

/**
 * READERS concurrent readers, each on its own 127.0.0.x address with a keep-alive connection, OPENS openings each.
 * revalidate: send If-None-Match with the last ETag as a browser does. firstAddress lets two runs use other addresses
 * (the per-link-and-address limit is 60 per 10 minutes).
 */
export async function readers(url: string, { revalidate, firstAddress = 2, count = READERS, opens = OPENS }: { revalidate: boolean; firstAddress?: number; count?: number; opens?: number }): Promise<LoadFigures> {
	const times: number[] = [];
	const statuses: Record<number, number> = {};
	let errors = 0;
	const t0 = performance.now();
	await Promise.all(
		Array.from({ length: count }, async (_, i) => {
			const n = firstAddress + i;
			const agent = new http.Agent({ keepAlive: true, maxSockets: 1, localAddress: `127.0.${Math.floor(n / 250)}.${(n % 250) + 2}` });
			let etag = '';
			for (let k = 0; k < opens; k++) {
				const r = await get(agent, url, revalidate && etag ? { 'if-none-match': etag } : {});
				statuses[r.status] = (statuses[r.status] ?? 0) + 1;
				if (r.status !== 200 && r.status !== 304) errors++;
				if (r.etag) etag = r.etag;
				times.push(r.ms);
			}
			agent.destroy();
		})
	);
	return { times: times.sort((a, b) => a - b), errors, statuses, seconds: (performance.now() - t0) / 1000 };
}

/**
 * CPU time (ms, all threads: JIT and GC included) a process has used so far, from Linux's /proc; null elsewhere.
 * Printed per request beside the latencies: it varies far less than they do with what else the machine runs.
 */
export function cpuMs(pid: number | undefined): number | null {
	const file = `/proc/${pid}/stat`;
	if (!pid || !existsSync(file)) return null;
	const fields = readFileSync(file, 'utf8').split(') ')[1].split(' ');
	return ((Number(fields[11]) + Number(fields[12])) * 1000) / 100; // utime + stime in clock ticks (USER_HZ 100)
}

/** Runs a round of readers and adds the server's CPU time per request to its figures. */
async function measured(pid: number | undefined, url: string, options: Parameters<typeof readers>[1]): Promise<LoadFigures> {
	const before = cpuMs(pid);
	const f = await readers(url, options);
	const after = cpuMs(pid);
	return { ...f, serverCpuUs: before === null || after === null ? undefined : ((after - before) * 1000) / f.times.length };
}

/** Prints one run's figures beside the target. */
export function report(label: string, f: LoadFigures) {
	const p95 = percentile(f.times, 95);
	const verdict = p95 <= TARGET_P95_MS && f.errors === 0 ? 'within target' : 'OVER target';
	console.log(
		`  ${label.padEnd(44)} p50 ${percentile(f.times, 50).toFixed(1).padStart(6)} ms  p95 ${p95.toFixed(1).padStart(6)} ms  (target ≤ ${TARGET_P95_MS} ms)  ` +
			`errors ${f.errors} (target 0)  ${Math.round(f.times.length / f.seconds)} req/s  statuses ${JSON.stringify(f.statuses)}` +
			(f.serverCpuUs === undefined ? '' : `  server CPU ${Math.round(f.serverCpuUs)} µs/request`) +
			`  → ${verdict}`
	);
}

/** A signed-in engineer's car, corner, revision and one share link on the app at base; returns the link's URL. */
export async function shareLink(base: string) {
	const email = `load-${randomUUID().slice(0, 8)}@example.test`;
	const password = 'bench password long enough';
	const { db, client } = connect(databaseUrl(testDatabase) as string, 1);
	await createUserWithTeam(db, { email, name: 'Load engineer', teamName: 'Load team', passwordHash: await hashPassword(password) });
	await client.end();
	const signin = await fetch(`${base}/auth/callback/credentials`, { method: 'POST', body: new URLSearchParams({ email, password, callbackUrl: '/' }), redirect: 'manual', headers: { origin: base } });
	const cookie = signin.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
	const json = { cookie, 'content-type': 'application/json', origin: base };
	const post = async (path: string, body: unknown) => {
		const res = await fetch(base + path, { method: 'POST', headers: json, body: JSON.stringify(body) });
		if (res.status >= 300) throw new Error(`${path}: ${res.status} ${await res.text()}`);
		return res.json();
	};
	const geometry = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
	const car = await post('/api/v1/cars', { name: `Load ${Date.now()}` });
	const corner = await post(`/api/v1/cars/${car.id}/corners`, { position: 'front_left', kind: 'double_wishbone' });
	const revision = await post(`/api/v1/corners/${corner.id}/revisions`, { label: 'load', note: '', geometry });
	const share = await post(`/api/v1/revisions/${revision.id}/shares`, { note: 'Load test' });
	return { url: share.url as string, cookie, revisionId: revision.id as string, cornerId: corner.id as string };
}

/**
 * The first opening (renders the sheet), then a warm-up, not measured, from addresses from `firstAddress` on (two
 * rounds of READERS), as benchmarks usually do: first connections, and the JIT of the page's and the 304's paths in
 * the server and in this client. The revalidating round is as long as a measured one: with only the page's path
 * warmed, the first measured round cost the server about three times the CPU per request of the next one.
 */
export async function warmUp(url: string, firstAddress: number) {
	await get(new http.Agent(), url, {});
	await readers(url, { revalidate: false, firstAddress, opens: 2 });
	await readers(url, { revalidate: true, firstAddress: firstAddress + READERS });
}

/** Prints the figures (`npm run bench -- share-load`): the built app on LW_TEST_PORT+75 against the test database. */
export async function run() {
	ensureBuild();
	const port = Number(process.env.LW_TEST_PORT ?? 3100) + 75;
	const base = `http://127.0.0.1:${port}`;
	const mail = await startTestMailServer();
	const server = startTestServer(port);
	try {
		await waitForHttp(`${base}/signin`);
		const { url } = await shareLink(base);
		const path = new URL(url).pathname;
		await warmUp(base + path, 2 + 2 * READERS);
		console.log(`  ${READERS} readers × ${OPENS} openings of one link, each reader from its own 127.0.0.x address (load ${(await import('node:os')).loadavg()[0].toFixed(2)})`);
		report('browsers (reopen revalidates: 304)', await measured(server.pid, base + path, { revalidate: true, firstAddress: 2 }));
		report('full page every time (no ETag sent)', await measured(server.pid, base + path, { revalidate: false, firstAddress: 2 + READERS }));
	} finally {
		server.kill('SIGKILL');
		await mail.close();
	}
}
