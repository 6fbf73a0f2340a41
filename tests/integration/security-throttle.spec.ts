// Issue 21, sign-in throttling that slows only the attacker. Requests come from distinct loopback addresses
// (127.x.y.z all reach the app on this machine), so each test has addresses of its own.
// Outside rules: OWASP, "Slow Down Online Guessing Attacks with Device Cookies" (a browser that signed in to the
// account before is not held back by failures from its address) and OWASP's Authentication Cheat Sheet
// ("Account Lockout": a lock-out lets an attacker deny the real user; prefer delays).
import http from 'node:http';
import { randomInt } from 'node:crypto';
import { afterAll, describe, expect, test } from 'vitest';
import { baseUrl, closeDb, freshAccount } from './helpers';

afterAll(closeDb);

/** A fresh loopback address for this run. */
const address = () => `127.${randomInt(1, 255)}.${randomInt(0, 256)}.${randomInt(1, 255)}`;

/** One sign-in through Auth.js's credentials callback from a local address, with an optional device cookie. */
function signIn(from: string, email: string, password: string, device?: string) {
	const url = new URL('/auth/callback/credentials', baseUrl());
	const body = new URLSearchParams({ email, password, callbackUrl: '/' }).toString();
	return new Promise<{ signedIn: boolean; location: string; device?: string }>((resolve, reject) => {
		const req = http.request(
			url,
			{
				method: 'POST',
				localAddress: from,
				headers: {
					'content-type': 'application/x-www-form-urlencoded',
					'content-length': Buffer.byteLength(body),
					origin: baseUrl(),
					...(device ? { cookie: `lw_device=${device}` } : {})
				}
			},
			(res) => {
				res.resume();
				const cookies = res.headers['set-cookie'] ?? [];
				const session = cookies.some((c) => /authjs\.session-token=[^;]+/.test(c) && !/session-token=;/.test(c));
				const newDevice = cookies.map((c) => /^lw_device=([^;]+)/.exec(c)?.[1]).find(Boolean);
				res.on('end', () => resolve({ signedIn: session, location: String(res.headers.location ?? ''), device: newDevice ?? device }));
			}
		);
		req.on('error', reject);
		req.end(body);
	});
}

describe('sign-in throttling', () => {
	test('30 failures over 30 accounts from one address do not stop a correct sign-in of another account from a browser known to it there', async () => {
		const shared = address();
		const owner = await freshAccount('known-device');
		const first = await signIn(shared, owner.email, owner.password);
		expect(first.signedIn).toBe(true);
		expect(first.device).toMatch(/^[A-Za-z0-9_-]{43}$/);
		for (let i = 0; i < 30; i++) {
			const attempt = await signIn(shared, `guess-${i}-${randomInt(1e9)}@example.test`, 'not the password');
			expect(attempt.signedIn).toBe(false);
			expect(attempt.location).toContain('code=credentials');
		}
		// the address is over its budget: a browser that never signed in here waits ...
		const stranger = await freshAccount('stranger');
		const refused = await signIn(shared, stranger.email, stranger.password);
		expect(refused.signedIn).toBe(false);
		expect(refused.location).toContain('code=rate_limited');
		// ... but the owner's browser, known to the account, signs in at once
		const known = await signIn(shared, owner.email, owner.password, first.device);
		expect(known.location).not.toContain('error');
		expect(known.signedIn).toBe(true);
	});

	test('8 failures on one account from one address do not stop its owner from another address; that address alone waits', async () => {
		const [attacker, home] = [address(), address()];
		const victim = await freshAccount('victim');
		for (let i = 0; i < 8; i++) {
			const attempt = await signIn(attacker, victim.email, `wrong ${i}`);
			expect(attempt.signedIn).toBe(false);
		}
		const fromAttacker = await signIn(attacker, victim.email, victim.password);
		expect(fromAttacker.location).toContain('code=rate_limited');
		const fromHome = await signIn(home, victim.email, victim.password);
		expect(fromHome.signedIn).toBe(true);
		// the owner's browser, once known, is not held back even at the attacker's address
		const sameAddress = await signIn(attacker, victim.email, victim.password, fromHome.device);
		expect(sameAddress.signedIn).toBe(true);
	});

	test('a device cookie of another account, or a made-up one, counts as no known device', async () => {
		const shared = address();
		const a = await freshAccount('device-a');
		const b = await freshAccount('device-b');
		const ofA = (await signIn(address(), a.email, a.password)).device!;
		for (let i = 0; i < 8; i++) await signIn(shared, b.email, `wrong ${i}`);
		expect((await signIn(shared, b.email, b.password, ofA)).location).toContain('code=rate_limited');
		expect((await signIn(shared, b.email, b.password, 'x'.repeat(43))).location).toContain('code=rate_limited');
	});
});
