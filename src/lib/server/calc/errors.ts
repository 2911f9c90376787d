import { DomainError } from '$lib/domainError';

/* Failures of the calculation service; their codes decide the HTTP answer (see `DomainError`). */

/** Every worker is busy and the queue is full: 503 with Retry-After. */
export class CalcBusyError extends DomainError {
	declare readonly retryAfterSeconds: number;

	constructor(retryAfterSeconds: number) {
		super('unavailable', `The calculators are busy; try again in ${retryAfterSeconds} s.`, {
			retryAfterSeconds
		});
		this.name = 'CalcBusyError';
	}
}

/** The calculation ran past its time limit and its worker was ended: 422. */
export class CalcTimeLimitError extends DomainError {
	constructor(readonly limitMs: number) {
		super(
			'time_limit_exceeded',
			`The calculation was stopped after ${formatSeconds(limitMs)}, its time limit. ` +
				'Send fewer points, a coarser grid or fewer levels.'
		);
		this.name = 'CalcTimeLimitError';
	}
}

/** Too many calculations from one address without signing in: 429 with Retry-After. */
export class CalcRateLimitedError extends DomainError {
	declare readonly retryAfterSeconds: number;

	constructor(
		retryAfterSeconds: number,
		readonly perMinute: number
	) {
		super(
			'too_many_requests',
			`Without an account an address may run ${perMinute} calculations a minute; ` +
				`try again in ${retryAfterSeconds} s, or sign in.`,
			{ retryAfterSeconds }
		);
		this.name = 'CalcRateLimitedError';
	}
}

/**
 * The science refused the input (its RangeError), for a job whose input is valid by schema:
 * 400, the message beside the field that holds the input (`field`).
 */
export class CalcInputError extends DomainError {
	constructor(
		readonly field: string,
		message: string
	) {
		super('bad_request', message, { fields: { [field]: [message] } });
		this.name = 'CalcInputError';
	}
}

/**
 * A worker failed in a way the calculation itself did not report (it crashed, ran out of memory,
 * or could not start). Not a DomainError: it is a fault of the server, answered as a logged 500.
 */
export class CalcWorkerError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'CalcWorkerError';
	}
}

function formatSeconds(ms: number): string {
	return ms < 1000 ? `${ms} ms` : `${Number((ms / 1000).toFixed(1))} s`;
}
