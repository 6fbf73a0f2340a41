import { error, fail, isHttpError } from '@sveltejs/kit';
import { z } from 'zod';
import { cornerGeometrySchema, formatIssue } from '$lib/schemas/geometry';
import { targetsSchema } from '$lib/schemas/targets';
import { saveRevision, vehicleFromCar } from '$lib/server/corners/revisions';
import { solveCorner } from '$lib/server/corners/solve';
import { db } from '$lib/server/db';
import { latestRevision, revisionOfCorner, revisionPage, revisionsOfCornerByIds, setBaseline } from '$lib/server/db/queries/corners';
import { REVISION_PAGE } from '$lib/schemas/corner';
import { recordAudit } from '$lib/server/db/queries/audit';
import { studiesOfCorner } from '$lib/server/db/queries/studies';
import { scansOfCar } from '$lib/server/db/queries/scans';
import { sweepScans } from '$lib/server/scans/process';
import { scanView } from '$lib/server/scans/scans';
import { can, requireCorner } from '$lib/server/permissions';
import type { Actions, PageServerLoad } from './$types';

/** How many of the newest revisions the overlay picker offers without a search. */
const RECENT_OVERLAYS = 5;

/** The revision ids a saved study overlays (settings are stored JSON: read defensively). */
function overlayIds(settings: unknown): string[] {
	const list = (settings as { overlays?: unknown } | null)?.overlays;
	return Array.isArray(list) ? list.filter((x): x is string => typeof x === 'string' && z.string().uuid().safeParse(x).success) : [];
}

export const load: PageServerLoad = async (event) => {
	const { corner, car, role } = await requireCorner(event, event.params.cornerId, 'view');
	const fromId = event.url.searchParams.get('from');
	const asked = fromId && z.string().uuid().safeParse(fromId).success ? fromId : null;
	// the four reads do not depend on each other: one round trip's wait instead of four
	await sweepScans();
	const [latest, askedRevision, firstPage, baseline, studies, scans] = await Promise.all([
		latestRevision(db, corner.id),
		asked ? revisionOfCorner(db, corner.id, asked) : null,
		// the history's first page (search and further pages come from the API), never the whole list
		revisionPage(db, corner.id, { limit: REVISION_PAGE, offset: 0 }),
		corner.baselineRevisionId ? revisionsOfCornerByIds(db, corner.id, [corner.baselineRevisionId]) : [],
		studiesOfCorner(db, corner.id),
		scansOfCar(db, car.id, corner.id)
	]);
	// The overlay picker's revisions at hand: the baseline, the newest few, and those the saved studies overlay.
	const atHand = new Map([...baseline, ...firstPage.rows.slice(0, RECENT_OVERLAYS)].map((r) => [r.id, r]));
	const studied = [...new Set(studies.flatMap((s) => overlayIds(s.settings)))].filter((id) => !atHand.has(id));
	for (const r of await revisionsOfCornerByIds(db, corner.id, studied)) atHand.set(r.id, r);
	const shown = asked ? askedRevision : latest;
	if (fromId && !shown) error(404, { message: 'Revision not found', code: 'not_found' });
	const parsed = shown ? cornerGeometrySchema.safeParse(shown.geometry) : null;
	// First paint: the workspace's default sweep (heave −80…80 mm by 1 mm, with point positions for the 3-D view).
	const initial = parsed?.success ? solveCorner(parsed.data, { sweep: 'heave', from: -80, to: 80, step: 1, points: true }) : null;
	const design = initial?.samples.find((s) => s.travel === 0) ?? null;
	return {
		car: { id: car.id, name: car.name },
		corner,
		revision: shown,
		latestNumber: latest?.number ?? 0,
		revisions: firstPage.rows,
		revisionTotal: firstPage.total,
		overlayChoices: [...atHand.values()].map(({ id, number, label, createdAt }) => ({ id, number, label, createdAt })),
		vehicle: vehicleFromCar(car, corner),
		targets: targetsSchema.catch([]).parse(car.targets),
		studies,
		scans: scans.map(scanView),
		design,
		initial,
		canEdit: can(role, 'edit')
	};
};

const saveForm = z.object({
	geometry: z.string().min(2, 'geometry: missing'),
	label: z.string().trim().max(120, 'Label is at most 120 characters').default(''),
	note: z.string().max(5000, 'Note is at most 5000 characters').default(''),
	parentId: z.string().uuid().optional().or(z.literal('').transform(() => undefined))
});

export const actions: Actions = {
	save: async (event) => {
		const { corner, car } = await requireCorner(event, event.params.cornerId, 'edit');
		const form = saveForm.safeParse(Object.fromEntries(await event.request.formData()));
		if (!form.success) return fail(400, { message: formatIssue(form.error), field: null as string | null });
		let raw: unknown;
		try {
			raw = JSON.parse(form.data.geometry);
		} catch {
			return fail(400, { message: 'geometry: not valid JSON', field: null });
		}
		const geometry = cornerGeometrySchema.safeParse(raw);
		if (!geometry.success) {
			return fail(400, { message: formatIssue(geometry.error), field: geometry.error.issues[0]?.path.map(String).join('.') ?? null });
		}
		try {
			const { revision, supersededBy } = await saveRevision({
				car, corner, userId: event.locals.user!.id, geometry: geometry.data,
				label: form.data.label, note: form.data.note, parentId: form.data.parentId ?? null, source: 'editor'
			});
			return { saved: { id: revision.id, number: revision.number, supersededBy } };
		} catch (e) {
			if (isHttpError(e) && e.status === 400) return fail(400, { message: e.body.message, field: e.body.field ?? null });
			throw e;
		}
	},
	baseline: async (event) => {
		const { corner, car } = await requireCorner(event, event.params.cornerId, 'edit');
		const revisionId = String((await event.request.formData()).get('revisionId') ?? '');
		if (!z.string().uuid().safeParse(revisionId).success || !(await revisionOfCorner(db, corner.id, revisionId))) {
			return fail(400, { message: 'That revision is not one of this corner', field: null });
		}
		await setBaseline(db, corner.id, revisionId);
		await recordAudit(db, { teamId: car.teamId, actorId: event.locals.user!.id, action: 'corner.baseline_set', subjectType: 'corner', subjectId: corner.id, detail: { revisionId } });
		return { baselineSet: revisionId };
	}
};
