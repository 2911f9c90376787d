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
	| { status: 200; body: Uint8Array<ArrayBuffer>; headers: Record<string, string> }
	| { status: 304; headers: Record<string, string> }
	| { status: 404 };

/**
 * One file of an attachment for `user`: 404 alike for a missing attachment, one they may not
 * see, and a variant it does not have (a data file has no preview). The bytes read back are
 * checked against their SHA-256 name before they are sent.
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
	const body = await store.get(file.sha256);
	if (!body || createHash('sha256').update(body).digest('hex') !== file.sha256)
		throw new Error(`attachment file ${file.sha256} is missing or altered in the store`);
	return { status: 200, body: new Uint8Array(body), headers };
}
