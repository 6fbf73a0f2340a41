// The origin the browser uploads scan parts to (S3_PUBLIC_ENDPOINT, else S3_ENDPOINT), for the pages'
// Content-Security-Policy connect-src; null when no endpoint is configured (the service's default endpoint).
import { serverEnv } from '$lib/server/env';

let cached: string | null | undefined;

export function storageOrigin(): string | null {
	if (cached !== undefined) return cached;
	const e = serverEnv();
	const url = e.S3_PUBLIC_ENDPOINT ?? e.S3_ENDPOINT;
	if (!url) cached = null;
	else {
		const u = new URL(url);
		// virtual-hosted style puts the bucket in the host name
		cached = e.S3_FORCE_PATH_STYLE ? u.origin : `${u.protocol}//${e.S3_BUCKET}.${u.host}`;
	}
	return cached;
}

/** A page's CSP with the storage origin added to connect-src (pages that upload scans). */
export function withStorageConnect(csp: string, bucket = serverEnv().S3_BUCKET, region = serverEnv().S3_REGION): string {
	const origin = storageOrigin() ?? `https://${bucket}.s3.${region}.amazonaws.com`;
	return csp.replace(/connect-src ([^;]*)/, (_m, list: string) => `connect-src ${list} ${origin}`);
}
