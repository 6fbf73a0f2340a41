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

/** Parses the JSON body with a schema, or stops with 400 naming the field. */
export async function parseBody<T extends z.ZodType>(event: RequestEvent, schema: T): Promise<z.infer<T>> {
	let raw: unknown;
	try {
		raw = await event.request.json();
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
