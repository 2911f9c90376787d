import { requireRole } from '$lib/server/auth/guards';
import { db } from '$lib/server/db';
import { lastBackupAt } from '$lib/server/db/backup';
import type { LayoutServerLoad } from './$types';

/** Every admin page shows when the database was last backed up (each page checks the role too). */
export const load: LayoutServerLoad = async (event) => {
	requireRole(event, 'admin');
	return { lastBackupAt: await lastBackupAt(db) };
};
