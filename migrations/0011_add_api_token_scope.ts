import { sql, type Kysely } from 'kysely';

/**
 * Personal API tokens (the `api_token` table of 0001 had name, hash, created, last used and
 * revoked): each token now has a scope — `read` (reads with the owner's visibility) or
 * `read+submit` (also the submission and upload-check APIs) — and an optional expiry, the
 * instant from which it is refused. Tokens are listed per owner on /account, hence the index.
 */
export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.alterTable('api_token')
		.addColumn('scope', 'text', (c) =>
			c
				.notNull()
				.defaultTo('read')
				.check(sql`scope in ('read', 'read+submit')`)
		)
		.execute();
	await db.schema.alterTable('api_token').addColumn('expires_at', 'text').execute();
	await db.schema.createIndex('api_token_by_user').on('api_token').column('user_id').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropIndex('api_token_by_user').execute();
	await db.schema.alterTable('api_token').dropColumn('expires_at').execute();
	await db.schema.alterTable('api_token').dropColumn('scope').execute();
}
