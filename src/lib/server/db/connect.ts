import SQLite from 'better-sqlite3';
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { Kysely, SqliteDialect } from 'kysely';
import type { Database } from './schema';

/** Opens a SQLite connection with the pragmas every Hopline connection needs. */
export function openSqlite(path: string): SQLite.Database {
	if (path !== ':memory:') mkdirSync(dirname(path), { recursive: true });
	const sqlite = new SQLite(path);
	sqlite.pragma('journal_mode = WAL');
	sqlite.pragma('foreign_keys = ON');
	sqlite.pragma('busy_timeout = 5000');
	// Under WAL, NORMAL survives application crashes; only a power cut can cost the last commit.
	sqlite.pragma('synchronous = NORMAL');
	// A 32 MiB page cache (the default is 2 MiB) keeps index rebuilds and page reads in memory.
	sqlite.pragma('cache_size = -32768');
	return sqlite;
}

/**
 * A Kysely instance over the SQLite file at `path`. The file is opened on the first query, not
 * here, so that importing server modules (as `vite build` does) never creates a database.
 */
export function openDatabase(path: string): Kysely<Database> {
	return new Kysely<Database>({
		dialect: new SqliteDialect({ database: async () => openSqlite(path) })
	});
}
