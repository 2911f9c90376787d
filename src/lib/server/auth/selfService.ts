import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';
import { sendMail } from '../mail/mailer';
import { hashPassword } from './password';
import { consumeToken, issueToken } from './tokens';
import { createPasswordUser } from './users';

/** Sign-up with e-mail verification, and password reset by e-mail. */

export class AccountExistsError extends Error {
	constructor() {
		super('An account with this e-mail address exists already. Sign in, or reset your password.');
		this.name = 'AccountExistsError';
	}
}

const DAY = 24 * 3600_000;
const HOUR = 3600_000;

export async function registerAccount(
	db: Kysely<Database>,
	account: { name: string; email: string; password: string },
	origin: string
): Promise<void> {
	const existing = await db
		.selectFrom('User')
		.select('id')
		.where('email', '=', account.email)
		.executeTakeFirst();
	if (existing) throw new AccountExistsError();
	await createPasswordUser(db, { ...account, role: 'reader', verified: false });
	const token = await issueToken(db, 'verify', account.email, DAY);
	await sendMail({
		to: account.email,
		subject: 'Confirm your e-mail address for Hopline',
		text: `Hello ${account.name},\n\nConfirm your address to finish creating your Hopline account:\n\n${origin}/verify?token=${token}\n\nThe link works once, for 24 hours. If you did not sign up, ignore this message.\n`
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
	await sendMail({
		to: email,
		subject: 'Reset your Hopline password',
		text: `Someone asked to reset the password of your Hopline account.\n\nChoose a new password here:\n\n${origin}/reset/${token}\n\nThe link works once, for one hour. If it was not you, ignore this message; your password stays as it is.\n`
	});
}

/** @returns false for an unknown, used or expired link. A reset also confirms the address. */
export async function resetPassword(
	db: Kysely<Database>,
	token: string,
	password: string
): Promise<boolean> {
	const email = await consumeToken(db, 'reset', token);
	if (!email) return false;
	await db
		.updateTable('User')
		.set({ passwordHash: await hashPassword(password), emailVerified: new Date().toISOString() })
		.where('email', '=', email)
		.execute();
	return true;
}
