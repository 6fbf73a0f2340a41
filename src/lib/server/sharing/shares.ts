// Creating, listing and revoking share links, and mailing them. Callers have checked the 'share' permission.
import type { RequestEvent } from '@sveltejs/kit';
import { flushShareOpens, pendingOpens } from './opens';
import { forgetShare } from './sheet';
import type { CreateShareInput } from '$lib/schemas/share';
import { POSITION_LABELS } from '$lib/schemas/corner';
import { hashToken, newToken } from '$lib/server/auth/tokens';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { createShareLink, revokeShareLink, sharesOfRevision } from '$lib/server/db/queries/shares';
import type { Car, Corner, Revision, ShareLink } from '$lib/server/db/schema';
import { shareLinkMail } from '$lib/server/mail/messages';
import { sendMail } from '$lib/server/mail/transport';
import { allow } from '$lib/server/rate-limit';
import { absoluteUrl } from '$lib/server/urls';

const DAY_MS = 24 * 3600 * 1000;

export interface Shared {
	revision: Revision;
	corner: Corner;
	car: Car;
}

export interface Actor {
	id: string;
	name: string;
}

export type MailOutcome = { to: string; sent: true } | { to: string; sent: false; message: string };

/** Creates a link to the revision and, when an address is given, mails it; a failed mail keeps the link. */
export async function createShare(event: Pick<RequestEvent, 'url'>, target: Shared, actor: Actor, input: CreateShareInput) {
	const token = newToken();
	const expiresAt = new Date(Date.now() + input.expiresInDays * DAY_MS);
	const link = await createShareLink(db, {
		teamId: target.car.teamId,
		revisionId: target.revision.id,
		tokenHash: hashToken(token),
		note: input.note,
		showRevisionNote: input.showRevisionNote,
		expiresAt,
		createdBy: actor.id,
		sentTo: input.email ?? null
	});
	await recordAudit(db, {
		teamId: target.car.teamId,
		actorId: actor.id,
		action: 'share.created',
		subjectType: 'share_link',
		subjectId: link.id,
		detail: { ...describe(target), expiresAt: expiresAt.toISOString(), ...(input.email ? { email: input.email } : {}) }
	});
	const url = absoluteUrl(event, `/s/${token}`);
	const mail = input.email ? await mailShare(target, actor, link, url, input.email) : null;
	return { id: link.id, url, expiresAt, mail };
}

/** The words the audit log keeps about a shared revision. */
function describe({ revision, corner, car }: Shared) {
	return { car: car.name, corner: corner.position, revision: revision.number, revisionId: revision.id };
}

/** Mails a link to the fabricator, within the sender's mail rate limit; never throws. */
export async function mailShare(target: Shared, actor: Actor, link: ShareLink, url: string, to: string): Promise<MailOutcome> {
	if (!(await allow('mailByUser', actor.id))) {
		return { to, sent: false, message: 'You have sent too many mails in the last hour; the link was created, send it yourself or try later.' };
	}
	const content = shareLinkMail({
		url,
		senderName: actor.name,
		carName: target.car.name,
		cornerLabel: POSITION_LABELS[target.corner.position],
		revisionNumber: target.revision.number,
		revisionLabel: target.revision.label,
		note: link.note,
		expiresAt: link.expiresAt
	});
	const sent = await sendMail(to, content);
	if (!sent.ok) return { to, sent: false, message: `${sent.message} The link was created; copy it and send it yourself.` };
	await recordAudit(db, {
		teamId: target.car.teamId,
		actorId: actor.id,
		action: 'share.mailed',
		subjectType: 'share_link',
		subjectId: link.id,
		detail: { ...describe(target), to }
	});
	return { to, sent: true };
}

/** A link's counts with the openings this process has not written yet. */
export function withPending(s: { id: string; openCount: number; lastOpenedAt: Date | null }) {
	const p = pendingOpens(s.id);
	if (!p) return {};
	return { openCount: s.openCount + p.count, lastOpenedAt: !s.lastOpenedAt || p.last > s.lastOpenedAt ? p.last : s.lastOpenedAt };
}

/** A link's state as the lists show it. */
export function linkStatus(s: { revokedAt: Date | null; expiresAt: Date }, now = Date.now()) {
	return s.revokedAt ? ('revoked' as const) : s.expiresAt.getTime() <= now ? ('expired' as const) : ('active' as const);
}

/** A revision's links as the API and the revision page list them. */
export async function listShares(revisionId: string) {
	const now = Date.now();
	return (await sharesOfRevision(db, revisionId)).map((s) => ({ ...s, ...withPending(s), status: linkStatus(s, now) }));
}

/** Revokes a link at once; false when it was revoked already. */
export async function revokeShare(link: ShareLink, actorId: string) {
	// The link's pending openings (and their audit event) are written before it stops.
	await flushShareOpens();
	const revoked = await revokeShareLink(db, link.id);
	forgetShare(link.tokenHash);
	if (!revoked) return false;
	await recordAudit(db, {
		teamId: link.teamId,
		actorId,
		action: 'share.revoked',
		subjectType: 'share_link',
		subjectId: link.id,
		detail: { revisionId: link.revisionId }
	});
	return true;
}
