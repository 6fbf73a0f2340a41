// API v1 plumbing: bodies and query strings through zod, and every failure as JSON
// `{ "error": { "code", "message", "field"? } }` whatever the client's Accept header.
import { error, isHttpError, json, type RequestEvent, type RequestHandler } from '@sveltejs/kit';
import type { z } from 'zod';

/** The first problem of a zod error as a field path and a message. */
export function firstIssue(err: z.ZodError): { field: string; message: string } {
	const issue = err.issues[0];
	const field = issue?.path.map(String).join('.') ?? '';
	return { field, message: issue?.message ?? 'Invalid input' };
}

/** Stops with 400 naming the field. */
export function invalid(field: string, message: string, code = 'invalid'): never {
	error(400, { message: field && !message.startsWith(field) ? `${field}: ${message}` : message, code, field });
}

/** The body-size limit's refusal (adapter-node's BODY_SIZE_LIMIT raises an error with status 413 while reading). */
export function tooLarge(e: unknown): boolean {
	return !!e && typeof e === 'object' && (e as { status?: unknown }).status === 413;
}

/** Stops with 413 naming the limit, when reading a body failed because it was over the size limit. */
export function refuseIfTooLarge(e: unknown): void {
	if (tooLarge(e)) {
		const detail = e instanceof Error && e.message ? ` (${e.message})` : '';
		error(413, { message: `The body is larger than the server accepts${detail}`, code: 'too_large' });
	}
}

/** True for application/json and any application/…+json media type (RFC 8259 §11, RFC 6839 §3.1). */
export function isJsonType(contentType: string | null) {
	const type = contentType?.split(';', 1)[0].trim().toLowerCase() ?? '';
	return type === 'application/json' || (type.startsWith('application/') && type.endsWith('+json'));
}

/** Parses the JSON body with a schema: 415 unless sent as JSON, 413 over the size limit, 400 naming the field. */
export async function parseBody<T extends z.ZodType>(event: RequestEvent, schema: T): Promise<z.infer<T>> {
	const type = event.request.headers.get('content-type');
	if (!isJsonType(type)) {
		error(415, { message: `Send the body as application/json (got ${type ? type.split(';', 1)[0] : 'no content type'})`, code: 'unsupported_media_type', field: 'content-type' });
	}
	let text: string;
	try {
		text = await event.request.text();
	} catch (e) {
		refuseIfTooLarge(e);
		throw e;
	}
	let raw: unknown;
	try {
		raw = JSON.parse(text);
	} catch {
		invalid('', 'The body must be JSON', 'invalid_json');
	}
	return parseWith(schema, raw);
}

/** Parses a value with a schema, or stops with 400 naming the field. */
export function parseWith<T extends z.ZodType>(schema: T, raw: unknown): z.infer<T> {
	const result = schema.safeParse(raw);
	if (!result.success) {
		const { field, message } = firstIssue(result.error);
		invalid(field, message);
	}
	return result.data;
}

/** Parses the query string with a schema, or stops with 400 naming the parameter. */
export function parseQuery<T extends z.ZodType>(event: RequestEvent, schema: T): z.infer<T> {
	return parseWith(schema, Object.fromEntries(event.url.searchParams));
}

/** The JSON error response of API v1. */
export function errorResponse(status: number, body: App.Error) {
	const { message, code = status === 404 ? 'not_found' : 'error', field } = body;
	return json({ error: { code, message, ...(field ? { field } : {}) } }, { status });
}

/** Wraps an API handler so that thrown errors answer in the API's JSON error shape. */
export function endpoint<E extends RequestEvent>(handler: (event: E) => Promise<Response> | Response) {
	return (async (event: E) => {
		try {
			return await handler(event);
		} catch (e) {
			if (isHttpError(e)) return errorResponse(e.status, e.body);
			throw e;
		}
	}) as unknown as RequestHandler & ((event: E) => Promise<Response>);
}
