import { randomUUID } from 'node:crypto';
import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';

/*
 * Ending sessions on the server. A session cookie is a signed JWT that would otherwise stay valid
 * until it expires, whatever happens on the server; so each one carries
 * - `sid`, an id of its own, fixed at sign-in and kept across refreshes; signing out writes it to
 *   `revoked_session` until the cookie would have expired, so a replayed copy is refused;
 * - `gen`, the user's `sessionGeneration` at sign-in; raising it (password reset, account
 *   disabled, "sign out everywhere") ends every session of the user at once.
 * Auth.js's `jwt` callback asks `sessionIsLive` on every request that reads the session
 * (hooks.server.ts and /auth/session alike) and drops the cookie when it says no.
 */

export interface SessionClaims {
	sid: string;
	gen: number;
}

/** What a decoded session token may hold; anything may be missing from an old or foreign one. */
export interface SessionToken {
	sub?: string;
	sid?: unknown;
	gen?: unknown;
	exp?: unknown;
}

/** The claims of a session beginning now for the user. */
export async function startSession(db: Kysely<Database>, userId: string): Promise<SessionClaims> {
	const row = await db
		.selectFrom('User')
		.select('sessionGeneration')
		.where('id', '=', userId)
		.executeTakeFirstOrThrow();
	return { sid: randomUUID(), gen: row.sessionGeneration };
}

/**
 * True when the session may go on: its user exists and is enabled, no generation bump ended it,
 * and it was not signed out. A token without `sid` and `gen` (issued before sessions could be
 * ended) is refused.
 */
export async function sessionIsLive(db: Kysely<Database>, token: SessionToken): Promise<boolean> {
	const { sub, sid, gen } = token;
	if (typeof sub !== 'string' || typeof sid !== 'string' || typeof gen !== 'number') return false;
	const row = await db
		.selectFrom('User')
		.select((eb) => [
			'User.disabledAt',
			'User.sessionGeneration',
			eb.exists(eb.selectFrom('revoked_session').select('id').where('id', '=', sid)).as('revoked')
		])
		.where('User.id', '=', sub)
		.executeTakeFirst();
	return !!row && row.disabledAt === null && row.sessionGeneration === gen && !Number(row.revoked);
}

/**
 * Ends one session (signing out): refused from now on, even if its cookie is replayed. The row
 * lasts until the cookie's own expiry (`exp`, seconds), after which the cookie is dead anyway;
 * expired rows are swept here.
 */
export async function endSession(
	db: Kysely<Database>,
	token: SessionToken,
	now = new Date()
): Promise<void> {
	const { sub, sid, exp } = token;
	if (typeof sub !== 'string' || typeof sid !== 'string') return;
	const expiresAt = typeof exp === 'number' ? new Date(exp * 1000) : now;
	await db.transaction().execute(async (trx) => {
		await trx.deleteFrom('revoked_session').where('expires_at', '<', now.toISOString()).execute();
		if (expiresAt <= now) return;
		await trx
			.insertInto('revoked_session')
			.values({ id: sid, user_id: sub, expires_at: expiresAt.toISOString() })
			.onConflict((oc) => oc.column('id').doNothing())
			.execute();
	});
}

/** Ends every session of the user; call it in the transaction of the change that warrants it. */
export async function endAllSessions(trx: Kysely<Database>, userId: string): Promise<void> {
	await trx
		.updateTable('User')
		.set((eb) => ({ sessionGeneration: eb('sessionGeneration', '+', 1) }))
		.where('id', '=', userId)
		.execute();
}
