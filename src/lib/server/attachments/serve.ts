import { createHash } from 'node:crypto';
import type { Kysely } from 'kysely';
import type { SessionUser } from '../auth/roles';
import type { Database } from '../db/schema';
import { attachmentForReader } from './attachments';
import type { BlobStore } from './storage';

export type FileVariant = 'original' | 'preview' | 'thumbnail' | 'data';

/**
 * Headers of every attachment file: the type detected at upload (never the client's), no
 * sniffing, a download name, a policy under which the file can run nothing even if opened
 * directly (`sandbox`), and caching for ever — the URL's content never changes — but only in
 * the reader's own browser, since who may see a file depends on who asks.
 */
export function fileHeaders(
	mediaType: string,
	sha256: string,
	disposition: { inline: boolean; fileName: string }
): Record<string, string> {
	const ascii = disposition.fileName.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
	return {
		'content-type': mediaType,
		'x-content-type-options': 'nosniff',
		'content-disposition': `${disposition.inline ? 'inline' : 'attachment'}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(disposition.fileName)}`,
		'content-security-policy': "sandbox; default-src 'none'; frame-ancestors 'none'",
		'cache-control': 'private, max-age=31536000, immutable',
		etag: `"${sha256}"`
	};
}

export type ServedFile =
	| { status: 200; body: ReadableStream<Uint8Array>; headers: Record<string, string> }
	| { status: 304; headers: Record<string, string> }
	| { status: 404 };

/**
 * One file of an attachment for `user`: 404 alike for a missing attachment, one they may not
 * see, and a variant it does not have (a data file has no preview). The body is streamed from
 * the store as the client reads it (verifiedStream below), with its Content-Length from the
 * file's row.
 */
export async function serveAttachmentFile(
	db: Kysely<Database>,
	store: BlobStore,
	user: SessionUser | null,
	attachmentId: number,
	variant: FileVariant,
	ifNoneMatch: string | null
): Promise<ServedFile> {
	const a = await attachmentForReader(db, attachmentId, user);
	if (!a) return { status: 404 };
	const file =
		variant === 'original'
			? { sha256: a.sha256, mediaType: a.mediaType }
			: variant === 'preview'
				? a.preview
				: variant === 'thumbnail'
					? a.thumbnail
					: a.numbers && { sha256: a.numbers.sha256, mediaType: 'text/plain; charset=utf-8' };
	if (!file) return { status: 404 };
	const stem = a.fileName.replace(/\.[^.]*$/, '');
	const extension =
		file.mediaType === 'image/png' ? 'png' : file.mediaType === 'image/jpeg' ? 'jpg' : null;
	const fileName =
		variant === 'original'
			? a.fileName
			: variant === 'data'
				? (a.numbers?.fileName ?? `${stem}.txt`)
				: `${stem}-${variant}${extension ? `.${extension}` : ''}`;
	const headers = fileHeaders(file.mediaType, file.sha256, {
		// The original and the numbers download as they were uploaded; renditions are for showing.
		inline: variant === 'preview' || variant === 'thumbnail',
		fileName
	});
	if (ifNoneMatch?.split(',').some((tag) => tag.trim() === headers.etag))
		return { status: 304, headers };
	const blob = await db
		.selectFrom('attachment_blob')
		.select('byte_size')
		.where('sha256', '=', file.sha256)
		.executeTakeFirst();
	const source = blob ? await store.getStream(file.sha256) : null;
	if (!blob || !source) throw new Error(`attachment file ${file.sha256} is missing from the store`);
	return {
		status: 200,
		body: verifiedStream(source, file.sha256, blob.byte_size),
		headers: { ...headers, 'content-length': String(blob.byte_size) }
	};
}

/**
 * `source` passed through as it is read, checked against the SHA-256 that names it and the
 * length its row records. Integrity is kept at read time, not only trusted from the write:
 * a file altered or cut short in the store (a disk fault, a hand edit, a bucket shared with
 * another tool) must never reach a reader as if it were the citable original. Hashing as the
 * bytes pass costs one SHA-256 of the file per download (about 20 ms of CPU for 10 MB, spread
 * over its chunks) and no memory beyond the chunk held back: the last chunk is sent only once
 * the digest and length match. On a mismatch the stream errors instead, so the response ends
 * short of its Content-Length and every client treats the download as failed.
 */
export function verifiedStream(
	source: ReadableStream<Uint8Array>,
	sha256: string,
	byteSize: number
): ReadableStream<Uint8Array> {
	const hash = createHash('sha256');
	let seen = 0;
	let held: Uint8Array | null = null;
	return source.pipeThrough(
		new TransformStream<Uint8Array, Uint8Array>({
			transform(chunk, controller) {
				seen += chunk.byteLength;
				if (seen > byteSize) {
					controller.error(altered(sha256, `is longer than its ${byteSize} bytes`));
					return;
				}
				hash.update(chunk);
				if (held) controller.enqueue(held);
				held = chunk;
			},
			flush(controller) {
				if (seen !== byteSize) {
					controller.error(altered(sha256, `holds ${seen} of its ${byteSize} bytes`));
					return;
				}
				if (hash.digest('hex') !== sha256) {
					controller.error(altered(sha256, 'no longer has the SHA-256 that names it'));
					return;
				}
				if (held) controller.enqueue(held);
			}
		})
	);
}

function altered(sha256: string, why: string): Error {
	const e = new Error(`attachment file ${sha256} in the store ${why}; the download was cut off`);
	console.error(e.message);
	return e;
}
