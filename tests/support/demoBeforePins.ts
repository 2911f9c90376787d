import type { Kysely } from 'kysely';
import * as pinMigration from '$migrations/0009_pin_version_references';
import type { Database } from '$lib/server/db/schema';
import { loadDemoScenario, type SeedSummary } from '$seed/load';

/**
 * Loads the demo scenario into a database migrated only up to a migration before 0009, for the
 * tests of those migrations. Today's approval path pins every reference in
 * `entry_version_reference`, which such a database has no table for: migration 0009 lends it
 * (its own `up`, with nothing yet to backfill) for the load and takes it back (its `down`), so
 * that migrating forward later creates and backfills it as it would in production.
 */
export async function loadDemoScenarioBeforePins(db: Kysely<Database>): Promise<SeedSummary> {
	await pinMigration.up(db);
	const summary = await loadDemoScenario(db);
	await pinMigration.down(db);
	return summary;
}
