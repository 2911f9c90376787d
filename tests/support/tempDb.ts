import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Kysely } from 'kysely';
import { openDatabase } from '$lib/server/db/connect';
import { migrateToLatest } from '$lib/server/db/migrate';
import type { Database } from '$lib/server/db/schema';

/** A fresh SQLite file migrated by the production migration path; remove() deletes it. */
export async function createTempDatabase(): Promise<{
	db: Kysely<Database>;
	path: string;
	remove: () => Promise<void>;
}> {
	const dir = mkdtempSync(join(tmpdir(), 'hopline-test-'));
	const path = join(dir, 'test.sqlite');
	const db = openDatabase(path);
	await migrateToLatest(db);
	return {
		db,
		path,
		remove: async () => {
			await db.destroy();
			rmSync(dir, { recursive: true, force: true });
		}
	};
}
