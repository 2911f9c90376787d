import { createHash } from 'node:crypto';
import { promisify } from 'node:util';
import { gunzip } from 'node:zlib';
import { DomainError } from '$lib/domainError';

/*
 * The bytes of an uploaded structure file to its text: gzip recognised by its magic number (not
 * by the name), decompressed in zlib's thread pool with a cap on the output so that a small
 * bomb cannot fill the memory, then decoded as UTF-8 (PDB and mmCIF are plain text).
 */
const gunzipAsync = promisify(gunzip);

/** gzip's magic number (RFC 1952, section 2.3.1: ID1 = 0x1f, ID2 = 0x8b). */
export function isGzip(bytes: Uint8Array): boolean {
	return bytes.length >= 2 && bytes[0] === 0x1f && bytes[1] === 0x8b;
}

export class StructureFileError extends DomainError {
	constructor(message: string, code: 'bad_request' | 'payload_too_large' = 'bad_request') {
		super(code, message);
		this.name = 'StructureFileError';
	}
}

export interface StructureFile {
	text: string;
	/** SHA-256 of the bytes as uploaded (compressed when gzipped), hex. */
	sha256: string;
	byteSize: number;
	gzipped: boolean;
}

const megabytes = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MB`;

export async function readStructureFile(
	bytes: Uint8Array,
	limits: { maxBytes: number; maxTextBytes: number }
): Promise<StructureFile> {
	if (bytes.length === 0) throw new StructureFileError('the structure file is empty');
	if (bytes.length > limits.maxBytes)
		throw new StructureFileError(
			`the structure file is ${megabytes(bytes.length)}; the limit is ${megabytes(limits.maxBytes)}`,
			'payload_too_large'
		);
	const sha256 = createHash('sha256').update(bytes).digest('hex');
	const gzipped = isGzip(bytes);
	let plain: Uint8Array = bytes;
	if (gzipped) {
		try {
			plain = await gunzipAsync(bytes, { maxOutputLength: limits.maxTextBytes });
		} catch (e) {
			if ((e as { code?: string }).code === 'ERR_BUFFER_TOO_LARGE')
				throw new StructureFileError(
					`the structure file unpacks to more than ${megabytes(limits.maxTextBytes)}, the limit`,
					'payload_too_large'
				);
			throw new StructureFileError('the file starts like gzip but could not be unpacked');
		}
	} else if (bytes.length > limits.maxTextBytes) {
		throw new StructureFileError(
			`the structure file is larger than ${megabytes(limits.maxTextBytes)}, the limit`,
			'payload_too_large'
		);
	}
	let text: string;
	try {
		text = new TextDecoder('utf-8', { fatal: true }).decode(plain);
	} catch {
		throw new StructureFileError('the structure file is not text: expected a PDB or mmCIF file');
	}
	if (text.includes('\u0000'))
		throw new StructureFileError('the structure file is not text: expected a PDB or mmCIF file');
	return { text, sha256, byteSize: bytes.length, gzipped };
}
