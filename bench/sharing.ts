// Sharing figures over HTTP on loopback: creating a link with its mail through the fake SMTP server, opening the
// shop sheet signed out, downloading its CSV, and printing the sheet to PDF in Chromium. Prints figures only.
// Uses the built app and the test database (prepared by the workspace bench before it, or by `npm test`).
import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { chromium } from '@playwright/test';
import { databaseUrl, testDatabase } from '../scripts/db.mjs';
import { hashPassword } from '../src/lib/server/auth/passwords';
import { connect } from '../src/lib/server/db/connect';
import { createUserWithTeam } from '../src/lib/server/db/queries/users';
import { ensureBuild, waitForHttp } from '../scripts/setup.mjs';
import { startTestMailServer, startTestServer } from '../scripts/test-server.mjs';

const REVISION_OPENS = 40; // under the 60-per-10-minutes limit of one link and address
const MAILS = 15; // under the 20-per-hour limit of one sender
const PRINTS = 5;

/** The p-th percentile of sorted values. */
const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];

/** Milliseconds of each call of fn, sorted. */
async function timed(n: number, fn: (i: number) => Promise<unknown>) {
	const times: number[] = [];
	for (let i = 0; i < n; i++) {
		const t0 = performance.now();
		await fn(i);
		times.push(performance.now() - t0);
	}
	return times.sort((a, b) => a - b);
}

/** A line of figures: p50 and p95 in ms. */
function line(label: string, times: number[]) {
	console.log(`  ${label.padEnd(52)} p50 ${percentile(times, 50).toFixed(1).padStart(7)} ms   p95 ${percentile(times, 95).toFixed(1).padStart(7)} ms   (${times.length} runs)`);
}

/** A fresh account with its own team (so the mail limit of earlier runs does not count), signed in: its cookie header. */
async function signIn(base: string) {
	const email = `bench-${randomUUID().slice(0, 8)}@example.test`;
	const password = 'bench password long enough';
	const { db, client } = connect(databaseUrl(testDatabase) as string, 1);
	await createUserWithTeam(db, { email, name: 'Bench engineer', teamName: 'Bench team', passwordHash: await hashPassword(password) });
	await client.end();
	const body = new URLSearchParams({ email, password, callbackUrl: '/' });
	const res = await fetch(`${base}/auth/callback/credentials`, { method: 'POST', body, redirect: 'manual', headers: { origin: base } });
	return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
}

/** Prints the sharing figures. */
export async function run() {
	ensureBuild();
	const port = Number(process.env.LW_TEST_PORT ?? 3100) + 70;
	const base = `http://127.0.0.1:${port}`;
	const mail = await startTestMailServer();
	const server = startTestServer(port);
	const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking'] });
	try {
		await waitForHttp(`${base}/signin`);
		const cookie = await signIn(base);
		const json = { cookie, 'content-type': 'application/json', origin: base };
		const geometry = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
		const car = await (await fetch(`${base}/api/v1/cars`, { method: 'POST', headers: json, body: JSON.stringify({ name: `Bench sharing ${Date.now()}` }) })).json();
		const corner = await (await fetch(`${base}/api/v1/cars/${car.id}/corners`, { method: 'POST', headers: json, body: JSON.stringify({ position: 'front_left', kind: 'double_wishbone' }) })).json();
		const revision = await (await fetch(`${base}/api/v1/corners/${corner.id}/revisions`, { method: 'POST', headers: json, body: JSON.stringify({ label: 'bench', note: '', geometry }) })).json();
		const shares = `${base}/api/v1/revisions/${revision.id}/shares`;

		let url = '';
		const create = await timed(MAILS, async (i) => {
			const res = await fetch(shares, { method: 'POST', headers: json, body: JSON.stringify({ email: `bench-${i}@example.test` }) });
			const body = await res.json();
			if (res.status !== 201 || !body.mail?.sent) throw new Error(`share creation failed: ${res.status} ${JSON.stringify(body)}`);
			url = body.url;
		});
		line('create a link and mail it (SMTP to the fake server)', create);
		line('open the shop sheet signed out (HTML, solve included)', await timed(REVISION_OPENS, () => fetch(url).then((r) => r.text())));
		const csvLink = (await (await fetch(shares, { method: 'POST', headers: json, body: '{}' })).json()).url;
		line('download the sheet as CSV', await timed(REVISION_OPENS, () => fetch(`${csvLink}/csv`).then((r) => r.text())));

		const printLink = (await (await fetch(shares, { method: 'POST', headers: json, body: '{}' })).json()).url;
		const page = await browser.newPage();
		await page.goto(printLink);
		await page.emulateMedia({ media: 'print' });
		const pdfs: number[] = [];
		line('print the sheet to PDF in Chromium (A4)', await timed(PRINTS, async () => pdfs.push((await page.pdf({ format: 'A4' })).length)));
		console.log(`  PDF size of the sheet                                ${(pdfs[0] / 1024).toFixed(1).padStart(8)} KB`);
	} finally {
		await browser.close();
		server.kill('SIGKILL');
		await Promise.race([mail.close(), new Promise((r) => setTimeout(r, 1000))]);
	}
}
