import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	AdminRuleError,
	addGroupMember,
	createGroup,
	removeGroupMember
} from '$lib/server/admin/accounts';
import type { SessionUser } from '$lib/server/auth/roles';
import type { Database } from '$lib/server/db/schema';
import { createTempDatabase } from '../support/tempDb';
import { insertSessionUser } from '../support/users';

let db: Kysely<Database>;
let remove: () => Promise<void>;
let admin: SessionUser;
let member: SessionUser;

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	admin = await insertSessionUser(db, 'admin', 'admin@lab.test');
	member = await insertSessionUser(db, 'reader', 'member@lab.test');
});
afterAll(async () => remove());

const removals = async () =>
	(
		await db
			.selectFrom('audit_log')
			.select('id')
			.where('action', '=', 'group.remove_member')
			.execute()
	).length;

describe('removing a group member', () => {
	it('removes a member once and logs it; a second removal is refused and logs nothing', async () => {
		const groupId = await createGroup(db, admin.id, { slug: 'remove-lab', name: 'Remove lab' });
		await addGroupMember(db, admin.id, groupId, member.email);
		await removeGroupMember(db, admin.id, groupId, member.id);
		expect(
			await db.selectFrom('group_member').selectAll().where('group_id', '=', groupId).execute()
		).toEqual([]);
		expect(await removals()).toBe(1);
		// Before the fix this said "Member removed." and logged a removal that never happened.
		const again = removeGroupMember(db, admin.id, groupId, member.id);
		await expect(again).rejects.toBeInstanceOf(AdminRuleError);
		await expect(again).rejects.toMatchObject({
			field: 'userId',
			message: 'that account is not a member of this group'
		});
		expect(await removals()).toBe(1);
	});
	it('refuses an unknown group', async () => {
		await expect(removeGroupMember(db, admin.id, 999_999, member.id)).rejects.toMatchObject({
			field: 'groupId',
			message: 'no such group'
		});
	});
});
