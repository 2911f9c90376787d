import { createHash, randomBytes } from 'node:crypto';
import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';

/*
 * Single-use e-mail tokens (address verification, password reset) in Auth.js's VerificationToken
 * table. Only a SHA-256 of the token is stored, so a copy of the database cannot be used to take
 * over accounts; a token is deleted when used and refused after it expires.
 */
export type TokenPurpose = 'verify' | 'reset';

const digest = (token: string) => createHash('sha256').update(token).digest('base64url');

export async function issueToken(
	db: Kysely<Database>,
	purpose: TokenPurpose,
	email: string,
	ttlMs: number
): Promise<string> {
	const token = randomBytes(32).toString('base64url');
	const identifier = `${purpose}:${email}`;
	await db.deleteFrom('VerificationToken').where('identifier', '=', identifier).execute();
	await db
		.insertInto('VerificationToken')
		.values({
			identifier,
			token: digest(token),
			expires: new Date(Date.now() + ttlMs).toISOString()
		})
		.execute();
	return token;
}

/** Whether the token is known, unused and unexpired, without using it up. */
export async function tokenIsValid(
	db: Kysely<Database>,
	purpose: TokenPurpose,
	token: string
): Promise<boolean> {
	if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return false;
	const row = await db
		.selectFrom('VerificationToken')
		.select('expires')
		.where('token', '=', digest(token))
		.where('identifier', 'like', `${purpose}:%`)
		.executeTakeFirst();
	return !!row && row.expires >= new Date().toISOString();
}

/** The e-mail address the token was issued to, or null when it is unknown, used or expired. */
export async function consumeToken(
	db: Kysely<Database>,
	purpose: TokenPurpose,
	token: string
): Promise<string | null> {
	if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
	const row = await db
		.selectFrom('VerificationToken')
		.selectAll()
		.where('token', '=', digest(token))
		.where('identifier', 'like', `${purpose}:%`)
		.executeTakeFirst();
	if (!row) return null;
	await db.deleteFrom('VerificationToken').where('token', '=', row.token).execute();
	if (row.expires < new Date().toISOString()) return null;
	return row.identifier.slice(purpose.length + 1);
}
