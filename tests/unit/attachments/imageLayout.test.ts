import { Jimp } from 'jimp';
import { describe, expect, it } from 'vitest';
import { AttachmentRejectedError } from '$lib/server/attachments/errors';
import { gifLayout, MAX_DIRECTORIES, tiffLayout } from '$lib/server/attachments/imageLayout';
import { inspectAttachment } from '$lib/server/attachments/inspect';
import { gifOf, tiffOf } from '../../support/hostileFiles';

// GIFs and TIFFs whose headers understate what a decoder allocates. Oracles: the files' own
// construction (tests/support/hostileFiles.ts: GIF89a blocks, TIFF 6.0 directories) and the
// limits passed in; what jimp decodes is read back from jimp itself.

const LIMITS = { maxBytes: 10 * 1024 * 1024, maxPixels: 40_000_000 };

async function refusal(bytes: Uint8Array) {
	try {
		await inspectAttachment(bytes, 'image', LIMITS);
	} catch (e) {
		if (e instanceof AttachmentRejectedError)
			return { status: e.status, code: e.code, message: e.message };
		throw e;
	}
	throw new Error('the file was accepted');
}

describe('TIFF directories', () => {
	it('a one-page TIFF is accepted at its size', async () => {
		const r = await inspectAttachment(tiffOf([{ width: 40, height: 30 }]), 'image', LIMITS);
		expect(r).toMatchObject({ ext: 'tif', width: 40, height: 30 });
	});

	it('jimp reads a hand-built TIFF, and shows the first page of two', async () => {
		const one = await Jimp.read(Buffer.from(tiffOf([{ width: 6, height: 4 }])));
		expect([one.width, one.height]).toEqual([6, 4]);
		const two = await Jimp.read(
			Buffer.from(
				tiffOf([
					{ width: 6, height: 4 },
					{ width: 20, height: 10 }
				])
			)
		);
		expect([two.width, two.height]).toEqual([6, 4]);
	});

	it('a 2-page TIFF whose second page declares 100 000 × 100 000: 422 naming the page', async () => {
		const r = await refusal(
			tiffOf([
				{ width: 40, height: 30 },
				{ width: 100_000, height: 100_000 }
			])
		);
		expect(r).toEqual({
			status: 422,
			code: 'too_many_pixels',
			message:
				'The image declares 100000 × 100000 pixels (page 2) (10,000 MP); the limit is 40 MP. Scale it down before attaching it.'
		});
	});

	it('a 2-page TIFF of small pages: 415, one image per attachment', async () => {
		const r = await refusal(
			tiffOf([
				{ width: 40, height: 30 },
				{ width: 40, height: 30 }
			])
		);
		expect(r.status).toBe(415);
		expect(r.message).toMatch(/^The TIFF file holds 2 pages; the registry shows one image/);
	});

	it('a page with a reduced-resolution copy in the chain is one page', async () => {
		const r = await inspectAttachment(
			tiffOf([
				{ width: 60, height: 40 },
				{ width: 15, height: 10, subfileType: 1 }
			]),
			'image',
			LIMITS
		);
		expect(r).toMatchObject({ width: 60, height: 40 });
	});

	it('a "reduced-resolution copy" of 100 000 × 100 000 is refused all the same', async () => {
		const r = await refusal(
			tiffOf([
				{ width: 60, height: 40 },
				{ width: 100_000, height: 100_000, subfileType: 1 }
			])
		);
		expect(r.code).toBe('too_many_pixels');
	});

	it('pages within the budget each but over it together: 422', async () => {
		const r = await refusal(
			tiffOf([
				{ width: 6000, height: 6000 },
				{ width: 6000, height: 6000, subfileType: 1 }
			])
		);
		expect(r.message).toBe(
			"The TIF file's images add up to 72 MP; the limit is 40 MP. Save the image on its own, without other images in the file."
		);
	});

	it('a SubIFD declaring 100 000 × 100 000: 422', async () => {
		const r = await refusal(
			tiffOf([{ width: 40, height: 30, subIfds: [{ width: 100_000, height: 100_000 }] }])
		);
		expect(r.message).toMatch(/\(a sub-image of page 1\)/);
	});

	it('an IFD whose next offset is itself: 422 at once, no endless walk', async () => {
		const r = await refusal(tiffOf([{ width: 40, height: 30 }], { loopTo: 0 }));
		expect(r).toEqual({
			status: 422,
			code: 'damaged',
			message:
				'The TIF file is damaged or truncated: its image directories point back to one another (a cycle).'
		});
	});

	it('a cycle through two directories, and one through a SubIFD, are found as well', () => {
		const two = tiffOf(
			[
				{ width: 4, height: 4, subfileType: 1 },
				{ width: 4, height: 4, subfileType: 1 }
			],
			{ loopTo: 0 }
		);
		expect(() => tiffLayout(two)).toThrow(/cycle/);
		// A SubIFD entry pointing at its own directory.
		const self = Buffer.from(tiffOf([{ width: 4, height: 4, subIfds: [{ width: 2, height: 2 }] }]));
		const ifd0 = self.readUInt32LE(4);
		const count = self.readUInt16LE(ifd0);
		for (let e = ifd0 + 2; e < ifd0 + 2 + count * 12; e += 12)
			if (self.readUInt16LE(e) === 330) self.writeUInt32LE(ifd0, e + 8);
		expect(() => tiffLayout(new Uint8Array(self))).toThrow(/cycle/);
	});

	it(`more than ${MAX_DIRECTORIES} directories: refused`, () => {
		const many = Array.from({ length: MAX_DIRECTORIES + 1 }, () => ({
			width: 2,
			height: 2,
			subfileType: 1
		}));
		expect(() => tiffLayout(tiffOf(many))).toThrow(/more than 64 image directories/);
	});

	it('a directory offset outside the file, and a cut directory: refused', async () => {
		const bytes = Buffer.from(tiffOf([{ width: 40, height: 30 }]));
		bytes.writeUInt32LE(bytes.length + 100, 4);
		expect(() => tiffLayout(new Uint8Array(bytes))).toThrow(/a directory lies outside the file/);
		expect((await refusal(new Uint8Array(bytes))).status).toBeGreaterThanOrEqual(415);
		const good = tiffOf([{ width: 40, height: 30 }]);
		expect(() => tiffLayout(good.subarray(0, good.byteLength - 10))).toThrow(
			/it ends inside an image directory/
		);
		expect((await refusal(good.subarray(0, good.byteLength - 10))).code).toBe('damaged');
	});

	it('BigTIFF: refused by name', () => {
		const big = Buffer.from(tiffOf([{ width: 4, height: 4 }]));
		big.writeUInt16LE(43, 2);
		expect(() => tiffLayout(new Uint8Array(big))).toThrow(/BigTIFF/);
	});

	it('random bytes after a TIFF header never loop or escape as anything but a LayoutError', () => {
		let seed = 99;
		const next = () => (seed = (seed * 1103515245 + 12345) & 0x7fffffff);
		const good = tiffOf([{ width: 8, height: 8, subIfds: [{ width: 4, height: 4 }] }]);
		for (let run = 0; run < 300; run++) {
			const bad = new Uint8Array(good);
			for (let k = 0; k < 1 + (next() % 6); k++)
				bad[4 + (next() % (bad.length - 4))] = next() & 0xff;
			try {
				tiffLayout(bad);
			} catch (e) {
				expect((e as Error).name).toBe('LayoutError');
			}
		}
		expect(seed).not.toBe(99);
	});
});

describe('GIF frames', () => {
	it('a GIF from jimp is accepted at its screen size', async () => {
		const gif = new Uint8Array(
			await new Jimp({ width: 30, height: 20, color: 0xff0000ff }).getBuffer('image/gif')
		);
		const r = await inspectAttachment(gif, 'image', LIMITS);
		expect(r).toMatchObject({ ext: 'gif', width: 30, height: 20 });
		expect(gifLayout(gif).frames).toEqual([{ width: 30, height: 20 }]);
	});

	it('a frame larger than its screen: 422 naming the frame', async () => {
		const r = await refusal(gifOf({ width: 10, height: 10 }, [{ width: 20_000, height: 20_000 }]));
		expect(r).toEqual({
			status: 422,
			code: 'too_many_pixels',
			message:
				'The image declares 20000 × 20000 pixels (frame 1, larger than its 10 × 10 screen) (400 MP); the limit is 40 MP. Scale it down before attaching it.'
		});
	});

	it('a huge second frame behind a small first one: 422', async () => {
		const r = await refusal(
			gifOf({ width: 10, height: 10 }, [
				{ width: 10, height: 10 },
				{ width: 65_535, height: 65_535 }
			])
		);
		expect(r.message).toMatch(/\(frame 2, larger than its 10 × 10 screen\)/);
	});

	it('jimp decodes the first frame onto the screen', async () => {
		const two = gifOf({ width: 3, height: 2 }, [
			{ width: 3, height: 2 },
			{ width: 3, height: 2 }
		]);
		const image = await Jimp.read(Buffer.from(two));
		expect([image.width, image.height]).toEqual([3, 2]);
	});

	it('cut inside its blocks, without a trailer, or with data after it: refused', async () => {
		const gif = gifOf({ width: 4, height: 4 }, [{ width: 4, height: 4 }]);
		expect((await refusal(gif.subarray(0, gif.byteLength - 3))).code).toBe('damaged');
		const after = new Uint8Array([...gif, 0x50, 0x4b, 0x3b]);
		expect(await refusal(after)).toMatchObject({ status: 415, code: 'polyglot' });
		const unknown = new Uint8Array([...gif.subarray(0, 19), 0x99, 0x3b]);
		expect((await refusal(unknown)).message).toMatch(/unknown block/);
	});
});
