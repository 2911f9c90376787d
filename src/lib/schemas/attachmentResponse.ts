import { z } from 'zod';
import { ATTACHMENT_KINDS, ATTACHMENT_ROLES, attachmentConditionsSchema } from './attachment';

/*
 * An attachment as the API answers it — in the entry API (a version's frozen list) and the
 * submission API alike: what it shows, its conditions, the original file's name, type, size and
 * SHA-256, and the absolute URLs of its files (/files/{id}/original, preview, thumbnail, data).
 * The URLs answer only those who may see a version listing the attachment.
 */

const sha256 = z
	.string()
	.regex(/^[0-9a-f]{64}$/)
	.describe('SHA-256 of the file, hex.');
const rendition = z
	.strictObject({
		mediaType: z.string(),
		width: z.number().int().nullable(),
		height: z.number().int().nullable(),
		sha256
	})
	.nullable();

export const attachmentAnswerSchema = z.strictObject({
	id: z.number().int().min(1),
	kind: z.enum(ATTACHMENT_KINDS),
	role: z
		.enum(ATTACHMENT_ROLES)
		.describe('image (shown, with preview and thumbnail), data (numbers only) or structure.'),
	caption: z.string(),
	conditions: attachmentConditionsSchema.describe(
		'Acquisition conditions as stated by the contributor (null: not stated).'
	),
	fileName: z.string(),
	mediaType: z.string().describe('The type read from the file’s bytes, as it is served.'),
	byteSize: z.number().int().min(0),
	sha256,
	width: z.number().int().nullable(),
	height: z.number().int().nullable(),
	preview: rendition.describe('At most 1280 px, without metadata; null unless an image.'),
	thumbnail: rendition.describe('At most 320 px; null unless an image.'),
	numbers: z
		.strictObject({ fileName: z.string(), byteSize: z.number().int().min(0), sha256 })
		.nullable()
		.describe('The spectrum’s numbers (two-column text), when given.'),
	urls: z
		.strictObject({
			original: z.string().describe('The file as uploaded (downloaded as an attachment).'),
			preview: z.string().nullable(),
			thumbnail: z.string().nullable(),
			data: z.string().nullable().describe('The spectrum’s numbers, when given.')
		})
		.describe('Absolute URLs; the visibility of the listing version applies to each.')
});
export type AttachmentAnswer = z.infer<typeof attachmentAnswerSchema>;
