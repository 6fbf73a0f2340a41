// What a share link shows: the shared revision's coordinate table (0.1 mm), what moved from the baseline,
// the adopted tolerances and the solved positions for the 3-D view. Everything comes from the one shared revision
// (and its corner's baseline); nothing else of the team is read.
import { error } from '@sveltejs/kit';
import { POSITION_LABELS, KIND_LABELS } from '$lib/schemas/corner';
import { cornerGeometrySchema, POINT_NAME, type CornerGeometry } from '$lib/schemas/geometry';
import { pointsOfKind, type Kind } from '$lib/points';
import { joinRocker } from '$lib/kinds';
import { hashToken } from '$lib/server/auth/tokens';
import { movedPoints } from '$lib/server/corners/compare';
import { solveCorner } from '$lib/server/corners/solve';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { markShareOpened, revisionById, shareByTokenHash } from '$lib/server/db/queries/shares';
import { tolerancesForRevision, type AdoptedTolerances } from '$lib/server/db/queries/tolerances';
import { allow } from '$lib/server/rate-limit';
import type { SheetRow } from './sheet-csv';

export { sheetCsv, type SheetRow } from './sheet-csv';

/** An "opened" audit event at most once per link in this period, so refreshing the page does not flood the log. */
export const OPENED_AUDIT_GAP_MS = 30 * 60 * 1000;
/** The sweep drawn in the 3-D view (mm of wheel travel). */
export const SHARE_SWEEP = { sweep: 'heave' as const, from: -50, to: 50, step: 5, points: true };

type Opened = NonNullable<Awaited<ReturnType<typeof shareByTokenHash>>>;

/**
 * The link behind a token, counted as opened unless count is false (the CSV download): 404 when unknown or
 * revoked, 410 when expired, 429 when one client opens it too often.
 */
export async function openShare(token: string, clientAddress: string, { count = true } = {}): Promise<Opened> {
	const found = await shareByTokenHash(db, hashToken(token));
	if (!found || found.share.revokedAt) error(404, { message: 'This link does not exist or was revoked.', code: 'not_found' });
	if (found.share.expiresAt.getTime() <= Date.now()) {
		error(410, { message: 'This link has expired. Ask the person who sent it for a new one.', code: 'expired' });
	}
	if (!(await allow('shareOpen', `${found.share.id}:${clientAddress}`))) {
		error(429, { message: 'This link was opened too often in a short time. Wait a few minutes and reload.', code: 'rate_limited' });
	}
	if (!count) return found;
	const before = await markShareOpened(db, found.share.id);
	if (!before || Date.now() - before.getTime() > OPENED_AUDIT_GAP_MS) {
		await recordAudit(db, {
			teamId: found.share.teamId,
			actorId: null,
			action: 'share.opened',
			subjectType: 'share_link',
			subjectId: found.share.id,
			detail: { revisionId: found.revision.id, revision: found.revision.number, car: found.car.name, corner: found.corner.position }
		});
	}
	return found;
}


/** The table rows in the kind's point order, then any other points of the file. */
function rowsOf(g: CornerGeometry, baseline: CornerGeometry | null, tolerances: AdoptedTolerances | null): SheetRow[] {
	const moved = new Map(baseline ? movedPoints(baseline, g).map((m) => [m.name, m]) : []);
	const all = joinRocker(g.points, g.rocker);
	const known = pointsOfKind(g.kind as Kind, !!g.rocker).filter((p) => all[p.name]);
	const extra = Object.keys(all).filter((n) => !known.some((p) => p.name === n)).map((name) => ({ name, label: name }));
	return [...known, ...extra].map((p) => {
		const m = moved.get(p.name);
		return {
			name: p.name,
			label: p.label,
			xyz: all[p.name] as [number, number, number],
			delta: m && m.d !== null ? { dx: m.dx!, dy: m.dy!, dz: m.dz!, d: m.d } : null,
			tolerance: tolerances?.points[p.name] ?? null
		};
	});
}

/**
 * A stored corner file read for the sheet. Points saved before point names were limited may have names the
 * schema now refuses: those are shown as they are (the CSV neutralises them), the rest is parsed as usual.
 */
function storedGeometry(raw: unknown): CornerGeometry {
	const points = Object.entries((raw as { points?: Record<string, [number, number, number]> }).points ?? {});
	const geometry = cornerGeometrySchema.parse({ ...(raw as object), points: Object.fromEntries(points.filter(([n]) => POINT_NAME.test(n))) });
	return { ...geometry, points: { ...geometry.points, ...Object.fromEntries(points.filter(([n]) => !POINT_NAME.test(n))) } };
}

/** Everything the share page and its CSV show for an opened link (the revision's internal note only when the link says so). */
export async function sheetOf({ share, revision, corner, car }: Opened) {
	const geometry = storedGeometry(revision.geometry);
	const isBaseline = corner.baselineRevisionId === revision.id;
	const baselineRow = !isBaseline && corner.baselineRevisionId ? await revisionById(db, corner.baselineRevisionId) : null;
	const baseline = baselineRow && baselineRow.cornerId === corner.id ? storedGeometry(baselineRow.geometry) : null;
	const tolerances = await tolerancesForRevision(db, corner.id, revision.id);
	return {
		link: { note: share.note, expiresAt: share.expiresAt },
		car: { name: car.name, series: car.series },
		corner: { position: corner.position, label: POSITION_LABELS[corner.position] },
		revision: { number: revision.number, label: revision.label, note: share.showRevisionNote ? revision.note : '', createdAt: revision.createdAt, kind: revision.kind, kindLabel: KIND_LABELS[revision.kind] },
		baseline: isBaseline ? ('self' as const) : baselineRow && baseline ? { number: baselineRow.number, label: baselineRow.label } : null,
		rows: rowsOf(geometry, baseline, tolerances),
		hasTolerances: tolerances !== null,
		loadedRadius: geometry.tyre.loaded_radius,
		geometry
	};
}

/** The solved positions for the 3-D view (heave −50…+50 mm). */
export function framesOf(geometry: CornerGeometry) {
	const solved = solveCorner(geometry, SHARE_SWEEP);
	return solved.samples.flatMap((s) =>
		s.points
			? [{ position: s.travel ?? 0, points: s.points, wheel_centre: s.wheel_centre, contact_patch: s.contact_patch, fvic: s.fvic, rc_height: s.rc_height }]
			: []
	);
}
