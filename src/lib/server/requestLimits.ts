import type { IncomingMessage } from 'node:http';
import type { Handle } from '@sveltejs/kit';
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
			{
				error: { code: 'length_required', message: 'Send a Content-Length header with the body.' }
			},
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
