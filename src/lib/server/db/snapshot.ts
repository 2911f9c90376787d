import { Kysely, SqliteDialect } from 'kysely';
import { openSqlite } from './connect';
import { readCatalogueRevision } from './revision';
import type { Database } from './schema';

/*
 * A read snapshot of the database that outlives one request handler: a connection of its own,
 * read-only, holding one read transaction. Under WAL it sees the database exactly as it was
 * when the snapshot began, however long it is read and whatever is committed meanwhile, and it
 * never blocks a writer. Used where many reads must agree with each other over time, such as a
 * streamed export (catalogue/potentialExport.ts). While it is open, checkpoints cannot pass
 * it, so the write-ahead log may grow: callers bound how long they hold one.
 *
 * Why not the app's reader connection: it is shared by every request, and a transaction held
 * open on it would show all of them the old snapshot.
 */
export interface ReadSnapshot {
	db: Kysely<Database>;
	/** The catalogue revision the snapshot sees. */
	revision: number;
	/** Ends the read transaction and closes the connection; later calls do nothing. */
	close(): Promise<void>;
}

export async function openReadSnapshot(path: string): Promise<ReadSnapshot> {
	if (path === ':memory:') throw new Error('an in-memory database has no read snapshots');
	const sqlite = openSqlite(path, { readonly: true });
	const db = new Kysely<Database>({ dialect: new SqliteDialect({ database: sqlite }) });
	let closed = false;
	const close = async () => {
		if (closed) return;
		closed = true;
		if (sqlite.inTransaction) sqlite.exec('ROLLBACK');
		await db.destroy();
	};
	try {
		sqlite.exec('BEGIN');
		// The snapshot is taken by the first read inside the transaction.
		const revision = await readCatalogueRevision(db);
		return { db, revision, close };
	} catch (e) {
		await close();
		throw e;
	}
}
