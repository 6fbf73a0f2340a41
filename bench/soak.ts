// `npm run soak`: the app under load and faults on loopback, bounded in count and time, figures printed.
// 1. 200 share readers (each from its own 127.0.0.x address) × 10 openings, as browsers and as full fetches;
// 2. 50 concurrent authenticated solves; 3. 20 concurrent writers of revisions on one corner (numbers unique and
// gap-free); 4. PostgreSQL stopped and started under writes (every acknowledged revision still there, 503s while
// down). Nothing is asserted on time; the exit status is 1 when a correctness check fails (a lost or duplicated
// write, a gap, an error that is not a 503 during the outage, or no 503 at all while the database was down).
// Uses the built app against a freshly reset test database (`linkwright_test`): do not run it beside `npm test`.
import { spawn } from 'node:child_process';
import { loadavg } from 'node:os';
import { eq, inArray } from 'drizzle-orm';
import { databaseUrl, testDatabase } from '../scripts/db.mjs';
import { ensureBuild, prepareDatabase, waitForHttp } from '../scripts/setup.mjs';
import { startTestMailServer, startTestServer } from '../scripts/test-server.mjs';
import { hashToken, newToken } from '../src/lib/server/auth/tokens';
import { connect } from '../src/lib/server/db/connect';
import { createApiToken } from '../src/lib/server/db/queries/users';
import { revisions, users } from '../src/lib/server/db/schema';
import { percentile, readers, report, shareLink, warmUp } from './share-load';
import { readFileSync } from 'node:fs';

const SOLVERS = 50;
const SOLVES_EACH = 4;
const WRITERS = 20;
const WRITES_EACH = 10;
const OUTAGE_WRITERS = 5;
const DOWN_AFTER_MS = 2000;
const DOWN_FOR_MS = 8000;
const AFTER_UP_MS = 4000;

let failed = false;
const check = (ok: boolean, what: string) => {
	console.log(`  ${ok ? 'ok  ' : 'FAIL'} ${what}`);
	if (!ok) failed = true;
};
const line = (label: string, times: number[], extra = '') =>
	console.log(`  ${label.padEnd(44)} p50 ${percentile(times, 50).toFixed(1).padStart(7)} ms  p95 ${percentile(times, 95).toFixed(1).padStart(7)} ms  ${extra}`);

/** Runs `node scripts/db.mjs <command>` without blocking this process's event loop. */
function db(command: 'stop' | 'start') {
	return new Promise<void>((resolve) => spawn('node', ['scripts/db.mjs', command], { stdio: 'ignore' }).on('exit', () => resolve()));
}

async function main() {
	ensureBuild();
	prepareDatabase({ test: true });
	const port = Number(process.env.LW_TEST_PORT ?? 3100) + 80;
	const base = `http://127.0.0.1:${port}`;
	const mail = await startTestMailServer();
	const server = startTestServer(port);
	const { db: database, client } = connect(databaseUrl(testDatabase) as string, 2);
	try {
		await waitForHttp(`${base}/signin`);
		console.log(`soak on ${base} (load average ${loadavg()[0].toFixed(2)} on this machine)`);
		const { url, cookie, revisionId, cornerId } = await shareLink(base);
		const [engineer] = await database.select().from(users).where(eq(users.email, 'engineer@linkwright.test'));
		const token = newToken('lw_');
		await createApiToken(database, engineer.id, 'soak', hashToken(token));
		const auth = { authorization: `Bearer ${token}` };
		const own = { cookie, origin: base, 'content-type': 'application/json' };
		const geometry = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));

		console.log('\n== 1. share sheet: 200 readers × 10 openings');
		const path = new URL(url).pathname;
		await fetch(base + path).then((r) => r.text());
		await warmUp(base + path, 402); // not measured: the same warm-up as `npm run bench -- share-load`
		report('browsers (reopen revalidates: 304)', await readers(base + path, { revalidate: true, firstAddress: 2 }));
		report('full page every time (no ETag sent)', await readers(base + path, { revalidate: false, firstAddress: 202 }));

		console.log(`\n== 2. ${SOLVERS} concurrent authenticated solves × ${SOLVES_EACH} (heave -50…50 by 1 mm, bearer token)`);
		const demoRevision = (await (await fetch(`${base}/api/v1/corners/00000000-0000-4000-8000-0000000000f1/revisions`, { headers: auth })).json()).revisions[0].id;
		const solveTimes: number[] = [];
		let solveErrors = 0;
		const t2 = performance.now();
		await Promise.all(
			Array.from({ length: SOLVERS }, async () => {
				for (let i = 0; i < SOLVES_EACH; i++) {
					const t0 = performance.now();
					const res = await fetch(`${base}/api/v1/revisions/${demoRevision}/solve?sweep=heave&from=-50&to=50&step=1`, { headers: auth });
					await res.arrayBuffer();
					solveTimes.push(performance.now() - t0);
					if (res.status !== 200) solveErrors++;
				}
			})
		);
		solveTimes.sort((a, b) => a - b);
		line('solve', solveTimes, `errors ${solveErrors}  ${Math.round(solveTimes.length / ((performance.now() - t2) / 1000))} solves/s`);
		check(solveErrors === 0, `${SOLVERS * SOLVES_EACH} solves answered 200`);

		console.log(`\n== 3. ${WRITERS} concurrent writers × ${WRITES_EACH} revisions on one corner`);
		const writeTimes: number[] = [];
		const acked: { id: string; number: number }[] = [];
		let writeErrors = 0;
		await Promise.all(
			Array.from({ length: WRITERS }, async (_, w) => {
				for (let i = 0; i < WRITES_EACH; i++) {
					const t0 = performance.now();
					const res = await fetch(`${base}/api/v1/corners/${cornerId}/revisions`, { method: 'POST', headers: own, body: JSON.stringify({ label: `w${w}-${i}`, note: '', geometry }) });
					writeTimes.push(performance.now() - t0);
					if (res.status === 201) acked.push(await res.json());
					else writeErrors++;
				}
			})
		);
		writeTimes.sort((a, b) => a - b);
		line('save a revision', writeTimes, `errors ${writeErrors}`);
		const rows = await database.select({ number: revisions.number }).from(revisions).where(eq(revisions.cornerId, cornerId));
		const numbers = rows.map((r) => r.number).sort((a, b) => a - b);
		check(writeErrors === 0 && acked.length === WRITERS * WRITES_EACH, `${acked.length} of ${WRITERS * WRITES_EACH} writes acknowledged`);
		check(new Set(acked.map((a) => a.number)).size === acked.length, 'acknowledged numbers are unique');
		check(numbers.every((n, i) => n === i + 1), `the corner's ${numbers.length} revisions are numbered 1…${numbers.length} without gaps`);

		console.log(`\n== 4. PostgreSQL stopped ${DOWN_AFTER_MS / 1000} s into ${OUTAGE_WRITERS} writers, started ${DOWN_FOR_MS / 1000} s later`);
		const outage = { acked: [] as { id: string; number: number }[], unavailable: 0, unavailableMs: [] as number[], slow: [] as string[], other: new Map<number, number>(), downAt: 0, upAt: 0, firstOkAfterUp: 0 };
		let running = true;
		const writers = Array.from({ length: OUTAGE_WRITERS }, async (_, w) => {
			for (let i = 0; running; i++) {
				let status = 0;
				const t0 = performance.now();
				try {
					const res = await fetch(`${base}/api/v1/corners/${cornerId}/revisions`, { method: 'POST', headers: own, body: JSON.stringify({ label: `outage w${w}-${i}`, note: '', geometry }), signal: AbortSignal.timeout(30_000) });
					status = res.status;
					if (status === 201) {
						outage.acked.push(await res.json());
						if (outage.upAt && !outage.firstOkAfterUp) outage.firstOkAfterUp = performance.now();
					} else await res.arrayBuffer();
				} catch {
					status = 0;
				}
				if (status === 503) {
					outage.unavailable++;
					outage.unavailableMs.push(performance.now() - t0);
					if (performance.now() - t0 > 1000 && outage.downAt) outage.slow.push(`${((t0 - outage.downAt) / 1000).toFixed(1)}→${((performance.now() - outage.downAt) / 1000).toFixed(1)} s`);
				}
				else if (status !== 201) outage.other.set(status, (outage.other.get(status) ?? 0) + 1);
				if (status !== 201) await new Promise((r) => setTimeout(r, 100));
			}
		});
		await new Promise((r) => setTimeout(r, DOWN_AFTER_MS));
		const stopAt = performance.now();
		outage.downAt = stopAt;
		await db('stop');
		console.log(`  \`db stop\` took ${Math.round(performance.now() - stopAt)} ms`);
		const downAt = performance.now();
		await new Promise((r) => setTimeout(r, DOWN_FOR_MS));
		await db('start');
		outage.upAt = performance.now();
		console.log(`  \`db start\` returned ${((outage.upAt - downAt) / 1000).toFixed(1)} s after the stop completed`);
		await new Promise((r) => setTimeout(r, AFTER_UP_MS));
		running = false;
		await Promise.all(writers);
		await client.end({ timeout: 1 });
		const { db: after, client: afterClient } = connect(databaseUrl(testDatabase) as string, 1);
		const ids = outage.acked.map((a) => a.id);
		const found = ids.length ? await after.select({ id: revisions.id }).from(revisions).where(inArray(revisions.id, ids)) : [];
		const all = (await after.select({ number: revisions.number }).from(revisions).where(eq(revisions.cornerId, cornerId))).map((r) => r.number).sort((a, b) => a - b);
		await afterClient.end();
		const lost = ids.length - found.length;
		console.log(
			`  acknowledged ${outage.acked.length}, 503 while down ${outage.unavailable}, other answers ${JSON.stringify(Object.fromEntries(outage.other))}, ` +
				`first write after the restart ${outage.firstOkAfterUp ? `${Math.round(outage.firstOkAfterUp - outage.upAt)} ms after \`db start\` returned` : 'none'}`
		);
		outage.unavailableMs.sort((a, b) => a - b);
		if (outage.slow.length) console.log(`  503s slower than 1 s (seconds from \`db stop\`): ${outage.slow.join(', ')}`);
		line('time to a 503 while down', outage.unavailableMs, `max ${Math.round(outage.unavailableMs.at(-1) ?? 0)} ms`);
		check(lost === 0, `0 acknowledged writes lost (${lost} lost of ${ids.length})`);
		check(outage.unavailable > 0, 'writes got 503 while the database was down');
		check([...outage.other.keys()].every((s) => s === 201), 'no answer other than 201 or 503 (no 500, no hang)');
		check(outage.firstOkAfterUp > 0, 'writes succeed again after the restart, with no restart of the app');
		check(all.every((n, i) => n === i + 1), `numbers still gap-free (${all.length} revisions)`);
		void revisionId;
	} finally {
		server.kill('SIGKILL');
		await mail.close();
	}
	console.log(failed ? '\nsoak: a check FAILED' : '\nsoak: every check held');
	process.exit(failed ? 1 : 0);
}

await main();
