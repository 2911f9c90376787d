import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { diskStore } from '$lib/server/attachments/diskStore';
import { s3Store } from '$lib/server/attachments/s3Store';
import type { BlobStore } from '$lib/server/attachments/storage';
import { storeFromConfig } from '$lib/server/attachments/store';
import { parseConfig } from '$lib/server/config';
import { startFakeS3 } from '../support/fakeS3';

// One contract, both backends: the disk in a temporary folder, S3 against s3rver on 127.0.0.1.
// Oracle: the bytes put in come back identical, keyed by node:crypto's SHA-256 of them.

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

function bytesOf(length: number, seed: number): Uint8Array {
	const out = new Uint8Array(length);
	for (let i = 0; i < length; i++) out[i] = (i * 31 + seed * 7) & 0xff;
	return out;
}

function contract(name: string, make: () => BlobStore) {
	describe(`${name} store`, () => {
		it('gives back the bytes it was given, under their SHA-256', async () => {
			const store = make();
			const bytes = bytesOf(300_000, 1);
			const key = sha256(bytes);
			expect(await store.has(key)).toBe(false);
			expect(await store.get(key)).toBeNull();
			await store.put(key, bytes, 'image/png');
			expect(await store.has(key)).toBe(true);
			const back = await store.get(key);
			expect(back && sha256(back)).toBe(key);
			expect(back?.byteLength).toBe(bytes.byteLength);
		});

		it('streams the bytes it was given, and null for a missing key', async () => {
			const store = make();
			const bytes = bytesOf(500_000, 4);
			const key = sha256(bytes);
			expect(await store.getStream(key)).toBeNull();
			await store.put(key, bytes, 'application/octet-stream');
			const stream = await store.getStream(key);
			if (!stream) throw new Error('expected a stream');
			const back = new Uint8Array(await new Response(stream).arrayBuffer());
			expect(sha256(back)).toBe(key);
		});

		it('stores the same content twice as once, and deletes it', async () => {
			const store = make();
			const bytes = bytesOf(1000, 2);
			const key = sha256(bytes);
			await store.put(key, bytes, 'text/plain');
			await store.put(key, bytes, 'text/plain');
			expect(await store.has(key)).toBe(true);
			await store.delete(key);
			expect(await store.has(key)).toBe(false);
			expect(await store.get(key)).toBeNull();
			await expect(store.delete(key)).resolves.toBeUndefined(); // a missing key is no error
		});

		it('keeps an empty file and a one-byte file apart', async () => {
			const store = make();
			const a = new Uint8Array([7]);
			await store.put(sha256(a), a, 'application/octet-stream');
			expect(Array.from((await store.get(sha256(a))) ?? [])).toEqual([7]);
		});

		it('refuses anything that is not a SHA-256 as a key', async () => {
			const store = make();
			await expect(store.get('../../etc/passwd')).rejects.toThrow(TypeError);
			await expect(store.put('A'.repeat(64), new Uint8Array(1), 'x/y')).rejects.toThrow(
				/not a SHA-256 key/
			);
			await expect(store.has('')).rejects.toThrow(TypeError);
		});
	});
}

const diskRoot = mkdtempSync(join(tmpdir(), 'hopline-disk-store-'));
afterAll(() => rmSync(diskRoot, { recursive: true, force: true }));
contract('disk', () => diskStore(diskRoot));

describe('disk store layout', () => {
	it('writes <root>/ab/cd/<sha256> and leaves no temporary file', async () => {
		const root = mkdtempSync(join(tmpdir(), 'hopline-disk-layout-'));
		try {
			const bytes = bytesOf(10, 3);
			const key = sha256(bytes);
			await diskStore(root).put(key, bytes, 'text/plain');
			expect(readdirSync(join(root, key.slice(0, 2), key.slice(2, 4)))).toEqual([key]);
		} finally {
			rmSync(root, { recursive: true, force: true });
		}
	});
});

const BUCKET = 'hopline-test';
let fake: Awaited<ReturnType<typeof startFakeS3>>;
beforeAll(async () => {
	fake = await startFakeS3(BUCKET);
});
afterAll(async () => {
	await fake?.stop();
});
contract('s3', () =>
	s3Store({
		bucket: BUCKET,
		prefix: 'attachments/',
		endpoint: fake.endpoint,
		region: 'us-east-1',
		forcePathStyle: true,
		credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' }
	})
);

describe('store chosen by configuration', () => {
	it('is the disk beside the database by default and S3 with a bucket', () => {
		expect(storeFromConfig(parseConfig({})).kind).toBe('disk');
		const s3 = parseConfig({
			S3_BUCKET: BUCKET,
			S3_ENDPOINT: fake.endpoint,
			S3_FORCE_PATH_STYLE: 'true',
			S3_ACCESS_KEY_ID: 'S3RVER',
			S3_SECRET_ACCESS_KEY: 'S3RVER'
		});
		expect(storeFromConfig(s3).kind).toBe('s3');
	});

	it('reaches the fake through the configured S3 store', async () => {
		const store = storeFromConfig(
			parseConfig({
				S3_BUCKET: BUCKET,
				S3_ENDPOINT: fake.endpoint,
				S3_FORCE_PATH_STYLE: 'true',
				S3_ACCESS_KEY_ID: 'S3RVER',
				S3_SECRET_ACCESS_KEY: 'S3RVER',
				S3_PREFIX: 'configured/'
			})
		);
		const bytes = bytesOf(64, 9);
		await store.put(sha256(bytes), bytes, 'text/plain');
		expect(await store.has(sha256(bytes))).toBe(true);
	});
});
