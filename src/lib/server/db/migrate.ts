import { Migrator, type Kysely, type MigrationProvider } from 'kysely';
import { migrations } from '$migrations/index';
import type { Database } from './schema';

const staticProvider: MigrationProvider = { getMigrations: async () => migrations };

/** Brings the schema to the newest migration; throws with the failing migration's name. */
export async function migrateToLatest(db: Kysely<Database>): Promise<string[]> {
	const migrator = new Migrator({ db, provider: staticProvider });
	const { error, results } = await migrator.migrateToLatest();
	const failed = results?.find((r) => r.status === 'Error');
	if (error || failed) {
		const name = failed ? ` (${failed.migrationName})` : '';
		throw new Error(`Migration failed${name}: ${error instanceof Error ? error.message : error}`);
	}
	return (results ?? []).map((r) => r.migrationName);
}
