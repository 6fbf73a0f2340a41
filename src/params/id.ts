import type { ParamMatcher } from '@sveltejs/kit';

/** Matches a UUID path segment. */
export const match: ParamMatcher = (param) =>
	/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(param);
