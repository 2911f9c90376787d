import type { Kysely } from 'kysely';

/**
 * Ending sessions on the server (session cookies are signed JWTs, valid until they expire):
 * - `User.sessionGeneration`: every session cookie carries the generation it was issued under;
 *   raising it ends all of the user's sessions at once (password reset, account disabled,
 *   "sign out everywhere").
 * - `revoked_session`: the id of each session signed out, kept until that session's cookie
 *   would have expired anyway, so a copy of the cookie replayed after signing out is refused.
 */
export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.alterTable('User')
		.addColumn('sessionGeneration', 'integer', (c) => c.notNull().defaultTo(0))
		.execute();
	await db.schema
		.createTable('revoked_session')
		.addColumn('id', 'text', (c) => c.primaryKey())
		.addColumn('user_id', 'text', (c) => c.notNull().references('User.id').onDelete('cascade'))
		.addColumn('expires_at', 'text', (c) => c.notNull())
		.execute();
	await db.schema
		.createIndex('revoked_session_by_expiry')
		.on('revoked_session')
		.column('expires_at')
		.execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropTable('revoked_session').execute();
	await db.schema.alterTable('User').dropColumn('sessionGeneration').execute();
}
