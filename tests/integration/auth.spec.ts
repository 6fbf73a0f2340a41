import { afterAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { memberships } from '../../src/lib/server/db/schema';
import { Client, DEMO_CAR_ID, baseUrl, closeDb, freshAccount, testDb } from './helpers';

afterAll(closeDb);

describe('sign-in', () => {
	test('a demo account signs in and gets a session cookie', async () => {
		const client = new Client();
		const location = await client.signIn('engineer@linkwright.test');
		expect(location).not.toContain('error');
		expect(client.signedIn).toBe(true);
		const res = await client.fetch('/api/v1/cars');
		expect(res.status).toBe(200);
	});

	test('a wrong password gives no session and the same answer as an unknown account', async () => {
		const wrong = new Client();
		const unknown = new Client();
		const a = await wrong.signIn('viewer@linkwright.test', 'not the password');
		const b = await unknown.signIn('nobody-here@linkwright.test', 'not the password');
		expect(wrong.signedIn).toBe(false);
		expect(unknown.signedIn).toBe(false);
		expect(a).toContain('/signin?error=CredentialsSignin&code=credentials');
		expect(b).toBe(a);
	});

	test('the sign-in page explains a failed attempt', async () => {
		const res = await new Client().fetch('/signin?error=CredentialsSignin&code=credentials');
		expect(await res.text()).toContain('Wrong e-mail or password.');
	});

	test('attempts are throttled per account and address: after 8 failures the right password from that address, on a browser that never signed in, waits', async () => {
		const { email, password } = await freshAccount('limited');
		for (let i = 0; i < 8; i++) await new Client().signIn(email, `wrong ${i}`);
		const client = new Client();
		const location = await client.signIn(email, password);
		expect(location).toContain('code=rate_limited');
		expect(client.signedIn).toBe(false);
	});

	test('a session cookie read a moment ago keeps working unrenewed; a changed one is refused; the account still follows its teams', async () => {
		const { client, teamId } = await freshAccount('cookie');
		const jar = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
		// a script that never stores the renewed cookie: the same cookie, again and again
		for (let i = 0; i < 3; i++) expect((await fetch(`${baseUrl()}/api/v1/cars`, { headers: { cookie: jar } })).status).toBe(200);
		const token = client.cookies.get('authjs.session-token')!;
		const changed = jar.replace(token, token.slice(0, -4) + (token.endsWith('AAAA') ? 'BBBB' : 'AAAA'));
		expect((await fetch(`${baseUrl()}/api/v1/cars`, { headers: { cookie: changed } })).status).toBe(401);
		// the account's teams are read on every request, however recently its cookie was read
		await testDb().delete(memberships).where(eq(memberships.teamId, teamId));
		const me = await fetch(`${baseUrl()}/api/v1/cars?team=${teamId}`, { headers: { cookie: jar } });
		expect(me.status).toBe(404);
	});

	test('sign-out clears the session', async () => {
		const client = new Client();
		await client.signIn('owner@linkwright.test');
		const res = await client.fetch('/signout', {
			method: 'POST',
			headers: { 'content-type': 'application/x-www-form-urlencoded' },
			body: new URLSearchParams({ redirectTo: '/signin' })
		});
		expect(res.status).toBeLessThan(400);
		expect(client.signedIn).toBe(false);
		expect((await client.fetch('/api/v1/cars')).status).toBe(401);
	});
});

describe('cross-site form posts', () => {
	test('a form post from another origin is rejected (SvelteKit origin check)', async () => {
		const { client } = await freshAccount('csrf');
		const res = await client.fetch('/cars/new', {
			method: 'POST',
			headers: { origin: 'http://evil.example', 'content-type': 'application/x-www-form-urlencoded' },
			body: new URLSearchParams({ name: 'Forged car' })
		});
		expect(res.status).toBe(403);
	});
});

describe('pages of another team', () => {
	test("a second team's user gets 404 on the demo car's page", async () => {
		const { client } = await freshAccount('outsider');
		const res = await client.fetch(`/cars/${DEMO_CAR_ID}`);
		expect(res.status).toBe(404);
	});

	test('an anonymous visitor is sent to sign in', async () => {
		const res = await new Client().fetch(`/cars/${DEMO_CAR_ID}`);
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toContain('/signin?redirectTo=');
	});
});
