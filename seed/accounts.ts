import type { Kysely } from 'kysely';
import type { Database, Role } from '../src/lib/server/db/schema';
import { createPasswordUser } from '../src/lib/server/auth/users';
import { z } from 'zod';
import accounts from './demoAccounts.json';

/**
 * One demo account per role, created only in demo mode (HOPLINE_DEMO) and only when missing.
 * The sign-in details live in demoAccounts.json, which `npm run demo` prints; the addresses use
 * the reserved .test top-level domain, so no mail can ever reach a real person.
 */
export const DEMO_ACCOUNTS = z
	.array(
		z.object({
			role: z.enum(['reader', 'contributor', 'curator', 'admin'] satisfies Role[]),
			email: z.string().email(),
			name: z.string(),
			password: z.string().min(10)
		})
	)
	.parse(accounts);

export async function ensureDemoAccounts(db: Kysely<Database>): Promise<number> {
	let created = 0;
	for (const account of DEMO_ACCOUNTS) {
		const existing = await db
			.selectFrom('User')
			.select('id')
			.where('email', '=', account.email)
			.executeTakeFirst();
		if (existing) continue;
		await createPasswordUser(db, { ...account, verified: true });
		created++;
	}
	return created;
}
