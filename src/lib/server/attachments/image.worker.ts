import { isMainThread, parentPort, workerData } from 'node:worker_threads';
import { makeRenditions } from './renditions';

/*
 * The attachment worker's module: decodes an image and makes its renditions off the request
 * thread. Started by the pool of src/lib/server/calc/pool.ts (same protocol as calc.worker.ts:
 * a 'ready' message, then `{ id, job }` in and `{ type: 'done', id, ok, result | error }` out),
 * whose running-time limit is the decode time-out. Imported on the main thread it only reports
 * its URL, which is how the bundlers keep it as a chunk of its own (see calc.worker.ts).
 */
export const imageWorkerUrl: string = import.meta.url;
export const IMAGE_WORKER_MARKER = 'hopline-image-worker';

export interface ImageJob {
	bytes: Uint8Array;
	photo: boolean;
}

if (!isMainThread && parentPort && workerData === IMAGE_WORKER_MARKER) {
	const port = parentPort;
	port.on('message', ({ id, job }: { id: number; job: ImageJob }) => {
		makeRenditions(job.bytes, job.photo).then(
			(result) => {
				port.postMessage({ type: 'done', id, ok: true, result }, [
					result.preview.bytes.buffer as ArrayBuffer,
					result.thumbnail.bytes.buffer as ArrayBuffer
				]);
			},
			(e: unknown) => {
				const error = e instanceof Error ? e : new Error(String(e));
				port.postMessage({
					type: 'done',
					id,
					ok: false,
					error: { name: 'DecodeError', message: error.message }
				});
			}
		);
	});
	port.postMessage({ type: 'ready' });
}
