/*
 * The sizes every image inside a GIF or a TIFF file declares, read from their headers without
 * decoding a pixel. image-size reports a GIF's logical screen and a TIFF's first directory
 * only, while the decoders jimp uses allocate for each frame and page: omggif makes a buffer of
 * the first frame's own width × height (which may be far larger than the screen), and jimp's
 * TIFF reader decodes every page in the chain of image file directories (IFDs), though it shows
 * only the first. So the pixel budget is checked against what these walks find.
 *
 * Both walks are bounded: a GIF is read block by block, each step moving forward; a TIFF's
 * directories are followed through a set of offsets already seen (an offset met twice is a
 * cycle, which utif2, the TIFF reader under jimp, would follow for ever) and at most
 * MAX_DIRECTORIES of them. Layouts from the GIF89a specification and TIFF 6.0 (section 2,
 * "Image File Directory"; section 8 for NewSubfileType; SubIFDs from the TIFF Technical Note 1).
 */

export class LayoutError extends Error {
	override readonly name = 'LayoutError';
}

export interface ImageBox {
	width: number;
	height: number;
}

export interface GifLayout {
	/** The logical screen, which is the size jimp's decoded image has. */
	screen: ImageBox;
	/** Every frame's own size, in file order. */
	frames: ImageBox[];
	/** Where the trailer ends: anything after it is not part of the image. */
	end: number;
}

/** Walks a GIF's blocks up to its trailer. @throws LayoutError for a malformed or cut file. */
export function gifLayout(bytes: Uint8Array): GifLayout {
	const n = bytes.byteLength;
	const u16 = (at: number) => (bytes[at] as number) | ((bytes[at + 1] as number) << 8);
	if (n < 13) throw new LayoutError('it ends inside its header');
	const screen = { width: u16(6), height: u16(8) };
	let at = 13;
	const packed = bytes[10] as number;
	if (packed & 0x80) at += 3 * 2 ** ((packed & 7) + 1); // global colour table
	const skipSubBlocks = () => {
		while (true) {
			if (at >= n) throw new LayoutError('it ends inside a data block');
			const size = bytes[at] as number;
			at += 1 + size;
			if (size === 0) return;
		}
	};
	const frames: ImageBox[] = [];
	while (true) {
		if (at >= n) throw new LayoutError('it ends before its trailer');
		const block = bytes[at];
		if (block === 0x3b) return { screen, frames, end: at + 1 };
		if (block === 0x21) {
			at += 2; // introducer, label
			skipSubBlocks();
		} else if (block === 0x2c) {
			if (at + 10 > n) throw new LayoutError('it ends inside an image descriptor');
			const frame = { width: u16(at + 5), height: u16(at + 7) };
			if (frame.width === 0 || frame.height === 0)
				throw new LayoutError(`frame ${frames.length + 1} declares no size`);
			frames.push(frame);
			const flags = bytes[at + 9] as number;
			at += 10;
			if (flags & 0x80) at += 3 * 2 ** ((flags & 7) + 1); // local colour table
			at += 1; // LZW minimum code size
			skipSubBlocks();
		} else {
			throw new LayoutError(`it holds an unknown block (0x${(block ?? 0).toString(16)})`);
		}
	}
}

/** More directories than any figure or scan needs; beyond it the file is refused. */
export const MAX_DIRECTORIES = 64;

export interface TiffDirectory extends ImageBox {
	/** NewSubfileType bit 0: a reduced-resolution copy (a thumbnail) of another image. */
	reduced: boolean;
	/** 'page' in the main chain, 'sub' for a SubIFD of a page. */
	place: 'page' | 'sub';
}

const TAG_NEW_SUBFILE_TYPE = 254;
const TAG_WIDTH = 256;
const TAG_LENGTH = 257;
const TAG_SUB_IFDS = 330;
const TAG_EXIF_IFD = 34665;
const TAG_GPS_IFD = 34853;

/**
 * Every image directory of a classic TIFF: the main chain (pages) and each page's SubIFDs, with
 * the EXIF and GPS directories followed for cycles only.
 * @throws LayoutError for a cycle, an offset outside the file, too many directories, an image
 *   directory without a size, or BigTIFF.
 */
export function tiffLayout(bytes: Uint8Array): TiffDirectory[] {
	const n = bytes.byteLength;
	if (n < 8) throw new LayoutError('it ends inside its header');
	const little = bytes[0] === 0x49;
	const view = new DataView(bytes.buffer, bytes.byteOffset, n);
	const u16 = (at: number) => view.getUint16(at, little);
	const u32 = (at: number) => view.getUint32(at, little);
	const magic = u16(2);
	if (magic === 43) throw new LayoutError('it is a BigTIFF, which the registry does not read');
	if (magic !== 42) throw new LayoutError('its header is not a TIFF header');

	const seen = new Set<number>();
	const out: TiffDirectory[] = [];
	/** The value of one entry: count values of a SHORT, LONG or IFD type, inline or at an offset. */
	const values = (entry: number): number[] => {
		const type = u16(entry + 2);
		const count = u32(entry + 4);
		const size = type === 3 ? 2 : type === 4 || type === 13 ? 4 : 0;
		if (size === 0 || count === 0) return [];
		if (count > MAX_DIRECTORIES) throw new LayoutError('an entry lists too many directories');
		const from = count * size <= 4 ? entry + 8 : u32(entry + 8);
		if (from + count * size > n) throw new LayoutError('an entry points outside the file');
		return Array.from({ length: count }, (_, i) =>
			size === 2 ? u16(from + 2 * i) : u32(from + 4 * i)
		);
	};
	/** Reads the directory at `offset`; returns the offset of the next one in its chain. */
	const visit = (offset: number, place: 'page' | 'sub' | 'meta', depth: number): number => {
		if (seen.has(offset))
			throw new LayoutError('its image directories point back to one another (a cycle)');
		seen.add(offset);
		if (seen.size > MAX_DIRECTORIES)
			throw new LayoutError(`it holds more than ${MAX_DIRECTORIES} image directories`);
		if (offset < 8 || offset + 2 > n) throw new LayoutError('a directory lies outside the file');
		const count = u16(offset);
		const end = offset + 2 + count * 12;
		if (end + 4 > n) throw new LayoutError('it ends inside an image directory');
		let width = 0;
		let height = 0;
		let subfileType = 0;
		const children: { offset: number; place: 'sub' | 'meta' }[] = [];
		for (let e = offset + 2; e < end; e += 12) {
			const tag = u16(e);
			if (tag === TAG_WIDTH) width = values(e)[0] ?? 0;
			else if (tag === TAG_LENGTH) height = values(e)[0] ?? 0;
			else if (tag === TAG_NEW_SUBFILE_TYPE) subfileType = values(e)[0] ?? 0;
			else if (tag === TAG_SUB_IFDS)
				for (const o of values(e)) children.push({ offset: o, place: 'sub' });
			else if (tag === TAG_EXIF_IFD || tag === TAG_GPS_IFD)
				for (const o of values(e)) children.push({ offset: o, place: 'meta' });
		}
		if (place !== 'meta') {
			if (!(width > 0 && height > 0))
				throw new LayoutError(`image directory ${out.length + 1} declares no size`);
			out.push({ width, height, reduced: (subfileType & 1) === 1, place });
		}
		if (depth < 3) {
			for (const child of children) {
				// A SubIFD may have a chain of its own; EXIF and GPS directories have none.
				let next = child.offset;
				while (next !== 0) {
					next = visit(next, child.place, depth + 1);
					if (child.place === 'meta') break;
				}
			}
		}
		return u32(end);
	};
	let next = u32(4);
	if (next === 0) throw new LayoutError('it holds no image directory');
	while (next !== 0) next = visit(next, 'page', 0);
	return out;
}
