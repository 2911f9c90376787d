import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { KINDS } from '$lib/kinds';
import { createAttachment, type AttachmentDeps } from '$lib/server/attachments/attachments';
import { diskStore } from '$lib/server/attachments/diskStore';
import { s3Store } from '$lib/server/attachments/s3Store';
import { serveAttachmentFile } from '$lib/server/attachments/serve';
import type { BlobStore } from '$lib/server/attachments/storage';
import type { SessionUser } from '$lib/server/auth/roles';
import { addVersion, createEntry } from '$lib/server/catalogue/entries';
import type { Database } from '$lib/server/db/schema';
import { startFakeS3 } from '../support/fakeS3';
import { createTempDatabase } from '../support/tempDb';
import { insertSessionUser } from '../support/users';

// Downloads streamed from both stores: the disk in a temporary folder and S3 against s3rver.
// Oracles: the bytes stored, read back whole through a Response; node:crypto's SHA-256; files
// altered behind the app's back by writing other bytes under the same key.

let db: Kysely<Database>;
let remove: () => Promise<void>;
let contributor: SessionUser;
let fake: Awaited<ReturnType<typeof startFakeS3>>;
const root = mkdtempSync(join(tmpdir(), 'hopline-serve-'));
const BUCKET = 'hopline-serve';

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	contributor = await insertSessionUser(db, 'contributor', 'serve@test.invalid');
	fake = await startFakeS3(BUCKET);
});
afterAll(async () => {
	await remove();
	await fake?.stop();
	rmSync(root, { recursive: true, force: true });
});

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

/**
 * Two-column text of about `size` bytes (long numbers, so that 600 kB stay within the 20 000
 * points a numbers file may hold), different for each seed.
 */
function numbersOf(size: number, seed: number): Uint8Array {
	const lines = ['x,y'];
	let length = 4;
	for (let i = 0; length < size; i++) {
		const line = `${(1000 + i * 0.0123456789).toFixed(10)},${(((i * seed) % 9973) / 7).toFixed(12)}`;
		lines.push(line);
		length += line.length + 1;
	}
	return new TextEncoder().encode(lines.join('\n') + '\n');
}

async function dataAttachment(store: BlobStore, bytes: Uint8Array) {
	const entry = await db.transaction().execute(async (trx) => {
		const e = await createEntry(trx, {
			kind: 'protein',
			visibility: 'public',
			groupId: null,
			createdBy: contributor.id
		});
		await addVersion(
			trx,
			e.id,
			KINDS.protein.schema.parse({ name: `S ${e.accession}`, organism: 'Testus servii' }),
			{ status: 'submitted', createdBy: contributor.id }
		);
		return e;
	});
	const deps: AttachmentDeps = {
		store,
		limits: { maxBytes: 10 * 1024 * 1024, maxPixels: 40_000_000 },
		render: () => Promise.reject(new Error('no image here'))
	};
	return createAttachment(db, deps, {
		entryId: entry.id,
		meta: { kind: 'other', caption: 'numbers', conditions: {} },
		fileName: 'numbers.csv',
		bytes,
		role: 'data',
		uploadedBy: contributor.id
	});
}

/** Reads a body to its end; the bytes that came before an error, and the error. */
async function drain(body: ReadableStream<Uint8Array>) {
	const reader = body.getReader();
	let received = 0;
	const chunks: Uint8Array[] = [];
	try {
		while (true) {
			const { done, value } = await reader.read();
			if (done) return { bytes: Buffer.concat(chunks), received, error: null };
			received += value.byteLength;
			chunks.push(value);
		}
	} catch (e) {
		return { bytes: Buffer.concat(chunks), received, error: e as Error };
	}
}

function backend(name: string, make: () => BlobStore) {
	describe(`downloads from the ${name} store`, () => {
		it('streams the original whole, with its Content-Length from the row', async () => {
			const store = make();
			const bytes = numbersOf(600_000, 3);
			const a = await dataAttachment(store, bytes);
			const served = await serveAttachmentFile(db, store, contributor, a.id, 'original', null);
			expect(served.status).toBe(200);
			if (served.status !== 200) return;
			expect(served.headers['content-length']).toBe(String(bytes.byteLength));
			const out = await drain(served.body);
			expect(out.error).toBeNull();
			expect(sha256(out.bytes)).toBe(a.sha256);
			// The 304 path is unchanged and reads nothing.
			const again = await serveAttachmentFile(
				db,
				store,
				contributor,
				a.id,
				'data',
				`"${a.sha256}"`
			);
			expect(again.status).toBe(304);
		});

		it('a file altered in the store is cut off before its last chunk, never sent whole', async () => {
			const store = make();
			const bytes = numbersOf(400_000, 5);
			const a = await dataAttachment(store, bytes);
			const altered = new Uint8Array(bytes);
			altered[1000] = altered[1000] === 0x30 ? 0x31 : 0x30; // one digit changed, same length
			await store.delete(a.sha256);
			await store.put(a.sha256, altered, 'text/plain');
			const served = await serveAttachmentFile(db, store, contributor, a.id, 'original', null);
			if (served.status !== 200) throw new Error('expected a body');
			const out = await drain(served.body);
			expect(out.error?.message).toMatch(/no longer has the SHA-256 that names it/);
			expect(out.received).toBeLessThan(bytes.byteLength);
		});

		it('a file cut short in the store ends in an error, not a short success', async () => {
			const store = make();
			const bytes = numbersOf(200_000, 7);
			const a = await dataAttachment(store, bytes);
			await store.delete(a.sha256);
			await store.put(a.sha256, bytes.subarray(0, 150_000), 'text/plain');
			const served = await serveAttachmentFile(db, store, contributor, a.id, 'original', null);
			if (served.status !== 200) throw new Error('expected a body');
			const out = await drain(served.body);
			expect(out.error?.message).toMatch(/holds 150000 of its \d+ bytes/);
		});

		it('a file missing from the store is an error before any header is sent', async () => {
			const store = make();
			const a = await dataAttachment(store, numbersOf(1000, 11));
			await store.delete(a.sha256);
			await expect(
				serveAttachmentFile(db, store, contributor, a.id, 'original', null)
			).rejects.toThrow(/missing from the store/);
		});

		it('a reader that stops early releases the file', async () => {
			const store = make();
			const a = await dataAttachment(store, numbersOf(600_000, 13));
			const served = await serveAttachmentFile(db, store, contributor, a.id, 'original', null);
			if (served.status !== 200) throw new Error('expected a body');
			const reader = served.body.getReader();
			const first = await reader.read();
			expect(first.value?.byteLength).toBeGreaterThan(0);
			await expect(reader.cancel()).resolves.toBeUndefined();
		});
	});
}

backend('disk', () => diskStore(root));
backend('s3', () =>
	s3Store({
		bucket: BUCKET,
		prefix: 'serve/',
		endpoint: fake.endpoint,
		region: 'us-east-1',
		forcePathStyle: true,
		credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' }
	})
);
