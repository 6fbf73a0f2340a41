import type { ParamMatcher } from '@sveltejs/kit';

/** An axle of a car: front or rear. */
export const match: ParamMatcher = (param) => param === 'front' || param === 'rear';
