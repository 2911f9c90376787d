import { randomBytes } from 'node:crypto';
import { mkdir, open, readFile, rename, rm, stat } from 'node:fs/promises';
import { dirname, join } from 'node:path';
import { Readable } from 'node:stream';
import { assertBlobKey, type BlobStore } from './storage';

/*
 * Attachment files on the local disk: `<root>/ab/cd/<sha256>`, two levels of folders so that no
 * folder holds more than a few hundred files. A file is written to a temporary name in the same
 * folder, flushed, then renamed into place, so a reader never sees half a file and a crash
 * leaves at most a stray `.tmp-…` file, never a wrong one.
 */
export function diskStore(root: string): BlobStore {
	const pathOf = (key: string) => {
		assertBlobKey(key);
		return join(root, key.slice(0, 2), key.slice(2, 4), key);
	};
	const exists = async (path: string) => {
		try {
			await stat(path);
			return true;
		} catch (e) {
			if ((e as NodeJS.ErrnoException).code === 'ENOENT') return false;
			throw e;
		}
	};
	return {
		kind: 'disk',
		async put(key, bytes) {
			const path = pathOf(key);
			if (await exists(path)) return;
			await mkdir(dirname(path), { recursive: true });
			const temp = `${path}.tmp-${randomBytes(6).toString('hex')}`;
			const handle = await open(temp, 'wx', 0o640);
			try {
				await handle.writeFile(bytes);
				await handle.sync();
			} finally {
				await handle.close();
			}
			try {
				await rename(temp, path); // atomic; two writers of one key write the same bytes
			} catch (e) {
				await rm(temp, { force: true });
				throw e;
			}
		},
		async get(key) {
			try {
				return new Uint8Array(await readFile(pathOf(key)));
			} catch (e) {
				if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
				throw e;
			}
		},
		async getStream(key) {
			// Opened here, so that a missing file is null rather than an error mid-response.
			let handle;
			try {
				handle = await open(pathOf(key), 'r');
			} catch (e) {
				if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
				throw e;
			}
			// The handle closes with the stream: at its end, on an error, or when the reader cancels.
			return Readable.toWeb(handle.createReadStream()) as ReadableStream<Uint8Array>;
		},
		async has(key) {
			return exists(pathOf(key));
		},
		async delete(key) {
			await rm(pathOf(key), { force: true });
		}
	};
}
