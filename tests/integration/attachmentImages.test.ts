import { afterAll, describe, expect, it } from 'vitest';
import { imageSize } from 'image-size';
import { AttachmentRejectedError } from '$lib/server/attachments/errors';
import { closeImagePool, createImagePool, renderImage } from '$lib/server/attachments/imaging';
import { jpegOf, jpegWithGps, pngOf, exifGpsSegment } from '../support/hostileFiles';

// Real worker threads on the real worker module (through tsx, as in `vite dev`). Oracles: the
// sizes from image-size read back from the renditions; the EXIF bytes we put in, searched for.

const pools = [createImagePool(30_000)];
afterAll(async () => {
	await Promise.all(pools.map((p) => p.close()));
	await closeImagePool();
});

function contains(haystack: Uint8Array, needle: Uint8Array): boolean {
	return Buffer.from(haystack).indexOf(Buffer.from(needle)) !== -1;
}

describe('renditions in a worker thread', () => {
	it('a 2000 × 1000 PNG: preview 1280 × 640, thumbnail 320 × 160, both PNG', async () => {
		const r = await renderImage(await pngOf(2000, 1000), false, pools[0]);
		expect([r.preview.width, r.preview.height, r.preview.mime]).toEqual([1280, 640, 'image/png']);
		expect([r.thumbnail.width, r.thumbnail.height]).toEqual([320, 160]);
		const read = imageSize(r.preview.bytes);
		expect([read.type, read.width, read.height]).toEqual(['png', 1280, 640]);
	});

	it('a small image is re-encoded at its own size, never enlarged', async () => {
		const r = await renderImage(await pngOf(100, 50), false, pools[0]);
		expect([r.preview.width, r.thumbnail.width]).toEqual([100, 100]);
	});

	it('a JPEG with EXIF GPS: JPEG renditions without any EXIF', async () => {
		const original = await jpegWithGps(1600, 1200);
		const gps = exifGpsSegment().subarray(4); // "Exif\0\0" + the TIFF block
		expect(contains(original, gps)).toBe(true);
		const r = await renderImage(original, true, pools[0]);
		expect(r.preview.mime).toBe('image/jpeg');
		expect([r.preview.width, r.preview.height]).toEqual([1280, 960]);
		for (const out of [r.preview.bytes, r.thumbnail.bytes]) {
			expect(contains(out, new TextEncoder().encode('Exif'))).toBe(false);
			expect(contains(out, new Uint8Array([0xff, 0xe1]))).toBe(false); // no APP1 segment
		}
	});

	it('an image the decoder cannot read: 422', async () => {
		const png = Buffer.from(await pngOf(64, 64));
		png.fill(0x41, 60, png.length - 20); // the IDAT data turned to garbage
		const e = await renderImage(new Uint8Array(png), false, pools[0]).catch((x: unknown) => x);
		expect(e).toBeInstanceOf(AttachmentRejectedError);
		expect(e).toMatchObject({ status: 422, code: 'decode_failed' });
	});

	it('a decode past the time-out: the worker is ended and the upload refused with 422', async () => {
		const quick = createImagePool(150);
		pools.push(quick);
		const big = await pngOf(4000, 3000);
		const e = await renderImage(big, false, quick).catch((x: unknown) => x);
		expect(e).toMatchObject({ status: 422, code: 'decode_time_limit' });
		expect((e as Error).message).toMatch(/could not be decoded within/);
	});

	it('JPEG by the WebAssembly decoder: damaged and fuzzed files are decoded or refused with 422, and the worker keeps working', async () => {
		const good = await jpegOf(240, 180);
		let seed = 2024;
		const next = () => (seed = (seed * 1103515245 + 12345) & 0x7fffffff);
		const outcomes = { rendered: 0, refused: 0 };
		for (let run = 0; run < 40; run++) {
			const bad = new Uint8Array(good);
			if (run % 4 === 0) {
				// Cut short (the inspection refuses these before any decode; the decoder must too).
				const cut = bad.subarray(0, 2 + (next() % (bad.byteLength - 2)));
				await check(cut);
				continue;
			}
			for (let k = 0; k < 1 + (next() % 12); k++)
				bad[2 + (next() % (bad.byteLength - 4))] = next() & 0xff;
			await check(bad);
		}
		async function check(bytes: Uint8Array) {
			try {
				const r = await renderImage(bytes, true, pools[0]);
				expect(r.preview.width).toBeGreaterThan(0);
				outcomes.rendered++;
			} catch (e) {
				expect(e).toMatchObject({ status: 422, code: 'decode_failed' });
				outcomes.refused++;
			}
		}
		expect(outcomes.rendered + outcomes.refused).toBe(40);
		expect(outcomes.refused).toBeGreaterThan(0);
		// A good file after the failures: the decoder was made afresh where one gave up.
		const r = await renderImage(good, true, pools[0]);
		expect([r.preview.width, r.preview.height]).toEqual([240, 180]);
	});
});
