import type { ParamMatcher } from '@sveltejs/kit';
import { SHARE_TOKEN_PATTERN } from '$lib/schemas/share';

/** Matches a share-link token path segment (anything else is a plain 404). */
export const match: ParamMatcher = (param) => SHARE_TOKEN_PATTERN.test(param);
