import {
	randomBytes,
	scrypt as scryptCallback,
	timingSafeEqual,
	type ScryptOptions
} from 'node:crypto';
import { config } from '../config';
import { AdmissionQueue } from './hashingQueue';

/*
 * Password hashing with scrypt (node:crypto) and a random 16-byte salt per user. Stored as
 * `scrypt$N$r$p$salt$hash` (base64), so parameters can be raised later without breaking old
 * hashes. Never reversible; comparison in constant time.
 * References: C. Percival & S. Josefsson, RFC 7914 (scrypt); OWASP Password Storage Cheat Sheet
 * (N = 2^17, r = 8, p = 1 as the scrypt baseline).
 *
 * Each hash takes 128·N·r bytes = 128 MiB and about a second of CPU here, so every hash goes
 * through one admission queue (PASSWORD_HASH_CONCURRENCY at once, PASSWORD_HASH_QUEUE waiting;
 * beyond that BusyError at once): a burst of sign-ins cannot exhaust memory or the thread pool.
 */

const PARAMS = { N: 2 ** 17, r: 8, p: 1 };
const KEY_LENGTH = 32;
export const MIN_PASSWORD_LENGTH = 10;

export const passwordHashing = new AdmissionQueue(
	config.PASSWORD_HASH_CONCURRENCY,
	config.PASSWORD_HASH_QUEUE
);

function scrypt(password: string, salt: Buffer, options: ScryptOptions): Promise<Buffer> {
	return passwordHashing.run(
		() =>
			new Promise((resolve, reject) =>
				scryptCallback(
					password.normalize('NFKC'),
					salt,
					KEY_LENGTH,
					{ ...options, maxmem: 256 * 1024 * 1024 },
					(err, key) => (err ? reject(err) : resolve(key))
				)
			)
	);
}

/** @throws {BusyError} when the hashing queue is full. */
export async function hashPassword(password: string): Promise<string> {
	const salt = randomBytes(16);
	const key = await scrypt(password, salt, PARAMS);
	return [
		'scrypt',
		PARAMS.N,
		PARAMS.r,
		PARAMS.p,
		salt.toString('base64'),
		key.toString('base64')
	].join('$');
}

/** Hashed in place of a missing or malformed hash, so that "no such account" costs as much. */
const DUMMY_SALT = randomBytes(16);

/**
 * True when the password matches the stored hash. A missing or malformed hash (no account, an
 * account without a password) is a mismatch that still costs one full hash, so the answer's
 * timing does not tell whether an account exists.
 * @throws {BusyError} when the hashing queue is full.
 */
export async function verifyPassword(password: string, stored: string | null): Promise<boolean> {
	const parts = stored?.split('$') ?? [];
	if (parts.length !== 6 || parts[0] !== 'scrypt') {
		await scrypt(password, DUMMY_SALT, PARAMS);
		return false;
	}
	const [, n, r, p, salt, hash] = parts as [string, string, string, string, string, string];
	const expected = Buffer.from(hash, 'base64');
	const key = await scrypt(password, Buffer.from(salt, 'base64'), {
		N: Number(n),
		r: Number(r),
		p: Number(p)
	});
	return key.length === expected.length && timingSafeEqual(key, expected);
}
