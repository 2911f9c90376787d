import { requireRole } from '$lib/server/auth/guards';
import { db } from '$lib/server/db';
import { lastBackupAt } from '$lib/server/db/backup';
import type { LayoutServerLoad } from './$types';

const SECTIONS = [
	{ href: '/admin/users', label: 'Users and roles' },
	{ href: '/admin/groups', label: 'Groups' },
	{ href: '/admin/backups', label: 'Backups' },
	{ href: '/admin/mail', label: 'Demo mailbox' }
] as const;

/**
 * Every admin page shows when the database was last backed up (each page checks the role too)
 * and the section's menu with the open page marked. Both are made here, so that the pages'
 * start-up code carries neither the menu nor client-side page state; reading the path makes
 * this load run again on each navigation inside the section.
 */
export const load: LayoutServerLoad = async (event) => {
	requireRole(event, 'admin');
	const at = await lastBackupAt(db);
	return {
		lastBackup: at && `${at.slice(0, 10)} ${at.slice(11, 16)} UTC`,
		sections: SECTIONS.map((s) => ({ ...s, current: s.href === event.url.pathname }))
	};
};
