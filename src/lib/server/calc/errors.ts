/* Failures of the calculation service, mapped to HTTP answers by the API handler and the pages. */

/** Every worker is busy and the queue is full: 503 with Retry-After. */
export class CalcBusyError extends Error {
	constructor(readonly retryAfterSeconds: number) {
		super(`The calculators are busy; try again in ${retryAfterSeconds} s.`);
		this.name = 'CalcBusyError';
	}
}

/** The calculation ran past its time limit and its worker was ended: 422. */
export class CalcTimeLimitError extends Error {
	constructor(readonly limitMs: number) {
		super(
			`The calculation was stopped after ${formatSeconds(limitMs)}, its time limit. ` +
				'Send fewer points, a coarser grid or fewer levels.'
		);
		this.name = 'CalcTimeLimitError';
	}
}

/** Too many calculations from one address without signing in: 429 with Retry-After. */
export class CalcRateLimitedError extends Error {
	constructor(
		readonly retryAfterSeconds: number,
		readonly perMinute: number
	) {
		super(
			`Without an account an address may run ${perMinute} calculations a minute; ` +
				`try again in ${retryAfterSeconds} s, or sign in.`
		);
		this.name = 'CalcRateLimitedError';
	}
}

/** A worker failed in a way the calculation itself did not report (it crashed, ran out of memory, or could not start). */
export class CalcWorkerError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'CalcWorkerError';
	}
}

function formatSeconds(ms: number): string {
	return ms < 1000 ? `${ms} ms` : `${Number((ms / 1000).toFixed(1))} s`;
}
