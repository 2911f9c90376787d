import { attachmentConditionsSchema } from '$lib/schemas/attachment';
import type { AttachmentAnswer } from '$lib/schemas/attachmentResponse';
import type { AttachmentDto } from './attachments';

export interface AttachmentUrls {
	original: string;
	preview: string | null;
	thumbnail: string | null;
	data: string | null;
}

/** The file URLs of an attachment, root-relative (pages); the API makes them absolute. */
export function attachmentUrls(a: AttachmentDto): AttachmentUrls {
	const base = `/files/${a.id}`;
	return {
		original: `${base}/original`,
		preview: a.preview ? `${base}/preview` : null,
		thumbnail: a.thumbnail ? `${base}/thumbnail` : null,
		data: a.numbers ? `${base}/data` : null
	};
}

/**
 * An attachment as the API answers it (entry and submission APIs alike), its URLs absolute
 * against `base` as permalinks are. The stored conditions were checked by the same schema on
 * upload, so parsing them again only fills defaults.
 */
export function attachmentAnswer(a: AttachmentDto, base: URL): AttachmentAnswer {
	const urls = attachmentUrls(a);
	const absolute = (path: string | null) => (path === null ? null : new URL(path, base).href);
	const conditions = attachmentConditionsSchema.safeParse(a.conditions);
	return {
		id: a.id,
		kind: a.kind,
		role: a.role,
		caption: a.caption,
		conditions: conditions.success ? conditions.data : attachmentConditionsSchema.parse({}),
		fileName: a.fileName,
		mediaType: a.mediaType,
		byteSize: a.byteSize,
		sha256: a.sha256,
		width: a.width,
		height: a.height,
		preview: a.preview && { ...a.preview },
		thumbnail: a.thumbnail && { ...a.thumbnail },
		numbers: a.numbers && { ...a.numbers },
		urls: {
			original: new URL(urls.original, base).href,
			preview: absolute(urls.preview),
			thumbnail: absolute(urls.thumbnail),
			data: absolute(urls.data)
		}
	};
}
