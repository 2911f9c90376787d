import { afterEach, describe, expect, it } from 'vitest';
import { fitNernst, nernstFractionReduced } from '$lib/science';
import { estimateChain, type LadderChainInput } from '$lib/server/calc/chainEstimate';
import { chainEstimateFor } from '$lib/server/calc/compute';
import { config } from '$lib/server/config';
import { CalcBusyError, CalcTimeLimitError, CalcWorkerError } from '$lib/server/calc/errors';
import { runCalcJob, type CalcJob } from '$lib/server/calc/jobs';
import { WorkerPool, type WorkerPoolOptions } from '$lib/server/calc/pool';

// The pool runs real worker threads on the real worker module (loaded through tsx, as in
// `vite dev`). Oracles: the same job run in this thread by runCalcJob / the science functions.

const load: WorkerPoolOptions['load'] = async () => {
	const worker = await import('$lib/server/calc/calc.worker');
	return { url: worker.calcWorkerUrl, workerData: worker.CALC_WORKER_MARKER };
};

const pools: WorkerPool[] = [];
function pool(options: Partial<WorkerPoolOptions> = {}): WorkerPool {
	const p = new WorkerPool({
		size: 1,
		queueMax: 4,
		timeLimitMs: 30_000,
		memoryMb: 256,
		load,
		...options
	});
	pools.push(p);
	return p;
}
afterEach(async () => {
	await Promise.all(pools.splice(0).map((p) => p.close()));
});

const titration: CalcJob = {
	kind: 'titration',
	points: Array.from({ length: 31 }, (_, i) => {
		const e = -500 + i * 15;
		return { potentialMv: e, signal: nernstFractionReduced(e, -260, 1, 298.15) };
	}),
	options: { components: 1, n: 1 }
};

/** About a second of work at the largest grid the schema allows (three 600-point DVR solutions). */
const heavyTunnelling: CalcJob = {
	kind: 'tunnelling',
	request: {
		temperatureK: 298.15,
		isotope: 'H',
		points: 600,
		levels: 20,
		potential: {
			kind: 'double-well',
			barrierKcalMol: 8,
			halfSeparationA: 0.35,
			asymmetryKcalMol: 0
		}
	}
};

const light: CalcJob = {
	kind: 'tunnelling',
	request: { temperatureK: 298.15, isotope: 'H', points: 400, levels: 6, imagFreqCm1: 1000 }
};

describe('calculation worker pool', () => {
	it('returns what the same job returns in this thread', async () => {
		const p = pool();
		const result = await p.run(titration);
		expect(result).toEqual(runCalcJob(titration));
		if (titration.kind !== 'titration') throw new Error('unreachable');
		expect(result).toEqual(fitNernst(titration.points, titration.options));
		expect(p.stats()).toEqual({ workers: 1, running: 0, queued: 0 });
	});

	it('passes the science’s RangeError through as a RangeError with its message', async () => {
		const flat: CalcJob = {
			kind: 'titration',
			points: Array.from({ length: 10 }, (_, i) => ({ potentialMv: i * 10, signal: 1 })),
			options: { components: 1, n: 1 }
		};
		const error = await pool()
			.run(flat)
			.catch((e: unknown) => e);
		expect(error).toBeInstanceOf(RangeError);
		expect((error as RangeError).message).toMatch(/does not change/);
	});

	it('refuses a job at once when every worker is busy and the queue is full', async () => {
		const p = pool({ size: 1, queueMax: 1 });
		// Both are accepted (one runs, one waits) before either can finish.
		const first = p.run(heavyTunnelling);
		const second = p.run(titration);
		const refused = await p.run(titration).catch((e: unknown) => e);
		expect(refused).toBeInstanceOf(CalcBusyError);
		expect((refused as CalcBusyError).retryAfterSeconds).toBeGreaterThanOrEqual(1);
		await expect(first).resolves.toMatchObject({ levels: { massAmu: expect.any(Number) } });
		await expect(second).resolves.toMatchObject({ components: [{ n: 1 }] });
		// Room again once they are done.
		await expect(p.run(titration)).resolves.toBeDefined();
	});

	it('terminates a job past its time limit and answers the next one with a fresh worker', async () => {
		// The heavy job needs about a second; a barrier-only tunnelling factor, microseconds.
		const p = pool({ timeLimitMs: 250 });
		const heavy = p.run(heavyTunnelling).catch((e: unknown) => e);
		const waiting = p.run(light); // queued behind the heavy job: runs on the fresh worker
		const error = await heavy;
		await expect(waiting).resolves.toEqual(runCalcJob(light));
		expect(error).toBeInstanceOf(CalcTimeLimitError);
		expect((error as CalcTimeLimitError).message).toMatch(/stopped after 250 ms/);
		expect(p.stats()).toEqual({ workers: 1, running: 0, queued: 0 });
		await expect(p.run(light)).resolves.toEqual(runCalcJob(light));
	});

	it('fails the waiting jobs, instead of hanging, when the worker cannot start', async () => {
		const p = pool({
			load: async () => ({
				url: new URL('./no-such-worker.js', import.meta.url).href,
				workerData: null
			})
		});
		await expect(p.run(titration)).rejects.toBeInstanceOf(CalcWorkerError);
	});

	it('gives up on a worker that stays alive but never reports ready', async () => {
		const p = pool({
			startupLimitMs: 3000,
			load: async () => ({
				url: 'data:text/javascript,setInterval(() => {}, 1000)',
				workerData: null
			})
		});
		await expect(p.run(titration)).rejects.toThrow(/did not report ready within 3000 ms/);
		expect(p.stats()).toEqual({ workers: 0, running: 0, queued: 0 });
	});
});

describe('protein-page chain estimates (the service’s own pool)', () => {
	const input: LadderChainInput = {
		chain: {
			centres: [
				{ id: 'HL000001', emMv: -400, emSigmaMv: 20 },
				{ id: 'HL000002', emMv: -300, emSigmaMv: 15 },
				{ id: 'HL000003', emMv: -150 }
			],
			hops: [
				{ from: 'HL000001', to: 'HL000002', edgeDistanceA: 9 },
				{ from: 'HL000002', to: 'HL000003', edgeDistanceA: 11 }
			],
			entry: 'HL000001',
			exit: 'HL000003',
			lambdaEv: 0.7,
			temperatureK: 298.15,
			model: 'moser-dutton'
		},
		labels: { HL000001: 'FS1', HL000002: 'FS2', HL000003: 'FS3' },
		used: {},
		conditions: { ph: 7, temperatureK: 298.15 },
		leftOut: []
	};

	it('equals the estimate made in this thread, and is reused for the same chain', async () => {
		const first = await chainEstimateFor(input);
		expect(first).toEqual({ estimate: estimateChain(input), note: null, transient: false });
		const again = await chainEstimateFor(structuredClone(input));
		expect(again.estimate).toBe(first.estimate); // the kept result, not a new computation
		expect(await chainEstimateFor(null)).toEqual({ estimate: null, note: null, transient: false });
	});

	it('counts a chain the reader chose against their address only when it is computed', async () => {
		const caller = { anonymousKey: '192.0.2.77' };
		const variant = (i: number): LadderChainInput => ({
			...input,
			chain: { ...input.chain, lambdaEv: 0.5 + i / 1000 }
		});
		for (let i = 0; i < config.CALC_ANON_PER_MINUTE; i++) {
			const outcome = await chainEstimateFor(variant(i), caller);
			expect(outcome.estimate).not.toBeNull();
		}
		// Over the limit: a new chain is refused with a note no one else may be served…
		const refused = await chainEstimateFor(variant(999), caller);
		expect(refused.estimate).toBeNull();
		expect(refused.transient).toBe(true);
		expect(refused.note).toMatch(/calculations a minute\. Reload the page in \d+ s/);
		// …while a kept one costs nothing, and another address is not affected.
		expect((await chainEstimateFor(variant(0), caller)).estimate).not.toBeNull();
		expect(
			(await chainEstimateFor(variant(999), { anonymousKey: '192.0.2.78' })).estimate
		).not.toBeNull();
	});
});
