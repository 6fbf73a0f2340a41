// Absolute links for mails and share links: the configured public URL (ORIGIN), else the request's own.
import type { RequestEvent } from '@sveltejs/kit';
import { serverEnv } from '$lib/server/env';

/** An absolute URL of a path on this site. */
export function absoluteUrl(event: Pick<RequestEvent, 'url'>, path: string) {
	return new URL(path, serverEnv().ORIGIN ?? event.url.origin).href;
}
