import { describe, expect, it } from 'vitest';
import { hashPassword, verifyPassword } from '$lib/server/auth/password';
import { AdmissionQueue, BusyError } from '$lib/server/auth/hashingQueue';
import { AttemptLimiter } from '$lib/server/auth/rateLimit';
import {
	ForbiddenError,
	ROLES,
	UnauthenticatedError,
	assertRole,
	roleAtLeast,
	type SessionUser
} from '$lib/server/auth/roles';

// Each scrypt hash takes 1–2 s on a busy 2-core machine; these tests check results, not speed.
describe('password hashing (scrypt, RFC 7914)', { timeout: 30_000 }, () => {
	it('verifies the right password and refuses a wrong one', async () => {
		const stored = await hashPassword('correct horse battery');
		expect(stored).toMatch(/^scrypt\$131072\$8\$1\$[A-Za-z0-9+/=]+\$[A-Za-z0-9+/=]+$/);
		expect(await verifyPassword('correct horse battery', stored)).toBe(true);
		expect(await verifyPassword('correct horse batterz', stored)).toBe(false);
	});
	it('salts every hash, so equal passwords never store alike', async () => {
		expect(await hashPassword('same password')).not.toBe(await hashPassword('same password'));
	});
	it('treats missing or malformed hashes as a mismatch', async () => {
		expect(await verifyPassword('x', null)).toBe(false);
		expect(await verifyPassword('x', 'md5$abc')).toBe(false);
	});
	it('normalises Unicode so composed and decomposed forms match', async () => {
		const stored = await hashPassword('caf\u00e9-password');
		expect(await verifyPassword('cafe\u0301-password', stored)).toBe(true);
	});
});

describe('attempt limiter', () => {
	it('allows N failures per window, then asks to wait until the oldest expires', () => {
		let now = 0;
		const limiter = new AttemptLimiter(3, 60_000, () => now);
		for (let i = 0; i < 3; i++) {
			expect(limiter.retryAfterMs('a')).toBe(0);
			limiter.record('a');
			now += 1000;
		}
		expect(limiter.retryAfterMs('a')).toBe(57_000);
		expect(limiter.retryAfterMs('b')).toBe(0);
		now = 60_001;
		expect(limiter.retryAfterMs('a')).toBe(0);
	});
	it('forgets a key on reset', () => {
		const limiter = new AttemptLimiter(1, 60_000);
		limiter.record('a');
		expect(limiter.retryAfterMs('a')).toBeGreaterThan(0);
		limiter.reset('a');
		expect(limiter.retryAfterMs('a')).toBe(0);
	});
});

describe('attempt limiter: quota (RateLimit-Remaining and -Reset of API tokens)', () => {
	it('counts down what is left and says when the oldest counted attempt leaves the window', () => {
		let now = 0;
		const limiter = new AttemptLimiter(3, 60_000, () => now);
		expect(limiter.quota('t')).toEqual({ remaining: 3, resetMs: 0 });
		limiter.record('t');
		now = 10_000;
		limiter.record('t');
		// Oldest at 0 leaves the window at 60 000: 50 000 ms from now.
		expect(limiter.quota('t')).toEqual({ remaining: 1, resetMs: 50_000 });
		limiter.record('t');
		expect(limiter.quota('t')).toEqual({ remaining: 0, resetMs: 50_000 });
		expect(limiter.retryAfterMs('t')).toBe(50_000);
		now = 60_001;
		expect(limiter.quota('t')).toEqual({ remaining: 1, resetMs: 9_999 });
	});
});

describe('attempt limiter: taking back and sweeping', () => {
	it('forgiveOne takes back the latest attempt only', () => {
		const limiter = new AttemptLimiter(2, 60_000);
		limiter.record('a');
		limiter.record('a');
		expect(limiter.retryAfterMs('a')).toBeGreaterThan(0);
		limiter.forgiveOne('a');
		expect(limiter.retryAfterMs('a')).toBe(0);
		limiter.forgiveOne('a');
		limiter.forgiveOne('a');
		expect(limiter.size).toBe(0);
	});
	it('forgets keys whose attempts expired once many keys pile up', () => {
		let now = 0;
		const limiter = new AttemptLimiter(5, 1000, () => now);
		for (let i = 0; i < 10_000; i++) limiter.record(`old-${i}`);
		now = 2000;
		limiter.record('fresh');
		expect(limiter.size).toBe(1);
	});
});

describe('admission queue (password hashing)', () => {
	/** A task that finishes when told to. */
	function gate() {
		let open!: () => void;
		const opened = new Promise<void>((resolve) => (open = resolve));
		return { open, task: () => opened };
	}

	it('runs at most `concurrency` at once, queues `maxWaiting` more, refuses the rest at once', async () => {
		const queue = new AdmissionQueue(2, 3);
		const gates = Array.from({ length: 5 }, gate);
		const started: number[] = [];
		const runs = gates.map((g, i) =>
			queue.run(async () => {
				started.push(i);
				await g.task();
				return i;
			})
		);
		await expect(queue.run(async () => 'late')).rejects.toBeInstanceOf(BusyError);
		await Promise.resolve();
		expect(started).toEqual([0, 1]);
		expect(queue.load).toEqual({ running: 2, waiting: 3 });
		gates[0]!.open();
		await runs[0];
		await Promise.resolve();
		expect(started).toEqual([0, 1, 2]);
		expect(queue.load).toEqual({ running: 2, waiting: 2 });
		for (const g of gates) g.open();
		expect(await Promise.all(runs)).toEqual([0, 1, 2, 3, 4]);
		expect(queue.load).toEqual({ running: 0, waiting: 0 });
		expect(queue.completed).toBe(5);
	});
	it('frees the place of a task that fails', async () => {
		const queue = new AdmissionQueue(1, 0);
		await expect(queue.run(() => Promise.reject(new Error('boom')))).rejects.toThrow('boom');
		expect(await queue.run(async () => 'next')).toBe('next');
	});
	it('refuses nonsense sizes', () => {
		expect(() => new AdmissionQueue(0, 1)).toThrow(RangeError);
		expect(() => new AdmissionQueue(1, -1)).toThrow(RangeError);
	});
});

describe('roles', () => {
	const user = (role: SessionUser['role']): SessionUser => ({
		id: 'u',
		email: 'u@x.test',
		name: null,
		role,
		groupIds: []
	});
	it('are ordered reader < contributor < curator < admin', () => {
		for (const [i, role] of ROLES.entries()) {
			for (const [j, least] of ROLES.entries()) expect(roleAtLeast(role, least)).toBe(i >= j);
		}
	});
	it('assertRole: signed out is unauthenticated, a lower role is forbidden', () => {
		expect(() => assertRole(null, 'reader')).toThrow(UnauthenticatedError);
		expect(() => assertRole(user('contributor'), 'curator')).toThrow(ForbiddenError);
		expect(() => assertRole(user('admin'), 'curator')).not.toThrow();
	});
});
