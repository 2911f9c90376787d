import { describe, expect, it } from 'vitest';
import { hashPassword, verifyPassword } from '$lib/server/auth/password';
import { AttemptLimiter } from '$lib/server/auth/rateLimit';
import {
	ForbiddenError,
	ROLES,
	UnauthenticatedError,
	assertRole,
	roleAtLeast,
	type SessionUser
} from '$lib/server/auth/roles';

describe('password hashing (scrypt, RFC 7914)', () => {
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
			limiter.recordFailure('a');
			now += 1000;
		}
		expect(limiter.retryAfterMs('a')).toBe(57_000);
		expect(limiter.retryAfterMs('b')).toBe(0);
		now = 60_001;
		expect(limiter.retryAfterMs('a')).toBe(0);
	});
	it('forgets a key on reset', () => {
		const limiter = new AttemptLimiter(1, 60_000);
		limiter.recordFailure('a');
		expect(limiter.retryAfterMs('a')).toBeGreaterThan(0);
		limiter.reset('a');
		expect(limiter.retryAfterMs('a')).toBe(0);
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
