import { dirname, join, resolve } from 'node:path';
import { config, type Config } from '../config';
import { diskStore } from './diskStore';
import { s3Store } from './s3Store';
import type { BlobStore } from './storage';

/** The store the configuration names: S3 when S3_BUCKET is set, otherwise the local disk. */
export function storeFromConfig(c: Config): BlobStore {
	if (c.S3_BUCKET) {
		return s3Store({
			bucket: c.S3_BUCKET,
			prefix: c.S3_PREFIX,
			endpoint: c.S3_ENDPOINT,
			region: c.S3_REGION,
			forcePathStyle: c.S3_FORCE_PATH_STYLE,
			credentials:
				c.S3_ACCESS_KEY_ID && c.S3_SECRET_ACCESS_KEY
					? { accessKeyId: c.S3_ACCESS_KEY_ID, secretAccessKey: c.S3_SECRET_ACCESS_KEY }
					: undefined
		});
	}
	return diskStore(resolve(c.ATTACHMENT_DIR ?? join(dirname(c.DATABASE_PATH), 'attachments')));
}

let current: BlobStore | null = null;

/** The app's store, made on first use (the build imports server modules without using them). */
export function attachmentStore(): BlobStore {
	current ??= storeFromConfig(config);
	return current;
}
