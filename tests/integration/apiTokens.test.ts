import { createHash } from 'node:crypto';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { API_TOKEN_PATTERN, apiTokenForm, type ApiTokenInput } from '$lib/schemas/apiToken';
import { setUserDisabled } from '$lib/server/admin/accounts';
import { ApiTokenRefusedError } from '$lib/server/auth/apiTokenErrors';
import {
	authenticateApiToken,
	createApiToken,
	listApiTokens,
	noteTokenUse,
	revokeApiToken,
	TOKENS_IN_USE_MAX
} from '$lib/server/auth/apiTokens';
import type { SessionUser } from '$lib/server/auth/roles';
import type { Database } from '$lib/server/db/schema';
import { createTempDatabase } from '../support/tempDb';
import { insertSessionUser } from '../support/users';

/**
 * Personal API tokens as the service keeps them, on a database migrated by the production path
 * (0011 included): what is stored (a SHA-256, computed here independently with node:crypto as
 * the oracle), who a token speaks for, every refusal, the last-used time written at most once a
 * minute, and an audit log that never holds the token.
 */
let db: Kysely<Database>;
let remove: () => Promise<void>;
let reader: SessionUser;
let contributor: SessionUser;
let admin: SessionUser;
const NOW = new Date('2030-06-15T12:00:00.000Z');

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	reader = await insertSessionUser(db, 'reader', 'reader@tokens.test');
	contributor = await insertSessionUser(db, 'contributor', 'contributor@tokens.test');
	admin = await insertSessionUser(db, 'admin', 'admin@tokens.test');
	const group = await db
		.insertInto('research_group')
		.values({ slug: 'token-lab', name: 'Token lab' })
		.returning('id')
		.executeTakeFirstOrThrow();
	await db
		.insertInto('group_member')
		.values({ group_id: group.id, user_id: contributor.id })
		.execute();
	contributor = { ...contributor, groupIds: [group.id] };
});
afterAll(async () => remove?.());

const input = (over: Partial<ApiTokenInput> = {}): ApiTokenInput => ({
	name: 'notebook',
	scope: 'read',
	expires: null,
	...over
});
const create = (user: SessionUser, over: Partial<ApiTokenInput> = {}, now = NOW) =>
	db.transaction().execute((trx) => createApiToken(trx, user, input(over), now));
const sha256 = (text: string) => createHash('sha256').update(text).digest('hex');

async function refusal(token: string, now = NOW): Promise<string> {
	try {
		await authenticateApiToken(db, token, now);
	} catch (e) {
		if (e instanceof ApiTokenRefusedError) return e.reason;
		throw e;
	}
	return 'accepted';
}

describe('creating a token', () => {
	it('returns a recognisable token once and stores only its SHA-256', async () => {
		const { token, summary } = await create(contributor, { name: 'stored as hash' });
		expect(token).toMatch(API_TOKEN_PATTERN);
		const row = await db
			.selectFrom('api_token')
			.selectAll()
			.where('id', '=', summary.id)
			.executeTakeFirstOrThrow();
		expect(row.token_sha256).toBe(sha256(token));
		expect(JSON.stringify(row)).not.toContain(token.slice(6));
		expect(row).toMatchObject({ scope: 'read', expires_at: null, user_id: contributor.id });
	});

	it('makes a different token every time', async () => {
		const a = await create(contributor);
		const b = await create(contributor);
		expect(a.token).not.toBe(b.token);
	});

	it('gives the submit scope only to contributors and above', async () => {
		await expect(create(reader, { scope: 'read+submit' })).rejects.toMatchObject({
			code: 'bad_request',
			fields: { scope: [expect.stringContaining('contributor role')] }
		});
		expect((await create(contributor, { scope: 'read+submit' })).summary.scope).toBe('read+submit');
		expect((await create(admin, { scope: 'read+submit' })).summary.scope).toBe('read+submit');
	});

	it('expires at the midnight (UTC) after the chosen last day; refuses past or far days', async () => {
		const { summary } = await create(contributor, { expires: '2030-06-15' });
		expect(summary.expiresAt).toBe('2030-06-16T00:00:00.000Z');
		await expect(create(contributor, { expires: '2030-06-14' })).rejects.toMatchObject({
			fields: { expires: [expect.stringContaining('today or a later day')] }
		});
		await expect(create(contributor, { expires: '2036-01-01' })).rejects.toMatchObject({
			fields: { expires: [expect.stringContaining('at most')] }
		});
	});

	it('reads the form: a name, a scope of the list, a calendar date or nothing', () => {
		const ok = apiTokenForm.safeParse({ name: '  lab  ', scope: 'read+submit', expires: '' });
		expect(ok.success && ok.data).toEqual({ name: 'lab', scope: 'read+submit', expires: null });
		const bad = apiTokenForm.safeParse({ name: ' ', scope: 'write', expires: '2030-02-30' });
		expect(bad.success).toBe(false);
		expect(bad.error?.issues.map((i) => i.path[0]).sort()).toEqual(['expires', 'name', 'scope']);
	});

	it(`holds at most ${TOKENS_IN_USE_MAX} tokens in use per account; revoked ones do not count`, async () => {
		const user = await insertSessionUser(db, 'reader', 'many@tokens.test');
		const ids: number[] = [];
		for (let i = 0; i < TOKENS_IN_USE_MAX; i++)
			ids.push((await create(user, { name: `t${i}` })).summary.id);
		await expect(create(user)).rejects.toMatchObject({ code: 'conflict' });
		await db.transaction().execute((trx) => revokeApiToken(trx, user.id, ids[0]!, NOW));
		expect((await create(user)).token).toMatch(API_TOKEN_PATTERN);
	});
});

describe('authenticating with a token', () => {
	it('speaks for the owner with their role and groups, read now', async () => {
		const { token, summary } = await create(contributor, { scope: 'read+submit' });
		const holder = await authenticateApiToken(db, token, NOW);
		expect(holder).toMatchObject({ tokenId: summary.id, scope: 'read+submit', lastUsedAt: null });
		expect(holder.user).toEqual(contributor);
		await db.updateTable('User').set({ role: 'reader' }).where('id', '=', contributor.id).execute();
		expect((await authenticateApiToken(db, token, NOW)).user.role).toBe('reader');
		await db
			.updateTable('User')
			.set({ role: 'contributor' })
			.where('id', '=', contributor.id)
			.execute();
	});

	it('refuses a malformed, unknown, revoked or expired token and one of a disabled owner', async () => {
		const { token, summary } = await create(contributor);
		expect(await refusal('not-a-token')).toBe('malformed');
		expect(await refusal(token.slice(0, -1))).toBe('malformed');
		// Right shape, last character changed: a token nobody was given.
		const other = token.slice(0, -1) + (token.endsWith('A') ? 'B' : 'A');
		expect(await refusal(other)).toBe('unknown');

		const expiring = await create(contributor, { expires: '2030-06-20' });
		expect(await refusal(expiring.token, new Date('2030-06-20T23:59:59.999Z'))).toBe('accepted');
		expect(await refusal(expiring.token, new Date('2030-06-21T00:00:00.000Z'))).toBe('expired');

		await db.transaction().execute((trx) => revokeApiToken(trx, contributor.id, summary.id, NOW));
		expect(await refusal(token)).toBe('revoked');

		const owner = await insertSessionUser(db, 'contributor', 'disabled@tokens.test');
		const theirs = await create(owner);
		expect(await refusal(theirs.token)).toBe('accepted');
		await db.transaction().execute((trx) => setUserDisabled(trx, admin.id, owner.id, true));
		expect(await refusal(theirs.token)).toBe('disabled');
	});

	it('lets only the owner revoke, once', async () => {
		const { summary } = await create(contributor);
		await expect(
			db.transaction().execute((trx) => revokeApiToken(trx, reader.id, summary.id, NOW))
		).rejects.toMatchObject({ code: 'not_found' });
		await db.transaction().execute((trx) => revokeApiToken(trx, contributor.id, summary.id, NOW));
		await expect(
			db.transaction().execute((trx) => revokeApiToken(trx, contributor.id, summary.id, NOW))
		).rejects.toMatchObject({ code: 'not_found' });
	});
});

describe('last-used time', () => {
	it('is written at most once a minute per token', async () => {
		const { token, summary } = await create(contributor);
		const stored = async () =>
			(
				await db
					.selectFrom('api_token')
					.select('last_used_at')
					.where('id', '=', summary.id)
					.executeTakeFirstOrThrow()
			).last_used_at;
		const use = async (iso: string) =>
			noteTokenUse(db, await authenticateApiToken(db, token, new Date(iso)), new Date(iso));

		expect(await use('2030-06-15T12:00:00.000Z')).toBe(true);
		expect(await stored()).toBe('2030-06-15T12:00:00.000Z');
		expect(await use('2030-06-15T12:00:30.000Z')).toBe(false);
		expect(await use('2030-06-15T12:00:59.999Z')).toBe(false);
		expect(await stored()).toBe('2030-06-15T12:00:00.000Z');
		expect(await use('2030-06-15T12:01:00.000Z')).toBe(true);
		expect(await stored()).toBe('2030-06-15T12:01:00.000Z');
	});

	it('is not written twice by two requests that read the same old time', async () => {
		const { token } = await create(contributor);
		const holder = await authenticateApiToken(db, token, NOW);
		const both = await Promise.all([noteTokenUse(db, holder, NOW), noteTokenUse(db, holder, NOW)]);
		expect(both.filter(Boolean)).toHaveLength(1);
	});
});

describe('the list and the audit log', () => {
	it('lists tokens in use first with status, never the token or its hash', async () => {
		const user = await insertSessionUser(db, 'contributor', 'lister@tokens.test');
		const kept = await create(user, { name: 'kept' });
		const gone = await create(user, { name: 'gone' });
		await create(user, { name: 'short', expires: '2030-06-15' });
		await db.transaction().execute((trx) => revokeApiToken(trx, user.id, gone.summary.id, NOW));
		const list = await listApiTokens(db, user.id, new Date('2030-06-16T00:00:00.000Z'));
		expect(list.map((t) => [t.name, t.status])).toEqual([
			['kept', 'active'],
			['short', 'expired'],
			['gone', 'revoked']
		]);
		const text = JSON.stringify(list);
		expect(text).not.toContain(kept.token.slice(6));
		expect(text).not.toContain(sha256(kept.token));
	});

	it('records creation and revocation without the token or its hash', async () => {
		const user = await insertSessionUser(db, 'contributor', 'audited@tokens.test');
		const { token, summary } = await create(user, { name: 'audited', scope: 'read+submit' });
		await db.transaction().execute((trx) => revokeApiToken(trx, user.id, summary.id, NOW));
		const rows = await db
			.selectFrom('audit_log')
			.selectAll()
			.where('actor_id', '=', user.id)
			.orderBy('id')
			.execute();
		expect(rows.map((r) => r.action)).toEqual([
			'account.api_token_create',
			'account.api_token_revoke'
		]);
		expect(JSON.parse(rows[0]!.after!)).toEqual({
			tokenId: summary.id,
			name: 'audited',
			scope: 'read+submit',
			expiresAt: null
		});
		const text = JSON.stringify(rows);
		expect(text).not.toContain(token.slice(6));
		expect(text).not.toContain(sha256(token));
	});
});
