import {
	compress,
	encodedEtag,
	preferredEncoding,
	type ContentEncoding
} from '../http/compression';
import { etagMatches } from '../http/readCache';
import { openApiDocument } from './document';

/*
 * Serving the document: the same bytes for the life of the process, so a strong ETag and
 * `If-None-Match` → 304; compressed once per encoding for clients that accept it (110 kB of
 * JSON: 17 kB with brotli, 18 kB with gzip), each encoding with its own ETag.
 */

// zlib's output is backed by a plain ArrayBuffer; the DOM types only do not know it.
const encoded = new Map<ContentEncoding, Uint8Array<ArrayBuffer>>();

export function documentResponse(request: Request): Response {
	const { json, etag } = openApiDocument();
	const encoding = preferredEncoding(request.headers.get('accept-encoding'));
	const tag = encoding ? encodedEtag(etag, encoding) : etag;
	const headers = new Headers({
		etag: tag,
		'cache-control': 'public, no-cache',
		vary: 'Accept-Encoding'
	});
	if (etagMatches(request.headers.get('if-none-match'), tag)) {
		return new Response(null, { status: 304, headers });
	}
	headers.set('content-type', 'application/json; charset=utf-8');
	if (!encoding) return new Response(json, { headers });
	let body = encoded.get(encoding);
	if (!body) {
		body = compress(new TextEncoder().encode(json), encoding) as Uint8Array<ArrayBuffer>;
		encoded.set(encoding, body);
	}
	headers.set('content-encoding', encoding);
	return new Response(body, { headers });
}
