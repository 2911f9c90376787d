import type { IncomingMessage } from 'node:http';
import type { Handle } from '@sveltejs/kit';
import { SPECTRUM_MAX_BYTES } from '$lib/schemas/spectrumData';
import { config } from './config';
import { withHeaders } from './http/headers';

/*
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

/**
 * Where files are attached to a submission: the submission page's `attach` action and the API.
 * One request carries an image (ATTACHMENT_MAX_BYTES), its numbers file (SPECTRUM_MAX_BYTES) and
 * a few text fields.
 */
const ATTACH_API_PATH = /^\/api\/v1\/submissions\/\d+\/attachments$/;
const ATTACH_PAGE_PATH = /^\/submissions\/\d+$/;
const ATTACHMENT_FIELDS_OVERHEAD = 64 * 1024;

/** Whether a request attaches a file to a submission (page action or API). */
export function isAttachRequest(url: URL): boolean {
	return (
		ATTACH_API_PATH.test(url.pathname) ||
		(ATTACH_PAGE_PATH.test(url.pathname) && url.search.startsWith('?/attach'))
	);
}

/** The largest request that attaches a file: both files at their limits and the fields. */
export function attachRequestLimit(): number {
	return config.ATTACHMENT_MAX_BYTES + SPECTRUM_MAX_BYTES + ATTACHMENT_FIELDS_OVERHEAD;
}

/**
 * The refusal of an attaching request by its declared length, or null when it fits: the message
 * names the limits of both files.
 */
export function attachTooLargeMessage(requestBytes: number): string | null {
	if (requestBytes <= attachRequestLimit()) return null;
	return `The upload is ${megabytes(requestBytes)}; the limit is ${megabytes(config.ATTACHMENT_MAX_BYTES)} for the image and ${megabytes(SPECTRUM_MAX_BYTES)} for its numbers file.`;
}

/** What a request may weigh, by where it goes, and how a heavier one is refused. */
export interface BodyLimit {
	bytes: number;
	/** The refusal's words for a request of `length` bytes. */
	message: (length: number) => string;
	/** A page action that says the refusal beside its own file field (still unread). */
	pageAnswers: boolean;
	/** The field an API refusal is said of, if one. */
	field: string | null;
}

export function bodyLimitFor(url: URL): BodyLimit {
	const page = !url.pathname.startsWith('/api/');
	if (isAttachRequest(url))
		return {
			bytes: attachRequestLimit(),
			message: (length) => attachTooLargeMessage(length) as string,
			pageAnswers: page,
			field: 'file'
		};
	if (UPLOAD_PATHS.some((p) => url.pathname.startsWith(p)))
		return {
			bytes: config.UPLOAD_MAX_BYTES + MULTIPART_OVERHEAD,
			message: uploadLimitMessage,
			pageAnswers: page,
			field: null
		};
	return {
		bytes: config.BODY_MAX_BYTES,
		message: (length) =>
			`The request is ${megabytes(length)}; the limit is ${megabytes(config.BODY_MAX_BYTES)}.`,
		pageAnswers: false,
		field: null
	};
}

export const limitRequestSize: Handle = async ({ event, resolve }) => {
	const method = event.request.method;
	if (method === 'GET' || method === 'HEAD' || method === 'OPTIONS') return resolve(event);
	const limit = bodyLimitFor(event.url);
	const header = event.request.headers.get('content-length');
	const length = header === null ? null : Number(header);
	if (length === null && event.request.body !== null) {
		return Response.json(
			{
				error: { code: 'length_required', message: 'Send a Content-Length header with the body.' }
			},
			{ status: 411 }
		);
	}
	if (length !== null && length > limit.bytes) {
		if (limit.pageAnswers) return resolve(event);
		const message = limit.message(length);
		return event.url.pathname.startsWith('/api/')
			? Response.json(
					{
						error: {
							code: 'payload_too_large',
							message,
							...(limit.field ? { fields: { [limit.field]: [message] } } : {})
						}
					},
					{ status: 413 }
				)
			: new Response(message, {
					status: 413,
					headers: { 'content-type': 'text/plain; charset=utf-8' }
				});
	}
	return resolve(event);
};

/** How much of an unread body is read and thrown away before answering, at most. */
const DRAIN_MAX_BYTES = 64 * 1024 * 1024;
const DRAIN_MAX_MS = 5000;

/**
 * Reads and discards what is left of a request body (nothing is kept), until it ends or the
 * bounds above are passed. A client that is still sending when a socket is closed gets a reset
 * instead of the answer (Node's own fetch fails with EPIPE), so the body is drained first.
 */
function drainBody(req: IncomingMessage): Promise<void> {
	if (req.complete || req.destroyed) return Promise.resolve();
	const declared = Number(req.headers['content-length']);
	if (Number.isFinite(declared) && declared > DRAIN_MAX_BYTES) return Promise.resolve();
	return new Promise((resolve) => {
		let bytes = 0;
		const done = () => {
			clearTimeout(timer);
			req.off('data', count).off('end', done).off('close', done);
			resolve();
		};
		const count = (chunk: Buffer) => {
			bytes += chunk.length;
			if (bytes > DRAIN_MAX_BYTES) done();
		};
		const timer = setTimeout(done, DRAIN_MAX_MS);
		// SvelteKit's body stream listens too and would keep every chunk: it is never read now.
		req.removeAllListeners('data');
		req.on('data', count).once('end', done).once('close', done);
		req.resume();
	});
}

/**
 * Closes the connection after a response that left the request body unread: a refusal
 * answered before reading it (the 413s above, a cross-site 403, a 401 from a guard). Node would
 * otherwise keep the socket for the next request with the rest of the body still in it, and
 * that next request would wait and fail. The rest of the body is drained first (within bounds)
 * so that the client reads the answer; `Connection: close` then tells the client and makes Node
 * end the socket once the response is written. Under vite dev there is no Node request to
 * drain; an unread body stream is the sign there.
 */
export const closeIfBodyUnread: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	const node = event.platform?.req;
	if (node ? node.complete : event.request.body === null || event.request.bodyUsed) return response;
	if (node) await drainBody(node);
	return withHeaders(response, { connection: 'close' });
};
