// Members, invitations and password resets over HTTP, with the mails read back from the fake SMTP server.
import { randomUUID } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import { afterAll, describe, expect, test } from 'vitest';
import { auditEvents, invitations, memberships } from '../../src/lib/server/db/schema';
import { Client, closeDb, freshAccount, testDb } from './helpers';

afterAll(closeDb);

/** Posts a form to a page action the way a browser without JavaScript does (asking for HTML, not the JSON of `enhance`). */
function post(client: Client, path: string, fields: Record<string, string>) {
	return client.fetch(path, {
		method: 'POST',
		headers: { 'content-type': 'application/x-www-form-urlencoded', accept: 'text/html' },
		body: new URLSearchParams(fields)
	});
}

/** The messages the fake SMTP server kept for an address, newest first. */
async function mailsTo(address: string): Promise<{ subject: string; text: string; html: string }[]> {
	return (await (await new Client().fetch(`/dev/mail/messages.json?to=${encodeURIComponent(address)}`)).json()).messages;
}

/** The path of the first link to a page of ours in a mail's text. */
function linkIn(text: string, prefix: string) {
	const m = text.match(new RegExp(`https?://[^\\s]+(${prefix}/[A-Za-z0-9_-]{43})`));
	expect(m, `a ${prefix} link in: ${text}`).not.toBeNull();
	return m![1];
}

const address = (what: string) => `${what}-${randomUUID().slice(0, 8)}@example.test`;

describe('invitations', () => {
	test('an owner invites a new engineer; the mailed link creates the account, which can then edit in the team', async () => {
		const owner = await freshAccount('owner');
		const email = address('new-engineer');
		expect((await post(owner.client, '/team/members?/invite', { email, role: 'engineer' })).status).toBe(200);
		const [mail] = await mailsTo(email);
		expect(mail.subject).toContain('Team owner');
		expect(mail.text).toContain('as an engineer');
		expect(mail.html).toContain('/invite/');
		const path = linkIn(mail.text, '/invite');

		const invited = new Client();
		const page = await invited.fetch(path);
		expect(page.status).toBe(200);
		expect(await page.text()).toContain('Create your account for');
		const created = await post(invited, `${path}?/create`, { name: 'New Engineer', password: 'long enough pass', email, providerId: 'credentials', redirectTo: '/' });
		expect([302, 303]).toContain(created.status);
		expect(invited.signedIn).toBe(true);

		const [member] = await testDb().select().from(memberships).where(and(eq(memberships.teamId, owner.teamId), eq(memberships.role, 'engineer')));
		expect(member).toBeDefined();
		const car = await invited.json('/api/v1/cars', 'POST', { name: 'Built by the invited engineer' });
		expect(car.status).toBe(201);
		const owned = await (await owner.client.fetch('/api/v1/cars')).json();
		expect(owned.cars.map((c: { name: string }) => c.name)).toContain('Built by the invited engineer');

		// Used once: the same link is gone.
		expect((await new Client().fetch(path)).status).toBe(410);
		const actions = (await testDb().select().from(auditEvents).where(eq(auditEvents.teamId, owner.teamId))).map((e) => e.action);
		expect(actions).toEqual(expect.arrayContaining(['member.invited', 'invitation.accepted']));
	});

	test('an existing account signed in with the invited address adds the team to its own', async () => {
		const owner = await freshAccount('owner');
		const existing = await freshAccount('existing');
		expect((await post(owner.client, '/team/members?/invite', { email: existing.email, role: 'viewer' })).status).toBe(200);
		const path = linkIn((await mailsTo(existing.email))[0].text, '/invite');

		const other = await freshAccount('other');
		expect((await post(other.client, `${path}?/join`, {})).status).toBe(403);

		expect((await post(existing.client, `${path}?/join`, {})).status).toBe(303);
		const rows = await testDb().select().from(memberships).where(eq(memberships.userId, existing.user.id));
		expect(rows.map((r) => [r.teamId, r.role]).sort()).toEqual([[existing.teamId, 'owner'], [owner.teamId, 'viewer']].sort());
	});

	test('cancelling makes the link 404; resending replaces the link', async () => {
		const owner = await freshAccount('owner');
		const email = address('invitee');
		await post(owner.client, '/team/members?/invite', { email, role: 'engineer' });
		const first = linkIn((await mailsTo(email))[0].text, '/invite');
		const [inv] = await testDb().select().from(invitations).where(eq(invitations.email, email));
		expect((await post(owner.client, '/team/members?/resend', { invitationId: inv.id })).status).toBe(200);
		const mails = await mailsTo(email);
		expect(mails).toHaveLength(2);
		const second = linkIn(mails[0].text, '/invite');
		expect(second).not.toBe(first);
		expect((await new Client().fetch(first)).status).toBe(404);
		expect((await new Client().fetch(second)).status).toBe(200);
		expect((await post(owner.client, '/team/members?/cancel', { invitationId: inv.id })).status).toBe(200);
		expect((await new Client().fetch(second)).status).toBe(404);
	});

	test('a bad address is refused naming the field; an invitation mail that fails says so and keeps the invitation', async () => {
		const owner = await freshAccount('owner');
		const bad = await post(owner.client, '/team/members?/invite', { email: 'nope', role: 'engineer' });
		expect(bad.status).toBe(400);
		expect(await bad.text()).toContain('Enter a valid e-mail address');
		const member = await post(owner.client, '/team/members?/invite', { email: owner.email, role: 'viewer' });
		expect(member.status).toBe(400);
		expect(await member.text()).toContain('is already a member of');
		const failing = await post(owner.client, '/team/members?/invite', { email: 'crew@fail.example.test', role: 'viewer' });
		expect(await failing.text()).toContain('The mail server refused the address crew@fail.example.test');
		const kept = await testDb().select().from(invitations).where(and(eq(invitations.teamId, owner.teamId), eq(invitations.email, 'crew@fail.example.test')));
		expect(kept).toHaveLength(1);
	});
});

describe('members and roles', () => {
	test('the last owner can be neither demoted nor removed; with a second owner they can', async () => {
		const owner = await freshAccount('owner');
		const demote = await post(owner.client, '/team/members?/role', { userId: owner.user.id, role: 'engineer' });
		expect(demote.status).toBe(400);
		expect(await demote.text()).toContain('at least one owner');
		expect((await post(owner.client, '/team/members?/remove', { userId: owner.user.id })).status).toBe(400);

		const second = await freshAccount('second');
		await testDb().insert(memberships).values({ teamId: owner.teamId, userId: second.user.id, role: 'viewer' });
		expect((await post(owner.client, '/team/members?/role', { userId: second.user.id, role: 'owner' })).status).toBe(200);
		expect((await post(owner.client, '/team/members?/role', { userId: owner.user.id, role: 'engineer' })).status).toBe(200);
		const [me] = await testDb().select().from(memberships).where(and(eq(memberships.teamId, owner.teamId), eq(memberships.userId, owner.user.id)));
		expect(me.role).toBe('engineer');
		const events = await testDb().select().from(auditEvents).where(and(eq(auditEvents.teamId, owner.teamId), eq(auditEvents.action, 'member.role_changed')));
		expect(events.map((e) => e.detail)).toEqual(
			expect.arrayContaining([expect.objectContaining({ from: 'viewer', to: 'owner' }), expect.objectContaining({ from: 'owner', to: 'engineer' })])
		);
	});

	test('an owner removes a member, which is logged; members page and audit log are for owners only', async () => {
		const owner = await freshAccount('owner');
		const member = await freshAccount('member');
		await testDb().insert(memberships).values({ teamId: owner.teamId, userId: member.user.id, role: 'engineer' });
		expect((await post(owner.client, '/team/members?/remove', { userId: member.user.id })).status).toBe(200);
		const left = await testDb().select().from(memberships).where(and(eq(memberships.teamId, owner.teamId), eq(memberships.userId, member.user.id)));
		expect(left).toHaveLength(0);
		const log = await owner.client.fetch('/team/audit');
		expect(log.status).toBe(200);
		expect(await log.text()).toContain('removed a member');

		const engineer = new Client();
		await engineer.signIn('engineer@linkwright.test');
		expect((await engineer.fetch('/team/members')).status).toBe(403);
		expect((await engineer.fetch('/team/audit')).status).toBe(403);
		expect((await post(engineer, '/team/members?/invite', { email: address('x'), role: 'owner' })).status).toBe(403);
	});
});

describe('password reset', () => {
	test('the mailed one-time link sets a new password; the old one stops working and the link cannot be used twice', async () => {
		const account = await freshAccount('forgetful');
		const asked = await post(new Client(), '/password/forgot', { email: account.email });
		expect(asked.status).toBe(200);
		const [mail] = await mailsTo(account.email);
		expect(mail.subject).toBe('Reset your Linkwright password');
		expect(mail.html).toContain('/password/reset/');
		const path = linkIn(mail.text, '/password/reset');
		expect((await new Client().fetch(path)).status).toBe(200);
		const mismatch = await post(new Client(), path, { password: 'a brand new secret', confirm: 'something else' });
		expect(mismatch.status).toBe(400);
		const done = await post(new Client(), path, { password: 'a brand new secret', confirm: 'a brand new secret' });
		expect(done.status).toBe(303);
		expect(done.headers.get('location')).toBe('/signin?reset=1');

		const withNew = new Client();
		await withNew.signIn(account.email, 'a brand new secret');
		expect(withNew.signedIn).toBe(true);
		const withOld = new Client();
		await withOld.signIn(account.email, account.password);
		expect(withOld.signedIn).toBe(false);
		expect((await new Client().fetch(path)).status).toBe(410);
	});

	test('an unknown address gets the same answer and no mail; the fourth request within the hour is refused', async () => {
		const unknown = address('nobody');
		const res = await post(new Client(), '/password/forgot', { email: unknown });
		expect(res.status).toBe(200);
		expect(await res.text()).toContain('If ' + unknown + ' has an account');
		expect(await mailsTo(unknown)).toHaveLength(0);
		const account = await freshAccount('hasty');
		for (let i = 0; i < 3; i++) expect((await post(new Client(), '/password/forgot', { email: account.email })).status).toBe(200);
		const limited = await post(new Client(), '/password/forgot', { email: account.email });
		expect(limited.status).toBe(429);
		expect(await limited.text()).toContain('Too many reset requests');
		expect(await mailsTo(account.email)).toHaveLength(3);
	});
});
