import type { AttachmentAnswer } from '$lib/schemas/attachmentResponse';
import type { AttachmentDto } from './attachments';

/** An attachment as pages and the API show it: its row and the URLs of its files. */
export function attachmentAnswer(a: AttachmentDto): AttachmentAnswer {
	const base = `/files/${a.id}`;
	return {
		id: a.id,
		kind: a.kind,
		role: a.role,
		caption: a.caption,
		conditions: a.conditions,
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
			original: `${base}/original`,
			preview: a.preview ? `${base}/preview` : null,
			thumbnail: a.thumbnail ? `${base}/thumbnail` : null,
			data: a.numbers ? `${base}/data` : null
		}
	};
}
