import type { Handle } from '@sveltejs/kit';
import { API_ERROR_CODES, type ApiErrorBody, type ApiErrorCode } from '$lib/schemas/apiError';
import { withHeaders } from '../http/headers';
import { isApiPath } from './paths';

/*
 * What every answer under /api/v1 has in common, whatever route (or none) made it:
 *
 * - **CORS for reads.** GET and HEAD answers carry `Access-Control-Allow-Origin: *` (and expose
 *   the headers a client reads: paging, caching, rate limits), so a page on any origin may read
 *   public data — never with the reader's cookies: `*` without `Access-Control-Allow-Credentials`
 *   makes browsers refuse a credentialed answer, so a session cookie is no use to another site.
 *   A preflight (OPTIONS with Origin and Access-Control-Request-Method) is granted for GET and
 *   HEAD with the Authorization header (a token is sent on purpose, never by the browser on its
 *   own). Other methods get no CORS headers and no preflight: writes stay same-origin for
 *   cookies (the cross-site check, http/originCheck.ts) and are for scripts with tokens.
 * - **One error shape.** Any answer of 400 or more that is not `{ error: { code, message } }`
 *   with the code of its status is rewritten into it: SvelteKit's plain-text 405 (any method a
 *   route does not export, OPTIONS outside a preflight included) keeps its `Allow` header.
 * - **401s say how to authenticate** (`WWW-Authenticate: Bearer`), as HTTP requires.
 * - **No cookies.** Auth.js may refresh or clear its session cookie on any request that reads
 *   the session; API answers drop `Set-Cookie`, so scripts and other sites never get one.
 */

/** Headers a cross-origin script may read on a GET or HEAD answer. */
export const CORS_EXPOSED_HEADERS = [
	'Link',
	'ETag',
	'Retry-After',
	'RateLimit-Limit',
	'RateLimit-Remaining',
	'RateLimit-Reset',
	'RateLimit-Policy',
	'X-Total-Count',
	'Content-Disposition',
	'WWW-Authenticate'
];
/** Request headers a preflight allows: the token, and revalidation of cached answers. */
export const CORS_ALLOWED_HEADERS = ['Authorization', 'If-None-Match', 'If-Modified-Since'];
/** How long a browser may keep a granted preflight (Chromium's own cap is 2 hours). */
const PREFLIGHT_MAX_AGE_SECONDS = 7200;

const READS = new Set(['GET', 'HEAD']);

export function isPreflight(request: Request): boolean {
	return (
		request.method === 'OPTIONS' &&
		request.headers.has('origin') &&
		request.headers.has('access-control-request-method')
	);
}

const CORS_READ_HEADERS = {
	'access-control-allow-origin': '*',
	'access-control-expose-headers': CORS_EXPOSED_HEADERS.join(', ')
};

function preflightAnswer(): Response {
	return new Response(null, {
		status: 204,
		headers: {
			'access-control-allow-origin': '*',
			'access-control-allow-methods': 'GET, HEAD',
			'access-control-allow-headers': CORS_ALLOWED_HEADERS.join(', '),
			'access-control-max-age': String(PREFLIGHT_MAX_AGE_SECONDS)
		}
	});
}

export const apiBoundary: Handle = async ({ event, resolve }) => {
	if (!isApiPath(event.url.pathname)) return resolve(event);
	const { request } = event;
	if (isPreflight(request) && READS.has(request.headers.get('access-control-request-method') ?? ''))
		return preflightAnswer();
	let response = await inErrorShape(await resolve(event), request, event.url);
	const headers: Record<string, string> = READS.has(request.method) ? { ...CORS_READ_HEADERS } : {};
	if (response.status === 401 && !response.headers.has('www-authenticate'))
		headers['www-authenticate'] = 'Bearer realm="Hopline API"';
	response = withHeaders(response, headers);
	return response.headers.has('set-cookie') ? withoutCookies(response) : response;
};

function withoutCookies(response: Response): Response {
	try {
		response.headers.delete('set-cookie');
		return response;
	} catch {
		const copy = new Response(response.body, response);
		copy.headers.delete('set-cookie');
		return copy;
	}
}

/** The code of a status: the first in the API's list with it; else the general one of its class. */
export function codeForStatus(status: number): ApiErrorCode {
	const codes = Object.entries(API_ERROR_CODES) as [ApiErrorCode, number][];
	return (
		codes.find(([, s]) => s === status)?.[0] ?? (status >= 500 ? 'internal_error' : 'bad_request')
	);
}

/** Whether a body is the API's error shape with the code of `status`. */
function isErrorShape(body: string, status: number): boolean {
	let parsed: unknown;
	try {
		parsed = JSON.parse(body);
	} catch {
		return false;
	}
	const error = (parsed as Partial<ApiErrorBody> | null)?.error;
	return (
		typeof error?.message === 'string' &&
		typeof error.code === 'string' &&
		Object.hasOwn(API_ERROR_CODES, error.code) &&
		API_ERROR_CODES[error.code] === status
	);
}

/** A short message another layer (SvelteKit, a plain-text refusal) gave, if it gave one. */
function messageIn(body: string, contentType: string): string | null {
	if (contentType.includes('json')) {
		try {
			const message = (JSON.parse(body) as { message?: unknown }).message;
			return typeof message === 'string' ? message : null;
		} catch {
			return null;
		}
	}
	return contentType.startsWith('text/plain') && body.length > 0 && body.length <= 500
		? body.trim()
		: null;
}

async function inErrorShape(response: Response, request: Request, url: URL): Promise<Response> {
	if (response.status < 400) return response;
	const contentType = response.headers.get('content-type') ?? '';
	if (request.method === 'HEAD') {
		// No body to look at; the status and headers are what a HEAD answer says.
		return contentType.startsWith('application/json')
			? response
			: withHeaders(response, { 'content-type': 'application/json' });
	}
	const body = await response.clone().text();
	if (isErrorShape(body, response.status)) return response;
	const code = codeForStatus(response.status);
	let message: string;
	if (response.status === 405) {
		const allow = response.headers.get('allow') || 'nothing';
		message =
			request.method === 'OPTIONS'
				? `${url.pathname} answers ${allow}; OPTIONS is answered only as a browser's CORS preflight for GET or HEAD.`
				: `${request.method} is not allowed on ${url.pathname}; it answers ${allow}.`;
	} else if (response.status >= 500) {
		message = 'Internal error; quote the error id when reporting it.';
	} else {
		message = messageIn(body, contentType) ?? `The request failed with status ${response.status}.`;
	}
	const errorBody: ApiErrorBody = { error: { code, message } };
	const errorId = response.status >= 500 ? errorIdIn(body) : null;
	if (errorId) errorBody.error.errorId = errorId;
	const headers = new Headers(response.headers);
	headers.set('content-type', 'application/json');
	headers.delete('content-length');
	return new Response(JSON.stringify(errorBody), { status: response.status, headers });
}

function errorIdIn(body: string): string | null {
	try {
		const id = (JSON.parse(body) as { errorId?: unknown; error?: { errorId?: unknown } }).errorId;
		return typeof id === 'string' ? id : null;
	} catch {
		return null;
	}
}
