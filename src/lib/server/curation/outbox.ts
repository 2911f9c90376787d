import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';
import { sendMail } from '../mail/mailer';

/*
 * Mail decided inside a transaction is sent only after it commits: services return the
 * messages, routes deliver them. A failed delivery is logged and never undoes the change.
 */
export interface OutgoingMail {
	to: string;
	subject: string;
	text: string;
}

export async function deliver(mails: readonly OutgoingMail[]): Promise<number> {
	let sent = 0;
	for (const mail of mails) {
		try {
			await sendMail(mail);
			sent++;
		} catch (e) {
			console.error(`Could not send "${mail.subject}" to ${mail.to}:`, e);
		}
	}
	return sent;
}

export interface CurationActionOptions {
	/**
	 * The action commits its own transactions (a chunked approval given the database, see
	 * `decideSubmission`): it is handed `db` itself, and its mail goes out once it has returned.
	 */
	ownTransactions?: boolean;
	/** How mail is sent; `deliver` unless a test watches the sending. */
	send?: (mails: readonly OutgoingMail[]) => Promise<unknown>;
}

/**
 * The one way a route runs a curation action: in one transaction (opened here, at the
 * boundary), then the mail the action decided on is delivered — after the commit only, so a
 * change that rolls back (the action threw) mails no one, and a mail failure never undoes it.
 * The action's failure is thrown as it came, for the route to map (`toFormFailure`,
 * `apiHandler`).
 */
export async function runCurationAction<T extends { mails: readonly OutgoingMail[] }>(
	db: Kysely<Database>,
	action: (trx: Kysely<Database>) => Promise<T>,
	options: CurationActionOptions = {}
): Promise<T> {
	const result = options.ownTransactions
		? await action(db)
		: await db.transaction().execute(action);
	await (options.send ?? deliver)(result.mails);
	return result;
}
