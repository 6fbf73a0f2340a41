// Shared helpers for integration tests: an HTTP client with a cookie jar, and direct database access.
import { randomUUID } from 'node:crypto';
import { connect } from '../../src/lib/server/db/connect';
import { createUserWithTeam } from '../../src/lib/server/db/queries/users';
import { hashPassword } from '../../src/lib/server/auth/passwords';
import { databaseUrl, testDatabase } from '../../scripts/db.mjs';

export const baseUrl = () => process.env.LW_TEST_BASE_URL ?? `http://127.0.0.1:${Number(process.env.LW_TEST_PORT ?? 3100) + 50}`;
export const DEMO_PASSWORD = 'linkwright-demo';
export const DEMO_CAR_ID = '00000000-0000-4000-8000-00000000ca01';
export const DEMO_TEAM_ID = '00000000-0000-4000-8000-00000000d3e0';

let handle: ReturnType<typeof connect> | null = null;

/** The test database (one small pool shared by a test file). */
export function testDb() {
	handle ??= connect(process.env.TEST_DATABASE_URL ?? (databaseUrl(testDatabase) as string), 2);
	return handle.db;
}

/** Closes the pool at the end of a file. */
export async function closeDb() {
	await handle?.client.end();
	handle = null;
}

/** A browser-like client: keeps cookies, sends our own Origin on posts. */
export class Client {
	cookies = new Map<string, string>();

	/** Sends a request to a path of the app, recording Set-Cookie headers. */
	async fetch(path: string, init: RequestInit = {}) {
		const headers = new Headers(init.headers);
		if (this.cookies.size) headers.set('cookie', [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; '));
		if (init.method && init.method !== 'GET' && !headers.has('origin')) headers.set('origin', baseUrl());
		const res = await fetch(baseUrl() + path, { ...init, headers, redirect: 'manual' });
		for (const line of res.headers.getSetCookie()) {
			const [pair] = line.split(';');
			const [name, ...rest] = pair.split('=');
			const value = rest.join('=');
			if (value === '' || /max-age=0/i.test(line) || /expires=thu, 01 jan 1970/i.test(line)) this.cookies.delete(name);
			else this.cookies.set(name, value);
		}
		return res;
	}

	/** Sends JSON with a method, returning the response. */
	json(path: string, method: string, body: unknown) {
		return this.fetch(path, { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
	}

	/** Signs in through Auth.js's credentials callback; returns the redirect location. */
	async signIn(email: string, password = DEMO_PASSWORD) {
		const body = new URLSearchParams({ email, password, callbackUrl: '/' });
		const res = await this.fetch('/auth/callback/credentials', {
			method: 'POST',
			headers: { 'content-type': 'application/x-www-form-urlencoded' },
			body
		});
		return res.headers.get('location') ?? '';
	}

	get signedIn() {
		return [...this.cookies.keys()].some((k) => k.endsWith('authjs.session-token'));
	}
}

/** Creates a fresh account with its own team; returns the account, its team and a signed-in client. */
export async function freshAccount(prefix = 'user') {
	const email = `${prefix}-${randomUUID().slice(0, 8)}@example.test`;
	const password = 'correct horse battery';
	const created = await createUserWithTeam(testDb(), {
		email,
		name: `Test ${prefix}`,
		teamName: `Team ${prefix}`,
		passwordHash: await hashPassword(password)
	});
	if (!created) throw new Error('could not create the test account');
	const client = new Client();
	await client.signIn(email, password);
	return { ...created, email, password, client };
}
