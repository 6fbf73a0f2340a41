import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { createShareInput, SHARE_DEFAULT_DAYS } from '$lib/schemas/share';
import { db } from '$lib/server/db';
import { revisionsOfCorner } from '$lib/server/db/queries/corners';
import { findUserById } from '$lib/server/db/queries/users';
import { pointSourcesOf } from '$lib/server/db/queries/scans';
import { parseForm } from '$lib/server/forms';
import { can, requireRevision, requireShare, requireUser } from '$lib/server/permissions';
import { createShare, listShares, revokeShare } from '$lib/server/sharing/shares';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { revision, corner, car, role } = await requireRevision(event, event.params.revisionId, 'view');
	event.depends('app:shares');
	const all = await revisionsOfCorner(db, corner.id);
	const author = revision.authorId ? await findUserById(db, revision.authorId) : null;
	const canShare = can(role, 'share');
	return {
		revision,
		corner,
		car: { id: car.id, name: car.name },
		authorName: author?.name ?? null,
		parent: all.find((r) => r.id === revision.parentId) ?? null,
		latestNumber: all[0]?.number ?? revision.number,
		canEdit: can(role, 'edit'),
		canShare,
		shares: canShare ? await listShares(revision.id) : [],
		// where points captured on a scan came from (issue 17)
		sources: (await pointSourcesOf(db, revision.id)).map((s) => ({ point: s.point, scanId: s.scanId, scanName: s.scanName, fit: s.fit, residualMm: s.residualMm, pointsUsed: s.pointsUsed })),
		shareDefaultDays: SHARE_DEFAULT_DAYS
	};
};

const revokeForm = z.object({ shareId: z.string().uuid('shareId: not a share link') });

export const actions: Actions = {
	createShare: async (event) => {
		const target = await requireRevision(event, event.params.revisionId, 'share');
		const parsed = parseForm(await event.request.formData(), createShareInput);
		if (!parsed.ok) return fail(400, { share: { errors: parsed.errors, values: parsed.values } });
		const created = await createShare(event, target, requireUser(event), parsed.data);
		return { created: { ...created, expiresAt: created.expiresAt.toISOString() } };
	},
	revokeShare: async (event) => {
		// Permission first (the revision's 'share'), so a caller without it learns nothing from the form's checks.
		await requireRevision(event, event.params.revisionId, 'share');
		const parsed = parseForm(await event.request.formData(), revokeForm);
		if (!parsed.ok) return fail(400, { revokeError: parsed.errors.shareId ?? 'Choose a link' });
		const { share } = await requireShare(event, parsed.data.shareId, 'share');
		if (share.revisionId !== event.params.revisionId || !(await revokeShare(share, requireUser(event).id))) {
			return fail(400, { revokeError: 'That link is already revoked.' });
		}
		return { revoked: share.id };
	}
};
