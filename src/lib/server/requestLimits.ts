import type { Handle } from '@sveltejs/kit';
import { config } from './config';

/**
 * Request-size limits, applied before any body is read. adapter-node's own limit is lifted
 * (BODY_SIZE_LIMIT=Infinity in the start scripts) so that these, which know which routes take
 * uploads, answer with a message that says what the limit is.
 */
const UPLOAD_PATHS = ['/submissions/upload', '/api/v1/uploads/'];
/** Room for the multipart envelope and the other form fields around the file. */
const MULTIPART_OVERHEAD = 256 * 1024;

const megabytes = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MB`;

export function uploadLimitMessage(bytes: number): string {
	return `The upload is ${megabytes(bytes)}; the limit is ${megabytes(config.UPLOAD_MAX_BYTES)} per file. Split the file and upload the parts one by one.`;
}

/** The message for a request whose length exceeds the upload limit, or null when it fits. */
export function uploadTooLargeMessage(requestBytes: number): string | null {
	return requestBytes > config.UPLOAD_MAX_BYTES + MULTIPART_OVERHEAD
		? uploadLimitMessage(requestBytes)
		: null;
}

export function bodyLimitFor(pathname: string): { bytes: number; upload: boolean } {
	const upload = UPLOAD_PATHS.some((p) => pathname.startsWith(p));
	return {
		bytes: upload ? config.UPLOAD_MAX_BYTES + MULTIPART_OVERHEAD : config.BODY_MAX_BYTES,
		upload
	};
}

export const limitRequestSize: Handle = async ({ event, resolve }) => {
	const method = event.request.method;
	if (method === 'GET' || method === 'HEAD' || method === 'OPTIONS') return resolve(event);
	const limit = bodyLimitFor(event.url.pathname);
	const header = event.request.headers.get('content-length');
	const length = header === null ? null : Number(header);
	if (length === null && event.request.body !== null) {
		return Response.json(
			{ error: { code: 'bad_request', message: 'Send a Content-Length header with the body.' } },
			{ status: 411 }
		);
	}
	if (length !== null && length > limit.bytes) {
		const message = limit.upload
			? (uploadTooLargeMessage(length) as string)
			: `The request is ${megabytes(length)}; the limit is ${megabytes(config.BODY_MAX_BYTES)}.`;
		// The upload page's own action answers this beside its file field, before reading the body.
		if (limit.upload && !event.url.pathname.startsWith('/api/')) return resolve(event);
		return event.url.pathname.startsWith('/api/')
			? Response.json({ error: { code: 'payload_too_large', message } }, { status: 413 })
			: new Response(message, {
					status: 413,
					headers: { 'content-type': 'text/plain; charset=utf-8' }
				});
	}
	return resolve(event);
};
