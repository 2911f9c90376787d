import type { ApiTokenScope } from '$lib/schemas/apiTokenScopes';

/*
 * What a personal API token may be used for. Reads (GET, HEAD, OPTIONS) anywhere under /api/v1
 * need the `read` scope, which every token has. Any other method is allowed only on the routes
 * listed here, with the scope given; elsewhere the token gives nothing (the request is answered
 * as if it carried no credential, so an unlisted route refuses it or answers 405). A new
 * mutating API route therefore stays closed to tokens until it is listed, and
 * tests/unit/tokenRoutes.test.ts fails until it is.
 */

/** `METHOD routeId` (SvelteKit's `event.route.id`; `fallback` for a route's fallback handler). */
export const TOKEN_WRITE_ROUTES: Record<string, ApiTokenScope | null> = {
	'POST /api/v1/submissions': 'read+submit',
	'POST /api/v1/uploads/check': 'read+submit',
	'POST /api/v1/submissions/[id=id]/attachments': 'read+submit',
	'DELETE /api/v1/submissions/[id=id]/attachments/[attachmentId=id]': 'read+submit',
	// Calculations change nothing; a token spares its holder the per-address limit of callers
	// without an account.
	'POST /api/v1/calc/titration': 'read',
	'POST /api/v1/calc/tunnelling': 'read',
	// Unknown paths answer 404 whoever asks.
	'fallback /api/v1/[...rest]': null
};

const READS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** The scope a token needs for the request, or null when a token gives nothing there. */
export function scopeNeeded(method: string, routeId: string | null): ApiTokenScope | null {
	if (READS.has(method)) return 'read';
	if (routeId === null) return null;
	return (
		TOKEN_WRITE_ROUTES[`${method} ${routeId}`] ?? TOKEN_WRITE_ROUTES[`fallback ${routeId}`] ?? null
	);
}
