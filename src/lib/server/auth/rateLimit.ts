import { config } from '../config';

/**
 * Attempts counted per key (an account's e-mail, a client address, a mail recipient) over a
 * sliding window. In memory, per server process: a restart forgives everyone, which is
 * acceptable for a brake on guessing and mail sending (it is not an audit record).
 */
export class AttemptLimiter {
	private attempts = new Map<string, number[]>();
	/** Keys are swept of expired attempts whenever the map grows past this many. */
	private sweepAt = 10_000;

	constructor(
		private readonly maxAttempts: number,
		private readonly windowMs: number,
		private readonly now: () => number = Date.now
	) {}

	private recent(key: string): number[] {
		const since = this.now() - this.windowMs;
		const list = (this.attempts.get(key) ?? []).filter((t) => t > since);
		if (list.length) this.attempts.set(key, list);
		else this.attempts.delete(key);
		return list;
	}

	/** Milliseconds until the key may try again; 0 when it may try now. */
	retryAfterMs(key: string): number {
		const list = this.recent(key);
		if (list.length < this.maxAttempts) return 0;
		return list[list.length - this.maxAttempts]! + this.windowMs - this.now();
	}

	/**
	 * The key's standing now: attempts it may still make in the window, and the milliseconds
	 * until its oldest counted attempt leaves the window (one more becomes possible then; 0 when
	 * none is counted).
	 */
	quota(key: string): { remaining: number; resetMs: number } {
		const list = this.recent(key);
		return {
			remaining: Math.max(0, this.maxAttempts - list.length),
			resetMs: list.length ? Math.max(0, list[0]! + this.windowMs - this.now()) : 0
		};
	}

	record(key: string): void {
		const list = this.recent(key);
		list.push(this.now());
		this.attempts.set(key, list);
		this.sweepIfLarge();
	}

	/**
	 * Counts an attempt if the key may make one now, in one pass over its attempts: the wait
	 * (0 when counted) and its standing afterwards, as `retryAfterMs`, `record` and `quota` would
	 * give them in turn.
	 */
	take(key: string): { waitMs: number; remaining: number; resetMs: number } {
		const list = this.recent(key);
		const now = this.now();
		let waitMs = 0;
		if (list.length < this.maxAttempts) {
			list.push(now);
			this.attempts.set(key, list);
			this.sweepIfLarge();
		} else waitMs = list[list.length - this.maxAttempts]! + this.windowMs - now;
		return {
			waitMs,
			remaining: Math.max(0, this.maxAttempts - list.length),
			resetMs: list.length ? Math.max(0, list[0]! + this.windowMs - now) : 0
		};
	}

	private sweepIfLarge(): void {
		if (this.attempts.size <= this.sweepAt) return;
		for (const k of [...this.attempts.keys()]) this.recent(k);
		this.sweepAt = Math.max(10_000, 2 * this.attempts.size);
	}

	/** Takes back the latest attempt (one that turned out not to count). */
	forgiveOne(key: string): void {
		const list = this.recent(key);
		list.pop();
		if (list.length) this.attempts.set(key, list);
		else this.attempts.delete(key);
	}

	reset(key: string): void {
		this.attempts.delete(key);
	}

	/** Keys currently remembered (for tests of the sweep). */
	get size(): number {
		return this.attempts.size;
	}
}

const WINDOW_MS = config.AUTH_LIMIT_WINDOW_MINUTES * 60_000;

/** Failed password sign-ins per account (its e-mail) and per client address. */
export const accountAttempts = new AttemptLimiter(config.SIGNIN_FAILURES_PER_ACCOUNT, WINDOW_MS);
export const addressAttempts = new AttemptLimiter(config.SIGNIN_FAILURES_PER_ADDRESS, WINDOW_MS);

/** Requests per personal API token (http/bearer.ts), keyed by the token's id. */
export const apiTokenRequests = new AttemptLimiter(
	config.API_TOKEN_RATE_LIMIT,
	config.API_TOKEN_RATE_WINDOW_SECONDS * 1000
);

/** Requests that send mail (sign-in links, sign-up, reset), per client address and per recipient. */
export const mailsPerClient = new AttemptLimiter(config.MAIL_REQUESTS_PER_ADDRESS, WINDOW_MS);
export const mailsPerRecipient = new AttemptLimiter(config.MAIL_REQUESTS_PER_RECIPIENT, WINDOW_MS);

/**
 * Counts a request that may send mail to `recipient` from `client`, whether or not an account
 * exists for the recipient (so the count reveals nothing).
 * @returns 0 when it may go ahead (and it is counted), else the milliseconds to wait.
 */
export function takeMailRequest(client: string, recipient: string): number {
	const key = recipient.trim().toLowerCase();
	const wait = Math.max(mailsPerClient.retryAfterMs(client), mailsPerRecipient.retryAfterMs(key));
	if (wait > 0) return wait;
	mailsPerClient.record(client);
	mailsPerRecipient.record(key);
	return 0;
}

export const TOO_MANY_MAIL_REQUESTS =
	'Too many requests for mail from your address or to this one; try again later.';
