// Object storage for scans: any S3-compatible service through the AWS SDK v3, configured by the S3_* settings
// (src/lib/server/env.ts). `npm start` and `npm test` point them at the local fake (scripts/object-store.mjs).
// The browser uploads the original straight to the bucket through presigned multipart part URLs; the app server
// only starts, completes or aborts the upload and streams the object to the processing worker.
import {
	AbortMultipartUploadCommand,
	CompleteMultipartUploadCommand,
	CreateMultipartUploadCommand,
	DeleteObjectCommand,
	GetObjectCommand,
	HeadObjectCommand,
	PutObjectCommand,
	S3Client,
	UploadPartCommand
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { serverEnv } from '$lib/server/env';

/** How long a presigned part URL stays valid (s); an upload not completed within it is swept (common practice). */
export const PART_URL_SECONDS = 3600;

/** The settings the worker thread needs to reach the same bucket. */
export interface StorageConfig {
	endpoint?: string;
	publicEndpoint?: string;
	bucket: string;
	region: string;
	accessKeyId?: string;
	secretAccessKey?: string;
	forcePathStyle: boolean;
}

/** The storage settings from the environment. */
export function storageConfig(): StorageConfig {
	const e = serverEnv();
	return {
		endpoint: e.S3_ENDPOINT,
		publicEndpoint: e.S3_PUBLIC_ENDPOINT,
		bucket: e.S3_BUCKET,
		region: e.S3_REGION,
		accessKeyId: e.S3_ACCESS_KEY_ID,
		secretAccessKey: e.S3_SECRET_ACCESS_KEY,
		forcePathStyle: e.S3_FORCE_PATH_STYLE
	};
}

/** An S3 client for the settings; `forBrowser` signs URLs for the public endpoint when one is set. */
export function clientOf(c: StorageConfig, forBrowser = false): S3Client {
	const endpoint = forBrowser ? (c.publicEndpoint ?? c.endpoint) : c.endpoint;
	return new S3Client({
		region: c.region,
		...(endpoint ? { endpoint } : {}),
		forcePathStyle: c.forcePathStyle,
		...(c.accessKeyId && c.secretAccessKey ? { credentials: { accessKeyId: c.accessKeyId, secretAccessKey: c.secretAccessKey } } : {}),
		// no default CRC32 checksums: presigned part URLs are PUT by a browser that cannot add them
		requestChecksumCalculation: 'WHEN_REQUIRED',
		responseChecksumValidation: 'WHEN_REQUIRED'
	});
}

let server: S3Client | null = null;
let browser: S3Client | null = null;
const s3 = () => (server ??= clientOf(storageConfig()));
const s3Browser = () => (browser ??= clientOf(storageConfig(), true));
const Bucket = () => storageConfig().bucket;

/** Starts a multipart upload of one object; returns its upload id. */
export async function startUpload(key: string, contentType: string): Promise<string> {
	const out = await s3().send(new CreateMultipartUploadCommand({ Bucket: Bucket(), Key: key, ContentType: contentType }));
	if (!out.UploadId) throw new Error('object storage gave no upload id');
	return out.UploadId;
}

/** Presigned PUT URLs for parts 1..count of an upload. */
export async function partUrls(key: string, uploadId: string, count: number): Promise<string[]> {
	const client = s3Browser();
	return Promise.all(
		Array.from({ length: count }, (_, i) =>
			getSignedUrl(client, new UploadPartCommand({ Bucket: Bucket(), Key: key, UploadId: uploadId, PartNumber: i + 1 }), {
				expiresIn: PART_URL_SECONDS
			})
		)
	);
}

/** Completes an upload from its parts' ETags; returns the stored object's size in bytes. */
export async function completeUpload(key: string, uploadId: string, parts: { partNumber: number; etag: string }[]) {
	await s3().send(
		new CompleteMultipartUploadCommand({
			Bucket: Bucket(),
			Key: key,
			UploadId: uploadId,
			MultipartUpload: { Parts: parts.map((p) => ({ PartNumber: p.partNumber, ETag: p.etag })) }
		})
	);
	const head = await s3().send(new HeadObjectCommand({ Bucket: Bucket(), Key: key }));
	return head.ContentLength ?? 0;
}

/** Aborts an upload, dropping its stored parts; an upload already gone is fine. */
export async function abortUpload(key: string, uploadId: string) {
	try {
		await s3().send(new AbortMultipartUploadCommand({ Bucket: Bucket(), Key: key, UploadId: uploadId }));
	} catch (e) {
		if ((e as { name?: string }).name !== 'NoSuchUpload') throw e;
	}
}

/** Deletes objects (missing ones are fine). */
export async function deleteObjects(keys: (string | null | undefined)[]) {
	// one by one: DeleteObjects needs a body checksum that not every S3-compatible service accepts alike
	for (const Key of keys) if (Key) await s3().send(new DeleteObjectCommand({ Bucket: Bucket(), Key }));
}

/** Writes a small object (the preview). */
export async function putObject(key: string, body: Uint8Array, contentType: string) {
	await s3().send(new PutObjectCommand({ Bucket: Bucket(), Key: key, Body: body, ContentType: contentType }));
}

/** An object's body as a web stream, or null when it does not exist. */
export async function getObjectStream(key: string) {
	try {
		const out = await s3().send(new GetObjectCommand({ Bucket: Bucket(), Key: key }));
		return { body: out.Body!.transformToWebStream(), size: out.ContentLength ?? 0 };
	} catch (e) {
		if ((e as { name?: string }).name === 'NoSuchKey') return null;
		throw e;
	}
}

/** Bytes [start, end) of an object (an HTTP range read), or null when the object does not exist. */
export async function getObjectRange(key: string, start: number, end: number): Promise<Uint8Array | null> {
	try {
		const out = await s3().send(new GetObjectCommand({ Bucket: Bucket(), Key: key, Range: `bytes=${start}-${end - 1}` }));
		return await out.Body!.transformToByteArray();
	} catch (e) {
		if ((e as { name?: string }).name === 'NoSuchKey') return null;
		throw e;
	}
}
