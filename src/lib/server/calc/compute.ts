import type { RequestEvent } from '@sveltejs/kit';
import type { ChainEstimate } from '$lib/catalogue/chainEstimate';
import { config } from '../config';
import { AddressWindow, addressKey } from './addressLimit';
import type { LadderChainInput } from './chainEstimate';
import { CalcBusyError, CalcInputError, CalcRateLimitedError, CalcTimeLimitError } from './errors';
import type { CalcJob, CalcKind, CalcResults } from './jobs';
import { WorkerPool } from './pool';

/*
 * The calculation service: every costly computation (titration fits, tunnelling levels, chain
 * estimates) goes through `calculate`, which runs it in the worker pool, so the thread that
 * answers requests never computes for long. Callers without an account are limited per address.
 */

const pool = new WorkerPool({
	size: config.CALC_WORKERS,
	queueMax: config.CALC_QUEUE_MAX,
	timeLimitMs: config.CALC_TIME_LIMIT_MS,
	memoryMb: config.CALC_WORKER_MEMORY_MB,
	// Imported dynamically, never statically: see calc.worker.ts.
	load: async () => {
		const worker = await import('./calc.worker');
		return { url: worker.calcWorkerUrl, workerData: worker.CALC_WORKER_MARKER };
	}
});

const anonymous = new AddressWindow(config.CALC_ANON_PER_MINUTE, 60_000);

/** Who asks: signed-in users are not counted per address (null key). */
export interface Caller {
	anonymousKey: string | null;
}

export function callerOf(event: Pick<RequestEvent, 'locals' | 'getClientAddress'>): Caller {
	return { anonymousKey: event.locals.user ? null : addressKey(event.getClientAddress()) };
}

/** Refuses a caller over its per-address limit (CalcRateLimitedError); call it before reading a body. */
export function checkCaller(caller: Caller): void {
	if (caller.anonymousKey === null) return;
	const waitMs = anonymous.retryAfterMs(caller.anonymousKey);
	if (waitMs > 0)
		throw new CalcRateLimitedError(Math.ceil(waitMs / 1000), config.CALC_ANON_PER_MINUTE);
}

/** The request field that holds each kind's input, named when the science refuses it. */
const INPUT_FIELD: Record<CalcKind, string> = {
	titration: 'points',
	tunnelling: 'potential',
	chain: 'input',
	structure: 'file',
	structurePairs: 'cutoffA'
};

/**
 * Runs one calculation in a worker and returns its result. Throws CalcRateLimitedError,
 * CalcBusyError, CalcTimeLimitError, CalcWorkerError, CalcInputError (the science refused the
 * input with a RangeError; its message, on the kind's input field) or the science's TypeError.
 * `caller` null: started by the server itself (not counted).
 */
export async function calculate<K extends CalcKind>(
	job: Extract<CalcJob, { kind: K }>,
	caller: Caller | null
): Promise<CalcResults[K]> {
	if (caller) {
		checkCaller(caller);
		if (caller.anonymousKey !== null) anonymous.record(caller.anonymousKey);
	}
	// Structured cloning across the thread boundary loses the static type; jobs.ts pairs each
	// kind with its result, and runCalcJob is checked against that pairing.
	try {
		return (await pool.run(job)) as CalcResults[K];
	} catch (e) {
		if (e instanceof RangeError) throw new CalcInputError(INPUT_FIELD[job.kind], e.message);
		throw e;
	}
}

/** How full the pool is (for benchmarks and tests). */
export const calcPoolStats = () => pool.stats();

/**
 * Chain estimates are the same for the same chain (seeded Monte Carlo), and protein pages are
 * read far more often than they change: the last results are kept, keyed by their input, and a
 * chain being computed is shared by the requests that want it. A chain the reader chose (entry,
 * exit, conditions in the query) is counted against their address when it has to be computed,
 * as any calculator call is; a kept one costs nothing, and the page's default chain is never
 * counted (the server computes it for everyone).
 */
const CHAIN_CACHE_SIZE = 200;
const chainCache = new Map<string, Promise<ChainEstimate>>();

export interface ChainEstimateOutcome {
	estimate: ChainEstimate | null;
	/** Why there is no estimate although the ladder allows one (busy, too long). */
	note: string | null;
	/** True when the note says "try again": a page showing it must not be kept for others. */
	transient: boolean;
}

export async function chainEstimateFor(
	input: LadderChainInput | null,
	caller: Caller | null = null
): Promise<ChainEstimateOutcome> {
	if (!input) return { estimate: null, note: null, transient: false };
	const key = JSON.stringify(input);
	let pending = chainCache.get(key);
	if (pending) {
		chainCache.delete(key); // re-inserted last: most recently used
	} else {
		if (caller) {
			try {
				checkCaller(caller);
			} catch (e) {
				if (!(e instanceof CalcRateLimitedError)) throw e;
				return {
					estimate: null,
					note: `The electron-transit estimate for this choice is not shown: without an account an address may run ${e.perMinute} calculations a minute. Reload the page in ${e.retryAfterSeconds} s, or sign in.`,
					transient: true
				};
			}
		}
		pending = calculate({ kind: 'chain', input }, caller);
		pending.catch(() => chainCache.delete(key)); // failures are not kept
	}
	chainCache.set(key, pending);
	if (chainCache.size > CHAIN_CACHE_SIZE) chainCache.delete(chainCache.keys().next().value!);
	try {
		return { estimate: await pending, note: null, transient: false };
	} catch (e) {
		if (e instanceof CalcBusyError)
			return {
				estimate: null,
				note: `The electron-transit estimate is not shown: the calculators are busy. Reload the page in ${e.retryAfterSeconds} s.`,
				transient: true
			};
		if (e instanceof CalcTimeLimitError)
			return {
				estimate: null,
				note: 'The electron-transit estimate is not shown: this chain is too long to estimate within the time limit.',
				transient: false
			};
		if (e instanceof CalcInputError)
			return {
				estimate: null,
				note: `The electron-transit estimate cannot be computed for this chain: ${e.message}`,
				transient: false
			};
		throw e;
	}
}
