/**
 * A file refused at upload, with the HTTP status to answer and a message for the contributor
 * that says what was wrong and what to send instead. Never carries the file's content.
 */
export class AttachmentRejectedError extends Error {
	override readonly name = 'AttachmentRejectedError';
	constructor(
		readonly status: 400 | 413 | 415 | 422,
		readonly code:
			| 'empty'
			| 'too_large'
			| 'unsupported_type'
			| 'active_content'
			| 'archive'
			| 'polyglot'
			| 'damaged'
			| 'too_many_pixels'
			| 'decode_failed'
			| 'decode_time_limit'
			| 'unreadable_numbers',
		message: string,
		/** Which of the files sent was refused: the attachment's own, or an image's numbers. */
		readonly part: 'file' | 'numbers' = 'file'
	) {
		super(message);
	}
}
