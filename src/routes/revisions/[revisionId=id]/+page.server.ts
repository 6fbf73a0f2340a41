import { db } from '$lib/server/db';
import { revisionsOfCorner } from '$lib/server/db/queries/corners';
import { findUserById } from '$lib/server/db/queries/users';
import { can, requireRevision } from '$lib/server/permissions';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { revision, corner, car, role } = await requireRevision(event, event.params.revisionId, 'view');
	const all = await revisionsOfCorner(db, corner.id);
	const author = revision.authorId ? await findUserById(db, revision.authorId) : null;
	return {
		revision,
		corner,
		car: { id: car.id, name: car.name },
		authorName: author?.name ?? null,
		parent: all.find((r) => r.id === revision.parentId) ?? null,
		latestNumber: all[0]?.number ?? revision.number,
		canEdit: can(role, 'edit')
	};
};
