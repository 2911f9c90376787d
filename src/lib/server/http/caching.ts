import { createHash } from 'node:crypto';
import type { Handle, RequestEvent } from '@sveltejs/kit';
import { hasSessionCookie } from '../auth/sessionCookie';
import type { CatalogueValidity } from '../catalogue/validity';
import type { Viewer } from '../catalogue/visibility';
import { addVary, etagMatches } from './readCache';

/*
 * HTTP caching of catalogue reads, for every reader (the read cache, readCache.ts, keeps answers
 * for signed-out readers only; this handle runs after the reader is known, and the read cache
 * keeps what it tags):
 *
 * - A version of an entry as the API answers it (`/api/v1/entries/HL…?version=N`) is frozen once
 *   approved and carries nothing live, so its answer never changes: a strong ETag (SHA-256 of the bytes) and,
 *   for a signed-out reader (who sees it only when the entry is public), `Cache-Control: public,
 *   max-age=31536000, immutable`. For a signed-in or token-bearing reader it is `private,
 *   no-cache` with `Vary: Cookie, Authorization`: the copy is theirs alone, and revalidated,
 *   because a group-only entry may be closed to them later (revalidation costs a 304).
 *   Entry pages (`/e/HL…` and `/e/HL…/vN`, with their `__data.json`) are not immutable: a
 *   version page freezes its version but also shows the current registry beneath it (related
 *   lists, ladder, chain estimate, newer versions), so the read cache's `public, no-cache` applies.
 * - Lists and facets (`/api/v1/potentials`, …, `/api/v1/facets`, the export) carry an ETag made
 *   from the catalogue revision and validity (catalogue/validity.ts: an embargo's end or
 *   midnight changes what is shown without a write), the build, the request's URL and Accept,
 *   and the reader's visibility class (the groups whose rows they see). A matching
 *   `If-None-Match` is answered 304 before any work is done. A reader in no group sees what a
 *   signed-out reader sees, so both get the same tag.
 * - API answers set no cookie: a cookie refreshed by Auth.js while answering a script would
 *   belong to nobody's request (the pages refresh the session instead).
 */

export type CachePolicy = 'immutable' | 'list' | 'private' | null;

const ENTRY_PAGE = '/e/[accession=accession]/[[version=version]]';
const ENTRY_API = '/api/v1/entries/[accession=accession]';
const LIST_ROUTES: ReadonlySet<string> = new Set([
	'/api/v1/potentials',
	'/api/v1/potentials/export',
	'/api/v1/proteins',
	'/api/v1/centres',
	'/api/v1/distances',
	'/api/v1/spin-records',
	'/api/v1/facets'
]);

export const IMMUTABLE_CACHE_CONTROL = 'public, max-age=31536000, immutable';
const PRIVATE_CACHE_CONTROL = 'private, no-cache';
const SHARED_CACHE_CONTROL = 'public, no-cache';

/**
 * How an answer to this request may be cached, by its route and whether the request says who
 * reads. An entry page read with a session may hold a group's entry and names the reader: it is
 * theirs alone (`private`); a signed-out reader's gets the read cache's headers.
 */
export function cachePolicy(
	event: Pick<RequestEvent, 'route' | 'params' | 'url'>,
	personal = false
): CachePolicy {
	const route = event.route.id;
	if (route === ENTRY_API) return event.url.searchParams.has('version') ? 'immutable' : null;
	if (route === ENTRY_PAGE) return personal ? 'private' : null;
	return route !== null && LIST_ROUTES.has(route) ? 'list' : null;
}

/** Whether the request says who reads (a session cookie or an Authorization header). */
export function isPersonal(request: Request): boolean {
	return request.headers.has('authorization') || hasSessionCookie(request);
}

/** The groups whose rows a reader sees beyond the public ones: `public` for none. */
export function visibilityClass(viewer: Viewer | null): string {
	const groups = [...new Set(viewer?.groupIds ?? [])].sort((a, b) => a - b);
	return groups.length === 0 ? 'public' : `groups:${groups.join(',')}`;
}

/** The ETag of a list answer: what it depends on, hashed. */
export function listEtag(
	request: Request,
	validity: CatalogueValidity,
	build: string,
	viewer: Viewer | null
): string {
	const basis = [
		build,
		validity.revision,
		validity.validUntil,
		request.url,
		request.headers.get('accept') ?? '',
		visibilityClass(viewer)
	].join('\n');
	return `"l-${createHash('sha256').update(basis).digest('base64url').slice(0, 27)}"`;
}

/**
 * Whether `If-None-Match` names this list tag, in any of the encodings the read cache sends it
 * in (readCache.ts tags a compressed copy `"…-br"` / `"…-gzip"`): the same bytes, so still fresh.
 */
function listTagMatches(ifNoneMatch: string | null, etag: string): string | null {
	if (!ifNoneMatch) return null;
	if (etagMatches(ifNoneMatch, etag)) return etag;
	for (const encoding of ['br', 'gzip']) {
		const encoded = etag.replace(/"$/, `-${encoding}"`);
		if (etagMatches(ifNoneMatch, encoded)) return encoded;
	}
	return null;
}

function notModified(etag: string, cacheControl: string): Response {
	const headers = new Headers({ etag, 'cache-control': cacheControl });
	addVary(headers, ['Cookie', 'Authorization']);
	return new Response(null, { status: 304, headers });
}

export interface CachingOptions {
	/** The catalogue's current validity (catalogue/validity.ts); shared with the read cache. */
	validity: () => Promise<CatalogueValidity>;
	/** Changes with every deployment, so that a new build never answers 304 for old bytes. */
	build: string;
}

export function createCachingHandle(options: CachingOptions): Handle {
	return async ({ event, resolve }) => {
		const { request } = event;
		const personal = isPersonal(request);
		const policy =
			request.method === 'GET' || request.method === 'HEAD' ? cachePolicy(event, personal) : null;
		let response: Response;
		if (policy === 'list') {
			const cacheControl = personal ? PRIVATE_CACHE_CONTROL : SHARED_CACHE_CONTROL;
			const etag = listEtag(request, await options.validity(), options.build, event.locals.viewer);
			const matched = listTagMatches(request.headers.get('if-none-match'), etag);
			if (matched) return notModified(matched, cacheControl);
			response = await resolve(event);
			if (response.status === 200) {
				response.headers.set('etag', etag);
				response.headers.set('cache-control', cacheControl);
				addVary(response.headers, ['Cookie', 'Authorization']);
			}
		} else if (policy === 'immutable') {
			response = await resolve(event);
			// A page that says no-store holds something true only now (the protein page's "busy,
			// reload" note under its live sections): never frozen, and so never kept either.
			const noStore = /\bno-store\b/i.test(response.headers.get('cache-control') ?? '');
			if (response.status === 200 && !noStore)
				response = await immutable(response, request, personal);
		} else if (policy === 'private') {
			response = await resolve(event);
			if (response.status === 200 && !response.headers.has('cache-control')) {
				response.headers.set('cache-control', PRIVATE_CACHE_CONTROL);
				addVary(response.headers, ['Cookie', 'Authorization']);
			}
		} else {
			response = await resolve(event);
		}
		if (event.url.pathname.startsWith('/api/')) response.headers.delete('set-cookie');
		return response;
	};
}

/** A frozen answer with its strong ETag and caching headers, or 304 when the reader holds it. */
async function immutable(response: Response, request: Request, personal: boolean) {
	const body = new Uint8Array(await response.arrayBuffer());
	const etag = `"${createHash('sha256').update(body).digest('base64url').slice(0, 43)}"`;
	const cacheControl = personal ? PRIVATE_CACHE_CONTROL : IMMUTABLE_CACHE_CONTROL;
	if (etagMatches(request.headers.get('if-none-match'), etag))
		return notModified(etag, cacheControl);
	const headers = new Headers(response.headers);
	headers.set('etag', etag);
	headers.set('cache-control', cacheControl);
	addVary(headers, ['Cookie', 'Authorization']);
	return new Response(body, { status: response.status, headers });
}
