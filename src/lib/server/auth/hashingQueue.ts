import { DomainError } from '$lib/domainError';

/*
 * A small admission queue for expensive work: at most `concurrency` tasks run at once, at most
 * `maxWaiting` more wait their turn (first come, first served), and any beyond that are refused
 * at once with BusyError instead of piling up. Password hashing goes through one (scrypt takes
 * 128 MiB and about a second of CPU per call), so a burst of sign-ins costs bounded memory and
 * a refused caller learns it within milliseconds.
 */
export class BusyError extends DomainError {
	constructor() {
		super('unavailable', 'The server is busy checking other passwords; try again in a moment.');
		this.name = 'BusyError';
	}
}

export class AdmissionQueue {
	private running = 0;
	private readonly waiting: (() => void)[] = [];
	/** Tasks finished (or failed) since start; a count the tests read, never a timing. */
	completed = 0;

	constructor(
		readonly concurrency: number,
		readonly maxWaiting: number
	) {
		if (!Number.isInteger(concurrency) || concurrency < 1)
			throw new RangeError(`concurrency must be a positive integer, got ${concurrency}`);
		if (!Number.isInteger(maxWaiting) || maxWaiting < 0)
			throw new RangeError(`maxWaiting must be a non-negative integer, got ${maxWaiting}`);
	}

	/** Tasks running and waiting now. */
	get load(): { running: number; waiting: number } {
		return { running: this.running, waiting: this.waiting.length };
	}

	/**
	 * Runs `task` when a place is free.
	 * @throws {BusyError} at once when every place and the waiting list are taken.
	 */
	async run<T>(task: () => Promise<T>): Promise<T> {
		if (this.running < this.concurrency) this.running++;
		else if (this.waiting.length < this.maxWaiting)
			// The finishing task hands its place over directly, so `running` stays as it is.
			await new Promise<void>((resolve) => this.waiting.push(resolve));
		else throw new BusyError();
		try {
			return await task();
		} finally {
			this.completed++;
			const next = this.waiting.shift();
			if (next) next();
			else this.running--;
		}
	}
}
