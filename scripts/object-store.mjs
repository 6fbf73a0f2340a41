#!/usr/bin/env node
// The local S3-compatible fake of development, demo and tests (s3rver from npm): listens on 127.0.0.1 only,
// keeps its objects in the git-ignored data folder, creates the bucket with a CORS rule that lets the app's pages
// PUT upload parts straight from the browser and read the ETag header back. Not started when S3_ENDPOINT is set.
// Usage: node scripts/object-store.mjs   (port LW_S3_PORT, default 4568; `npm test` uses 4569)
import fs from 'node:fs';
import path from 'node:path';
import { root } from './db.mjs';
import { portFree, portInUseMessage } from './ports.mjs';

export const s3Port = Number(process.env.LW_S3_PORT ?? 4568);
/** The fake's port in tests (LW_S3_PORT, default 4569 so `npm start`'s 4568 can run beside). */
export const testS3Port = Number(process.env.LW_S3_PORT ?? 4569);
export const S3_BUCKET = process.env.S3_BUCKET ?? 'linkwright-scans';
// s3rver's one built-in account (any other key pair is refused with a signature error)
export const FAKE_KEYS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' };

/** The folder that keeps the fake server's buckets on a port. */
export function objectStoreDir(port = s3Port) {
	return process.env.LW_S3_DIR ?? path.join(root, '.data', 's3', String(port));
}

/** The CORS rule of the bucket: any origin may GET, PUT, HEAD; the browser may read ETag (multipart parts need it). */
const CORS = `<CORSConfiguration>
  <CORSRule>
    <AllowedOrigin>*</AllowedOrigin>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`;

/** Starts the fake server; resolves once it listens. `clear` empties its folder first. */
export async function startObjectStore({ port = s3Port, dir = objectStoreDir(port), bucket = S3_BUCKET, clear = false } = {}) {
	// a stale server from an earlier run: say which process holds the port rather than fail on EADDRINUSE
	if (!(await portFree(port))) throw new Error(portInUseMessage(port, 'the fake object storage', 'LW_S3_PORT'));
	const { default: S3rver } = await import('s3rver');
	if (clear) fs.rmSync(dir, { recursive: true, force: true });
	fs.mkdirSync(dir, { recursive: true });
	const server = new S3rver({
		address: '127.0.0.1',
		port,
		silent: true,
		directory: dir,
		configureBuckets: [{ name: bucket, configs: [CORS] }]
	});
	await server.run();
	return {
		port,
		dir,
		bucket,
		endpoint: `http://127.0.0.1:${port}`,
		close: () => server.close().catch(() => undefined)
	};
}

if (import.meta.url === `file://${process.argv[1]}`) {
	const store = await startObjectStore();
	console.log(`[s3] fake object storage on ${store.endpoint}, bucket ${store.bucket}, keeping objects in ${store.dir}`);
	for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, async () => (await store.close(), process.exit(0)));
}
