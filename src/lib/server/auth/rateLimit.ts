import { fail } from '@sveltejs/kit';
/**
 * Failed sign-in attempts counted per key (an account's e-mail, a client address) over a sliding
 * window. In memory, per server process: a restart forgives everyone, which is acceptable for a
 * brake on password guessing (it is not an audit record).
 */
export class AttemptLimiter {
	private failures = new Map<string, number[]>();

	constructor(
		private readonly maxFailures: number,
		private readonly windowMs: number,
		private readonly now: () => number = Date.now
	) {}

	private recent(key: string): number[] {
		const since = this.now() - this.windowMs;
		const list = (this.failures.get(key) ?? []).filter((t) => t > since);
		if (list.length) this.failures.set(key, list);
		else this.failures.delete(key);
		return list;
	}

	/** Milliseconds until the key may try again; 0 when it may try now. */
	retryAfterMs(key: string): number {
		const list = this.recent(key);
		if (list.length < this.maxFailures) return 0;
		return list[list.length - this.maxFailures]! + this.windowMs - this.now();
	}

	recordFailure(key: string): void {
		this.failures.set(key, [...this.recent(key), this.now()]);
	}

	reset(key: string): void {
		this.failures.delete(key);
	}
}

/** Five wrong passwords per account, thirty per client address, in any fifteen minutes. */
export const accountAttempts = new AttemptLimiter(5, 15 * 60_000);
export const addressAttempts = new AttemptLimiter(30, 15 * 60_000);

/** Requests that send mail (sign-up, reset), counted per client address: ten per fifteen minutes. */
export const mailRequests = new AttemptLimiter(10, 15 * 60_000);

/**
 * Counts a mail-sending request from a client address; the 429 answer for a form action when
 * the address has sent too many, else null.
 */
export function refuseTooManyMailRequests(address: string, values: Record<string, string>) {
	if (mailRequests.retryAfterMs(address) > 0) {
		return fail(429, {
			values,
			errors: { form: ['Too many requests from your address; try again later.'] }
		});
	}
	mailRequests.recordFailure(address);
	return null;
}
