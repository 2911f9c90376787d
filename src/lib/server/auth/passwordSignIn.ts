import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';
import { BusyError } from './hashingQueue';
import { verifyPassword } from './password';
import { accountAttempts, addressAttempts } from './rateLimit';
import { findUserForSignIn } from './users';

/*
 * The one check of an e-mail and password, used by Auth.js's `authorize` whichever way the
 * request came (the /signin form, or a direct POST to /auth/callback/password):
 * 1. refused while the account or the client address has too many recent failures;
 * 2. the attempt is counted as a failure *before* hashing, so concurrent guesses cannot all slip
 *    under the limit, and taken back when it succeeds or never reached the hash;
 * 3. one hash whether or not the account exists (a dummy one when it does not), so neither the
 *    answer nor its timing tells existing accounts from unknown ones;
 * 4. hashing waits in the bounded queue (password.ts), or is refused as "busy".
 */

export interface PasswordUser {
	id: string;
	email: string;
	name: string | null;
}

export type PasswordOutcome =
	| { ok: true; user: PasswordUser }
	| { ok: false; reason: 'limited'; retryAfterMs: number }
	| { ok: false; reason: 'busy' | 'wrong' | 'unverified' };

export type PasswordRefusal = Extract<PasswordOutcome, { ok: false }>;

export async function checkPasswordSignIn(
	db: Kysely<Database>,
	attempt: { email: string; password: string; clientAddress: string }
): Promise<PasswordOutcome> {
	const email = attempt.email.trim().toLowerCase();
	const client = attempt.clientAddress;
	const wait = Math.max(accountAttempts.retryAfterMs(email), addressAttempts.retryAfterMs(client));
	if (wait > 0) return { ok: false, reason: 'limited', retryAfterMs: wait };
	accountAttempts.record(email);
	addressAttempts.record(client);
	const forgive = () => {
		accountAttempts.forgiveOne(email);
		addressAttempts.forgiveOne(client);
	};

	const user = await findUserForSignIn(db, email);
	let matches: boolean;
	try {
		matches = await verifyPassword(attempt.password, user?.passwordHash ?? null);
	} catch (e) {
		if (!(e instanceof BusyError)) throw e;
		forgive();
		return { ok: false, reason: 'busy' };
	}
	if (!user?.email || !matches || user.disabledAt !== null) return { ok: false, reason: 'wrong' };
	// The right password: this attempt was no failure, and the account's earlier ones are forgiven.
	addressAttempts.forgiveOne(client);
	accountAttempts.reset(email);
	if (!user.emailVerified) return { ok: false, reason: 'unverified' };
	return { ok: true, user: { id: user.id, email: user.email, name: user.name } };
}
