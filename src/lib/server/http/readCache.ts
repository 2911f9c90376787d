import { createHash } from 'node:crypto';
import type { Handle, RequestEvent } from '@sveltejs/kit';
import { LRUCache } from 'lru-cache';
import { hasSessionCookie } from '../auth/sessionCookie';
import type { CatalogueValidity } from '../catalogue/validity';
import {
	compress,
	encodedEtag,
	isCompressible,
	preferredEncoding,
	type ContentEncoding
} from './compression';

/*
 * Answers for signed-out readers, kept in memory for as long as the catalogue they show stays
 * the same. Signed-out readers of a catalogue page all see the same bytes — it depends on the
 * URL and on the approved, public data, which move only with the catalogue revision (every
 * approval, withdrawal and visibility change bumps it in the writing transaction), with the
 * end of an embargo and with the date (citations carry it) — so the first such request renders
 * and the next ones, until the revision or the validity moves, are served from here. Every
 * kept answer has an ETag; a matching `If-None-Match` gets 304.
 *
 * Never kept: requests carrying a session cookie or an Authorization header (members see
 * group-only rows, and the header shows who is signed in), anything but GET, answers other
 * than 200, answers that set a cookie or say `private`/`no-store`, routes not listed as
 * catalogue reads, and bodies over the per-entry limit. The memory is bounded by bytes (LRU).
 */

/**
 * Routes whose signed-out answer depends only on the URL and the public catalogue, and what of
 * the URL: the whole of it, or (`path`) the path alone — a query string those routes do not
 * read must not file a copy of their answer per made-up query, pushing others out.
 */
export const CATALOGUE_READ_ROUTES: ReadonlyMap<string, 'url' | 'path'> = new Map([
	['/', 'url'],
	['/proteins', 'url'],
	['/search', 'url'],
	['/e/[accession=accession]/[[version=version]]', 'url'],
	['/e/[accession=accession]/compare', 'url'],
	['/api', 'path'],
	['/api/v1', 'path'],
	['/api/v1/potentials', 'url'],
	['/api/v1/proteins', 'url'],
	['/api/v1/centres', 'url'],
	['/api/v1/distances', 'url'],
	['/api/v1/spin-records', 'url'],
	['/api/v1/facets', 'url'],
	['/api/v1/entries/[accession=accession]', 'url']
]);
interface KeptAnswer {
	revision: number;
	validUntil: number;
	status: number;
	headers: [string, string][];
	body: Uint8Array;
	etag: string;
	compressible: boolean;
	/** Compressed copies, made the first time a reader asks for each. */
	encoded: Partial<Record<ContentEncoding, Uint8Array>>;
}

export interface ReadCacheOptions {
	/** The catalogue's current validity (catalogue/validity.ts). */
	validity: () => Promise<CatalogueValidity>;
	maxBytes: number;
	maxEntryBytes: number;
}

export function isSignedOutRead(event: {
	request: Request;
	route: { id: string | null };
}): boolean {
	const { request } = event;
	if (request.method !== 'GET') return false;
	if (!event.route.id || !CATALOGUE_READ_ROUTES.has(event.route.id)) return false;
	if (request.headers.has('authorization')) return false;
	return !hasSessionCookie(request);
}

/** Whether an `If-None-Match` header names this ETag (weak comparison, RFC 9110 §13.1.2). */
export function etagMatches(ifNoneMatch: string | null, etag: string): boolean {
	if (!ifNoneMatch) return false;
	if (ifNoneMatch.trim() === '*') return true;
	const bare = (tag: string) => tag.trim().replace(/^W\//, '');
	return ifNoneMatch.split(',').some((tag) => bare(tag) === bare(etag));
}

/** Adds tokens to `Vary`, each once (case aside). */
export function addVary(headers: Headers, tokens: readonly string[]): void {
	const present = (headers.get('vary') ?? '')
		.split(',')
		.map((t) => t.trim())
		.filter(Boolean);
	const lower = new Set(present.map((t) => t.toLowerCase()));
	for (const token of tokens) if (!lower.has(token.toLowerCase())) present.push(token);
	headers.set('vary', present.join(', '));
}

/** Headers an answer kept for everyone must not carry on to the next reader. */
const PER_REQUEST_HEADERS = new Set(['set-cookie', 'date', 'connection', 'keep-alive']);

function keepable(response: Response): boolean {
	if (response.status !== 200 || response.headers.has('set-cookie')) return false;
	const cacheControl = response.headers.get('cache-control') ?? '';
	return !/\b(?:private|no-store)\b/i.test(cacheControl);
}

/**
 * Shared caches between the server and a reader (a proxy) must not hand the signed-out answer
 * to someone signed in, and browsers revalidate with the ETag before reuse.
 */
function cachingHeaders(headers: Headers, etag: string, compressible: boolean): void {
	headers.set('etag', etag);
	// A route or caching.ts may have said more (an immutable version); otherwise revalidate.
	if (!headers.has('cache-control')) headers.set('cache-control', 'public, no-cache');
	addVary(
		headers,
		compressible ? ['Cookie', 'Authorization', 'Accept-Encoding'] : ['Cookie', 'Authorization']
	);
}

/**
 * The kept answer in the encoding the reader prefers, or 304 if it already holds that one.
 * `grown` is told when a compressed copy was added, so the cache can count its bytes.
 */
function answer(kept: KeptAnswer, request: Request, grown: () => void): Response {
	const headers = new Headers(kept.headers);
	const encoding = kept.compressible
		? preferredEncoding(request.headers.get('accept-encoding'))
		: null;
	const etag = encoding ? encodedEtag(kept.etag, encoding) : kept.etag;
	headers.set('etag', etag);
	if (etagMatches(request.headers.get('if-none-match'), etag)) {
		headers.delete('content-length');
		return new Response(null, { status: 304, headers });
	}
	let body = kept.body;
	if (encoding) {
		let copy = kept.encoded[encoding];
		if (!copy) {
			copy = kept.encoded[encoding] = compress(kept.body, encoding);
			grown();
		}
		body = copy;
		headers.set('content-encoding', encoding);
		headers.set('content-length', String(body.byteLength));
	}
	return new Response(body as Uint8Array<ArrayBuffer>, { status: kept.status, headers });
}

export function createReadCache(options: ReadCacheOptions) {
	const kept = new LRUCache<string, KeptAnswer>({
		maxSize: options.maxBytes,
		maxEntrySize: options.maxEntryBytes,
		sizeCalculation: (entry, key) =>
			entry.body.byteLength +
			(entry.encoded.br?.byteLength ?? 0) +
			(entry.encoded.gzip?.byteLength ?? 0) +
			key.length * 2 +
			512
	});
	let hits = 0;
	let misses = 0;

	/** Answers being rendered now, by key: concurrent first visits wait for one rendering. */
	const rendering = new Map<string, Promise<KeptAnswer | Response>>();

	async function render(
		event: RequestEvent,
		resolve: Parameters<Handle>[0]['resolve'],
		validity: CatalogueValidity
	): Promise<KeptAnswer | Response> {
		// The revision was read before rendering: if an approval lands meanwhile, this answer is
		// filed under the older revision and never served once the newer one is seen.
		const response = await resolve(event);
		if (!keepable(response)) return response;
		const body = new Uint8Array(await response.arrayBuffer());
		const headers = new Headers(response.headers);
		// Tagged already by caching.ts (versions, lists) or SvelteKit (pages); else a hash of the bytes.
		const etag =
			headers.get('etag') ??
			`"${createHash('sha256').update(body).digest('base64url').slice(0, 27)}"`;
		const compressible =
			!headers.has('content-encoding') &&
			isCompressible(headers.get('content-type'), body.byteLength);
		cachingHeaders(headers, etag, compressible);
		return {
			revision: validity.revision,
			validUntil: validity.validUntil,
			status: response.status,
			headers: [...headers].filter(([name]) => !PER_REQUEST_HEADERS.has(name)),
			body,
			etag,
			compressible,
			encoded: {}
		};
	}

	const handle: Handle = async ({ event, resolve }) => {
		if (!isSignedOutRead(event)) return resolve(event);
		const validity = await options.validity();
		// The request's own URL: SvelteKit's event.url is the page's URL even for its
		// `__data.json` request, which must not share the page's answer.
		const url =
			CATALOGUE_READ_ROUTES.get(event.route.id ?? '') === 'path'
				? event.request.url.split('?')[0]
				: event.request.url;
		const key = `${validity.revision}\n${url}\n${event.request.headers.get('accept') ?? ''}`;
		// A compressed copy added to a kept answer: set it again so the LRU counts its bytes.
		const recount = (entry: KeptAnswer) => () => {
			if (kept.peek(key) === entry) kept.set(key, entry);
		};
		const found = kept.get(key);
		if (found && Date.now() < Math.min(found.validUntil, validity.validUntil)) {
			hits++;
			return answer(found, event.request, recount(found));
		}
		const inFlight = rendering.get(key);
		if (inFlight) {
			const result = await inFlight.catch(() => null);
			// Failed or not keepable (an error page, say): each waiting reader renders its own.
			if (result === null || result instanceof Response) return resolve(event);
			hits++;
			return answer(result, event.request, recount(result));
		}
		misses++;
		const work = render(event, resolve, validity);
		rendering.set(key, work);
		try {
			const result = await work;
			if (result instanceof Response) return result;
			if (result.body.byteLength <= options.maxEntryBytes) kept.set(key, result);
			return answer(result, event.request, recount(result));
		} finally {
			rendering.delete(key);
		}
	};

	return {
		handle,
		stats: () => ({ entries: kept.size, bytes: kept.calculatedSize, hits, misses }),
		clear: () => kept.clear()
	};
}
