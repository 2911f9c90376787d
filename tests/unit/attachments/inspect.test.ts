import { describe, expect, it } from 'vitest';
import { AttachmentRejectedError } from '$lib/server/attachments/errors';
import { checkDeclaredSize, inspectAttachment } from '$lib/server/attachments/inspect';
import {
	HTML_PAGE,
	SVG_WITH_SCRIPT,
	jpegOf,
	jpegWithGps,
	pngDeclaring,
	pngOf,
	zipOf
} from '../../support/hostileFiles';

// The hostile files the issue names, each refused with its status and message; the oracle is the
// file's construction (tests/support/hostileFiles.ts) and the limits passed in.

const LIMITS = { maxBytes: 10 * 1024 * 1024, maxPixels: 40_000_000 };
const text = (s: string) => new TextEncoder().encode(s);

async function refusal(bytes: Uint8Array, role: 'image' | 'data' = 'image') {
	try {
		await inspectAttachment(bytes, role, LIMITS);
	} catch (e) {
		if (e instanceof AttachmentRejectedError)
			return { status: e.status, code: e.code, message: e.message };
		throw e;
	}
	throw new Error('the file was accepted');
}

describe('accepted files', () => {
	it('a PNG, with its header size', async () => {
		const r = await inspectAttachment(await pngOf(40, 30), 'image', LIMITS);
		expect(r).toMatchObject({
			role: 'image',
			ext: 'png',
			mime: 'image/png',
			width: 40,
			height: 30
		});
	});

	it('a JPEG carrying EXIF GPS (the preview strips it, not the check)', async () => {
		const r = await inspectAttachment(await jpegWithGps(64, 48), 'image', LIMITS);
		expect(r).toMatchObject({ ext: 'jpg', mime: 'image/jpeg', width: 64, height: 48 });
	});

	it('a two-column text file as data', async () => {
		const r = await inspectAttachment(text('B (mT),dI/dB\n330,0.1\n331,0.2\n'), 'data', LIMITS);
		expect(r).toMatchObject({ role: 'data', mime: 'text/plain; charset=utf-8' });
	});

	it('a file exactly at the limit', async () => {
		const png = await pngOf(8, 8);
		const r = await inspectAttachment(png, 'image', { ...LIMITS, maxBytes: png.byteLength });
		expect(r.bytes).toBe(png.byteLength);
	});
});

describe('hostile files', () => {
	it('0 bytes: 400', async () => {
		expect(await refusal(new Uint8Array(0))).toEqual({
			status: 400,
			code: 'empty',
			message: 'The file is empty.'
		});
	});

	it('limit + 1 byte: 413 naming both sizes', async () => {
		const r = await refusal(new Uint8Array(LIMITS.maxBytes + 1));
		expect(r.status).toBe(413);
		expect(r.message).toBe(
			'The file is 10\u202f485\u202f761 bytes; the limit is 10\u202f485\u202f760 bytes (10 MB).'
		);
	});

	it('a declared Content-Length over the limit: 413 before the body is read', () => {
		expect(() => checkDeclaredSize(LIMITS.maxBytes + 1, LIMITS.maxBytes)).toThrow(
			AttachmentRejectedError
		);
		expect(() => checkDeclaredSize(LIMITS.maxBytes, LIMITS.maxBytes)).not.toThrow();
	});

	it('a truncated PNG: 422', async () => {
		const png = await pngOf(40, 30);
		const r = await refusal(png.subarray(0, png.byteLength - 20));
		expect(r.status).toBe(422);
		expect(r.code).toBe('damaged');
		expect(r.message).toMatch(/^The PNG file is damaged or truncated: it ends (inside its|before)/);
	});

	it('a PNG cut inside its header: 422', async () => {
		const r = await refusal((await pngOf(40, 30)).subarray(0, 20));
		expect(r).toMatchObject({ status: 422, code: 'damaged' });
	});

	it('a PNG declaring 100 000 × 100 000 pixels: 422, never decoded', async () => {
		const r = await refusal(pngDeclaring(100_000, 100_000));
		expect(r).toEqual({
			status: 422,
			code: 'too_many_pixels',
			message:
				'The image declares 100000 × 100000 pixels (10,000 MP); the limit is 40 MP. Scale it down before attaching it.'
		});
	});

	it('just over the pixel budget is refused, at it accepted', async () => {
		expect((await refusal(pngDeclaring(8000, 5001))).code).toBe('too_many_pixels');
		await expect(
			inspectAttachment(pngDeclaring(8000, 5000), 'image', LIMITS)
		).resolves.toMatchObject({
			width: 8000
		});
	});

	it('an SVG with a script: 415', async () => {
		expect(await refusal(text(SVG_WITH_SCRIPT))).toEqual({
			status: 415,
			code: 'active_content',
			message:
				'SVG images are not accepted: they can carry scripts. Export the figure as PNG instead.'
		});
	});

	it('HTML renamed .png: 415 (the name is never read)', async () => {
		const r = await refusal(text(HTML_PAGE));
		expect(r.status).toBe(415);
		expect(r.message).toMatch(/^The file is an HTML page, whatever its name says/);
	});

	it('a shell script: 415', async () => {
		expect((await refusal(text('#!/bin/sh\nrm -rf /\n'))).message).toMatch(/a script/);
	});

	it('a ZIP/PNG polyglot (a ZIP appended to a PNG): 415', async () => {
		const png = await pngOf(16, 16);
		const r = await refusal(new Uint8Array([...png, ...zipOf('notes.txt', 'x,y\n1,2\n')]));
		expect(r.status).toBe(415);
		expect(r.code).toBe('polyglot');
		expect(r.message).toMatch(/of other data after the end of the image/);
	});

	it('a PNG with a ZIP of HTML appended: 415', async () => {
		const png = await pngOf(16, 16);
		const r = await refusal(new Uint8Array([...png, ...zipOf('a.html', HTML_PAGE)]));
		expect(r).toMatchObject({ status: 415, code: 'polyglot' });
	});

	it('a PNG with a ZIP inside a chunk: 415', async () => {
		const png = Buffer.from(await pngOf(16, 16));
		// A private ancillary chunk holding the archive, placed before IEND.
		const zip = Buffer.from(zipOf('a.txt', 'x'));
		const head = Buffer.alloc(8);
		head.writeUInt32BE(zip.length, 0);
		head.write('zzIP', 4, 'latin1');
		const withZip = Buffer.concat([
			png.subarray(0, png.length - 12),
			head,
			zip,
			Buffer.alloc(4),
			png.subarray(png.length - 12)
		]);
		expect(await refusal(new Uint8Array(withZip))).toMatchObject({ status: 415, code: 'polyglot' });
	});

	it('markup split across the megabyte windows of the scan is still found: 415', async () => {
		const png = Buffer.from(await pngOf(16, 16));
		// A 1.5 MB private chunk whose `<script>` starts a few bytes before the 1 MiB mark.
		const filler = Buffer.alloc(1_500_000, 0x20);
		const at = 1024 * 1024 - 3 - (png.length - 12) - 8;
		filler.write('<script>', at, 'latin1');
		const head = Buffer.alloc(8);
		head.writeUInt32BE(filler.length, 0);
		head.write('zzTX', 4, 'latin1');
		const withScript = Buffer.concat([
			png.subarray(0, png.length - 12),
			head,
			filler,
			Buffer.alloc(4),
			png.subarray(png.length - 12)
		]);
		expect(withScript.indexOf('<script>')).toBe(1024 * 1024 - 3);
		expect(await refusal(new Uint8Array(withScript))).toMatchObject({
			status: 415,
			code: 'polyglot'
		});
	});

	it('a JPEG followed by HTML: 415', async () => {
		const jpeg = await jpegOf(16, 16);
		const r = await refusal(new Uint8Array([...jpeg, ...text(HTML_PAGE)]));
		expect(r.status).toBe(415);
	});

	it('a ZIP archive: 415', async () => {
		expect(await refusal(zipOf('spectrum.png', 'x'))).toMatchObject({
			status: 415,
			code: 'archive'
		});
	});

	it('a PDF: 415 naming its type', async () => {
		const r = await refusal(text('%PDF-1.7\n1 0 obj\n<<>>\nendobj\ntrailer\n<<>>\n%%EOF\n'));
		expect(r.status).toBe(415);
		expect(r.message).toMatch(/application\/pdf/);
	});

	it('an image sent as data: 415', async () => {
		const r = await refusal(await pngOf(4, 4), 'data');
		expect(r).toMatchObject({ status: 415, code: 'unsupported_type' });
	});

	it('data that is not UTF-8: 415', async () => {
		expect((await refusal(new Uint8Array([0x78, 0xff, 0xfe, 0x0a]), 'data')).status).toBe(415);
	});
});
