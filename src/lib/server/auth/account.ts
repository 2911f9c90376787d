import type { Kysely } from 'kysely';
import { writeAudit } from '../audit/log';
import type { CurationNotices, Database } from '../db/schema';
import { endAllSessions } from './sessions';

/** What a signed-in user changes on their own account (`/account`); every change is audited. */

/** How the user hears of new submissions (curators): immediate mail, a daily digest, or none. */
export async function curationNoticesOf(
	db: Kysely<Database>,
	userId: string
): Promise<CurationNotices> {
	const row = await db
		.selectFrom('User')
		.select('curationNotices')
		.where('id', '=', userId)
		.executeTakeFirstOrThrow();
	return row.curationNotices;
}

export async function setCurationNotices(
	trx: Kysely<Database>,
	userId: string,
	curationNotices: CurationNotices
): Promise<void> {
	await trx.updateTable('User').set({ curationNotices }).where('id', '=', userId).execute();
	await writeAudit(trx, { actorId: userId, action: 'account.notices', after: { curationNotices } });
}

/** Ends every session of the account, on every device (see auth/sessions.ts). */
export async function signOutEverywhere(trx: Kysely<Database>, userId: string): Promise<void> {
	await endAllSessions(trx, userId);
	await writeAudit(trx, { actorId: userId, action: 'account.sign_out_everywhere' });
}
