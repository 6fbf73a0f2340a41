// Members and invitations of a team, each change written to the audit log. Callers have checked 'manage_members'.
import type { RequestEvent } from '@sveltejs/kit';
import { INVITATION_DAYS } from '$lib/schemas/team';
import { hashToken, newToken } from '$lib/server/auth/tokens';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import {
	cancelInvitation,
	changeRole,
	createInvitation,
	memberOfTeam,
	pendingInvitationOfTeam,
	removeMember,
	renewInvitation
} from '$lib/server/db/queries/members';
import type { Invitation, Role } from '$lib/server/db/schema';
import { invitationMail } from '$lib/server/mail/messages';
import { sendMail } from '$lib/server/mail/transport';
import { allow } from '$lib/server/rate-limit';
import { absoluteUrl } from '$lib/server/urls';

const DAY_MS = 24 * 3600 * 1000;

export interface TeamRef {
	id: string;
	name: string;
}
export interface Actor {
	id: string;
	name: string;
}

export type Mailed = { sent: true } | { sent: false; message: string };

const LAST_OWNER = 'The team must keep at least one owner: make someone else an owner first.';

/** Mails an invitation link within the sender's mail rate limit; never throws. */
async function mailInvitation(event: Pick<RequestEvent, 'url'>, team: TeamRef, actor: Actor, invitation: Invitation, token: string): Promise<Mailed> {
	if (!(await allow('mailByUser', actor.id))) {
		return { sent: false, message: 'You have sent too many mails in the last hour. The invitation is kept: resend it later.' };
	}
	const url = absoluteUrl(event, `/invite/${token}`);
	const sent = await sendMail(
		invitation.email,
		invitationMail({ url, teamName: team.name, role: invitation.role, inviterName: actor.name, expiresAt: invitation.expiresAt })
	);
	return sent.ok ? { sent: true } : { sent: false, message: `${sent.message} The invitation is kept: resend it later.` };
}

/** Invites an address to the team with a role and mails the link. */
export async function invite(event: Pick<RequestEvent, 'url'>, team: TeamRef, actor: Actor, input: { email: string; role: Role }) {
	const token = newToken();
	const invitation = await createInvitation(db, {
		teamId: team.id,
		email: input.email,
		role: input.role,
		tokenHash: hashToken(token),
		invitedBy: actor.id,
		expiresAt: new Date(Date.now() + INVITATION_DAYS * DAY_MS)
	});
	await recordAudit(db, {
		teamId: team.id,
		actorId: actor.id,
		action: 'member.invited',
		subjectType: 'invitation',
		subjectId: invitation.id,
		detail: { email: input.email, role: input.role }
	});
	return { invitation, mail: await mailInvitation(event, team, actor, invitation, token) };
}

/** Sends a pending invitation again with a new link and expiry (the old link stops working); null when not pending. */
export async function resend(event: Pick<RequestEvent, 'url'>, team: TeamRef, actor: Actor, invitationId: string) {
	if (!(await pendingInvitationOfTeam(db, team.id, invitationId))) return null;
	const token = newToken();
	const invitation = await renewInvitation(db, invitationId, hashToken(token), new Date(Date.now() + INVITATION_DAYS * DAY_MS));
	if (!invitation) return null;
	await recordAudit(db, {
		teamId: team.id,
		actorId: actor.id,
		action: 'invitation.resent',
		subjectType: 'invitation',
		subjectId: invitation.id,
		detail: { email: invitation.email, role: invitation.role }
	});
	return { invitation, mail: await mailInvitation(event, team, actor, invitation, token) };
}

/** Cancels a pending invitation; false when it was not pending. */
export async function cancel(team: TeamRef, actor: Actor, invitationId: string) {
	const row = await cancelInvitation(db, team.id, invitationId);
	if (!row) return false;
	await recordAudit(db, {
		teamId: team.id,
		actorId: actor.id,
		action: 'invitation.cancelled',
		subjectType: 'invitation',
		subjectId: row.id,
		detail: { email: row.email, role: row.role }
	});
	return true;
}

export type MemberChange = { ok: true } | { ok: false; message: string };

/** Gives a member another role; the last owner keeps theirs. */
export async function setRole(team: TeamRef, actor: Actor, userId: string, role: Role): Promise<MemberChange> {
	const member = await memberOfTeam(db, team.id, userId);
	const changed = await changeRole(db, team.id, userId, role);
	if (!changed.ok) return { ok: false, message: changed.reason === 'last_owner' ? LAST_OWNER : 'Not a member of this team.' };
	if (changed.before !== role) {
		await recordAudit(db, {
			teamId: team.id,
			actorId: actor.id,
			action: 'member.role_changed',
			subjectType: 'user',
			subjectId: userId,
			detail: { email: member?.email, name: member?.name, from: changed.before, to: role }
		});
	}
	return { ok: true };
}

/** Removes a member from the team; the last owner stays. */
export async function remove(team: TeamRef, actor: Actor, userId: string): Promise<MemberChange> {
	const member = await memberOfTeam(db, team.id, userId);
	const removed = await removeMember(db, team.id, userId);
	if (!removed.ok) return { ok: false, message: removed.reason === 'last_owner' ? LAST_OWNER : 'Not a member of this team.' };
	await recordAudit(db, {
		teamId: team.id,
		actorId: actor.id,
		action: 'member.removed',
		subjectType: 'user',
		subjectId: userId,
		detail: { email: member?.email, name: member?.name, role: removed.before }
	});
	return { ok: true };
}
