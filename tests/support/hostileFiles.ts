import { crc32, deflateSync } from 'node:zlib';
import { Jimp } from 'jimp';

/*
 * Files for the attachment tests, made here rather than kept as binaries: good images from jimp,
 * and hostile ones built byte by byte (the PNG layout from the PNG specification, ISO/IEC
 * 15948; the EXIF layout from CIPA DC-008, the JPEG APP1 segment carrying a TIFF header).
 */

export async function pngOf(width: number, height: number): Promise<Uint8Array> {
	const image = new Jimp({ width, height, color: 0x3366ccff });
	return new Uint8Array(await image.getBuffer('image/png'));
}

export async function jpegOf(width: number, height: number): Promise<Uint8Array> {
	const image = new Jimp({ width, height, color: 0xcc6633ff });
	for (let x = 0; x < width; x += 7) image.setPixelColor(0x000000ff, x, Math.floor(height / 2));
	return new Uint8Array(await image.getBuffer('image/jpeg', { quality: 85 }));
}

function chunk(type: string, data: Uint8Array): Buffer {
	const head = Buffer.alloc(8);
	head.writeUInt32BE(data.byteLength, 0);
	head.write(type, 4, 'latin1');
	const crc = Buffer.alloc(4);
	crc.writeUInt32BE(crc32(Buffer.concat([head.subarray(4), data])), 0);
	return Buffer.concat([head, data, crc]);
}

/** A well-formed PNG whose header declares width × height; its pixel data is a few bytes. */
export function pngDeclaring(width: number, height: number): Uint8Array {
	const ihdr = Buffer.alloc(13);
	ihdr.writeUInt32BE(width, 0);
	ihdr.writeUInt32BE(height, 4);
	ihdr[8] = 8; // bit depth
	ihdr[9] = 0; // greyscale
	return new Uint8Array(
		Buffer.concat([
			Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
			chunk('IHDR', ihdr),
			chunk('IDAT', deflateSync(Buffer.alloc(16))),
			chunk('IEND', new Uint8Array(0))
		])
	);
}

/** A minimal ZIP archive holding one stored file (local header, central directory, end record). */
export function zipOf(name: string, content: string): Uint8Array {
	const data = Buffer.from(content);
	const fileName = Buffer.from(name);
	const crc = crc32(data);
	const local = Buffer.alloc(30);
	local.writeUInt32LE(0x04034b50, 0);
	local.writeUInt16LE(10, 4);
	local.writeUInt32LE(crc, 14);
	local.writeUInt32LE(data.length, 18);
	local.writeUInt32LE(data.length, 22);
	local.writeUInt16LE(fileName.length, 26);
	const central = Buffer.alloc(46);
	central.writeUInt32LE(0x02014b50, 0);
	central.writeUInt16LE(20, 4);
	central.writeUInt16LE(10, 6);
	central.writeUInt32LE(crc, 16);
	central.writeUInt32LE(data.length, 20);
	central.writeUInt32LE(data.length, 24);
	central.writeUInt16LE(fileName.length, 28);
	const centralAt = local.length + fileName.length + data.length;
	const end = Buffer.alloc(22);
	end.writeUInt32LE(0x06054b50, 0);
	end.writeUInt16LE(1, 8);
	end.writeUInt16LE(1, 10);
	end.writeUInt32LE(central.length + fileName.length, 12);
	end.writeUInt32LE(centralAt, 16);
	return new Uint8Array(Buffer.concat([local, fileName, data, central, fileName, end]));
}

/** EXIF with a GPS position (latitude 52° 12′ 30″ N), as an APP1 segment. */
export function exifGpsSegment(): Buffer {
	const tiff = Buffer.alloc(8 + 2 + 12 + 4 + 2 + 2 * 12 + 4 + 24);
	tiff.write('II', 0, 'latin1');
	tiff.writeUInt16LE(42, 2);
	tiff.writeUInt32LE(8, 4); // IFD0 at 8
	tiff.writeUInt16LE(1, 8); // one entry
	tiff.writeUInt16LE(0x8825, 10); // GPSInfo IFD pointer
	tiff.writeUInt16LE(4, 12); // LONG
	tiff.writeUInt32LE(1, 14);
	const gpsAt = 8 + 2 + 12 + 4;
	tiff.writeUInt32LE(gpsAt, 18);
	tiff.writeUInt32LE(0, 22); // no next IFD
	tiff.writeUInt16LE(2, gpsAt); // two GPS entries
	let e = gpsAt + 2;
	tiff.writeUInt16LE(1, e); // GPSLatitudeRef
	tiff.writeUInt16LE(2, e + 2); // ASCII
	tiff.writeUInt32LE(2, e + 4);
	tiff.write('N\0', e + 8, 'latin1');
	e += 12;
	const rationalsAt = gpsAt + 2 + 2 * 12 + 4;
	tiff.writeUInt16LE(2, e); // GPSLatitude
	tiff.writeUInt16LE(5, e + 2); // RATIONAL
	tiff.writeUInt32LE(3, e + 4);
	tiff.writeUInt32LE(rationalsAt, e + 8);
	tiff.writeUInt32LE(0, e + 12); // no next IFD
	[52, 1, 12, 1, 30, 1].forEach((v, i) => tiff.writeUInt32LE(v, rationalsAt + 4 * i));
	const body = Buffer.concat([Buffer.from('Exif\0\0', 'latin1'), tiff]);
	const head = Buffer.from([0xff, 0xe1, 0, 0]);
	head.writeUInt16BE(body.length + 2, 2);
	return Buffer.concat([head, body]);
}

/** A JPEG from jimp with the EXIF GPS segment inserted after its start-of-image marker. */
export async function jpegWithGps(width: number, height: number): Promise<Uint8Array> {
	const jpeg = Buffer.from(await jpegOf(width, height));
	return new Uint8Array(Buffer.concat([jpeg.subarray(0, 2), exifGpsSegment(), jpeg.subarray(2)]));
}

export const SVG_WITH_SCRIPT =
	'<?xml version="1.0"?>\n<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>fetch("/api/v1/me")</script></svg>';
export const HTML_PAGE =
	'<!DOCTYPE html>\n<html><body><script>alert(document.cookie)</script></body></html>';

export interface TiffDirectorySpec {
	width: number;
	height: number;
	/** NewSubfileType; 1 marks a reduced-resolution copy. */
	subfileType?: number;
	/** SubIFDs of this directory. */
	subIfds?: TiffDirectorySpec[];
}

/**
 * A little-endian classic TIFF (TIFF 6.0, section 2) with one directory per spec in its main
 * chain: uncompressed 8-bit RGB strips, pixel data written only for images of at most
 * 4096 pixels (a huge declared size gets a 3-byte strip: it is never decoded). `loopTo` makes the
 * last directory's next offset point back to directory `loopTo`: a cycle.
 */
export function tiffOf(pages: TiffDirectorySpec[], options: { loopTo?: number } = {}): Uint8Array {
	const parts: Buffer[] = [];
	let size = 8;
	const reserve = (bytes: Buffer) => {
		const at = size;
		parts.push(bytes);
		size += bytes.length;
		return at;
	};
	const header = Buffer.alloc(8);
	header.write('II', 0, 'latin1');
	header.writeUInt16LE(42, 2);
	parts.push(header);
	/** Writes a directory (and its sub-directories first); returns its offset and its buffer. */
	const write = (spec: TiffDirectorySpec): { at: number; ifd: Buffer } => {
		const subs = (spec.subIfds ?? []).map(write);
		const pixels = spec.width * spec.height <= 4096 ? spec.width * spec.height * 3 : 3;
		const dataAt = reserve(Buffer.alloc(pixels, 0x80));
		const bitsAt = reserve(Buffer.from([8, 0, 8, 0, 8, 0]));
		let subsAt = 0;
		if (subs.length > 1) {
			const offsets = Buffer.alloc(4 * subs.length);
			subs.forEach((sub, i) => offsets.writeUInt32LE(sub.at, 4 * i));
			subsAt = reserve(offsets);
		}
		const entries: [number, number, number, number][] = [
			[254, 4, 1, spec.subfileType ?? 0],
			[256, 4, 1, spec.width],
			[257, 4, 1, spec.height],
			[258, 3, 3, bitsAt],
			[259, 3, 1, 1],
			[262, 3, 1, 2],
			[273, 4, 1, dataAt],
			[277, 3, 1, 3],
			[278, 4, 1, spec.height],
			[279, 4, 1, pixels]
		];
		if (subs.length > 0)
			entries.push([330, 4, subs.length, subs.length > 1 ? subsAt : (subs[0]?.at ?? 0)]);
		const ifd = Buffer.alloc(2 + entries.length * 12 + 4);
		ifd.writeUInt16LE(entries.length, 0);
		entries.forEach(([tag, type, count, value], i) => {
			const e = 2 + i * 12;
			ifd.writeUInt16LE(tag, e);
			ifd.writeUInt16LE(type, e + 2);
			ifd.writeUInt32LE(count, e + 4);
			if (type === 3 && count === 1) ifd.writeUInt16LE(value, e + 8);
			else ifd.writeUInt32LE(value, e + 8);
		});
		return { at: reserve(ifd), ifd };
	};
	const chain = pages.map(write);
	header.writeUInt32LE(chain[0]?.at ?? 0, 4);
	chain.forEach((d, i) => {
		const next =
			i + 1 < chain.length
				? (chain[i + 1]?.at ?? 0)
				: options.loopTo !== undefined
					? (chain[options.loopTo]?.at ?? 0)
					: 0;
		d.ifd.writeUInt32LE(next, d.ifd.length - 4);
	});
	return new Uint8Array(Buffer.concat(parts));
}

/**
 * A GIF89a (the GIF89a specification, sections 18–20) with a two-colour global table and one
 * image descriptor per frame, each with a tiny LZW stream: enough for every header walk, though
 * frames larger than their data are never decodable.
 */
export function gifOf(
	screen: { width: number; height: number },
	frames: { width: number; height: number; left?: number; top?: number }[]
): Uint8Array {
	const head = Buffer.alloc(13);
	head.write('GIF89a', 0, 'latin1');
	head.writeUInt16LE(screen.width, 6);
	head.writeUInt16LE(screen.height, 8);
	head[10] = 0x80; // global colour table of 2 entries
	const parts = [head, Buffer.from([0, 0, 0, 0xff, 0xff, 0xff])];
	for (const f of frames) {
		const d = Buffer.alloc(10);
		d[0] = 0x2c;
		d.writeUInt16LE(f.left ?? 0, 1);
		d.writeUInt16LE(f.top ?? 0, 3);
		d.writeUInt16LE(f.width, 5);
		d.writeUInt16LE(f.height, 7);
		parts.push(d, Buffer.from([0x02, 0x02, 0x4c, 0x01, 0x00]));
	}
	parts.push(Buffer.from([0x3b]));
	return new Uint8Array(Buffer.concat(parts));
}
