import { createHash, randomBytes } from 'node:crypto';
import { sql, type Kysely } from 'kysely';
import {
	API_TOKEN_MAX_DAYS,
	API_TOKEN_PATTERN,
	API_TOKEN_PREFIX,
	type ApiTokenInput,
	type ApiTokenSummary
} from '$lib/schemas/apiToken';
import type { ApiTokenScope } from '$lib/schemas/apiTokenScopes';
import { writeAudit } from '../audit/log';
import type { Database } from '../db/schema';
import {
	ApiTokenInputError,
	ApiTokenLimitError,
	ApiTokenNotFoundError,
	ApiTokenRefusedError
} from './apiTokenErrors';
import { roleAtLeast, type SessionUser } from './roles';
import { loadSessionUser } from './users';

/*
 * Personal API tokens: made on /account, shown to their owner once, sent by scripts as
 * `Authorization: Bearer hlpat_…` (see http/bearer.ts for the request side).
 *
 * - Only the SHA-256 of a token is stored (`api_token.token_sha256`), so a copy of the database
 *   lets nobody in. A token is 32 random bytes, so a fast hash is enough: there is nothing to
 *   guess that a slow one would protect.
 * - A token is found by its hash (an indexed equality in SQL, whose timing can tell at most
 *   something about a hash nobody can invert; comparing the same two hashes again in constant
 *   time would add nothing).
 * - The owner's role, groups and enabled state are read on every request (`loadSessionUser`,
 *   as for cookie sessions), so a role change, leaving a group or a disabled account applies at
 *   once. Tokens survive a password change and "sign out everywhere" (they are not sessions);
 *   they end when revoked, when they expire, or when the account is disabled.
 * - The last-used time is written at most once a minute per token (`noteTokenUse`), so a script
 *   reading all day costs one small write a minute, not one per request.
 * - No token, hash or part of either ever goes into the audit log, a message or a log line.
 */

/** Most tokens in use (neither revoked nor expired) per account. */
export const TOKENS_IN_USE_MAX = 50;
/** Tokens listed on /account: those in use first, then the newest revoked or expired ones. */
export const TOKENS_LISTED = 100;
/** The last-used time is written only when the stored one is at least this old. */
export const LAST_USED_RESOLUTION_MS = 60_000;

const DAY_MS = 86_400_000;

export function tokenDigest(token: string): string {
	return createHash('sha256').update(token).digest('hex');
}

/** A new token: the prefix and 32 random bytes in base64url. */
export function generateToken(): string {
	return API_TOKEN_PREFIX + randomBytes(32).toString('base64url');
}

/**
 * The instant from which a token chosen to work through `lastDay` (YYYY-MM-DD, UTC) is refused:
 * the following midnight, UTC.
 * @throws {ApiTokenInputError} for a day before today or beyond API_TOKEN_MAX_DAYS.
 */
export function expiryOf(lastDay: string | null, now: Date): string | null {
	if (lastDay === null) return null;
	const start = Date.parse(`${lastDay}T00:00:00.000Z`);
	const today = Date.parse(now.toISOString().slice(0, 10) + 'T00:00:00.000Z');
	if (start < today)
		throw new ApiTokenInputError({ expires: ['today or a later day (UTC), or empty for never'] });
	if (start > today + API_TOKEN_MAX_DAYS * DAY_MS)
		throw new ApiTokenInputError({
			expires: [`at most ${API_TOKEN_MAX_DAYS} days from today, or empty for never`]
		});
	return new Date(start + DAY_MS).toISOString();
}

/**
 * Makes a token for the user and returns it (the only time it exists in the clear) with its
 * summary. The scope must be one the user's role can use: submitting needs a contributor.
 * @throws {ApiTokenInputError} {ApiTokenLimitError}
 */
export async function createApiToken(
	trx: Kysely<Database>,
	user: SessionUser,
	input: ApiTokenInput,
	now: Date = new Date()
): Promise<{ token: string; summary: ApiTokenSummary }> {
	if (input.scope === 'read+submit' && !roleAtLeast(user.role, 'contributor'))
		throw new ApiTokenInputError({
			scope: [`submitting needs the contributor role; your account is a ${user.role}'s`]
		});
	const expiresAt = expiryOf(input.expires, now);
	const nowIso = now.toISOString();
	const inUse = await trx
		.selectFrom('api_token')
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.where('user_id', '=', user.id)
		.where('revoked_at', 'is', null)
		.where((eb) => eb.or([eb('expires_at', 'is', null), eb('expires_at', '>', nowIso)]))
		.executeTakeFirstOrThrow();
	if (Number(inUse.n) >= TOKENS_IN_USE_MAX) throw new ApiTokenLimitError(TOKENS_IN_USE_MAX);
	const token = generateToken();
	const row = await trx
		.insertInto('api_token')
		.values({
			user_id: user.id,
			name: input.name,
			token_sha256: tokenDigest(token),
			scope: input.scope,
			expires_at: expiresAt,
			created_at: nowIso,
			last_used_at: null,
			revoked_at: null
		})
		.returning('id')
		.executeTakeFirstOrThrow();
	await writeAudit(trx, {
		actorId: user.id,
		action: 'account.api_token_create',
		after: { tokenId: row.id, name: input.name, scope: input.scope, expiresAt },
		at: nowIso
	});
	return {
		token,
		summary: {
			id: row.id,
			name: input.name,
			scope: input.scope,
			createdAt: nowIso,
			lastUsedAt: null,
			expiresAt,
			revokedAt: null,
			status: 'active'
		}
	};
}

/** The user's tokens as /account lists them: in use first, newest first; never the tokens. */
export async function listApiTokens(
	db: Kysely<Database>,
	userId: string,
	now: Date = new Date()
): Promise<ApiTokenSummary[]> {
	const nowIso = now.toISOString();
	const rows = await db
		.selectFrom('api_token')
		.select(['id', 'name', 'scope', 'created_at', 'last_used_at', 'expires_at', 'revoked_at'])
		.where('user_id', '=', userId)
		.orderBy(
			sql`case when revoked_at is null and (expires_at is null or expires_at > ${nowIso}) then 0 else 1 end`
		)
		.orderBy('id', 'desc')
		.limit(TOKENS_LISTED)
		.execute();
	return rows.map((r) => ({
		id: r.id,
		name: r.name,
		scope: r.scope,
		createdAt: r.created_at,
		lastUsedAt: r.last_used_at,
		expiresAt: r.expires_at,
		revokedAt: r.revoked_at,
		status:
			r.revoked_at !== null
				? 'revoked'
				: r.expires_at !== null && r.expires_at <= nowIso
					? 'expired'
					: 'active'
	}));
}

/**
 * Revokes one of the user's own tokens, at once: the next request with it gets 401.
 * @throws {ApiTokenNotFoundError} when the user has no such token in use.
 */
export async function revokeApiToken(
	trx: Kysely<Database>,
	userId: string,
	tokenId: number,
	now: Date = new Date()
): Promise<void> {
	const nowIso = now.toISOString();
	const row = await trx
		.updateTable('api_token')
		.set({ revoked_at: nowIso })
		.where('id', '=', tokenId)
		.where('user_id', '=', userId)
		.where('revoked_at', 'is', null)
		.returning(['name', 'scope'])
		.executeTakeFirst();
	if (!row) throw new ApiTokenNotFoundError(tokenId);
	await writeAudit(trx, {
		actorId: userId,
		action: 'account.api_token_revoke',
		before: { tokenId, name: row.name, scope: row.scope },
		at: nowIso
	});
}

/** Who a valid token speaks for, and what it may do. */
export interface TokenHolder {
	user: SessionUser;
	tokenId: number;
	scope: ApiTokenScope;
	lastUsedAt: string | null;
}

/**
 * The holder of a token, with the owner's role and groups read now.
 * @throws {ApiTokenRefusedError} for a malformed, unknown, revoked or expired token, or one
 * whose owner is disabled.
 */
export async function authenticateApiToken(
	db: Kysely<Database>,
	token: string,
	now: Date = new Date()
): Promise<TokenHolder> {
	if (!API_TOKEN_PATTERN.test(token)) throw new ApiTokenRefusedError('malformed');
	const digest = tokenDigest(token);
	const row = await db
		.selectFrom('api_token')
		.select(['id', 'user_id', 'scope', 'expires_at', 'revoked_at', 'last_used_at'])
		.where('token_sha256', '=', digest)
		.executeTakeFirst();
	if (!row) throw new ApiTokenRefusedError('unknown');
	if (row.revoked_at !== null) throw new ApiTokenRefusedError('revoked');
	if (row.expires_at !== null && row.expires_at <= now.toISOString())
		throw new ApiTokenRefusedError('expired');
	const user = await loadSessionUser(db, row.user_id);
	if (!user) throw new ApiTokenRefusedError('disabled');
	return { user, tokenId: row.id, scope: row.scope, lastUsedAt: row.last_used_at };
}

/**
 * Records that the token was used now, unless its last-used time is less than a minute old
 * (then nothing is written). The condition is repeated in SQL, so concurrent requests of the
 * same minute write at most once between them.
 * @returns whether a time was written.
 */
export async function noteTokenUse(
	db: Kysely<Database>,
	holder: Pick<TokenHolder, 'tokenId' | 'lastUsedAt'>,
	now: Date = new Date()
): Promise<boolean> {
	const cutoff = new Date(now.getTime() - LAST_USED_RESOLUTION_MS).toISOString();
	if (holder.lastUsedAt !== null && holder.lastUsedAt > cutoff) return false;
	const result = await db
		.updateTable('api_token')
		.set({ last_used_at: now.toISOString() })
		.where('id', '=', holder.tokenId)
		.where((eb) => eb.or([eb('last_used_at', 'is', null), eb('last_used_at', '<=', cutoff)]))
		.executeTakeFirst();
	return Number(result.numUpdatedRows) > 0;
}
