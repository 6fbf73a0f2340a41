// Form actions: parse with zod and turn problems into per-field messages for fail(400).
import type { z } from 'zod';

export type FieldErrors = Record<string, string>;

/** Parses form data with a schema; returns the data or the first message for each field. */
export function parseForm<T extends z.ZodType>(
	form: FormData,
	schema: T
): { ok: true; data: z.infer<T> } | { ok: false; errors: FieldErrors; values: Record<string, string> } {
	const values: Record<string, string> = {};
	for (const [key, value] of form) if (typeof value === 'string' && key !== 'password') values[key] = value;
	const result = schema.safeParse(Object.fromEntries(form));
	if (result.success) return { ok: true, data: result.data };
	const errors: FieldErrors = {};
	for (const issue of result.error.issues) {
		const key = issue.path.map(String).join('.') || 'form';
		errors[key] ??= issue.message;
	}
	return { ok: false, errors, values };
}
