import { Jimp } from 'jimp';
import { describe, expect, it } from 'vitest';
import { makeRenditions } from '$lib/server/attachments/renditions';
import { jpegOf, pngOf } from '../../support/hostileFiles';

// makeRenditions in this thread (the worker runs the same function). Oracles: jimp's own reading
// of the same file (EXIF orientation, CIPA DC-008 tag 0x0112) and pixel means computed by hand.

/** An APP1 EXIF segment holding only an Orientation tag. */
function exifOrientation(value: number): Buffer {
	const tiff = Buffer.alloc(8 + 2 + 12 + 4);
	tiff.write('II', 0, 'latin1');
	tiff.writeUInt16LE(42, 2);
	tiff.writeUInt32LE(8, 4);
	tiff.writeUInt16LE(1, 8);
	tiff.writeUInt16LE(0x0112, 10); // Orientation
	tiff.writeUInt16LE(3, 12); // SHORT
	tiff.writeUInt32LE(1, 14);
	tiff.writeUInt16LE(value, 18);
	const body = Buffer.concat([Buffer.from('Exif\0\0', 'latin1'), tiff]);
	const head = Buffer.from([0xff, 0xe1, 0, 0]);
	head.writeUInt16BE(body.length + 2, 2);
	return Buffer.concat([head, body]);
}

describe('renditions', () => {
	it('a JPEG turned by its EXIF orientation (6: 90° clockwise) comes out upright, as jimp reads it', async () => {
		const jpeg = Buffer.from(await jpegOf(40, 20));
		const turned = Buffer.concat([jpeg.subarray(0, 2), exifOrientation(6), jpeg.subarray(2)]);
		const byJimp = await Jimp.read(turned);
		const r = await makeRenditions(new Uint8Array(turned), true);
		expect([r.preview.width, r.preview.height]).toEqual([byJimp.width, byJimp.height]);
		expect([r.preview.width, r.preview.height]).toEqual([20, 40]);
	});

	it('shrinks by area averaging: a 2 × 2 checkerboard of black and white becomes mid grey', async () => {
		const size = 2560;
		const image = new Jimp({ width: size, height: 8, color: 0x000000ff });
		for (let x = 0; x < size; x++)
			for (let y = 0; y < 8; y++) if ((x + y) % 2 === 0) image.setPixelColor(0xffffffff, x, y);
		const png = new Uint8Array(await image.getBuffer('image/png'));
		const r = await makeRenditions(png, false);
		expect([r.preview.width, r.preview.height]).toEqual([1280, 4]);
		const preview = await Jimp.read(Buffer.from(r.preview.bytes));
		const data = preview.bitmap.data;
		for (let i = 0; i < data.length; i += 4)
			expect(Math.abs((data[i] as number) - 127.5)).toBeLessThanOrEqual(1);
	});

	it('keeps the aspect ratio at awkward ratios and never enlarges', async () => {
		const r = await makeRenditions(await pngOf(3001, 7), false);
		expect([r.preview.width, r.preview.height]).toEqual([1280, 3]);
		expect([r.thumbnail.width, r.thumbnail.height]).toEqual([320, 1]);
		const small = await makeRenditions(await pngOf(30, 20), false);
		expect([small.preview.width, small.thumbnail.width]).toEqual([30, 30]);
	});
});
