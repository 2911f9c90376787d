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
	await ensureDemoGroup(db);
	return created;
}

/** An invented consortium holding the demo reader, contributor and curator, for group-only entries. */
export const DEMO_GROUP = { slug: 'demo-consortium', name: 'Thermophile redox consortium (demo)' };

async function ensureDemoGroup(db: Kysely<Database>): Promise<void> {
	await db
		.insertInto('research_group')
		.values(DEMO_GROUP)
		.onConflict((oc) => oc.column('slug').doNothing())
		.execute();
	const group = await db
		.selectFrom('research_group')
		.select('id')
		.where('slug', '=', DEMO_GROUP.slug)
		.executeTakeFirstOrThrow();
	for (const account of DEMO_ACCOUNTS.filter((a) => a.role !== 'admin')) {
		const user = await db
			.selectFrom('User')
			.select('id')
			.where('email', '=', account.email)
			.executeTakeFirstOrThrow();
		await db
			.insertInto('group_member')
			.values({ group_id: group.id, user_id: user.id })
			.onConflict((oc) => oc.columns(['group_id', 'user_id']).doNothing())
			.execute();
	}
}
