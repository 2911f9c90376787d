import type { Kysely } from 'kysely';
import { writeAudit } from '../audit/log';
import type { Database } from '../db/schema';

/*
 * The ORCID iD a person records on /account. Citations of the versions they contribute to or
 * approve carry it from then on (catalogue/credit.ts copies it at each approval); versions
 * approved earlier keep what they were approved with.
 */

export async function orcidOf(db: Kysely<Database>, userId: string): Promise<string | null> {
	const row = await db
		.selectFrom('User')
		.select('orcid')
		.where('id', '=', userId)
		.executeTakeFirstOrThrow();
	return row.orcid;
}

/** Sets (or, with null, removes) the person's iD, already checked by `orcidInputSchema`. */
export async function setOrcid(
	trx: Kysely<Database>,
	userId: string,
	orcid: string | null
): Promise<void> {
	const before = await orcidOf(trx, userId);
	if (before === orcid) return;
	await trx.updateTable('User').set({ orcid }).where('id', '=', userId).execute();
	await writeAudit(trx, {
		actorId: userId,
		action: 'account.orcid',
		before: { orcid: before },
		after: { orcid }
	});
}
