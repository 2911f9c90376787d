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

type Image = Awaited<ReturnType<typeof Jimp.read>>;

/**
 * Shrinks by a whole factor, each output pixel the mean of a factor × factor block (a box
 * filter): one pass over the pixels, where jimp's interpolating resize of a 12 MP photograph
 * took longer than decoding it. The exact size is then reached by a bilinear step over at most
 * twice the target, which a box before it keeps free of aliasing.
 */
function boxShrink(image: Image, factor: number): Image {
	const width = Math.floor(image.width / factor);
	const height = Math.floor(image.height / factor);
	const out = new Jimp({ width, height });
	const src = image.bitmap.data;
	const dst = out.bitmap.data;
	const rowBytes = image.width * 4;
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
	return out;
}

function fit(image: Image, px: number): Image {
	const longer = Math.max(image.width, image.height);
	if (longer <= px) return image;
	const factor = Math.floor(longer / px); // the box never takes it below the target
	const shrunk = factor >= 2 ? boxShrink(image, factor) : image;
	if (Math.max(shrunk.width, shrunk.height) <= px) return shrunk;
	return shrunk.scaleToFit({ w: px, h: px });
}

async function encode(image: Image, mime: Rendition['mime']): Promise<Rendition> {
	const bytes =
		mime === 'image/jpeg'
			? await image.getBuffer('image/jpeg', { quality: 85 })
			: await image.getBuffer('image/png');
	return { bytes: new Uint8Array(bytes), mime, width: image.width, height: image.height };
}

/** Decodes `original` (already inspected: a supported type, within the pixel budget). */
export async function makeRenditions(original: Uint8Array, photo: boolean): Promise<Renditions> {
	const image = await Jimp.read(
		Buffer.from(original.buffer, original.byteOffset, original.byteLength)
	);
	const mime = photo ? 'image/jpeg' : 'image/png';
	const previewImage = fit(image, PREVIEW_PX);
	const preview = await encode(previewImage, mime);
	// From the preview, not the original: a quarter of the pixels to read again at most.
	const thumbnail = await encode(fit(previewImage, THUMBNAIL_PX), mime);
	return { preview, thumbnail };
}
