// Accepting an invitation: create an account, or (signed in with the invited address) add the team to yours.
import { error, fail, redirect, type RequestEvent } from '@sveltejs/kit';
import { signIn } from '../../../auth';
import { acceptWithNewAccount } from '$lib/schemas/team';
import { hashPassword } from '$lib/server/auth/passwords';
import { TEAM_COOKIE } from '$lib/server/auth/account';
import { hashToken } from '$lib/server/auth/tokens';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { acceptInvitation, createUserForInvitation, invitationByTokenHash } from '$lib/server/db/queries/members';
import { findUserByEmail } from '$lib/server/db/queries/users';
import { parseForm } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

/** The open invitation behind the URL's token: 404 when unknown or cancelled, 410 when used or expired. */
async function openInvitation(event: RequestEvent<{ token: string }>) {
	const found = await invitationByTokenHash(db, hashToken(event.params.token));
	if (!found || found.invitation.cancelledAt) error(404, { message: 'This invitation does not exist or was cancelled.', code: 'not_found' });
	if (found.invitation.acceptedAt) error(410, { message: 'This invitation has already been accepted. Sign in to reach the team.', code: 'used' });
	if (found.invitation.expiresAt.getTime() <= Date.now()) {
		error(410, { message: 'This invitation has expired. Ask the team owner to send it again.', code: 'expired' });
	}
	return found;
}

/** Makes the joined team the current one. */
function selectTeam(event: RequestEvent, teamId: string) {
	event.cookies.set(TEAM_COOKIE, teamId, { path: '/', httpOnly: true, sameSite: 'lax', secure: event.url.protocol === 'https:', maxAge: 365 * 24 * 3600 });
}

export const load: PageServerLoad = async (event) => {
	// same-origin, not no-referrer: with no-referrer the browser sends "Origin: null" on the form post, which the CSRF check refuses.
	event.setHeaders({ 'referrer-policy': 'same-origin', 'cache-control': 'private, no-store' });
	const { invitation, teamName, invitedByName } = await openInvitation(event);
	const account = await findUserByEmail(db, invitation.email);
	const signedInAs = event.locals.user?.email ?? null;
	return {
		teamName,
		invitedByName,
		email: invitation.email,
		role: invitation.role,
		expiresAt: invitation.expiresAt,
		accountExists: account !== null,
		signedInAs,
		alreadyMember: event.locals.teams.some((t) => t.id === invitation.teamId) && signedInAs === invitation.email,
		path: event.url.pathname
	};
};

export const actions: Actions = {
	/** An existing account, signed in with the invited address, joins the team. */
	join: async (event) => {
		const { invitation } = await openInvitation(event);
		const user = event.locals.user;
		if (!user) redirect(303, `/signin?redirectTo=${encodeURIComponent(event.url.pathname)}`);
		if (user.email !== invitation.email) return fail(403, { error: `This invitation is for ${invitation.email}; you are signed in as ${user.email}.` });
		if (!(await acceptInvitation(db, invitation.id, invitation.teamId, user.id, invitation.role))) {
			return fail(410, { error: 'This invitation is no longer open.' });
		}
		await recordAudit(db, {
			teamId: invitation.teamId,
			actorId: user.id,
			action: 'invitation.accepted',
			subjectType: 'invitation',
			subjectId: invitation.id,
			detail: { email: invitation.email, role: invitation.role, account: 'existing' }
		});
		selectTeam(event, invitation.teamId);
		redirect(303, '/');
	},
	/** A new account for the invited address, member of the team, then signed in. */
	create: async (event) => {
		const { invitation } = await openInvitation(event);
		const form = await event.request.clone().formData();
		const parsed = parseForm(form, acceptWithNewAccount);
		if (!parsed.ok) return fail(400, { errors: parsed.errors, values: parsed.values });
		const created = await createUserForInvitation(db, {
			invitationId: invitation.id,
			teamId: invitation.teamId,
			role: invitation.role,
			email: invitation.email,
			name: parsed.data.name,
			passwordHash: await hashPassword(parsed.data.password)
		});
		if (created === 'exists') return fail(400, { error: `${invitation.email} already has an account: sign in to accept.` });
		if (created === 'closed') return fail(410, { error: 'This invitation is no longer open.' });
		await recordAudit(db, {
			teamId: invitation.teamId,
			actorId: created.id,
			action: 'invitation.accepted',
			subjectType: 'invitation',
			subjectId: invitation.id,
			detail: { email: invitation.email, role: invitation.role, account: 'new' }
		});
		selectTeam(event, invitation.teamId);
		// Auth.js signs the new account in from the form's e-mail (hidden) and password, then redirects.
		await signIn(event);
	}
};
