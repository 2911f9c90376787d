import {
	DeleteObjectCommand,
	GetObjectCommand,
	HeadObjectCommand,
	PutObjectCommand,
	S3Client,
	S3ServiceException
} from '@aws-sdk/client-s3';
import { assertBlobKey, type BlobStore } from './storage';

export interface S3StoreOptions {
	bucket: string;
	/** Object names are `<prefix><sha256>`. @default '' */
	prefix?: string;
	/** For a store other than AWS, e.g. http://127.0.0.1:9000. */
	endpoint?: string;
	region: string;
	/** Omitted: the AWS SDK's usual credential chain (environment, profile, instance role). */
	credentials?: { accessKeyId: string; secretAccessKey: string };
	forcePathStyle?: boolean;
}

/*
 * Attachment files in an S3-compatible object store. Checksums are sent and checked only where
 * the protocol requires them: newer SDKs add CRC32 trailers to every upload by default, which
 * many S3-compatible stores (and the test fake) do not understand. The key is the SHA-256 of
 * the bytes, so a caller can check what it reads back.
 */
export function s3Store(options: S3StoreOptions): BlobStore {
	const client = new S3Client({
		region: options.region,
		endpoint: options.endpoint,
		forcePathStyle: options.forcePathStyle ?? false,
		credentials: options.credentials,
		requestChecksumCalculation: 'WHEN_REQUIRED',
		responseChecksumValidation: 'WHEN_REQUIRED',
		maxAttempts: 3
	});
	const Bucket = options.bucket;
	const nameOf = (key: string) => {
		assertBlobKey(key);
		return `${options.prefix ?? ''}${key}`;
	};
	const missing = (e: unknown) =>
		e instanceof S3ServiceException &&
		(e.name === 'NoSuchKey' || e.name === 'NotFound' || e.$metadata.httpStatusCode === 404);

	const has = async (key: string) => {
		try {
			await client.send(new HeadObjectCommand({ Bucket, Key: nameOf(key) }));
			return true;
		} catch (e) {
			if (missing(e)) return false;
			throw e;
		}
	};
	return {
		kind: 's3',
		async put(key, bytes, contentType) {
			if (await has(key)) return;
			await client.send(
				new PutObjectCommand({
					Bucket,
					Key: nameOf(key),
					Body: bytes,
					ContentLength: bytes.byteLength,
					ContentType: contentType
				})
			);
		},
		async get(key) {
			try {
				const answer = await client.send(new GetObjectCommand({ Bucket, Key: nameOf(key) }));
				if (!answer.Body) return null;
				return await answer.Body.transformToByteArray();
			} catch (e) {
				if (missing(e)) return null;
				throw e;
			}
		},
		async getStream(key) {
			try {
				const answer = await client.send(new GetObjectCommand({ Bucket, Key: nameOf(key) }));
				return answer.Body ? answer.Body.transformToWebStream() : null;
			} catch (e) {
				if (missing(e)) return null;
				throw e;
			}
		},
		has,
		async delete(key) {
			await client.send(new DeleteObjectCommand({ Bucket, Key: nameOf(key) }));
		}
	};
}
