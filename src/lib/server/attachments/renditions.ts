import { Jimp } from 'jimp';
import { decodeJpeg } from './jpegDecoder';

/*
 * The two renditions shown in the app: a preview (at most 1280 px on its longer side) and a
 * thumbnail (at most 320 px). Both are decoded from the original and encoded afresh by jimp, so
 * none of the original's metadata (EXIF with GPS, comments, text chunks, ICC profiles) survives;
 * an image smaller than a rendition is re-encoded at its own size, never enlarged. Photographs
 * (JPEG) stay JPEG; plots and line art (PNG, GIF, BMP, TIFF) become PNG, which keeps thin lines
 * and text sharp. Runs inside the attachment worker (image.worker.ts), never on the request thread.
 */

export const PREVIEW_PX = 1280;
export const THUMBNAIL_PX = 320;

export interface Rendition {
	bytes: Uint8Array;
	mime: 'image/png' | 'image/jpeg';
	width: number;
	height: number;
}

export interface Renditions {
	preview: Rendition;
	thumbnail: Rendition;
}

/** Decoded pixels, RGBA, row by row. */
interface Pixels {
	data: Buffer;
	width: number;
	height: number;
}

/** A jimp image holding `pixels` (shared, not copied). */
function imageOf(pixels: Pixels): InstanceType<typeof Jimp> {
	const image = new Jimp({ width: pixels.width, height: pixels.height });
	image.bitmap.data = pixels.data;
	return image;
}

/**
 * For each of `to` output positions along an axis of `from` input positions (to ≤ from), the
 * input positions it covers and the share of each: output i covers [i·s, (i+1)·s) with
 * s = from / to, the inputs at its two ends counting for the part inside. Shares sum to 1.
 */
function coverage(from: number, to: number) {
	const scale = from / to;
	const starts = new Int32Array(to + 1);
	const taps: number[] = [];
	const shares: number[] = [];
	for (let i = 0; i < to; i++) {
		starts[i] = taps.length;
		const a = i * scale;
		const b = Math.min(from, (i + 1) * scale);
		for (let k = Math.floor(a); k < b; k++) {
			const share = (Math.min(k + 1, b) - Math.max(k, a)) / scale;
			if (share > 1e-9) {
				taps.push(k);
				shares.push(share);
			}
		}
	}
	starts[to] = taps.length;
	return { starts, taps: Int32Array.from(taps), shares: Float32Array.from(shares) };
}

/**
 * Shrinks to width × height by area averaging: each output pixel the mean of the input area it
 * covers, edges weighted by the part inside (a box filter of fractional width), one horizontal
 * pass over the input rows then one vertical pass. Free of aliasing at any ratio. It replaced
 * jimp's interpolating resize here: that took longer than decoding a 12 MP photograph, and even
 * the last 1333 → 1280 px step after a whole-factor box took 0.25 s; this one takes a few ms.
 */
function areaShrink(source: Pixels, width: number, height: number): Pixels {
	const sw = source.width;
	const sh = source.height;
	const src = source.data;
	const h = coverage(sw, width);
	const v = coverage(sh, height);
	// Horizontal pass: every input row to `width` pixels, kept as floats for the second pass.
	const rows = new Float32Array(width * sh * 4);
	for (let y = 0; y < sh; y++) {
		const inRow = y * sw * 4;
		const outRow = y * width * 4;
		for (let x = 0; x < width; x++) {
			let r = 0;
			let g = 0;
			let b = 0;
			let a = 0;
			for (let t = h.starts[x] as number, end = h.starts[x + 1] as number; t < end; t++) {
				const i = inRow + (h.taps[t] as number) * 4;
				const share = h.shares[t] as number;
				r += (src[i] as number) * share;
				g += (src[i + 1] as number) * share;
				b += (src[i + 2] as number) * share;
				a += (src[i + 3] as number) * share;
			}
			const o = outRow + x * 4;
			rows[o] = r;
			rows[o + 1] = g;
			rows[o + 2] = b;
			rows[o + 3] = a;
		}
	}
	// Vertical pass: rows of the first pass, averaged into the output rows. A clamped view rounds
	// each sum to the nearest byte.
	const dst = Buffer.alloc(width * height * 4);
	const out = new Uint8ClampedArray(dst.buffer, dst.byteOffset, dst.byteLength);
	const line = width * 4;
	const sum = new Float32Array(line);
	for (let y = 0; y < height; y++) {
		sum.fill(0);
		for (let t = v.starts[y] as number, end = v.starts[y + 1] as number; t < end; t++) {
			const from = (v.taps[t] as number) * line;
			const share = v.shares[t] as number;
			for (let i = 0; i < line; i++)
				sum[i] = (sum[i] as number) + (rows[from + i] as number) * share;
		}
		out.set(sum, y * line);
	}
	return { data: dst, width, height };
}

/**
 * Shrinks by a whole factor, each output pixel the mean of a factor × factor block: integer sums
 * in one pass, a third of the area pass's cost on a 12 MP photograph. Up to factor − 1 pixels at
 * the right and bottom edges are left out.
 */
function boxShrink(source: Pixels, factor: number): Pixels {
	const width = Math.floor(source.width / factor);
	const height = Math.floor(source.height / factor);
	const src = source.data;
	const dst = Buffer.alloc(width * height * 4);
	const out = new Uint8ClampedArray(dst.buffer, dst.byteOffset, dst.byteLength);
	const rowBytes = source.width * 4;
	const area = factor * factor;
	for (let y = 0; y < height; y++) {
		for (let x = 0; x < width; x++) {
			let r = 0;
			let g = 0;
			let b = 0;
			let a = 0;
			for (let dy = 0; dy < factor; dy++) {
				let i = (y * factor + dy) * rowBytes + x * factor * 4;
				for (let dx = 0; dx < factor; dx++, i += 4) {
					r += src[i] as number;
					g += src[i + 1] as number;
					b += src[i + 2] as number;
					a += src[i + 3] as number;
				}
			}
			const o = (y * width + x) * 4;
			out[o] = r / area;
			out[o + 1] = g / area;
			out[o + 2] = b / area;
			out[o + 3] = a / area;
		}
	}
	return { data: dst, width, height };
}

/**
 * At most `px` on the longer side, never enlarged: a whole-factor box first where the ratio
 * allows (it stays at least the target size), then area averaging to the exact size.
 */
function fit(pixels: Pixels, px: number): Pixels {
	const longer = Math.max(pixels.width, pixels.height);
	if (longer <= px) return pixels;
	const scale = px / longer;
	const width = Math.max(1, Math.round(pixels.width * scale));
	const height = Math.max(1, Math.round(pixels.height * scale));
	const factor = Math.floor(Math.min(pixels.width / width, pixels.height / height));
	const boxed = factor >= 2 ? boxShrink(pixels, factor) : pixels;
	if (boxed.width === width && boxed.height === height) return boxed;
	return areaShrink(boxed, width, height);
}

async function encode(pixels: Pixels, mime: Rendition['mime']): Promise<Rendition> {
	const image = imageOf(pixels);
	const bytes =
		mime === 'image/jpeg'
			? await image.getBuffer('image/jpeg', { quality: 85 })
			: await image.getBuffer('image/png');
	return { bytes: new Uint8Array(bytes), mime, width: pixels.width, height: pixels.height };
}

const isJpeg = (bytes: Uint8Array) => bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff;

/**
 * RGBA pixels of an inspected image: JPEG by mozjpeg (jpegDecoder.ts), the rest by jimp. A JPEG
 * mozjpeg will not turn into RGBA (CMYK and YCCK, as print software saves them) goes to jimp's
 * own decoder, which converts those; only a file neither can read is refused.
 */
async function decode(original: Uint8Array): Promise<Pixels> {
	if (isJpeg(original)) {
		try {
			return await decodeJpeg(original);
		} catch {
			// Falls through to jimp.
		}
	}
	const decoded = await Jimp.read(
		Buffer.from(original.buffer, original.byteOffset, original.byteLength)
	);
	return { data: decoded.bitmap.data, width: decoded.width, height: decoded.height };
}

/**
 * Decodes `original` (already inspected: a supported type, within the pixel budget) once, and
 * makes both renditions from that one decode.
 */
export async function makeRenditions(original: Uint8Array, photo: boolean): Promise<Renditions> {
	const pixels = await decode(original);
	const mime = photo ? 'image/jpeg' : 'image/png';
	const previewPixels = fit(pixels, PREVIEW_PX);
	const preview = await encode(previewPixels, mime);
	// From the preview, not the original: a sixteenth of the pixels to read again at most.
	const thumbnail = await encode(fit(previewPixels, THUMBNAIL_PX), mime);
	return { preview, thumbnail };
}
