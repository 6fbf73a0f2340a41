// Small helpers for API v1 handlers: bodies and query strings through zod, errors as JSON.
import { error, type RequestEvent } from '@sveltejs/kit';
import type { z } from 'zod';

/** The first problem of a zod error as a field path and a message. */
export function firstIssue(err: z.ZodError): { field: string; message: string } {
	const issue = err.issues[0];
	const field = issue?.path.map(String).join('.') ?? '';
	return { field, message: issue?.message ?? 'Invalid input' };
}

/** Stops with 400 naming the field. */
export function invalid(field: string, message: string): never {
	error(400, { message: field ? `${field}: ${message}` : message, code: 'invalid', field });
}

/** Parses the JSON body with a schema, or stops with 400 naming the field. */
export async function parseBody<T extends z.ZodType>(event: RequestEvent, schema: T): Promise<z.infer<T>> {
	let raw: unknown;
	try {
		raw = await event.request.json();
	} catch {
		invalid('', 'The body must be JSON');
	}
	const result = schema.safeParse(raw);
	if (!result.success) {
		const { field, message } = firstIssue(result.error);
		invalid(field, message);
	}
	return result.data;
}

/** Parses the query string with a schema, or stops with 400 naming the parameter. */
export function parseQuery<T extends z.ZodType>(event: RequestEvent, schema: T): z.infer<T> {
	const result = schema.safeParse(Object.fromEntries(event.url.searchParams));
	if (!result.success) {
		const { field, message } = firstIssue(result.error);
		invalid(field, message);
	}
	return result.data;
}
