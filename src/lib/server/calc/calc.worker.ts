import { isMainThread, parentPort, workerData } from 'node:worker_threads';
import { runCalcJob, type CalcJob } from './jobs';

/*
 * The calculation worker's module. The pool (pool.ts) starts a worker thread on this very file,
 * whose location it learns from `calcWorkerUrl` after importing it dynamically: that import is
 * what makes the bundlers keep the file (and the science it needs) as a chunk of its own in the
 * Vite server build and in adapter-node's bundle alike, and `import.meta.url` is where that chunk
 * lies at run time. In `vite dev` and vitest it is the TypeScript source, loaded through tsx.
 *
 * Imported on the main thread it only reports its URL; in a worker started with the marker below
 * it answers `{ id, job }` messages with `{ id, ok, result | error }`.
 */
export const calcWorkerUrl: string = import.meta.url;

/** workerData that tells this module it is a calculation worker. */
export const CALC_WORKER_MARKER = 'hopline-calc-worker';

/** A reply to the pool. Errors travel as name and message; the pool rebuilds them. */
export type WorkerReply =
	| { type: 'ready' }
	| { type: 'done'; id: number; ok: true; result: unknown }
	| { type: 'done'; id: number; ok: false; error: { name: string; message: string } };

if (!isMainThread && parentPort && workerData === CALC_WORKER_MARKER) {
	const port = parentPort;
	port.on('message', ({ id, job }: { id: number; job: CalcJob }) => {
		let reply: WorkerReply;
		try {
			reply = { type: 'done', id, ok: true, result: runCalcJob(job) };
		} catch (e) {
			const error = e instanceof Error ? e : new Error(String(e));
			reply = { type: 'done', id, ok: false, error: { name: error.name, message: error.message } };
		}
		port.postMessage(reply);
	});
	port.postMessage({ type: 'ready' } satisfies WorkerReply);
}
