import { requireRole } from '$lib/server/auth/guards';
import { db } from '$lib/server/db';
import { lastBackupAt } from '$lib/server/db/backup';
import type { LayoutServerLoad } from './$types';

/**
 * Every admin page shows when the database was last backed up (each page checks the role too),
 * and which page of the section is open: named here, so that the section's menu needs no
 * client-side page state (reading the path makes this load run again on each navigation).
 */
export const load: LayoutServerLoad = async (event) => {
	requireRole(event, 'admin');
	return { lastBackupAt: await lastBackupAt(db), path: event.url.pathname };
};
