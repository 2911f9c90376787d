/*
 * Where attachment files live: one interface, two backends (diskStore.ts, s3Store.ts), chosen by
 * configuration in store.ts. Every file — an original, a preview, a thumbnail — is stored under
 * the SHA-256 of its own bytes, so the same content is stored once, a key never changes meaning,
 * and writing a key that is already there is a harmless no-op.
 */

/** A lower-case hexadecimal SHA-256: the only keys the stores accept. */
export type BlobKey = string;

const KEY = /^[0-9a-f]{64}$/;

/** Throws TypeError unless `key` is a lower-case hex SHA-256 (never a path or an object name). */
export function assertBlobKey(key: string): asserts key is BlobKey {
	if (!KEY.test(key)) throw new TypeError(`not a SHA-256 key: ${JSON.stringify(key.slice(0, 80))}`);
}

export interface BlobStore {
	/** 'disk' or 's3', for logs and the admin. */
	readonly kind: 'disk' | 's3';
	/**
	 * Stores `bytes` under `key` (their SHA-256, checked by the caller), durably before it
	 * resolves; a key already present is left as it is.
	 */
	put(key: BlobKey, bytes: Uint8Array, contentType: string): Promise<void>;
	/** The bytes under `key`, or null when there are none (whole, in memory: for small files). */
	get(key: BlobKey): Promise<Uint8Array | null>;
	/**
	 * The bytes under `key` as a stream read as the consumer pulls, or null when there are none:
	 * what downloads use, so that many of them at once hold a few chunks each, not whole files.
	 */
	getStream(key: BlobKey): Promise<ReadableStream<Uint8Array> | null>;
	has(key: BlobKey): Promise<boolean>;
	/** Removes `key`; removing a missing key is not an error. */
	delete(key: BlobKey): Promise<void>;
}
