import { apiError } from '$lib/server/api/respond';
import type { RequestHandler } from './$types';

/** Anything under /api/v1 that is not an endpoint: a 404 in the API's error shape. */
export const fallback: RequestHandler = ({ url }) =>
	apiError('not_found', `No API endpoint at ${url.pathname}; see /api/v1 for the list.`);
