import { fileTypeFromBuffer } from 'file-type';
import { imageSize } from 'image-size';
import { AttachmentRejectedError } from './errors';
import { gifLayout, LayoutError, tiffLayout } from './imageLayout';

/*
 * What an uploaded file really is, decided from its bytes alone (never its name or the type the
 * client declared), before anything decodes it. Every refusal is an AttachmentRejectedError
 * with its own status and message. Order matters: the cheap checks first, and the pixel budget
 * is read from the image header before any decoder sees the pixels (decompression bombs).
 */

/** The images the app decodes (jimp 1.6 reads these; WebP, AVIF and SVG it does not). */
export const IMAGE_TYPES = {
	png: 'image/png',
	jpg: 'image/jpeg',
	gif: 'image/gif',
	bmp: 'image/bmp',
	tif: 'image/tiff'
} as const;
export type ImageExt = keyof typeof IMAGE_TYPES;

/**
 * What a file is attached as: an image to show, numbers (a two-column text/CSV file), or a
 * structure file (PDB/mmCIF text, or gzip of it) kept for download and never rendered.
 */
export type AttachmentRole = 'image' | 'data' | 'structure';

export type Inspected =
	| { role: 'image'; ext: ImageExt; mime: string; width: number; height: number; bytes: number }
	| { role: 'data'; ext: 'txt'; mime: 'text/plain; charset=utf-8'; bytes: number }
	| {
			role: 'structure';
			ext: 'gz' | 'txt';
			mime: 'application/gzip' | 'text/plain; charset=utf-8';
			bytes: number;
	  };

export interface InspectLimits {
	maxBytes: number;
	maxPixels: number;
}

const ARCHIVES = new Set([
	'zip',
	'gz',
	'tar',
	'rar',
	'7z',
	'bz2',
	'xz',
	'zst',
	'lz',
	'lzh',
	'cab',
	'ar',
	'rpm',
	'deb',
	'dmg',
	'jar',
	'apk',
	'epub',
	'docx',
	'xlsx',
	'pptx',
	'odt',
	'ods',
	'odp',
	'Z',
	'cpio',
	'arj'
]);

const formatBytes = (n: number) => n.toLocaleString('en-GB').replace(/,/g, '\u202f');
const megabytes = (n: number) => `${Math.round((n / 1024 / 1024) * 10) / 10} MB`;

/** Checks the size a client announced (Content-Length) before the body is read. */
export function checkDeclaredSize(bytes: number, maxBytes: number): void {
	if (bytes > maxBytes) throw tooLarge(bytes, maxBytes);
}

function tooLarge(bytes: number, maxBytes: number) {
	return new AttachmentRejectedError(
		413,
		'too_large',
		`The file is ${formatBytes(bytes)} bytes; the limit is ${formatBytes(maxBytes)} bytes (${megabytes(maxBytes)}).`
	);
}

/** Inspects a whole file; returns what it is or throws AttachmentRejectedError. */
export async function inspectAttachment(
	bytes: Uint8Array,
	role: AttachmentRole,
	limits: InspectLimits
): Promise<Inspected> {
	if (bytes.byteLength === 0) throw new AttachmentRejectedError(400, 'empty', 'The file is empty.');
	if (bytes.byteLength > limits.maxBytes) throw tooLarge(bytes.byteLength, limits.maxBytes);

	const detected = await fileTypeFromBuffer(bytes);
	// A structure file was read through by the structure reader before it is kept (gzip
	// included); here it only has to be the text or gzip it claims to be.
	if (role === 'structure') return inspectStructure(bytes, detected?.ext);
	const markup = await activeMarkup(bytes);
	if (markup && (!detected || detected.ext === 'xml')) {
		throw new AttachmentRejectedError(
			415,
			'active_content',
			markup === 'svg'
				? 'SVG images are not accepted: they can carry scripts. Export the figure as PNG instead.'
				: `The file is ${markup === 'html' ? 'an HTML page' : 'a script'}, whatever its name says; attach a PNG, JPEG, GIF, BMP or TIFF image.`
		);
	}
	if (detected && ARCHIVES.has(detected.ext)) {
		throw new AttachmentRejectedError(
			415,
			'archive',
			`Archives (${detected.ext}) are not accepted; attach each image or data file on its own.`
		);
	}

	if (role === 'data') return inspectData(bytes, detected?.ext);

	if (!detected || !(detected.ext in IMAGE_TYPES)) {
		throw new AttachmentRejectedError(
			415,
			'unsupported_type',
			detected
				? `The file is ${detected.mime}, not an image the registry accepts: attach PNG, JPEG, GIF, BMP or TIFF.`
				: 'The file is not an image the registry recognises: attach PNG, JPEG, GIF, BMP or TIFF.'
		);
	}
	const ext = detected.ext as ImageExt;
	const { width, height, largest, decodedPixels, pages } = declaredSize(bytes, ext);
	if (largest.width * largest.height > limits.maxPixels) {
		throw new AttachmentRejectedError(
			422,
			'too_many_pixels',
			`The image declares ${largest.width} × ${largest.height} pixels${largest.where ? ` (${largest.where})` : ''} (${megapixels(largest.width * largest.height)} MP); the limit is ${megapixels(limits.maxPixels)} MP. Scale it down before attaching it.`
		);
	}
	if (decodedPixels > limits.maxPixels) {
		throw new AttachmentRejectedError(
			422,
			'too_many_pixels',
			`The ${ext.toUpperCase()} file's images add up to ${megapixels(decodedPixels)} MP; the limit is ${megapixels(limits.maxPixels)} MP. Save the image on its own, without other images in the file.`
		);
	}
	if (pages > 1) {
		// jimp's TIFF reader decodes every page to show the first, and a stack of pages is not
		// one figure: the registry shows one image per attachment.
		throw new AttachmentRejectedError(
			415,
			'unsupported_type',
			`The TIFF file holds ${pages} pages; the registry shows one image per attachment. Save each page as its own file and attach the one that shows the spectrum.`
		);
	}
	if (markup) {
		throw new AttachmentRejectedError(
			415,
			'polyglot',
			`The ${ext.toUpperCase()} file also holds ${markup === 'svg' ? 'SVG' : markup === 'html' ? 'HTML' : 'script'} markup; save the image again without it.`
		);
	}
	checkEnd(bytes, ext);
	if (zipInside(bytes)) {
		throw new AttachmentRejectedError(
			415,
			'polyglot',
			`The ${ext.toUpperCase()} file also holds a ZIP archive; save the image again on its own.`
		);
	}
	return { role: 'image', ext, mime: IMAGE_TYPES[ext], width, height, bytes: bytes.byteLength };
}

function megapixels(pixels: number): string {
	const mp = pixels / 1e6;
	return mp >= 100 ? Math.round(mp).toLocaleString('en-GB') : String(Math.round(mp * 10) / 10);
}

interface DeclaredSize {
	/** The size of the image as decoded and shown (a GIF's screen, a TIFF's first page). */
	width: number;
	height: number;
	/** The largest image the file declares anywhere, and where it is when not the first. */
	largest: { width: number; height: number; where: string | null };
	/** Pixels the decoder allocates for all the images it decodes together. */
	decodedPixels: number;
	/** Full-size pages (a TIFF may hold several; other formats one). */
	pages: number;
}

/**
 * Sizes from the headers, no pixel data read. PNG, JPEG and BMP hold one image, read by
 * image-size; GIF frames and TIFF directories are walked one by one (imageLayout.ts), since
 * image-size reports only the GIF's screen and the TIFF's first directory.
 */
function declaredSize(bytes: Uint8Array, ext: ImageExt): DeclaredSize {
	if (ext === 'gif' || ext === 'tif') {
		try {
			return ext === 'gif' ? gifSize(bytes) : tiffSize(bytes);
		} catch (e) {
			if (e instanceof LayoutError) throw damaged(ext, e.message);
			throw e;
		}
	}
	let size: ReturnType<typeof imageSize>;
	try {
		size = imageSize(bytes);
	} catch {
		throw damaged(ext, 'its header cannot be read');
	}
	const { width, height } = size;
	if (!(width > 0 && height > 0)) throw damaged(ext, 'it declares no size');
	return {
		width,
		height,
		largest: { width, height, where: null },
		decodedPixels: width * height,
		pages: 1
	};
}

/**
 * jimp decodes a GIF's first frame onto a screen-sized image, but omggif allocates that frame
 * at its own declared size, however much larger than the screen; the other frames are not
 * decoded, and any of them may become the first in a later decoder, so all are bounded.
 */
function gifSize(bytes: Uint8Array): DeclaredSize {
	const layout = gifLayout(bytes);
	const { width, height } = layout.screen;
	if (!(width > 0 && height > 0)) throw damaged('gif', 'it declares no size');
	if (layout.frames.length === 0) throw damaged('gif', 'it holds no image');
	if (layout.end !== bytes.byteLength) throw appended('gif', bytes.byteLength - layout.end);
	let largest: DeclaredSize['largest'] = { width, height, where: null };
	layout.frames.forEach((f, i) => {
		if (f.width * f.height > largest.width * largest.height)
			largest = { ...f, where: `frame ${i + 1}, larger than its ${width} × ${height} screen` };
	});
	// jimp's image is the screen; the frame's own buffer is one byte a pixel, bounded above.
	return { width, height, largest, decodedPixels: width * height, pages: 1 };
}

/**
 * Every directory of a TIFF bounded, pages counted. jimp's TIFF reader decodes every page in
 * the file to show the first, so a second page is a decode image-size would not see; more than
 * one page is refused after the budget (inspectAttachment). Reduced-resolution copies
 * (thumbnails a scanner writes beside the page) are accepted and counted in the pixels decoded.
 */
function tiffSize(bytes: Uint8Array): DeclaredSize {
	const directories = tiffLayout(bytes);
	const pages = directories.filter((d) => d.place === 'page' && !d.reduced).length;
	const first = directories[0] as { width: number; height: number };
	let largest: DeclaredSize['largest'] = { width: first.width, height: first.height, where: null };
	let page = 0;
	for (const d of directories) {
		if (d.place === 'page') page++;
		if (d.width * d.height > largest.width * largest.height)
			largest = {
				width: d.width,
				height: d.height,
				where: d.place === 'page' ? `page ${page}` : `a sub-image of page ${page}`
			};
	}
	const decodedPixels = directories
		.filter((d) => d.place === 'page')
		.reduce((sum, d) => sum + d.width * d.height, 0);
	return { width: first.width, height: first.height, largest, decodedPixels, pages };
}

function damaged(ext: string, why: string) {
	return new AttachmentRejectedError(
		422,
		'damaged',
		`The ${ext.toUpperCase()} file is damaged or truncated: ${why}.`
	);
}

/**
 * The file must end where its own format says it ends: a truncated upload is refused, and so is
 * anything appended after the image (a polyglot such as a PNG followed by a ZIP or an HTML page).
 */
function checkEnd(bytes: Uint8Array, ext: ImageExt): void {
	const n = bytes.byteLength;
	if (ext === 'png') {
		const view = new DataView(bytes.buffer, bytes.byteOffset, n);
		let at = 8;
		while (true) {
			if (at + 12 > n) throw damaged(ext, 'it ends before its last chunk');
			const length = view.getUint32(at);
			const type = String.fromCharCode(...bytes.subarray(at + 4, at + 8));
			const next = at + 12 + length;
			if (next > n) throw damaged(ext, `it ends inside its ${type} chunk`);
			if (type === 'IEND') {
				if (next !== n) throw appended(ext, n - next);
				return;
			}
			at = next;
		}
	}
	if (ext === 'jpg') {
		if (!(bytes[n - 2] === 0xff && bytes[n - 1] === 0xd9))
			throw damaged(
				ext,
				'it does not end with an end-of-image marker (it is cut short, or other data follows the image)'
			);
		return;
	}
	if (ext === 'gif') {
		if (bytes[n - 1] !== 0x3b) throw damaged(ext, 'it does not end with a trailer');
		return;
	}
	if (ext === 'bmp') {
		const declared = new DataView(bytes.buffer, bytes.byteOffset, n).getUint32(2, true);
		if (declared > n) throw damaged(ext, 'it is shorter than its header says');
		if (declared !== 0 && declared < n) throw appended(ext, n - declared);
	}
	// TIFF keeps its parts at offsets with no end marker; the ZIP and markup scans cover it.
}

function appended(ext: string, extra: number) {
	return new AttachmentRejectedError(
		415,
		'polyglot',
		`The ${ext.toUpperCase()} file has ${formatBytes(extra)} bytes of other data after the end of the image; save the image again on its own.`
	);
}

/** An end-of-central-directory record anywhere a ZIP reader would look for it (the last 64 kB). */
function zipInside(bytes: Uint8Array): boolean {
	const from = Math.max(0, bytes.byteLength - 65_557);
	for (let i = bytes.byteLength - 22; i >= from; i--) {
		if (
			bytes[i] === 0x50 &&
			bytes[i + 1] === 0x4b &&
			bytes[i + 2] === 0x05 &&
			bytes[i + 3] === 0x06
		)
			return true;
	}
	return false;
}

const MARKUP_WINDOW = 1024 * 1024;

/** Tags a browser or a content sniffer would act on, lower case, after their `<`. */
const SVG_TAGS = ['svg'];
const HTML_TAGS = ['script', 'html', 'iframe', 'body', '!doctype html', 'object', 'embed'];

/** Whether the bytes at `at` spell `word` in any letter case (ASCII). */
function spells(bytes: Uint8Array, at: number, word: string): boolean {
	if (at + word.length >= bytes.byteLength) return false;
	for (let i = 0; i < word.length; i++) {
		const b = bytes[at + i] as number;
		const lower = b >= 0x41 && b <= 0x5a ? b + 0x20 : b;
		if (lower !== word.charCodeAt(i)) return false;
	}
	// The tag name must end there: `<svg>`, `<svg ` or `<svg/`, not `<svgfoo`.
	const next = bytes[at + word.length] as number;
	return word.includes(' ') || next === 0x3e || next === 0x2f || next <= 0x20;
}

/**
 * HTML, SVG or script markup a browser or a sniffer could act on, anywhere in the file: at the
 * start (the whole file is markup) or inside an image's metadata or after its end. Walks the
 * `<` bytes with Buffer.indexOf (native) rather than decoding the file as text, which kept the
 * request thread busy for a tenth of a second on a 7 MB photograph.
 */
async function activeMarkup(bytes: Uint8Array): Promise<'svg' | 'html' | 'script' | null> {
	const buffer = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	let html = false;
	// A megabyte at a time with a turn of the event loop between: a compressed photograph has a
	// `<` every 256 bytes or so, and other requests should not wait for all of them at once.
	for (let from = 0; from < buffer.byteLength; from += MARKUP_WINDOW) {
		if (from > 0) await new Promise<void>((resolve) => setImmediate(resolve));
		const end = Math.min(buffer.byteLength, from + MARKUP_WINDOW);
		for (
			let at = buffer.indexOf(0x3c, from);
			at !== -1 && at < end;
			at = buffer.indexOf(0x3c, at + 1)
		) {
			if (SVG_TAGS.some((tag) => spells(bytes, at + 1, tag))) return 'svg';
			if (!html && HTML_TAGS.some((tag) => spells(bytes, at + 1, tag))) html = true;
		}
	}
	if (html) return 'html';
	let start = 0;
	if (bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf) start = 3; // UTF-8 BOM
	while (start < bytes.byteLength && (bytes[start] as number) <= 0x20) start++;
	if (bytes[start] === 0x23 && bytes[start + 1] === 0x21) return 'script'; // #!
	return null;
}

/** Numbers as text: UTF-8, no NUL bytes, not a binary format. */
function inspectStructure(bytes: Uint8Array, detectedExt: string | undefined): Inspected {
	if (detectedExt === 'gz')
		return { role: 'structure', ext: 'gz', mime: 'application/gzip', bytes: bytes.byteLength };
	const refuse = (why: string) =>
		new AttachmentRejectedError(
			415,
			'unsupported_type',
			`A structure file must be PDB or mmCIF text, or gzip of it; ${why}.`
		);
	if (detectedExt !== undefined) throw refuse(`this file is ${detectedExt.toUpperCase()}`);
	if (bytes.includes(0)) throw refuse('this file holds binary bytes');
	return {
		role: 'structure',
		ext: 'txt',
		mime: 'text/plain; charset=utf-8',
		bytes: bytes.byteLength
	};
}

function inspectData(bytes: Uint8Array, detectedExt: string | undefined): Inspected {
	if (detectedExt !== undefined) {
		throw new AttachmentRejectedError(
			415,
			'unsupported_type',
			`Spectrum data must be a two-column text or CSV file; this file is ${detectedExt.toUpperCase()}.`
		);
	}
	let text: string;
	try {
		text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
	} catch {
		throw new AttachmentRejectedError(
			415,
			'unsupported_type',
			'Spectrum data must be UTF-8 text (two columns, x and y); this file is not.'
		);
	}
	if (text.includes('\u0000')) {
		throw new AttachmentRejectedError(
			415,
			'unsupported_type',
			'Spectrum data must be text (two columns, x and y); this file holds binary bytes.'
		);
	}
	return { role: 'data', ext: 'txt', mime: 'text/plain; charset=utf-8', bytes: bytes.byteLength };
}
