import type { Handle } from '@sveltejs/kit';
import { DomainError } from '$lib/domainError';
import { API_TOKEN_PREFIX } from '$lib/schemas/apiToken';
import { scopeIncludes } from '$lib/schemas/apiTokenScopes';
import { isApiPath } from '../api/paths';
import {
	ApiTokenRateLimitError,
	ApiTokenRefusedError,
	ApiTokenScopeError
} from '../auth/apiTokenErrors';
import { authenticateApiToken, noteTokenUse, type TokenHolder } from '../auth/apiTokens';
import { apiTokenRequests } from '../auth/rateLimit';
import { scopeNeeded } from '../auth/tokenRoutes';
import { viewerOf } from '../catalogue/visibility';
import { config } from '../config';
import { db } from '../db';
import { toApiResponse } from './failures';
import { withHeaders } from './headers';

/*
 * Personal API tokens on requests (the tokens themselves: auth/apiTokens.ts). Under /api/v1 a
 * request with an Authorization header is answered for the token's owner, or refused in the
 * API's error shape: 401 for a token that lets nobody in (with WWW-Authenticate), 403 when its
 * scope does not cover the request, 429 past the per-token rate limit. A request with a token
 * is never read as a cookie session too (`attachUser` leaves it alone), and it needs no Origin
 * header (the cross-site check exempts it: a bearer token is not sent by browsers on their
 * own). Elsewhere the header is ignored: pages are for browsers and their sessions; so is
 * another scheme than Bearer that carries no Hopline token.
 */

/** The token of an `Authorization: Bearer <token>` header; null for any other scheme. */
export function bearerToken(header: string): string | null {
	return /^Bearer +([^\s]+) *$/i.exec(header)?.[1] ?? null;
}

const REALM = 'Bearer realm="Hopline API"';
const RATE_LIMIT_HEADER = String(config.API_TOKEN_RATE_LIMIT);
const RATE_POLICY_HEADER = `${config.API_TOKEN_RATE_LIMIT};w=${config.API_TOKEN_RATE_WINDOW_SECONDS}`;

/** Counts the request against the token's limit; the wait in ms when it is over it (then not counted). */
function takeTokenRequest(tokenId: number): { waitMs: number; headers: Record<string, string> } {
	const { waitMs, remaining, resetMs } = apiTokenRequests.take(String(tokenId));
	return {
		waitMs,
		headers: {
			'ratelimit-limit': RATE_LIMIT_HEADER,
			'ratelimit-remaining': String(remaining),
			'ratelimit-reset': String(Math.ceil(resetMs / 1000)),
			'ratelimit-policy': RATE_POLICY_HEADER
		}
	};
}

export const authenticateBearer: Handle = async ({ event, resolve }) => {
	const header = event.request.headers.get('authorization');
	if (header === null || !isApiPath(event.url.pathname)) return resolve(event);
	const token = bearerToken(header);
	// Another scheme (a proxy's Basic credentials passed through) is none of the API's business,
	// unless it carries one of our tokens: then the client only got the scheme wrong.
	if (token === null && !header.includes(API_TOKEN_PREFIX)) return resolve(event);
	let holder: TokenHolder;
	try {
		if (token === null) throw new ApiTokenRefusedError('scheme');
		holder = await authenticateApiToken(db, token);
	} catch (e) {
		if (!(e instanceof DomainError)) throw e;
		return withHeaders(toApiResponse(e), {
			'www-authenticate': `${REALM}, error="invalid_token"`
		});
	}
	const limit = takeTokenRequest(holder.tokenId);
	if (limit.waitMs > 0) {
		const wait = Math.max(1, Math.ceil(limit.waitMs / 1000));
		const refusal = new ApiTokenRateLimitError(
			wait,
			config.API_TOKEN_RATE_LIMIT,
			config.API_TOKEN_RATE_WINDOW_SECONDS
		);
		return withHeaders(toApiResponse(refusal), limit.headers);
	}
	// At most one small write a minute per token; the answer does not wait for it.
	const tokenId = holder.tokenId;
	void noteTokenUse(db, holder).catch((e: unknown) =>
		console.error(`[api token ${tokenId}] the last-used time was not written:`, e)
	);
	event.locals.apiToken = { id: holder.tokenId, scope: holder.scope };
	const needed = scopeNeeded(event.request.method, event.route.id);
	if (needed !== null) {
		if (!scopeIncludes(holder.scope, needed))
			return withHeaders(
				toApiResponse(new ApiTokenScopeError(holder.scope, needed)),
				limit.headers
			);
		event.locals.user = holder.user;
		event.locals.viewer = viewerOf(holder.user);
	}
	return withHeaders(await resolve(event), limit.headers);
};
