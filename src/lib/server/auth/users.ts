import type { Kysely } from 'kysely';
import type { Database, Role } from '../db/schema';
import { hashPassword } from './password';
import type { SessionUser } from './roles';

/* Accounts: reading the signed-in user with groups, and creating password accounts. */

export async function findUserForSignIn(db: Kysely<Database>, email: string) {
	return db
		.selectFrom('User')
		.select(['id', 'email', 'name', 'passwordHash', 'disabledAt', 'emailVerified'])
		.where('email', '=', email.toLowerCase())
		.executeTakeFirst();
}

/** The user behind a session, with role and groups read fresh, so role changes apply at once. */
export async function loadSessionUser(
	db: Kysely<Database>,
	id: string
): Promise<SessionUser | null> {
	const user = await db
		.selectFrom('User')
		.select(['id', 'email', 'name', 'role', 'disabledAt'])
		.where('id', '=', id)
		.executeTakeFirst();
	if (!user || user.disabledAt !== null || !user.email) return null;
	const groups = await db
		.selectFrom('group_member')
		.select('group_id')
		.where('user_id', '=', id)
		.execute();
	return {
		id: user.id,
		email: user.email,
		name: user.name,
		role: user.role,
		groupIds: groups.map((g) => g.group_id)
	};
}

/** @throws {BusyError} when the password hashing queue is full. */
export async function createPasswordUser(
	db: Kysely<Database>,
	account: { email: string; name: string; password: string; role: Role; verified: boolean }
): Promise<string> {
	const { password, ...rest } = account;
	const id = await insertPasswordUser(db, { ...rest, passwordHash: await hashPassword(password) });
	if (!id) throw new Error(`An account with the e-mail address ${account.email} exists already.`);
	return id;
}

/** Inserts an account with a password hashed already; null when the address is taken. */
export async function insertPasswordUser(
	db: Kysely<Database>,
	account: { email: string; name: string; passwordHash: string; role: Role; verified: boolean }
): Promise<string | null> {
	const row = await db
		.insertInto('User')
		.values({
			email: account.email.toLowerCase(),
			name: account.name,
			role: account.role,
			passwordHash: account.passwordHash,
			emailVerified: account.verified ? new Date().toISOString() : null,
			image: null,
			disabledAt: null
		})
		.onConflict((oc) => oc.column('email').doNothing())
		.returning('id')
		.executeTakeFirst();
	return row?.id ?? null;
}
