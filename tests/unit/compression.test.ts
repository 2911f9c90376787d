import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import {
	compress,
	encodedEtag,
	isCompressible,
	preferredEncoding
} from '$lib/server/http/compression';

describe('content coding negotiation (RFC 9110 §12.5.3)', () => {
	it.each([
		['gzip, deflate, br', 'br'], // what browsers send: our preference among equals
		['gzip', 'gzip'],
		['br;q=0, gzip', 'gzip'],
		['gzip;q=0.5, br;q=0.4', 'gzip'],
		['*', 'br'],
		['deflate', null],
		['identity', null],
		['br;q=0, gzip;q=0', null],
		['', null]
	])('Accept-Encoding %j → %s', (header, expected) => {
		expect(preferredEncoding(header)).toBe(expected);
	});
	it('without the header, sends the bytes as they are', () => {
		expect(preferredEncoding(null)).toBeNull();
	});
});

describe('what is worth compressing', () => {
	it('text, JSON and citation formats from 1 KB', () => {
		expect(isCompressible('text/html', 5000)).toBe(true);
		expect(isCompressible('application/json; charset=utf-8', 5000)).toBe(true);
		expect(isCompressible('application/vnd.citationstyles.csl+json', 5000)).toBe(true);
		expect(isCompressible('text/csv', 5000)).toBe(true);
		expect(isCompressible('application/x-bibtex', 5000)).toBe(true);
		expect(isCompressible('text/html', 1000)).toBe(false);
		expect(isCompressible('image/png', 5000)).toBe(false);
		expect(isCompressible(null, 5000)).toBe(false);
	});
});

describe('compressed copies', () => {
	const body = new TextEncoder().encode(
		'<table>' + '<tr><td>HL000123</td><td>−300 mV</td></tr>'.repeat(500) + '</table>'
	);
	it('decode to the same bytes with zlib, much smaller', () => {
		const br = compress(body, 'br');
		const gz = compress(body, 'gzip');
		expect(Buffer.from(brotliDecompressSync(br)).equals(Buffer.from(body))).toBe(true);
		expect(Buffer.from(gunzipSync(gz)).equals(Buffer.from(body))).toBe(true);
		expect(br.byteLength).toBeLessThan(body.byteLength / 10);
		expect(gz.byteLength).toBeLessThan(body.byteLength / 10);
	});
	it('carry an ETag of their own', () => {
		expect(encodedEtag('"abc"', 'br')).toBe('"abc-br"');
		expect(encodedEtag('"abc"', 'gzip')).toBe('"abc-gzip"');
	});
});
