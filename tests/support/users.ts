import type { Kysely } from 'kysely';
import type { SessionUser } from '$lib/server/auth/roles';
import type { Database, Role } from '$lib/server/db/schema';

/** A user row with no way to sign in, as services see it: for tests and benchmarks of services. */
export async function insertSessionUser(
	db: Kysely<Database>,
	role: Role,
	email: string
): Promise<SessionUser> {
	const { id } = await db
		.insertInto('User')
		.values({
			email,
			name: role,
			role,
			emailVerified: null,
			image: null,
			passwordHash: null,
			disabledAt: null
		})
		.returning('id')
		.executeTakeFirstOrThrow();
	return { id, email, name: role, role, groupIds: [] };
}
