import { requireRole } from '$lib/server/auth/guards';
import { db } from '$lib/server/db';
import { backupHistory } from '$lib/server/db/backup';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const log = await backupHistory(db, 50);
	return {
		log: log.map((r) => ({
			id: r.id,
			kind: r.kind,
			at: r.at,
			file: r.file,
			megabytes: r.bytes / 1e6,
			tables: r.table_count,
			rows: r.row_count,
			lastMigration: r.last_migration,
			seconds: r.seconds,
			sha256: r.sha256
		}))
	};
};
