import {
	randomBytes,
	scrypt as scryptCallback,
	timingSafeEqual,
	type ScryptOptions
} from 'node:crypto';

/**
 * Password hashing with scrypt (node:crypto) and a random 16-byte salt per user. Stored as
 * `scrypt$N$r$p$salt$hash` (base64), so parameters can be raised later without breaking old
 * hashes. Never reversible; comparison in constant time.
 * References: C. Percival & S. Josefsson, RFC 7914 (scrypt); OWASP Password Storage Cheat Sheet
 * (N = 2^17, r = 8, p = 1 as the scrypt baseline).
 */

const PARAMS = { N: 2 ** 17, r: 8, p: 1 };
const KEY_LENGTH = 32;
export const MIN_PASSWORD_LENGTH = 10;

function scrypt(password: string, salt: Buffer, options: ScryptOptions): Promise<Buffer> {
	return new Promise((resolve, reject) =>
		scryptCallback(
			password.normalize('NFKC'),
			salt,
			KEY_LENGTH,
			{ ...options, maxmem: 256 * 1024 * 1024 },
			(err, key) => (err ? reject(err) : resolve(key))
		)
	);
}

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

/** True when the password matches the stored hash; false for any malformed hash. */
export async function verifyPassword(password: string, stored: string | null): Promise<boolean> {
	const parts = stored?.split('$') ?? [];
	if (parts.length !== 6 || parts[0] !== 'scrypt') return false;
	const [, n, r, p, salt, hash] = parts as [string, string, string, string, string, string];
	const expected = Buffer.from(hash, 'base64');
	const key = await scrypt(password, Buffer.from(salt, 'base64'), {
		N: Number(n),
		r: Number(r),
		p: Number(p)
	});
	return key.length === expected.length && timingSafeEqual(key, expected);
}
