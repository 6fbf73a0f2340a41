// Browser side of a scan upload: start it through the API, PUT the parts straight to object storage through
// their presigned URLs (XMLHttpRequest for upload progress; three parts at a time), complete it; cancel aborts
// the requests in flight and the multipart upload, so nothing is left in the bucket.

export interface UploadStart {
	scan: { id: string };
	partSize: number;
	parts: { partNumber: number; url: string }[];
}

export class UploadError extends Error {}

/** The API's error message of a failed response. */
async function messageOf(res: Response) {
	try {
		const body = (await res.json()) as { error?: { message?: string } };
		return body.error?.message ?? `HTTP ${res.status}`;
	} catch {
		return `HTTP ${res.status}`;
	}
}

/** PUTs one part; resolves to its ETag. */
function putPart(url: string, blob: Blob, onProgress: (loaded: number) => void, signal: AbortSignal): Promise<string> {
	return new Promise((resolve, reject) => {
		// cancelled before this part started (even before the upload itself had started)
		if (signal.aborted) return reject(new DOMException('cancelled', 'AbortError'));
		const xhr = new XMLHttpRequest();
		xhr.open('PUT', url);
		xhr.upload.onprogress = (e) => onProgress(e.loaded);
		xhr.onload = () => {
			const etag = xhr.getResponseHeader('ETag');
			if (xhr.status >= 200 && xhr.status < 300 && etag) resolve(etag);
			else reject(new UploadError(xhr.status >= 200 && xhr.status < 300 ? 'the object storage did not expose the ETag header (check its CORS rule)' : `the object storage refused a part (HTTP ${xhr.status})`));
		};
		xhr.onerror = () => reject(new UploadError('the object storage could not be reached'));
		xhr.onabort = () => reject(new DOMException('cancelled', 'AbortError'));
		signal.addEventListener('abort', () => xhr.abort(), { once: true });
		xhr.send(blob);
	});
}

/** Uploads a file as a scan of a car (and corner); resolves to the scan id once processing has started. */
export async function uploadScan(
	file: File,
	opts: { carId: string; cornerId?: string; onProgress?: (fraction: number) => void; signal: AbortSignal; onStarted?: (scanId: string) => void }
): Promise<string> {
	const res = await fetch(`/api/v1/cars/${opts.carId}/scans`, {
		method: 'POST',
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify({ name: file.name, size: file.size, ...(opts.cornerId ? { cornerId: opts.cornerId } : {}) })
	});
	if (!res.ok) throw new UploadError(await messageOf(res));
	const start = (await res.json()) as UploadStart;
	const id = start.scan.id;
	opts.onStarted?.(id);
	const loaded = new Array<number>(start.parts.length).fill(0);
	const report = () => opts.onProgress?.(loaded.reduce((a, b) => a + b, 0) / file.size);
	const etags: string[] = new Array(start.parts.length);
	try {
		let next = 0;
		const lane = async () => {
			while (next < start.parts.length) {
				const i = next++;
				const part = start.parts[i];
				const blob = file.slice(i * start.partSize, Math.min(file.size, (i + 1) * start.partSize));
				etags[i] = await putPart(part.url, blob, (n) => ((loaded[i] = n), report()), opts.signal);
				loaded[i] = blob.size;
				report();
			}
		};
		await Promise.all([lane(), lane(), lane()]);
	} catch (e) {
		await fetch(`/api/v1/scans/${id}/cancel`, { method: 'POST' }).catch(() => undefined);
		throw e;
	}
	const done = await fetch(`/api/v1/scans/${id}/complete`, {
		method: 'POST',
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify({ parts: etags.map((etag, i) => ({ partNumber: i + 1, etag })) })
	});
	if (!done.ok) throw new UploadError(await messageOf(done));
	// a cancel that came while the upload was being completed: the scan is kept (it is whole); the page lists it
	return id;
}
