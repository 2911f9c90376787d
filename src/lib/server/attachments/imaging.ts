import { config } from '../config';
import { CalcBusyError, CalcTimeLimitError, CalcWorkerError } from '../calc/errors';
import { WorkerPool } from '../calc/pool';
import { AttachmentRejectedError } from './errors';
import type { ImageJob } from './image.worker';
import type { Renditions } from './renditions';

/*
 * Thumbnails and previews are made in worker threads (one by default: images are rare beside
 * requests, and a second decode would take the core that answers them). The pool's running-time
 * limit is the decode time-out: past it the worker is ended and the upload refused with 422.
 */
let pool: WorkerPool | null = null;

/** A pool of image workers; the app keeps one (below), tests make their own. */
export function createImagePool(timeLimitMs: number, size = 1): WorkerPool {
	return new WorkerPool({
		size,
		queueMax: 8,
		timeLimitMs,
		// A 40 MP image is 160 MB of pixels before resizing; jimp keeps them on the heap.
		memoryMb: 768,
		// Imported dynamically, never statically: see image.worker.ts.
		load: async () => {
			const worker = await import('./image.worker');
			return { url: worker.imageWorkerUrl, workerData: worker.IMAGE_WORKER_MARKER };
		}
	});
}

function imagePool(): WorkerPool {
	pool ??= createImagePool(config.ATTACHMENT_DECODE_TIME_LIMIT_MS);
	return pool;
}

/** Preview and thumbnail of an inspected image, or AttachmentRejectedError (422/503 as a CalcBusyError). */
export async function renderImage(
	bytes: Uint8Array,
	photo: boolean,
	workers: WorkerPool = imagePool()
): Promise<Renditions> {
	try {
		return (await workers.run({ bytes, photo } satisfies ImageJob)) as Renditions;
	} catch (e) {
		if (e instanceof CalcBusyError) throw e;
		if (e instanceof CalcTimeLimitError)
			throw new AttachmentRejectedError(
				422,
				'decode_time_limit',
				`The image could not be decoded within ${Math.round(e.limitMs / 1000)} s; save it smaller or in another format.`
			);
		if (e instanceof CalcWorkerError)
			throw new AttachmentRejectedError(
				422,
				'decode_failed',
				'The image could not be decoded: it is damaged or uses a variant of its format the registry cannot read.'
			);
		throw e;
	}
}

/** Ends the workers (tests, shutdown). */
export async function closeImagePool(): Promise<void> {
	await pool?.close();
	pool = null;
}
