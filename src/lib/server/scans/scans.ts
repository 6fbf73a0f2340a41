// Scans (issue 17): starting, completing, cancelling and deleting an upload, aligning a scan to vehicle axes and
// capturing its points into a new revision. Routes call a permission helper first, then these.
import { error } from '@sveltejs/kit';
import { randomUUID } from 'node:crypto';
import { joinRocker, kindSpec, splitRocker, tablePoints } from '$lib/kinds';
import { cornerGeometrySchema, formatIssue, type CornerGeometry } from '$lib/schemas/geometry';
import { formatOfName, partSizeOf, type AlignmentInput, type CaptureInput, type NewScanInput } from '$lib/schemas/scan';
import { UNIT_MM } from '$lib/mesh/preview';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { latestRevision } from '$lib/server/db/queries/corners';
import { cornerOfCar, deleteScanRow, insertScan, moveScan, setScanAlignment } from '$lib/server/db/queries/scans';
import type { Car, Scan } from '$lib/server/db/schema';
import { alignmentReference } from '$lib/server/corners/import';
import { saveRevision } from '$lib/server/corners/revisions';
import { bestFit, datumTransform } from '$lib/server/import/fit';
import { ImportError } from '$lib/server/import/errors';
import type { Vec3 } from '$lib/vec';
import { forgetPatchIndex } from './patch';
import { previewKeyOf, processScan, tilesKeyOf } from './process';
import { abortUpload, completeUpload, deleteObjects, partUrls, startUpload } from './storage';

/** Stops with 400 naming the field. */
function refuse(field: string, message: string, code = 'invalid'): never {
	error(400, { message: `${field}: ${message}`, code, field });
}

/** The scan as the API shows it (no storage keys). */
export function scanView(s: Scan) {
	return {
		id: s.id,
		carId: s.carId,
		cornerId: s.cornerId,
		name: s.name,
		format: s.format,
		sizeBytes: s.sizeBytes,
		status: s.status,
		error: s.error,
		stats: s.stats,
		unit: s.unit,
		alignment: s.alignment,
		createdAt: s.createdAt
	};
}

/** Starts an upload: the row ('uploading'), the multipart upload and a presigned URL per part. */
export async function createScan(car: Car, userId: string, input: NewScanInput) {
	if (input.cornerId && !(await cornerOfCar(db, car.id, input.cornerId))) refuse('cornerId', 'not a corner of this car');
	const id = randomUUID();
	const format = formatOfName(input.name)!;
	const objectKey = `teams/${car.teamId}/scans/${id}/original.${format}`;
	const uploadId = await startUpload(objectKey, 'application/octet-stream');
	const partSize = partSizeOf(input.size);
	const count = Math.ceil(input.size / partSize);
	let urls: string[];
	try {
		urls = await partUrls(objectKey, uploadId, count);
	} catch (e) {
		await abortUpload(objectKey, uploadId);
		throw e;
	}
	let scan: Scan;
	try {
		scan = await insertScan(db, {
			id,
			carId: car.id,
			cornerId: input.cornerId ?? null,
			name: input.name,
			format,
			sizeBytes: input.size,
			objectKey,
			uploadId,
			createdBy: userId
		});
	} catch (e) {
		// no row to sweep it later: the started upload goes now (nothing half-stored)
		await abortUpload(objectKey, uploadId).catch(() => undefined);
		throw e;
	}
	return { scan: scanView(scan), partSize, parts: urls.map((url, i) => ({ partNumber: i + 1, url })) };
}

/** Completes the upload and starts processing; a size that does not match drops the object. */
export async function completeScan(scan: Scan, parts: { partNumber: number; etag: string }[]) {
	if (scan.status !== 'uploading' || !scan.uploadId) refuse('status', `the scan is ${scan.status}, not uploading`, 'conflict');
	const expected = Math.ceil(scan.sizeBytes / partSizeOf(scan.sizeBytes));
	if (parts.length !== expected || parts.some((p, i) => p.partNumber !== i + 1))
		refuse('parts', `must list parts 1 to ${expected} in order (${parts.length} given)`);
	let size: number;
	try {
		size = await completeUpload(scan.objectKey, scan.uploadId, parts);
	} catch (e) {
		refuse('parts', `the object storage refused to complete the upload (${(e as Error).name ?? 'error'}): upload the file again`);
	}
	if (size !== scan.sizeBytes) {
		await deleteObjects([scan.objectKey]);
		await moveScan(db, scan.id, ['uploading'], { status: 'failed', error: `the upload has ${size} bytes, the file had ${scan.sizeBytes}` });
		refuse('parts', `the upload has ${size} bytes but the file has ${scan.sizeBytes}; upload it again`);
	}
	const row = await moveScan(db, scan.id, ['uploading'], { status: 'processing', uploadId: null });
	if (!row) refuse('status', 'the scan is no longer uploading', 'conflict');
	// not awaited: the client polls; a failure here is logged, and the sweeper fails the row if it stays processing
	processScan(row).catch((e) => console.error(`[scans] processing ${row.id} failed:`, e));
	return scanView(row);
}

/** Cancels an upload: aborts it (its parts are dropped) and removes the row. */
export async function cancelScan(scan: Scan) {
	if (scan.status !== 'uploading') refuse('status', `the scan is ${scan.status}; delete it instead`, 'conflict');
	if (scan.uploadId) await abortUpload(scan.objectKey, scan.uploadId);
	await deleteScanRow(db, scan.id);
}

/** Deletes a scan: its upload, its original, preview and full-resolution points, then its row. */
export async function removeScan(scan: Scan, car: Car, userId: string) {
	if (scan.uploadId) await abortUpload(scan.objectKey, scan.uploadId);
	await deleteObjects([scan.objectKey, scan.previewKey ?? previewKeyOf(scan), tilesKeyOf(scan)]);
	forgetPatchIndex(scan.id);
	await deleteScanRow(db, scan.id);
	await recordAudit(db, {
		teamId: car.teamId,
		actorId: userId,
		action: 'scan.deleted',
		subjectType: 'scan',
		subjectId: scan.id,
		detail: { name: scan.name, car: car.name }
	});
}

/** The geometry of the revision the scan aligns onto and captures into (its corner's alignment reference). */
async function referenceGeometry(scan: Scan) {
	if (!scan.cornerId) refuse('cornerId', 'the scan belongs to no corner; upload it from a corner page');
	const corner = await cornerOfCar(db, scan.carId, scan.cornerId);
	if (!corner) refuse('cornerId', 'the scan’s corner no longer exists');
	const ref = await alignmentReference(corner);
	const parsed = ref ? cornerGeometrySchema.safeParse(ref.geometry) : null;
	return { corner, reference: ref, geometry: parsed?.success ? parsed.data : null };
}

/** A rigid map from the scan's file coordinates (× unit) to vehicle axes, as stored with the scan. */
export interface StoredAlignment {
	method: 'datum' | 'best_fit' | 'none';
	R: [Vec3, Vec3, Vec3];
	t: Vec3;
	rms: number;
	residuals: Record<string, number>;
	names: string[];
	referenceRevisionId: string | null;
}

/** Aligns the scan to vehicle axes with the CSV import's datum and best-fit code; stores the unit and transform. */
export async function alignScan(scan: Scan, input: AlignmentInput) {
	if (scan.status !== 'ready') refuse('status', `the scan is ${scan.status}; it can be aligned once it is ready`, 'conflict');
	const s = UNIT_MM[input.unit];
	let alignment: StoredAlignment;
	if (input.method === 'none') {
		alignment = { method: 'none', R: [[1, 0, 0], [0, 1, 0], [0, 0, 1]], t: [0, 0, 0], rms: 0, residuals: {}, names: [], referenceRevisionId: null };
	} else {
		const { reference, geometry } = await referenceGeometry(scan);
		const points = geometry ? joinRocker(geometry.points, geometry.rocker) : null;
		if (!points || !reference) refuse('picks', 'the corner has no revision to align onto; save one first (the template will do)');
		const names = input.picks.map((p) => p.name);
		names.forEach((n, i) => {
			if (!points[n]) refuse(`picks.${i}.name`, `${n} is not a point of the revision r${reference.number}`);
		});
		if (new Set(names).size !== names.length) refuse('picks', 'each point may be picked once');
		const measured = input.picks.map((p) => p.at.map((v) => v * s) as Vec3);
		try {
			const fit =
				input.method === 'datum'
					? datumTransform(measured as [Vec3, Vec3, Vec3], names as [string, string, string], names.map((n) => points[n] as Vec3) as [Vec3, Vec3, Vec3])
					: bestFit(names.map((name, i) => ({ name, from: measured[i], to: points[name] as Vec3 })));
			alignment = { method: input.method, R: fit.map.R, t: fit.map.t, rms: fit.rms, residuals: fit.residuals, names, referenceRevisionId: reference.id };
		} catch (e) {
			if (e instanceof ImportError) refuse('picks', e.message.replace(/^alignment: /, ''));
			throw e;
		}
	}
	const row = await setScanAlignment(db, scan.id, input.unit, alignment as unknown as Record<string, unknown>);
	return scanView(row!);
}

/** Saves a new revision of the scan's corner with the captured points and where each came from. */
export async function captureScan(scan: Scan, car: Car, userId: string, input: CaptureInput) {
	if (scan.status !== 'ready') refuse('status', `the scan is ${scan.status}; points can be captured once it is ready`, 'conflict');
	if (input.cornerId !== scan.cornerId) refuse('cornerId', 'must be the scan’s own corner');
	const { corner, geometry } = await referenceGeometry(scan);
	const latest = await latestRevision(db, corner.id);
	const current = latest ? cornerGeometrySchema.safeParse(latest.geometry) : null;
	const base: CornerGeometry | null = current?.success ? current.data : geometry;
	if (!base || !latest) refuse('cornerId', 'the corner has no revision yet; save one first (the template will do), then capture into it');
	const allowed = new Set(tablePoints(corner.kind, !!base.rocker).map((p) => p.name));
	const points = joinRocker(base.points, base.rocker);
	for (const [name, p] of Object.entries(input.points)) {
		if (!allowed.has(name)) refuse(`points.${name}`, `not a point of the ${kindSpec(corner.kind).label.toLowerCase()} corner`);
		points[name] = p.at.map((v) => Math.round(v * 1000) / 1000) as [number, number, number];
	}
	const { points: plain, rocker } = splitRocker(points, (base.rocker?.rod_on as string | undefined) ?? null);
	const raw = { ...base, points: plain, ...(rocker ? { rocker: { ...base.rocker, ...rocker } } : {}) };
	const parsed = cornerGeometrySchema.safeParse(raw);
	if (!parsed.success) refuse(`points.${parsed.error.issues[0]?.path.slice(1).join('.') ?? ''}`.replace(/\.$/, ''), formatIssue(parsed.error));
	const { revision } = await saveRevision({
		car,
		corner,
		userId,
		geometry: parsed.data,
		label: input.label || `captured on scan ${scan.name}`,
		note: input.note,
		parentId: latest.id,
		source: 'scan',
		pointSources: Object.entries(input.points).map(([point, p]) => ({
			point,
			scanId: scan.id,
			scanName: scan.name,
			fit: p.fit,
			residualMm: p.residualMm,
			pointsUsed: p.pointsUsed
		}))
	});
	return { id: revision.id, number: revision.number };
}
