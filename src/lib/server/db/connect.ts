import SQLite from 'better-sqlite3';
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { Kysely } from 'kysely';
import { ReadWriteSqliteDialect, type ReadWriteOptions, type SqliteConnections } from './dialect';
import type { Database } from './schema';

/** Opens a SQLite connection with the pragmas every Hopline connection needs. */
export function openSqlite(path: string, options: { readonly?: boolean } = {}): SQLite.Database {
	if (path !== ':memory:' && !options.readonly) mkdirSync(dirname(path), { recursive: true });
	const sqlite = new SQLite(path, { readonly: options.readonly ?? false });
	if (!options.readonly) {
		// Only a writer may switch the journal mode; a reader finds the file in WAL mode already.
		sqlite.pragma('journal_mode = WAL');
		// Checkpoint when the WAL passes 10 000 pages (about 40 MB), not the default 1 000: a large
		// approval commits every 200 rows, and checkpointing that often rewrote the same index
		// pages again and again (a 20 000-row approval took 17 s instead of 13 s).
		sqlite.pragma('wal_autocheckpoint = 10000');
	}
	sqlite.pragma('foreign_keys = ON');
	sqlite.pragma('busy_timeout = 5000');
	// Under WAL, NORMAL survives application crashes; only a power cut can cost the last commit.
	sqlite.pragma('synchronous = NORMAL');
	// A 32 MiB page cache (the default is 2 MiB) keeps index rebuilds and page reads in memory.
	sqlite.pragma('cache_size = -32768');
	return sqlite;
}

/** The writer, then (for a file) a read-only reader of the same file; see dialect.ts. */
export function openConnections(path: string): SqliteConnections {
	const writer = openSqlite(path);
	if (path === ':memory:') return { writer, reader: null };
	try {
		return { writer, reader: openSqlite(path, { readonly: true }) };
	} catch (e) {
		writer.close();
		throw e;
	}
}

/**
 * A Kysely instance over the SQLite file at `path`: reads outside transactions on a read-only
 * connection, writes and transactions on a writer (dialect.ts). The file is opened on the first
 * query, not here, so that importing server modules (as `vite build` does) never creates a
 * database.
 */
export function openDatabase(path: string, options: ReadWriteOptions = {}): Kysely<Database> {
	return new Kysely<Database>({
		dialect: new ReadWriteSqliteDialect(() => openConnections(path), options)
	});
}
