import { mkdir, readFile, rename, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { config } from '../config';

/*
 * Uploaded structure files, kept byte for byte as uploaded (gzipped or not) under the data
 * folder, named by their SHA-256: the same file twice is stored once, and the match and submit
 * steps read the file back by its checksum instead of the contributor sending it again.
 * Until attachments exist (issue 15, part A) this folder is where the file lives; the distances'
 * note names the checksum, so the file can be linked as a "structure" attachment later.
 */
const SHA256 = /^[0-9a-f]{64}$/;

export function structureDir(): string {
	const base =
		config.DATABASE_PATH === ':memory:' ? tmpdir() : dirname(resolve(config.DATABASE_PATH));
	return join(base, 'structures');
}

export async function saveStructureBytes(sha256: string, bytes: Uint8Array): Promise<void> {
	if (!SHA256.test(sha256)) throw new TypeError('not a SHA-256 in hex');
	const dir = structureDir();
	await mkdir(dir, { recursive: true });
	// Written beside and renamed: a reader never sees half a file.
	const temporary = join(dir, `${sha256}.${process.pid}.${Date.now()}.part`);
	await writeFile(temporary, bytes);
	await rename(temporary, join(dir, sha256));
}

/** The stored bytes of a structure file, or null when there is none with this checksum. */
export async function loadStructureBytes(sha256: string): Promise<Uint8Array | null> {
	if (!SHA256.test(sha256)) return null;
	try {
		return await readFile(join(structureDir(), sha256));
	} catch (e) {
		if ((e as { code?: string }).code === 'ENOENT') return null;
		throw e;
	}
}
