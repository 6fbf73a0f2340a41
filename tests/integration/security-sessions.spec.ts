// Issue 21, sessions: a session cookie replayed after sign-out, a password reset, a removal from a team or
// "sign out everywhere" is refused (401) on its next request; a cross-site bodiless POST /auth/signout is refused.
// OWASP Session Management Cheat Sheet ("Session Expiration": a logged-out session must be invalidated on the
// server, not only in the browser) is the outside rule checked here.
import { afterAll, describe, expect, test } from 'vitest';
import { memberships } from '../../src/lib/server/db/schema';
import { createPasswordReset } from '../../src/lib/server/db/queries/password-resets';
import { hashToken, newToken } from '../../src/lib/server/auth/tokens';
import { Client, baseUrl, closeDb, freshAccount, testDb } from './helpers';

afterAll(closeDb);

/** The client's cookies as one Cookie header, to replay later as a script would. */
const jarOf = (client: Client) => [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ');

/** GET /api/v1/cars with a saved Cookie header; the status. */
async function replay(jar: string) {
	return (await fetch(`${baseUrl()}/api/v1/cars`, { headers: { cookie: jar } })).status;
}

/** A form post as a browser on our own site sends it. */
function form(client: Client, path: string, fields: Record<string, string>) {
	return client.fetch(path, {
		method: 'POST',
		headers: { 'content-type': 'application/x-www-form-urlencoded', accept: 'text/html' },
		body: new URLSearchParams(fields)
	});
}

describe('revocable sessions', () => {
	test('after sign-out the old cookie, replayed, gets 401', async () => {
		const { client } = await freshAccount('signout');
		const jar = jarOf(client);
		expect(await replay(jar)).toBe(200);
		const res = await form(client, '/signout', { redirectTo: '/signin' });
		expect(res.status).toBeLessThan(400);
		expect(client.signedIn).toBe(false);
		expect(await replay(jar)).toBe(401);
	});

	test('after a password reset every session of the account gets 401; the new password signs in', async () => {
		const account = await freshAccount('reset');
		const other = new Client();
		await other.signIn(account.email, account.password);
		const jars = [jarOf(account.client), jarOf(other)];
		for (const jar of jars) expect(await replay(jar)).toBe(200);
		const token = newToken();
		await createPasswordReset(testDb(), account.user.id, hashToken(token), new Date(Date.now() + 3600_000));
		const res = await form(new Client(), `/password/reset/${token}`, { password: 'a brand new passphrase', confirm: 'a brand new passphrase' });
		expect(res.status).toBe(303);
		for (const jar of jars) expect(await replay(jar)).toBe(401);
		const again = new Client();
		await again.signIn(account.email, 'a brand new passphrase');
		expect((await again.fetch('/api/v1/cars')).status).toBe(200);
	});

	test('removed from a team, every session of the member gets 401 (even for their own team)', async () => {
		const owner = await freshAccount('remover');
		const member = await freshAccount('removed');
		await testDb().insert(memberships).values({ teamId: owner.teamId, userId: member.user.id, role: 'engineer' });
		const jar = jarOf(member.client);
		expect(await replay(jar)).toBe(200);
		const res = await form(owner.client, '/team/members?/remove', { userId: member.user.id });
		expect(res.status).toBe(200);
		expect(await replay(jar)).toBe(401);
		expect(await replay(jarOf(owner.client))).toBe(200);
	});

	test('"Sign out everywhere" on the Account page ends this and every other session of the user, not other users\'', async () => {
		const account = await freshAccount('everywhere');
		const laptop = new Client();
		await laptop.signIn(account.email, account.password);
		const bystander = await freshAccount('bystander');
		const jars = [jarOf(account.client), jarOf(laptop)];
		expect(await (await account.client.fetch('/account')).text()).toContain('Sign out everywhere');
		const res = await form(account.client, '/account?/signOutEverywhere', {});
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/signin');
		for (const jar of jars) expect(await replay(jar)).toBe(401);
		expect(await replay(jarOf(bystander.client))).toBe(200);
	});
});

describe('cross-site sign-out', () => {
	test('a bodiless POST /auth/signout from another origin is refused (403) and the session lives on', async () => {
		const { client } = await freshAccount('csrf-signout');
		const jar = jarOf(client);
		const res = await fetch(`${baseUrl()}/auth/signout`, { method: 'POST', headers: { cookie: jar, origin: 'http://evil.example' }, redirect: 'manual' });
		expect(res.status).toBe(403);
		expect(res.headers.getSetCookie().some((c) => c.startsWith('authjs.session-token=;') || /session-token=;/.test(c))).toBe(false);
		expect(await replay(jar)).toBe(200);
	});

	test('Sec-Fetch-Site: cross-site without an Origin is refused too; our own origin may sign out', async () => {
		const { client } = await freshAccount('fetch-site');
		const jar = jarOf(client);
		const res = await fetch(`${baseUrl()}/auth/signout`, { method: 'POST', headers: { cookie: jar, 'sec-fetch-site': 'cross-site' }, redirect: 'manual' });
		expect(res.status).toBe(403);
		expect(await replay(jar)).toBe(200);
		const own = await client.fetch('/auth/signout', { method: 'POST' });
		expect(own.status).toBeLessThan(400);
		expect(await replay(jar)).toBe(401);
	});
});
