// Members page of the current team (owners only): members, pending invitations, roles.
import { fail } from '@sveltejs/kit';
import { invitationRef, inviteInput, memberInput, roleChangeInput } from '$lib/schemas/team';
import { db } from '$lib/server/db';
import { isMemberByEmail, membersOfTeam, pendingInvitations } from '$lib/server/db/queries/members';
import { parseForm } from '$lib/server/forms';
import { requireTeam, requireUser } from '$lib/server/permissions';
import { cancel, invite, remove, resend, setRole } from '$lib/server/team/members';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const team = requireTeam(event, 'manage_members');
	return {
		teamName: team.name,
		members: await membersOfTeam(db, team.id),
		invitations: await pendingInvitations(db, team.id),
		me: requireUser(event).id
	};
};

export const actions: Actions = {
	invite: async (event) => {
		const team = requireTeam(event, 'manage_members');
		const parsed = parseForm(await event.request.formData(), inviteInput);
		if (!parsed.ok) return fail(400, { invite: { errors: parsed.errors, values: parsed.values } });
		if (await isMemberByEmail(db, team.id, parsed.data.email)) {
			return fail(400, { invite: { errors: { email: `${parsed.data.email} is already a member of ${team.name}.` }, values: { email: parsed.data.email, role: parsed.data.role } } });
		}
		const { invitation, mail } = await invite(event, team, requireUser(event), parsed.data);
		return { notice: mail.sent ? `Invitation mailed to ${invitation.email}.` : null, mailError: mail.sent ? null : mail.message };
	},
	resend: async (event) => {
		const team = requireTeam(event, 'manage_members');
		const parsed = parseForm(await event.request.formData(), invitationRef);
		if (!parsed.ok) return fail(400, { error: parsed.errors.invitationId });
		const done = await resend(event, team, requireUser(event), parsed.data.invitationId);
		if (!done) return fail(400, { error: 'That invitation is no longer pending.' });
		return { notice: done.mail.sent ? `Invitation sent again to ${done.invitation.email}.` : null, mailError: done.mail.sent ? null : done.mail.message };
	},
	cancel: async (event) => {
		const team = requireTeam(event, 'manage_members');
		const parsed = parseForm(await event.request.formData(), invitationRef);
		if (!parsed.ok) return fail(400, { error: parsed.errors.invitationId });
		if (!(await cancel(team, requireUser(event), parsed.data.invitationId))) return fail(400, { error: 'That invitation is no longer pending.' });
		return { notice: 'Invitation cancelled.' };
	},
	role: async (event) => {
		const team = requireTeam(event, 'manage_members');
		const parsed = parseForm(await event.request.formData(), roleChangeInput);
		if (!parsed.ok) return fail(400, { error: Object.values(parsed.errors)[0] });
		const changed = await setRole(team, requireUser(event), parsed.data.userId, parsed.data.role);
		return changed.ok ? { notice: 'Role changed.' } : fail(400, { error: changed.message });
	},
	remove: async (event) => {
		const team = requireTeam(event, 'manage_members');
		const parsed = parseForm(await event.request.formData(), memberInput);
		if (!parsed.ok) return fail(400, { error: parsed.errors.userId });
		const removed = await remove(team, requireUser(event), parsed.data.userId);
		return removed.ok ? { notice: 'Member removed.' } : fail(400, { error: removed.message });
	}
};
