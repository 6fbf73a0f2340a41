// What a share link shows: the shared revision's coordinate table (0.1 mm), what moved from the baseline,
// the adopted tolerances and the solved positions for the 3-D view. Everything comes from the one shared revision
// (and its corner's baseline); nothing else of the team is read.
import { createHash } from 'node:crypto';
import { error } from '@sveltejs/kit';
import { POSITION_LABELS, KIND_LABELS } from '$lib/schemas/corner';
import { cornerGeometrySchema, POINT_NAME, type CornerGeometry } from '$lib/schemas/geometry';
import { pointsOfKind, type Kind } from '$lib/points';
import { joinRocker } from '$lib/kinds';
import { hashToken } from '$lib/server/auth/tokens';
import { movedPoints } from '$lib/server/corners/compare';
import { solveCorner } from '$lib/server/corners/solve';
import { db } from '$lib/server/db';
import { revisionById, shareToOpen } from '$lib/server/db/queries/shares';
import { latestTolerances, type AdoptedTolerances } from '$lib/server/db/queries/tolerances';
import { allowLocal } from '$lib/server/rate-limit';
import { recordShareOpen } from './opens';
import type { SheetRow } from './sheet-csv';

export { sheetCsv, type SheetRow } from './sheet-csv';
export { OPENED_AUDIT_GAP_MS } from './opens';

/** The sweep drawn in the 3-D view (mm of wheel travel). */
export const SHARE_SWEEP = { sweep: 'heave' as const, from: -50, to: 50, step: 5, points: true };

export type Opened = NonNullable<Awaited<ReturnType<typeof shareToOpen>>>;

/**
 * Link lookups of the last LOOKUP_TTL_MS by token hash, so a burst of readers of one link costs one query.
 * Revoking in this process drops the entry at once (`forgetShare`); another app instance sees a revocation, a
 * moved baseline or newly adopted tolerances within LOOKUP_TTL_MS. Expiry is checked against the clock each time.
 */
const LOOKUP_TTL_MS = 1000;
const lookups = new Map<string, { at: number; row: Promise<Opened | null> }>();

/** Token hashes of the last few hundred tokens opened (hashing each opening anew was a tenth of a cached opening). */
const hashes = new Map<string, string>();
function hashOf(token: string) {
	let h = hashes.get(token);
	if (h === undefined) {
		h = hashToken(token);
		if (hashes.size >= 500) hashes.delete(hashes.keys().next().value!);
		hashes.set(token, h);
	}
	return h;
}

async function lookUp(tokenHash: string): Promise<Opened | null> {
	const now = Date.now();
	const hit = lookups.get(tokenHash);
	if (hit && now - hit.at < LOOKUP_TTL_MS) return hit.row;
	const row = shareToOpen(db, tokenHash);
	lookups.set(tokenHash, { at: now, row });
	row.catch(() => lookups.delete(tokenHash));
	if (lookups.size > 1000) for (const [k, v] of lookups) if (now - v.at >= LOOKUP_TTL_MS) lookups.delete(k);
	return row;
}

/** Drops the cached lookup of a link (on revocation, so this process refuses it from the next request). */
export function forgetShare(tokenHash: string) {
	lookups.delete(tokenHash);
}

/**
 * The link behind a token, counted as opened unless count is false (the CSV download): 404 when unknown or
 * revoked, 410 when expired, 429 when one client opens it too often.
 */
export async function openShare(token: string, clientAddress: string, { count = true } = {}): Promise<Opened> {
	const found = await findShare(token);
	admitOpening(found, clientAddress, { count });
	return found;
}

/** Any share link, revision or axle: 404 when unknown or revoked, 410 when expired. */
export function refuseClosedLink(share: { revokedAt: Date | null; expiresAt: Date } | null | undefined): void {
	if (!share || share.revokedAt) error(404, { message: 'This link does not exist or was revoked.', code: 'not_found' });
	if (share.expiresAt.getTime() <= Date.now()) {
		error(410, { message: 'This link has expired. Ask the person who sent it for a new one.', code: 'expired' });
	}
}

/** Any share link: 429 when one client opens it too often. */
export function limitOpenings(shareId: string, clientAddress: string): void {
	if (!allowLocal('shareOpen', `${shareId}:${clientAddress}`)) {
		error(429, { message: 'This link was opened too often in a short time. Wait a few minutes and reload.', code: 'rate_limited' });
	}
}

/** The link behind a token, not yet counted or rate-limited: 404 when unknown or revoked, 410 when expired. */
export async function findShare(token: string): Promise<Opened> {
	const found = await lookUp(hashOf(token));
	refuseClosedLink(found?.share);
	return found!;
}

/** The second half of openShare: 429 when one client opens the link too often, else counts the opening. */
export function admitOpening(found: Opened, clientAddress: string, { count = true } = {}) {
	limitOpenings(found.share.id, clientAddress);
	if (count) {
		const { revision, car, corner } = found;
		recordShareOpen(found.share.id, found.share.teamId, { revisionId: revision.id, revision: revision.number, car: car.name, corner: corner.position });
	}
}

/** The link's settings that change what its sheet shows (everything but its counters), for cache keys. */
function settingsOf(share: Opened['share']) {
	const { openCount: _c, lastOpenedAt: _l, ...settings } = share;
	return settings;
}

/**
 * A version key of what an opened link shows: the link's settings, its revision (immutable), the corner's
 * baseline (immutable once written; the pointer may move) and the adopted tolerances (read anew each time).
 */
export function sheetVersion(opened: Opened) {
	const known = versions.get(opened);
	if (known) return known;
	const tolerances = latestTolerances(opened.tolerances);
	const key = JSON.stringify([settingsOf(opened.share), opened.revision.id, opened.corner.baselineRevisionId, tolerances]);
	const found = { key: createHash('sha256').update(key).digest('base64url').slice(0, 27), tolerances };
	versions.set(opened, found);
	return found;
}
/** Version keys by looked-up link (a lookup is shared by a burst of readers for LOOKUP_TTL_MS, then dropped). */
const versions = new WeakMap<Opened, { key: string; tolerances: ReturnType<typeof latestTolerances> }>();

type Sheet = Awaited<ReturnType<typeof buildSheet>> & { frames: ReturnType<typeof framesOf> };
/** Sheets already built, by version key (a few hundred at most; the oldest go first). */
const built = new Map<string, Promise<Sheet>>();
const BUILT_MAX = 300;

/** The sheet of an opened link with its solved frames, built once per version and kept in memory. */
export async function cachedSheet(opened: Opened): Promise<Sheet & { version: string }> {
	const { key, tolerances } = sheetVersion(opened);
	let entry = built.get(key);
	if (!entry) {
		entry = buildSheet(opened, tolerances).then((sheet) => ({ ...sheet, frames: framesOf(sheet.geometry) }));
		built.set(key, entry);
		entry.catch(() => built.delete(key));
		while (built.size > BUILT_MAX) built.delete(built.keys().next().value!);
	}
	return { ...(await entry), version: key };
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
export async function sheetOf(opened: Opened) {
	return buildSheet(opened, latestTolerances(opened.tolerances));
}

async function buildSheet({ share, revision, corner, car }: Opened, tolerances: AdoptedTolerances | null) {
	const full = await revisionById(db, revision.id);
	const geometry = storedGeometry(full!.geometry);
	const isBaseline = corner.baselineRevisionId === revision.id;
	const baselineRow = !isBaseline && corner.baselineRevisionId ? await revisionById(db, corner.baselineRevisionId) : null;
	const baseline = baselineRow && baselineRow.cornerId === corner.id ? storedGeometry(baselineRow.geometry) : null;
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
