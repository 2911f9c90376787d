import type { ParamMatcher } from '@sveltejs/kit';

/** A row id in a URL: a positive integer without leading zeros, at most ten digits. */
export const match: ParamMatcher = (param) => /^[1-9]\d{0,9}$/.test(param);
