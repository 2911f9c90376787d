import { Jimp } from 'jimp';

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
 * Shrinks by a whole factor, each output pixel the mean of a factor × factor block (a box
 * filter): one pass over the pixels, where jimp's interpolating resize of a 12 MP photograph
 * took longer than decoding it. The exact size is then reached by a bilinear step over at most
 * twice the target, which a box before it keeps free of aliasing.
 */
function boxShrink(source: Pixels, factor: number): Pixels {
	const width = Math.floor(source.width / factor);
	const height = Math.floor(source.height / factor);
	const src = source.data;
	const dst = Buffer.alloc(width * height * 4);
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
			dst[o] = r / area;
			dst[o + 1] = g / area;
			dst[o + 2] = b / area;
			dst[o + 3] = a / area;
		}
	}
	return { data: dst, width, height };
}

function fit(pixels: Pixels, px: number): Pixels {
	const longer = Math.max(pixels.width, pixels.height);
	if (longer <= px) return pixels;
	const factor = Math.floor(longer / px); // the box never takes it below the target
	const shrunk = factor >= 2 ? boxShrink(pixels, factor) : pixels;
	if (Math.max(shrunk.width, shrunk.height) <= px) return shrunk;
	const image = imageOf(shrunk).scaleToFit({ w: px, h: px });
	return { data: image.bitmap.data, width: image.width, height: image.height };
}

async function encode(pixels: Pixels, mime: Rendition['mime']): Promise<Rendition> {
	const image = imageOf(pixels);
	const bytes =
		mime === 'image/jpeg'
			? await image.getBuffer('image/jpeg', { quality: 85 })
			: await image.getBuffer('image/png');
	return { bytes: new Uint8Array(bytes), mime, width: pixels.width, height: pixels.height };
}

/** Decodes `original` (already inspected: a supported type, within the pixel budget). */
export async function makeRenditions(original: Uint8Array, photo: boolean): Promise<Renditions> {
	const decoded = await Jimp.read(
		Buffer.from(original.buffer, original.byteOffset, original.byteLength)
	);
	const pixels: Pixels = {
		data: decoded.bitmap.data,
		width: decoded.width,
		height: decoded.height
	};
	const mime = photo ? 'image/jpeg' : 'image/png';
	const previewPixels = fit(pixels, PREVIEW_PX);
	const preview = await encode(previewPixels, mime);
	// From the preview, not the original: a sixteenth of the pixels to read again at most.
	const thumbnail = await encode(fit(previewPixels, THUMBNAIL_PX), mime);
	return { preview, thumbnail };
}
