import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';
import { sendMailInBackground } from '../mail/mailer';
import { hashPassword } from './password';
import { endAllSessions } from './sessions';
import { consumeToken, issueToken, tokenIsValid } from './tokens';
import { insertPasswordUser } from './users';

/*
 * Sign-up with e-mail verification, and password reset by e-mail. Neither tells a visitor whether
 * an address has an account: the answer is the same, the work before it is alike (one password
 * hash, a token, a mail handed to the background), and only the mail says what happened.
 */

const DAY = 24 * 3600_000;
const HOUR = 3600_000;

/**
 * Creates an unconfirmed reader and mails a confirmation link; for an address that has an
 * account already, mails that account a notice with a reset link instead (nothing for a
 * disabled account), and changes nothing.
 * @throws {BusyError} when the password hashing queue is full (nothing is written).
 */
export async function registerAccount(
	db: Kysely<Database>,
	account: { name: string; email: string; password: string },
	origin: string
): Promise<void> {
	// Hashed whether or not the address is taken, so both answers take as long.
	const passwordHash = await hashPassword(account.password);
	const id = await insertPasswordUser(db, {
		name: account.name,
		email: account.email,
		passwordHash,
		role: 'reader',
		verified: false
	});
	if (id) {
		const token = await issueToken(db, 'verify', account.email, DAY);
		sendMailInBackground({
			to: account.email,
			subject: 'Confirm your e-mail address for Hopline',
			text: `Hello ${account.name},\n\nConfirm your address to finish creating your Hopline account:\n\n${origin}/verify?token=${token}\n\nThe link works once, for 24 hours. If you did not sign up, ignore this message.\n`
		});
		return;
	}
	const existing = await db
		.selectFrom('User')
		.select('disabledAt')
		.where('email', '=', account.email)
		.executeTakeFirst();
	if (!existing || existing.disabledAt !== null) return;
	const token = await issueToken(db, 'reset', account.email, HOUR);
	sendMailInBackground({
		to: account.email,
		subject: 'You already have a Hopline account',
		text: `Someone (perhaps you) tried to create a Hopline account with this address, which has one already. Nothing was changed.\n\nSign in at ${origin}/signin, or choose a new password here:\n\n${origin}/reset/${token}\n\nThe link works once, for one hour. If it was not you, ignore this message.\n`
	});
}

/** @returns the verified address, or null for an unknown, used or expired link. */
export async function verifyEmail(db: Kysely<Database>, token: string): Promise<string | null> {
	const email = await consumeToken(db, 'verify', token);
	if (!email) return null;
	await db
		.updateTable('User')
		.set({ emailVerified: new Date().toISOString() })
		.where('email', '=', email)
		.execute();
	return email;
}

/** Sends a reset link when the account exists; says nothing either way (no account probing). */
export async function requestPasswordReset(
	db: Kysely<Database>,
	email: string,
	origin: string
): Promise<void> {
	const user = await db
		.selectFrom('User')
		.select(['id', 'disabledAt'])
		.where('email', '=', email)
		.executeTakeFirst();
	if (!user || user.disabledAt !== null) return;
	const token = await issueToken(db, 'reset', email, HOUR);
	sendMailInBackground({
		to: email,
		subject: 'Reset your Hopline password',
		text: `Someone asked to reset the password of your Hopline account.\n\nChoose a new password here:\n\n${origin}/reset/${token}\n\nThe link works once, for one hour. If it was not you, ignore this message; your password stays as it is.\n`
	});
}

/**
 * Sets a new password through a reset link, confirms the address, and ends every session of the
 * account (whoever had the old password is signed out).
 * @returns the account's address, or null for an unknown, used or expired link.
 * @throws {BusyError} when the password hashing queue is full (the link stays usable).
 */
export async function resetPassword(
	db: Kysely<Database>,
	token: string,
	password: string
): Promise<string | null> {
	// Junk links cost no hash; a good one is used up only together with the change.
	if (!(await tokenIsValid(db, 'reset', token))) return null;
	const passwordHash = await hashPassword(password);
	return db.transaction().execute(async (trx) => {
		const email = await consumeToken(trx, 'reset', token);
		if (!email) return null;
		const user = await trx
			.updateTable('User')
			.set({ passwordHash, emailVerified: new Date().toISOString() })
			.where('email', '=', email)
			.returning('id')
			.executeTakeFirst();
		if (user) await endAllSessions(trx, user.id);
		return email;
	});
}
