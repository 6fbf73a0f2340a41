// Scans through API v1 and the local S3-compatible fake (s3rver started by `npm test`, not a mock): a presigned
// multipart upload from this process as a browser would, processing in the app's worker, the preview, alignment by
// three datums, capture into a revision with its point sources, cancel and delete leaving nothing in the bucket,
// and bad files failing with a message and no objects kept.
import { readFileSync } from 'node:fs';
import { HeadObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { decodePreview } from '../../src/lib/mesh/preview';
import { fitSphere } from '../../src/lib/fits';
import { pointSources, scans } from '../../src/lib/server/db/schema';
import { binaryStl, boxTriangles, cornerScan, SCAN_FRAME, toScanFile } from '../scan-files';
import { Client, closeDb, testDb } from './helpers';

const stock = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
const engineer = new Client();
const viewer = new Client();
let carId = '';
let cornerId = '';

const s3 = new S3Client({
	endpoint: process.env.S3_ENDPOINT,
	region: process.env.S3_REGION ?? 'us-east-1',
	forcePathStyle: true,
	credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID ?? 'S3RVER', secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? 'S3RVER' }
});
const Bucket = process.env.S3_BUCKET ?? 'linkwright-scans';

/** True when the bucket holds the key. */
async function exists(Key: string) {
	try {
		await s3.send(new HeadObjectCommand({ Bucket, Key }));
		return true;
	} catch {
		return false;
	}
}

/** Starts an upload, PUTs the parts to their presigned URLs (all but `stopAfter` when given), returns the start. */
async function upload(bytes: Uint8Array, name: string, stopAfter?: number) {
	const res = await engineer.json(`/api/v1/cars/${carId}/scans`, 'POST', { name, size: bytes.length, cornerId });
	expect(res.status).toBe(201);
	const start = (await res.json()) as { scan: { id: string }; partSize: number; parts: { partNumber: number; url: string }[] };
	const etags: string[] = [];
	for (const [i, part] of start.parts.entries()) {
		if (stopAfter !== undefined && i >= stopAfter) break;
		// a browser's PUT: the page's origin, no credentials but the URL's signature
		const put = await fetch(part.url, { method: 'PUT', body: Buffer.from(bytes.subarray(i * start.partSize, (i + 1) * start.partSize)), headers: { origin: 'http://127.0.0.1:3000' } });
		expect(put.status).toBe(200);
		expect(put.headers.get('access-control-expose-headers')).toMatch(/ETag/i);
		etags.push(put.headers.get('etag')!);
	}
	return { ...start, etags };
}

/** Completes an upload and waits until processing has ended. */
async function complete(start: Awaited<ReturnType<typeof upload>>) {
	const res = await engineer.json(`/api/v1/scans/${start.scan.id}/complete`, 'POST', { parts: start.etags.map((etag, i) => ({ partNumber: i + 1, etag })) });
	expect(res.status).toBe(202);
	for (let i = 0; i < 600; i++) {
		const scan = await (await viewer.fetch(`/api/v1/scans/${start.scan.id}`)).json();
		if (scan.status === 'ready' || scan.status === 'failed') return scan;
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error('processing did not end');
}

async function row(id: string) {
	const [r] = await testDb().select().from(scans).where(eq(scans.id, id));
	return r ?? null;
}

beforeAll(async () => {
	await engineer.signIn('engineer@linkwright.test');
	await viewer.signIn('viewer@linkwright.test');
	const car = await (await engineer.json('/api/v1/cars', 'POST', { name: 'Scan API car' })).json();
	carId = car.id;
	cornerId = (await (await engineer.json(`/api/v1/cars/${carId}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json()).id;
	expect((await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'stock', geometry: stock })).status).toBe(201);
});
afterAll(closeDb);

describe('upload, processing, alignment, capture, deletion', () => {
	const P = stock.points as Record<string, number[]>;
	const moved = [P['lower.outer'][0], P['lower.outer'][1], P['lower.outer'][2] + 2];
	// tooling balls on three chassis points, the lower ball joint 2 mm higher than in the stock revision
	const tris = cornerScan([
		{ at: P['lower.front'], radius: 12 },
		{ at: P['lower.rear'], radius: 12 },
		{ at: P['upper.front'], radius: 12 },
		{ at: moved, radius: 15 }
	], { lat: 150, lon: 200 });
	const bytes = binaryStl(tris, 'solid scanner export, binary despite the word');
	let scanId = '';
	let objectKey = '';

	test('a binary STL uploads in parts straight to the bucket and is processed: counts, bounds, unit, preview', async () => {
		const start = await upload(bytes, 'corner-scan.stl');
		expect(start.parts.length).toBe(2);
		scanId = start.scan.id;
		objectKey = (await row(scanId))!.objectKey;
		expect((await row(scanId))!.status).toBe('uploading');
		const scan = await complete(start);
		expect(scan.error).toBeNull();
		expect(scan.status).toBe('ready');
		expect(scan.stats.triangles).toBe(tris.length);
		// about 12 MB: two parts of 8 MB
		expect(tris.length).toBeGreaterThan(200_000);
		expect(scan.stats.encoding).toBe('binary STL');
		// metres: the balls span under a metre in the file
		expect(scan.unit).toBe('m');
		expect(await exists(objectKey)).toBe(true);
		const preview = await viewer.fetch(`/api/v1/scans/${scanId}/preview`);
		expect(preview.status).toBe(200);
		const mesh = decodePreview(await preview.arrayBuffer());
		expect(mesh.indices.length / 3).toBe(scan.stats.previewTriangles);
		expect(mesh.indices.length / 3).toBeLessThanOrEqual(200_000);
	});

	test('a patch reads every full-resolution point near a pick, whatever the preview kept, and a sphere fits them', async () => {
		const at = toScanFile(moved);
		const r = 0.02; // metres: the 15 mm ball and nothing of the other balls
		const query = (q: Record<string, number>) => new URLSearchParams(Object.entries(q).map(([k, v]) => [k, String(v)])).toString();
		const res = await viewer.fetch(`/api/v1/scans/${scanId}/patch?${query({ x: at[0], y: at[1], z: at[2], r })}`);
		expect(res.status).toBe(200);
		expect(res.headers.get('x-lw-stride')).toBe('1');
		const full = new Float32Array(await res.arrayBuffer());
		const n = full.length / 3;
		expect(Number(res.headers.get('x-lw-points-within'))).toBe(n);
		// every vertex of the construction: 149 rings of 200 between the poles (tests/scan-files sphereTriangles)
		expect(n).toBe(149 * 200 + 2);
		// every vertex of the ball lies on it: Coope's fit recovers the construction to float32 rounding of metres
		const f = fitSphere(Array.from(full, (v) => v * 1000));
		expect(f.radius).toBeCloseTo(15, 2);
		for (let k = 0; k < 3; k++) expect(Math.abs(f.centre[k] - at[k] * 1000)).toBeLessThan(0.01);
		// the ball's parameters named when wrong; a ball wider than a quarter of the scan is refused
		const missing = await viewer.fetch(`/api/v1/scans/${scanId}/patch?${query({ x: at[0], y: at[1], z: at[2] })}`);
		expect(missing.status).toBe(400);
		expect((await missing.json()).error.field).toBe('r');
		const wide = await viewer.fetch(`/api/v1/scans/${scanId}/patch?${query({ x: at[0], y: at[1], z: at[2], r: 10 })}`);
		expect(wide.status).toBe(400);
		expect((await wide.json()).error.field).toBe('r');
	});

	test('three datum picks align the scan back onto the construction', async () => {
		const picks = ['lower.front', 'lower.rear', 'upper.front'].map((name) => ({ name, at: toScanFile(P[name]) }));
		const res = await engineer.json(`/api/v1/scans/${scanId}/alignment`, 'PUT', { method: 'datum', unit: 'm', picks });
		expect(res.status).toBe(200);
		const { alignment } = await res.json();
		// R and t of the construction (SCAN_FRAME), to float32 rounding of metres
		for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(alignment.R[i][j]).toBeCloseTo(SCAN_FRAME.R0[i][j], 6);
		for (let i = 0; i < 3; i++) expect(Math.abs(alignment.t[i] - SCAN_FRAME.t0[i])).toBeLessThan(0.01);
		expect(alignment.rms).toBeLessThan(0.01);
		// a viewer may not align
		expect((await viewer.json(`/api/v1/scans/${scanId}/alignment`, 'PUT', { method: 'datum', unit: 'm', picks })).status).toBe(403);
	});

	test('a captured point is saved as a new revision with its source', async () => {
		const res = await engineer.json(`/api/v1/scans/${scanId}/capture`, 'POST', {
			cornerId,
			points: { 'lower.outer': { at: moved, fit: 'sphere', residualMm: 0.004, pointsUsed: 812 } }
		});
		expect(res.status).toBe(201);
		const saved = await res.json();
		const revision = await (await viewer.fetch(`/api/v1/revisions/${saved.id}`)).json();
		expect(revision.geometry.points['lower.outer']).toEqual(moved);
		expect(revision.geometry.points['lower.front']).toEqual(P['lower.front']);
		const sources = await testDb().select().from(pointSources).where(eq(pointSources.revisionId, saved.id));
		expect(sources).toHaveLength(1);
		expect(sources[0]).toMatchObject({ point: 'lower.outer', scanId, scanName: 'corner-scan.stl', fit: 'sphere', residualMm: 0.004, pointsUsed: 812 });
		// a point the kind does not have is refused by name, nothing saved
		const bad = await engineer.json(`/api/v1/scans/${scanId}/capture`, 'POST', { cornerId, points: { 'strut.top': { at: moved, fit: 'point' } } });
		expect(bad.status).toBe(400);
		expect((await bad.json()).error.field).toBe('points.strut.top');
	});

	test('deleting the scan removes its original, preview and points from the bucket; the revision keeps its source', async () => {
		const previewKey = (await row(scanId))!.previewKey!;
		const pointsKey = `${objectKey}.points.lwpt`;
		expect(await exists(previewKey)).toBe(true);
		expect(await exists(pointsKey)).toBe(true);
		expect((await viewer.fetch(`/api/v1/scans/${scanId}`, { method: 'DELETE' })).status).toBe(403);
		expect((await engineer.fetch(`/api/v1/scans/${scanId}`, { method: 'DELETE' })).status).toBe(204);
		expect(await exists(objectKey)).toBe(false);
		expect(await exists(previewKey)).toBe(false);
		expect(await exists(pointsKey)).toBe(false);
		expect(await row(scanId)).toBeNull();
		const [source] = await testDb().select().from(pointSources).where(eq(pointSources.scanName, 'corner-scan.stl'));
		expect(source.scanId).toBeNull();
	});
});

describe('bad input stores nothing', () => {
	test('a cancelled upload is aborted: its parts are dropped and the row is gone', async () => {
		const bytes = binaryStl(boxTriangles([0, 0, 0], [1, 1, 1]).flatMap((t) => Array.from({ length: 30_000 }, () => t)));
		const start = await upload(bytes, 'half.stl', 1);
		expect(start.parts.length).toBeGreaterThan(1);
		expect((await engineer.fetch(`/api/v1/scans/${start.scan.id}/cancel`, { method: 'POST' })).status).toBe(204);
		expect(await row(start.scan.id)).toBeNull();
		// the upload no longer exists: a late part is refused (S3 NoSuchUpload, 404)
		const late = await fetch(start.parts[1].url, { method: 'PUT', body: Buffer.from(bytes.subarray(start.partSize, 2 * start.partSize)) });
		expect(late.status).toBe(404);
	});

	test('a file that is not a mesh fails with a message and leaves no object', async () => {
		const start = await upload(new TextEncoder().encode('name,x,y,z\nlower.front,180,335,127\n'), 'points.stl');
		const scan = await complete(start);
		expect(scan.status).toBe('failed');
		expect(scan.error).toMatch(/not an STL/);
		expect(await exists((await row(scan.id))!.objectKey)).toBe(false);
	});

	test('zero triangles and NaN vertices fail by name', async () => {
		const empty = await complete(await upload(binaryStl([], 'empty'), 'empty.stl'));
		expect(empty.error).toMatch(/no triangles/);
		const t = boxTriangles([0, 0, 0], [1, 1, 1]);
		t[2][0] = [0, NaN, 0];
		const nan = await complete(await upload(binaryStl(t, 'nan'), 'nan.stl'));
		expect(nan.error).toMatch(/triangle 3: a coordinate is not a finite number/);
	});

	test('over the size limit, an unsupported format and a missing field are refused before any upload starts', async () => {
		const big = await engineer.json(`/api/v1/cars/${carId}/scans`, 'POST', { name: 'huge.stl', size: 501 * 1024 * 1024, cornerId });
		expect(big.status).toBe(400);
		expect((await big.json()).error).toMatchObject({ field: 'size', message: expect.stringMatching(/over the limit of 500 MB/) });
		const step = await engineer.json(`/api/v1/cars/${carId}/scans`, 'POST', { name: 'part.step', size: 100 });
		expect((await step.json()).error).toMatchObject({ field: 'name', message: expect.stringMatching(/\.stl, \.ply or \.obj/) });
		const none = await engineer.json(`/api/v1/cars/${carId}/scans`, 'POST', { name: 'a.stl' });
		expect((await none.json()).error.field).toBe('size');
		expect((await viewer.json(`/api/v1/cars/${carId}/scans`, 'POST', { name: 'a.stl', size: 10 })).status).toBe(403);
	});

	test('a scan left processing by a crash is swept to failed', async () => {
		const start = await upload(binaryStl(boxTriangles([0, 0, 0], [1, 1, 1])), 'stuck.stl');
		await testDb().update(scans).set({ status: 'processing', statusAt: new Date(Date.now() - 3600_000) }).where(eq(scans.id, start.scan.id));
		// the sweeper runs at most once a minute per process; the corner's list triggers it when due
		const { sweepStaleScans } = await import('../../src/lib/server/db/queries/scans');
		const swept = await sweepStaleScans(testDb(), 3900, 900);
		expect(swept.map((s) => s.id)).toContain(start.scan.id);
		const r = await row(start.scan.id);
		expect(r!.status).toBe('failed');
		expect(r!.error).toMatch(/processing stopped/);
	});
});
