import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';

/*
 * JPEG decoding for the renditions, by mozjpeg (libjpeg-turbo's decoder) compiled to WebAssembly
 * (@jsquash/jpeg). jimp's own JPEG decoder (jpeg-js, plain JavaScript) spent 2.5–3 s of the 3 s a
 * 4000 × 3000 photograph's renditions took; this one decodes it in about 0.4 s on the same
 * machine. jimp stays the image library for everything else (other formats, resizing, encoding).
 *
 * Loading: the package's own loader fetches its .wasm by a file: URL, which Node 20's fetch
 * cannot do, so the module is compiled here from the file and handed to it. Each image gets a
 * fresh instance: a fatal libjpeg error leaves the Emscripten runtime through exit(), after
 * which its heap may hold what the failed call left.
 * Runs in the attachment worker only (image.worker.ts), whose running-time limit is the decode
 * time-out.
 */

type Decode = typeof import('@jsquash/jpeg/decode.js').default;

let compiled: Promise<WebAssembly.Module> | null = null;
let decoder: Promise<Decode> | null = null;

function wasmModule(): Promise<WebAssembly.Module> {
	compiled ??= (async () => {
		const path = createRequire(import.meta.url).resolve('@jsquash/jpeg/codec/dec/mozjpeg_dec.wasm');
		return WebAssembly.compile(await readFile(path));
	})();
	return compiled;
}

async function freshDecoder(): Promise<Decode> {
	const [{ default: decode, init }, module] = await Promise.all([
		import('@jsquash/jpeg/decode.js'),
		wasmModule()
	]);
	// libjpeg's warnings ("Premature end of JPEG file") would go to the server's log per image.
	const quiet = { print: () => {}, printErr: () => {} };
	await (init as (m: WebAssembly.Module, o: object) => Promise<void>)(module, quiet);
	return decode;
}

export interface DecodedPixels {
	/** RGBA, row by row. */
	data: Buffer;
	width: number;
	height: number;
}

/**
 * Decodes a JPEG to RGBA pixels, turned upright by its EXIF orientation as jimp does.
 * @throws Error when libjpeg gives up on the file (the caller's 422).
 */
export async function decodeJpeg(bytes: Uint8Array): Promise<DecodedPixels> {
	decoder ??= freshDecoder();
	const decode = await decoder;
	// The decoder takes an ArrayBuffer of the file alone, not a view into a larger one.
	const own = bytes.slice().buffer;
	try {
		const image = await decode(own, { preserveOrientation: true });
		const data = Buffer.from(image.data.buffer, image.data.byteOffset, image.data.byteLength);
		if (
			!(image.width > 0 && image.height > 0) ||
			data.byteLength !== image.width * image.height * 4
		)
			throw new Error('the JPEG decoder returned no image');
		return { data, width: image.width, height: image.height };
	} catch (e) {
		throw e instanceof Error ? e : new Error(String(e));
	} finally {
		// A fresh instance for the next image (a few milliseconds; the compiled module is kept),
		// so nothing a failed or a large decode left in the WebAssembly heap carries over. The old
		// one is collected with its memory: 8 decodes of a 12 MP photograph in a row held the
		// process's external memory level at about 250 MB (measured with --expose-gc).
		decoder = freshDecoder();
		// Its failure, if any, is met by the next decodeJpeg; not an unhandled rejection meanwhile.
		decoder.catch(() => {});
	}
}
