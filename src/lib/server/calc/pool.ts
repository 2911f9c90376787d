import { Worker } from 'node:worker_threads';
import { CalcBusyError, CalcTimeLimitError, CalcWorkerError } from './errors';
import type { WorkerReply } from './calc.worker';

/*
 * A fixed set of worker threads with a bounded queue and a running-time limit per job.
 *
 * - `size` workers, each started on first need and kept; an idle worker does not keep the
 *   process alive (unref), so a server stops as it did before.
 * - At most `queueMax` jobs wait for a worker; one more is refused at once with CalcBusyError
 *   (503 + Retry-After), which keeps memory and waiting times bounded under load.
 * - A job's clock starts when a ready worker receives it (waiting and worker start-up are not
 *   counted). Past `timeLimitMs` the worker is terminated — the only way to stop synchronous
 *   code — the job fails with CalcTimeLimitError, and a fresh worker is started for the next job.
 * - Each worker's heap is capped (`memoryMb`); a worker that crashes or runs out of memory fails
 *   its job with CalcWorkerError and is replaced.
 *
 * Written on node:worker_threads directly rather than a pool package: the limit must count
 * running time only, the worker must be loaded through tsx in development, and both needed
 * the start-up handshake below; the whole is about as long as the glue a package would need.
 */

interface WorkerModule {
	url: string;
	workerData: unknown;
}

export interface WorkerPoolOptions {
	size: number;
	queueMax: number;
	timeLimitMs: number;
	memoryMb: number;
	/**
	 * Where the worker module is and the workerData that switches it on. Asynchronous because
	 * the module's URL is learnt by importing it (see calc.worker.ts).
	 */
	load: () => Promise<WorkerModule>;
	/**
	 * Time a new worker may take to load its module and report ready (tsx compiles it first in
	 * development). @default 30000
	 */
	startupLimitMs?: number;
}

interface Task {
	id: number;
	job: unknown;
	resolve: (result: unknown) => void;
	reject: (error: Error) => void;
}

interface Slot {
	worker: Worker | null;
	ready: boolean;
	task: Task | null;
	timer: ReturnType<typeof setTimeout> | null;
	startedAt: number;
}

export interface PoolStats {
	workers: number;
	running: number;
	queued: number;
}

export class WorkerPool {
	private readonly slots: Slot[];
	private readonly queue: Task[] = [];
	private nextId = 1;
	private loading: Promise<WorkerModule> | null = null;
	private module: WorkerModule | null = null;
	/** Moving average of running times, ms, for Retry-After. */
	private meanRunMs = 1000;
	private closed = false;

	constructor(private readonly options: WorkerPoolOptions) {
		this.slots = Array.from({ length: options.size }, () => ({
			worker: null,
			ready: false,
			task: null,
			timer: null,
			startedAt: 0
		}));
	}

	/** Runs a job in a worker: its result, or the error it threw (RangeError and TypeError kept as such). */
	async run(job: unknown): Promise<unknown> {
		this.loading ??= this.options.load().catch((e: unknown) => {
			this.loading = null; // the next job tries again
			throw e;
		});
		this.module = await this.loading;
		if (this.closed) throw new CalcWorkerError('the calculation pool is closed');
		const { running, queued } = this.stats();
		if (running + queued >= this.options.size + this.options.queueMax) {
			throw new CalcBusyError(this.retryAfterSeconds());
		}
		return new Promise((resolve, reject) => {
			this.queue.push({ id: this.nextId++, job, resolve, reject });
			this.pump();
		});
	}

	stats(): PoolStats {
		return {
			workers: this.slots.filter((s) => s.worker !== null).length,
			running: this.slots.filter((s) => s.task !== null).length,
			queued: this.queue.length
		};
	}

	/** Seconds until a refused job is likely to find room: the work ahead of it at the average pace. */
	retryAfterSeconds(): number {
		const { running, queued } = this.stats();
		const ahead = ((running + queued) * this.meanRunMs) / this.options.size;
		const ceiling = (this.options.timeLimitMs * (this.options.queueMax + 1)) / this.options.size;
		return Math.max(1, Math.ceil(Math.min(ahead, ceiling) / 1000));
	}

	/** Ends every worker and fails the waiting jobs. */
	async close(): Promise<void> {
		this.closed = true;
		for (const task of this.queue.splice(0))
			task.reject(new CalcWorkerError('the calculation pool is closed'));
		await Promise.all(
			this.slots.map(async (slot) => {
				const worker = slot.worker;
				slot.task?.reject(new CalcWorkerError('the calculation pool is closed'));
				this.clear(slot);
				slot.worker = null; // so that its exit is not taken for a crash
				slot.ready = false;
				if (worker) await worker.terminate();
			})
		);
	}

	private pump(): void {
		const module = this.module;
		if (!module || this.closed) return;
		let starting = this.slots.filter((s) => s.worker && !s.ready).length;
		for (const slot of this.slots) {
			if (this.queue.length === 0) return;
			if (slot.task) continue;
			if (slot.worker && slot.ready) this.start(slot, this.queue.shift() as Task);
			else if (!slot.worker && starting < this.queue.length) {
				this.spawn(slot, module); // its 'ready' message pumps again
				starting++;
			}
		}
	}

	private spawn(slot: Slot, module: WorkerModule): void {
		const url = new URL(module.url);
		const options = {
			workerData: module.workerData,
			resourceLimits: { maxOldGenerationSizeMb: this.options.memoryMb }
		};
		// In `vite dev` and vitest the module is TypeScript source: a two-line bootstrap registers
		// tsx (a devDependency, resolved from the project folder; it also maps $lib through
		// tsconfig) in the worker and imports it. `execArgv: ['--import', 'tsx']` does not reach
		// module loading in a worker thread on Node 20.
		const worker = url.pathname.endsWith('.ts')
			? new Worker(
					`import('tsx/esm/api').then((tsx) => { tsx.register(); return import(${JSON.stringify(url.href)}); });`,
					{ ...options, eval: true }
				)
			: new Worker(url, options);
		slot.worker = worker;
		slot.ready = false;
		// A worker that never reports ready (a wrong module) must not hold the queue for ever.
		const startupLimitMs = this.options.startupLimitMs ?? 30_000;
		const startup = setTimeout(() => {
			lost(`it did not report ready within ${startupLimitMs} ms`);
			void worker.terminate();
		}, startupLimitMs);
		startup.unref();
		worker.on('message', (reply: WorkerReply) => {
			if (slot.worker !== worker) return;
			if (reply.type === 'ready') {
				clearTimeout(startup);
				slot.ready = true;
				if (this.queue.length) this.pump();
				else worker.unref();
				return;
			}
			const task = slot.task;
			if (!task || task.id !== reply.id) return;
			this.meanRunMs = 0.8 * this.meanRunMs + 0.2 * (performance.now() - slot.startedAt);
			this.clear(slot);
			if (reply.ok) task.resolve(reply.result);
			else task.reject(rebuildError(reply.error));
			if (this.queue.length) this.pump();
			else worker.unref();
		});
		const lost = (reason: string) => {
			clearTimeout(startup);
			if (slot.worker !== worker) return; // terminated on purpose
			const task = slot.task;
			const wasReady = slot.ready;
			this.clear(slot);
			slot.worker = null;
			slot.ready = false;
			const error = new CalcWorkerError(`a calculation worker failed: ${reason}`);
			console.error('[calc]', error.message);
			if (task) task.reject(error);
			else if (!wasReady) {
				// It could not even start (a missing or broken worker file): fail the waiting jobs
				// rather than retrying forever; the next job tries again.
				for (const waiting of this.queue.splice(0)) waiting.reject(error);
			}
			this.pump();
		};
		worker.on('error', (e) => lost(e.message));
		worker.on('exit', (code) => lost(`exited with code ${code}`));
	}

	private start(slot: Slot, task: Task): void {
		const worker = slot.worker as Worker;
		slot.task = task;
		slot.startedAt = performance.now();
		worker.ref();
		slot.timer = setTimeout(() => {
			slot.worker = null;
			slot.ready = false;
			this.clear(slot);
			void worker.terminate();
			task.reject(new CalcTimeLimitError(this.options.timeLimitMs));
			this.meanRunMs = 0.8 * this.meanRunMs + 0.2 * this.options.timeLimitMs;
			this.pump();
		}, this.options.timeLimitMs);
		worker.postMessage({ id: task.id, job: task.job });
	}

	private clear(slot: Slot): void {
		if (slot.timer) clearTimeout(slot.timer);
		slot.timer = null;
		slot.task = null;
	}
}

function rebuildError(error: { name: string; message: string }): Error {
	if (error.name === 'RangeError') return new RangeError(error.message);
	if (error.name === 'TypeError') return new TypeError(error.message);
	return new CalcWorkerError(`${error.name}: ${error.message}`);
}
