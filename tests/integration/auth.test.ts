import type { Kysely } from 'kysely';
import { randomBytes, scryptSync } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { setUserDisabled } from '$lib/server/admin/accounts';
import { passwordHashing } from '$lib/server/auth/password';
import { checkPasswordSignIn } from '$lib/server/auth/passwordSignIn';
import { accountAttempts, addressAttempts } from '$lib/server/auth/rateLimit';
import { registerAccount, resetPassword } from '$lib/server/auth/selfService';
import { endAllSessions, endSession, sessionIsLive, startSession } from '$lib/server/auth/sessions';
import { issueToken } from '$lib/server/auth/tokens';
import { insertPasswordUser } from '$lib/server/auth/users';
import type { Database } from '$lib/server/db/schema';
import { createTempDatabase } from '../support/tempDb';

let db: Kysely<Database>;
let remove: () => Promise<void>;
beforeAll(async () => ({ db, remove } = await createTempDatabase()));
afterAll(async () => remove?.());

/**
 * A stored hash in the app's format (`scrypt$N$r$p$salt$hash`, see auth/password.ts) made with
 * N = 2^10 instead of 2^17, computed here independently with node:crypto, so that tests which
 * check many wrong passwords against an existing account do not spend seconds on each.
 */
function cheapHash(password: string): string {
	const salt = randomBytes(16);
	const key = scryptSync(password.normalize('NFKC'), salt, 32, { N: 1024, r: 8, p: 1 });
	return ['scrypt', 1024, 8, 1, salt.toString('base64'), key.toString('base64')].join('$');
}

async function account(email: string, password: string, verified = true): Promise<string> {
	const id = await insertPasswordUser(db, {
		email,
		name: email.split('@')[0]!,
		passwordHash: cheapHash(password),
		role: 'contributor',
		verified
	});
	if (!id) throw new Error(`${email} exists`);
	return id;
}

/** Holds every place of the hashing queue (running and waiting) until released. */
function fillHashingQueue(): () => Promise<void> {
	let release!: () => void;
	const gate = new Promise<void>((resolve) => (release = resolve));
	const held: Promise<unknown>[] = [];
	for (let i = 0; i < passwordHashing.concurrency + passwordHashing.maxWaiting; i++)
		held.push(passwordHashing.run(() => gate));
	return async () => {
		release();
		await Promise.all(held);
	};
}

describe('password sign-in check (one place for the form and /auth/callback/password)', () => {
	it('refuses the right password once the account has five recent failures', async () => {
		await account('guessed@lab.test', 'the-right-password');
		const attempt = (password: string) =>
			checkPasswordSignIn(db, {
				email: 'guessed@lab.test',
				password,
				clientAddress: '192.0.2.1'
			});
		for (let i = 0; i < 5; i++) expect((await attempt(`wrong-${i}`)).ok).toBe(false);
		const refused = await attempt('the-right-password');
		expect(refused).toMatchObject({ ok: false, reason: 'limited' });
		expect(
			refused.ok === false && refused.reason === 'limited' && refused.retryAfterMs
		).toBeGreaterThan(0);
		accountAttempts.reset('guessed@lab.test');
		expect(await attempt('the-right-password')).toMatchObject({ ok: true });
	});

	it('counts concurrent guesses before hashing, so a burst cannot slip past the limit', async () => {
		await account('burst@lab.test', 'the-right-password');
		const outcomes = await Promise.all(
			Array.from({ length: 8 }, (_, i) =>
				checkPasswordSignIn(db, {
					email: 'burst@lab.test',
					password: `guess-${i}`,
					clientAddress: '192.0.2.2'
				})
			)
		);
		const reasons = outcomes.map((o) => (o.ok ? 'ok' : o.reason));
		expect(reasons.filter((r) => r === 'wrong')).toHaveLength(5);
		expect(reasons.filter((r) => r === 'limited')).toHaveLength(3);
	});

	it('limits failures per client address across accounts (30 in the window)', async () => {
		for (let i = 0; i < 7; i++) await account(`spray-${i}@lab.test`, 'the-right-password');
		const outcomes = [];
		for (let i = 0; i < 31; i++)
			outcomes.push(
				await checkPasswordSignIn(db, {
					email: `spray-${i % 7}@lab.test`,
					password: `wrong-${i}`,
					clientAddress: '192.0.2.3'
				})
			);
		expect(outcomes.slice(0, 30).every((o) => !o.ok && o.reason === 'wrong')).toBe(true);
		expect(outcomes[30]).toMatchObject({ ok: false, reason: 'limited' });
		addressAttempts.reset('192.0.2.3');
	});

	it('hashes once for an unknown account too (no timing difference to find accounts by)', async () => {
		const before = passwordHashing.completed;
		const outcome = await checkPasswordSignIn(db, {
			email: 'nobody@lab.test',
			password: 'whatever-it-is',
			clientAddress: '192.0.2.4'
		});
		expect(outcome).toEqual({ ok: false, reason: 'wrong' });
		expect(passwordHashing.completed - before).toBe(1);
	});

	it('hashes for a disabled account too, and refuses it like a wrong password', async () => {
		const id = await account('disabled@lab.test', 'the-right-password');
		await db
			.updateTable('User')
			.set({ disabledAt: new Date().toISOString() })
			.where('id', '=', id)
			.execute();
		const before = passwordHashing.completed;
		const outcome = await checkPasswordSignIn(db, {
			email: 'disabled@lab.test',
			password: 'the-right-password',
			clientAddress: '192.0.2.5'
		});
		expect(outcome).toEqual({ ok: false, reason: 'wrong' });
		expect(passwordHashing.completed - before).toBe(1);
	});

	it('says "confirm your address" only to someone who knows the password', async () => {
		await account('unconfirmed@lab.test', 'the-right-password', false);
		const check = (password: string) =>
			checkPasswordSignIn(db, {
				email: 'unconfirmed@lab.test',
				password,
				clientAddress: '192.0.2.6'
			});
		expect(await check('a-wrong-password')).toEqual({ ok: false, reason: 'wrong' });
		expect(await check('the-right-password')).toEqual({ ok: false, reason: 'unverified' });
	});

	it('refuses at once as busy when the hashing queue is full, without counting a failure', async () => {
		await account('queued@lab.test', 'the-right-password');
		const release = fillHashingQueue();
		const outcome = await checkPasswordSignIn(db, {
			email: 'queued@lab.test',
			password: 'the-right-password',
			clientAddress: '192.0.2.7'
		});
		await release();
		expect(outcome).toEqual({ ok: false, reason: 'busy' });
		expect(accountAttempts.retryAfterMs('queued@lab.test')).toBe(0);
		expect(
			await checkPasswordSignIn(db, {
				email: 'queued@lab.test',
				password: 'the-right-password',
				clientAddress: '192.0.2.7'
			})
		).toMatchObject({ ok: true });
	});
});

describe('sessions end on the server', () => {
	const token = async (userId: string) => {
		const claims = await startSession(db, userId);
		return { sub: userId, ...claims, exp: Math.floor(Date.now() / 1000) + 3600 };
	};

	it('signing out ends that session only, for as long as its cookie would live', async () => {
		const id = await account('two-devices@lab.test', 'the-right-password');
		const laptop = await token(id);
		const phone = await token(id);
		expect(await sessionIsLive(db, laptop)).toBe(true);
		await endSession(db, laptop);
		expect(await sessionIsLive(db, laptop)).toBe(false);
		expect(await sessionIsLive(db, phone)).toBe(true);
		const row = await db
			.selectFrom('revoked_session')
			.selectAll()
			.where('id', '=', laptop.sid)
			.executeTakeFirstOrThrow();
		expect(row).toEqual({
			id: laptop.sid,
			user_id: id,
			expires_at: new Date(laptop.exp * 1000).toISOString()
		});
	});

	it('sweeps revoked sessions whose cookies have expired', async () => {
		const id = await account('sweep@lab.test', 'the-right-password');
		const old = await token(id);
		await endSession(db, old);
		const later = new Date((old.exp + 1) * 1000);
		await endSession(db, await token(id), later);
		expect(
			await db
				.selectFrom('revoked_session')
				.select('id')
				.where('id', '=', old.sid)
				.executeTakeFirst()
		).toBeUndefined();
	});

	it('ending all sessions refuses every cookie issued before, not those after', async () => {
		const id = await account('everywhere@lab.test', 'the-right-password');
		const a = await token(id);
		const b = await token(id);
		await endAllSessions(db, id);
		expect(await sessionIsLive(db, a)).toBe(false);
		expect(await sessionIsLive(db, b)).toBe(false);
		expect(await sessionIsLive(db, await token(id))).toBe(true);
	});

	it('refuses tokens without a session id or generation (issued before sessions could end)', async () => {
		const id = await account('legacy@lab.test', 'the-right-password');
		expect(await sessionIsLive(db, { sub: id })).toBe(false);
		expect(await sessionIsLive(db, { sub: id, sid: 'x', gen: '0' })).toBe(false);
	});

	it('disabling an account ends its sessions, and enabling it does not revive them', async () => {
		const admin = await account('admin-of-sessions@lab.test', 'the-right-password');
		await db.updateTable('User').set({ role: 'admin' }).where('id', '=', admin).execute();
		const id = await account('to-disable@lab.test', 'the-right-password');
		const session = await token(id);
		await db.transaction().execute((trx) => setUserDisabled(trx, admin, id, true));
		expect(await sessionIsLive(db, session)).toBe(false);
		await db.transaction().execute((trx) => setUserDisabled(trx, admin, id, false));
		expect(await sessionIsLive(db, session)).toBe(false);
		expect(await sessionIsLive(db, await token(id))).toBe(true);
	});

	it('a password reset ends every session and uses the link up with the change', async () => {
		const id = await account('forgetful@lab.test', 'the-old-password');
		const session = await token(id);
		const link = await issueToken(db, 'reset', 'forgetful@lab.test', 3600_000);
		expect(await resetPassword(db, link, 'a-new-password-1')).toBe('forgetful@lab.test');
		expect(await sessionIsLive(db, session)).toBe(false);
		expect(await resetPassword(db, link, 'another-password-2')).toBeNull();
		const outcome = await checkPasswordSignIn(db, {
			email: 'forgetful@lab.test',
			password: 'a-new-password-1',
			clientAddress: '192.0.2.8'
		});
		expect(outcome).toMatchObject({ ok: true });
	});

	it('a reset refused as busy keeps the link usable and the password unchanged', async () => {
		const id = await account('patient@lab.test', 'the-old-password');
		const before = await db
			.selectFrom('User')
			.select('passwordHash')
			.where('id', '=', id)
			.executeTakeFirstOrThrow();
		const link = await issueToken(db, 'reset', 'patient@lab.test', 3600_000);
		const release = fillHashingQueue();
		await expect(resetPassword(db, link, 'a-new-password-1')).rejects.toThrow(/busy/);
		await release();
		const after = await db
			.selectFrom('User')
			.select('passwordHash')
			.where('id', '=', id)
			.executeTakeFirstOrThrow();
		expect(after.passwordHash).toBe(before.passwordHash);
		expect(await resetPassword(db, link, 'a-new-password-1')).toBe('patient@lab.test');
	});
});

describe('sign-up does not reveal existing accounts', () => {
	it('for a taken address, changes nothing and issues a reset link for the owner', async () => {
		const id = await account('taken@lab.test', 'the-owners-password');
		const before = await db
			.selectFrom('User')
			.selectAll()
			.where('id', '=', id)
			.executeTakeFirstOrThrow();
		const hashed = passwordHashing.completed;
		await registerAccount(
			db,
			{ name: 'Someone Else', email: 'taken@lab.test', password: 'an-attackers-pass' },
			'http://hopline.test'
		);
		// As much work as a new account: one hash.
		expect(passwordHashing.completed - hashed).toBe(1);
		expect(
			await db.selectFrom('User').selectAll().where('id', '=', id).executeTakeFirstOrThrow()
		).toEqual(before);
		const tokens = await db
			.selectFrom('VerificationToken')
			.select('identifier')
			.where('identifier', 'like', '%:taken@lab.test')
			.execute();
		expect(tokens).toEqual([{ identifier: 'reset:taken@lab.test' }]);
	});
	it('for a new address, creates an unconfirmed reader and a confirmation link', async () => {
		await registerAccount(
			db,
			{ name: 'New Person', email: 'new.person@lab.test', password: 'a-good-password' },
			'http://hopline.test'
		);
		const user = await db
			.selectFrom('User')
			.select(['role', 'emailVerified'])
			.where('email', '=', 'new.person@lab.test')
			.executeTakeFirstOrThrow();
		expect(user).toEqual({ role: 'reader', emailVerified: null });
		const tokens = await db
			.selectFrom('VerificationToken')
			.select('identifier')
			.where('identifier', 'like', '%:new.person@lab.test')
			.execute();
		expect(tokens).toEqual([{ identifier: 'verify:new.person@lab.test' }]);
	});
});
