import type { Kysely } from 'kysely';
import { DomainError } from '$lib/domainError';
import type { Database, Role } from '../db/schema';
import { writeAudit } from '../audit/log';
import { endAllSessions } from '../auth/sessions';
import { roleAtLeast } from '../auth/roles';
import { closeAccessRequests } from './accessRequests';

/* Admin services: users, roles and groups. Every change is written to the audit log. */

/** A change an admin may not make (the last active admin, a taken name): 400 on `field`. */
export class AdminRuleError extends DomainError {
	constructor(
		readonly field: string,
		message: string
	) {
		super('bad_request', message, { fields: { [field]: [message] } });
		this.name = 'AdminRuleError';
	}
}

/** How an account is named in messages: its name, else its e-mail address. */
export function displayName(user: { name: string | null; email: string | null }): string {
	return user.name?.trim() || user.email || 'an account without a name';
}

function audit(
	trx: Kysely<Database>,
	actorId: string,
	action: string,
	before: unknown,
	after: unknown
) {
	return writeAudit(trx, { actorId, action, before, after });
}

export async function listUsers(db: Kysely<Database>) {
	const users = await db
		.selectFrom('User')
		.select(['id', 'email', 'name', 'role', 'disabledAt', 'createdAt', 'emailVerified'])
		.orderBy('email')
		.execute();
	const memberships = await db
		.selectFrom('group_member')
		.innerJoin('research_group', 'research_group.id', 'group_member.group_id')
		.select(['group_member.user_id', 'research_group.name'])
		.execute();
	return users.map((u) => ({
		...u,
		disabled: u.disabledAt !== null,
		verified: u.emailVerified !== null,
		groups: memberships.filter((m) => m.user_id === u.id).map((m) => m.name)
	}));
}

async function activeAdmins(trx: Kysely<Database>, exceptId: string): Promise<number> {
	const row = await trx
		.selectFrom('User')
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.where('role', '=', 'admin')
		.where('disabledAt', 'is', null)
		.where('id', '!=', exceptId)
		.executeTakeFirstOrThrow();
	return Number(row.n);
}

/** @throws {AdminRuleError} for an unknown user or when the last active admin would be lost. */
export async function setUserRole(
	trx: Kysely<Database>,
	actorId: string,
	userId: string,
	role: Role
): Promise<{ name: string; from: Role; to: Role }> {
	const user = await trx
		.selectFrom('User')
		.select(['id', 'role', 'email', 'name'])
		.where('id', '=', userId)
		.executeTakeFirst();
	if (!user) throw new AdminRuleError('userId', 'no such user');
	if (user.role === 'admin' && role !== 'admin' && (await activeAdmins(trx, userId)) === 0) {
		throw new AdminRuleError(
			'role',
			'this is the last active admin; make someone else admin first'
		);
	}
	await trx.updateTable('User').set({ role }).where('id', '=', userId).execute();
	await audit(trx, actorId, 'user.role', { userId, role: user.role }, { userId, role });
	// A role that answers an open request for access closes it.
	if (roleAtLeast(role, 'contributor')) await closeAccessRequests(trx, actorId, userId, 'granted');
	return { name: displayName(user), from: user.role, to: role };
}

/**
 * Disables (and signs out everywhere) or enables an account.
 * @throws {AdminRuleError} for an unknown user or when the last active admin would be disabled.
 */
export async function setUserDisabled(
	trx: Kysely<Database>,
	actorId: string,
	userId: string,
	disabled: boolean
): Promise<{ name: string }> {
	const user = await trx
		.selectFrom('User')
		.select(['id', 'role', 'disabledAt', 'name', 'email'])
		.where('id', '=', userId)
		.executeTakeFirst();
	if (!user) throw new AdminRuleError('userId', 'no such user');
	if (disabled && user.role === 'admin' && (await activeAdmins(trx, userId)) === 0) {
		throw new AdminRuleError('userId', 'this is the last active admin; it cannot be disabled');
	}
	const disabledAt = disabled ? new Date().toISOString() : null;
	await trx.updateTable('User').set({ disabledAt }).where('id', '=', userId).execute();
	// Disabling ends every session at once; enabling again does not revive them.
	if (disabled) await endAllSessions(trx, userId);
	await audit(
		trx,
		actorId,
		disabled ? 'user.disable' : 'user.enable',
		{ userId, disabledAt: user.disabledAt },
		{ userId, disabledAt }
	);
	return { name: displayName(user) };
}

export async function listGroups(db: Kysely<Database>) {
	const groups = await db.selectFrom('research_group').selectAll().orderBy('name').execute();
	const members = await db
		.selectFrom('group_member')
		.innerJoin('User', 'User.id', 'group_member.user_id')
		.select(['group_member.group_id', 'User.id', 'User.email', 'User.name'])
		.orderBy('User.email')
		.execute();
	return groups.map((g) => ({ ...g, members: members.filter((m) => m.group_id === g.id) }));
}

/** @throws {AdminRuleError} when the short name (the `slug` column) is taken. */
export async function createGroup(
	trx: Kysely<Database>,
	actorId: string,
	group: { slug: string; name: string }
): Promise<number> {
	const taken = await trx
		.selectFrom('research_group')
		.select('id')
		.where('slug', '=', group.slug)
		.executeTakeFirst();
	if (taken)
		throw new AdminRuleError('slug', `the short name "${group.slug}" is taken by another group`);
	const { id } = await trx
		.insertInto('research_group')
		.values(group)
		.returning('id')
		.executeTakeFirstOrThrow();
	await audit(trx, actorId, 'group.create', null, { id, ...group });
	return id;
}

/** The group's name. @throws {AdminRuleError} when there is no such group. */
async function requireGroup(trx: Kysely<Database>, groupId: number): Promise<string> {
	const group = await trx
		.selectFrom('research_group')
		.select(['id', 'name'])
		.where('id', '=', groupId)
		.executeTakeFirst();
	if (!group) throw new AdminRuleError('groupId', 'no such group');
	return group.name;
}

/** @throws {AdminRuleError} for an unknown group or e-mail, or an existing membership. */
export async function addGroupMember(
	trx: Kysely<Database>,
	actorId: string,
	groupId: number,
	email: string
): Promise<{ name: string; group: string }> {
	const groupName = await requireGroup(trx, groupId);
	const user = await trx
		.selectFrom('User')
		.select(['id', 'name', 'email'])
		.where('email', '=', email.toLowerCase())
		.executeTakeFirst();
	if (!user) throw new AdminRuleError('email', `no account with the e-mail address ${email}`);
	const existing = await trx
		.selectFrom('group_member')
		.select('user_id')
		.where('group_id', '=', groupId)
		.where('user_id', '=', user.id)
		.executeTakeFirst();
	if (existing) throw new AdminRuleError('email', `${email} is a member already`);
	await trx.insertInto('group_member').values({ group_id: groupId, user_id: user.id }).execute();
	await audit(trx, actorId, 'group.add_member', null, { groupId, userId: user.id });
	return { name: displayName(user), group: groupName };
}

/**
 * @throws {AdminRuleError} for an unknown group, or an account that is not a member of it (say,
 * removed meanwhile from another page): nothing is removed, and nothing is written to the log.
 */
export async function removeGroupMember(
	trx: Kysely<Database>,
	actorId: string,
	groupId: number,
	userId: string
): Promise<{ name: string; group: string }> {
	const groupName = await requireGroup(trx, groupId);
	const person = await trx
		.selectFrom('User')
		.select(['name', 'email'])
		.where('id', '=', userId)
		.executeTakeFirst();
	const removed = await trx
		.deleteFrom('group_member')
		.where('group_id', '=', groupId)
		.where('user_id', '=', userId)
		.executeTakeFirst();
	if (Number(removed.numDeletedRows) === 0)
		throw new AdminRuleError('userId', 'that account is not a member of this group');
	await audit(trx, actorId, 'group.remove_member', { groupId, userId }, null);
	return { name: person ? displayName(person) : 'the account', group: groupName };
}
