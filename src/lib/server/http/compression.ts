import { brotliCompressSync, constants, gzipSync } from 'node:zlib';
import Negotiator from 'negotiator';

/*
 * Compressed copies of answers kept for many readers (readCache.ts): compressed once, sent many
 * times. adapter-node compresses only prerendered files, so without this every page and JSON
 * answer went out at full size.
 */
export type ContentEncoding = 'br' | 'gzip';

const OFFERED = ['br', 'gzip', 'identity'];

/** negotiator 1.0's `encoding` takes our order for ties; its published types predate that. */
type EncodingNegotiator = {
	encoding(available: string[], options: { preferred: string[] }): string | undefined;
};

/**
 * The encoding the client prefers among ours (RFC 9110 §12.5.3), or null for none: its
 * q-values decide, and between equals (browsers send "gzip, deflate, br") ours, br first.
 */
export function preferredEncoding(acceptEncoding: string | null): ContentEncoding | null {
	if (!acceptEncoding) return null;
	const negotiator = new Negotiator({
		headers: { 'accept-encoding': acceptEncoding }
	}) as unknown as EncodingNegotiator;
	const chosen = negotiator.encoding(OFFERED, { preferred: OFFERED });
	return chosen === 'br' || chosen === 'gzip' ? chosen : null;
}

/** Worth compressing: text, JSON, CSV and the like, from one kilobyte up. */
export function isCompressible(contentType: string | null, bytes: number): boolean {
	if (bytes < 1024 || !contentType) return false;
	return /^(?:text\/|application\/(?:json|[\w.+-]+\+json|javascript|xml|[\w.+-]+\+xml|x-bibtex|x-research-info-systems))/i.test(
		contentType
	);
}

/**
 * Brotli at quality 5 and gzip at level 6: each a millisecond or two for a 60 KB page, most of
 * the size gone (the highest qualities cost ten times the time for a few per cent).
 */
export function compress(body: Uint8Array, encoding: ContentEncoding): Uint8Array {
	const out =
		encoding === 'br'
			? brotliCompressSync(body, {
					params: {
						[constants.BROTLI_PARAM_QUALITY]: 5,
						[constants.BROTLI_PARAM_SIZE_HINT]: body.byteLength
					}
				})
			: gzipSync(body, { level: 6 });
	return new Uint8Array(out.buffer, out.byteOffset, out.byteLength);
}

/** A strong ETag names one representation: each encoding gets its own (RFC 9110 §8.8.3). */
export function encodedEtag(etag: string, encoding: ContentEncoding): string {
	return etag.replace(/"$/, `-${encoding}"`);
}
