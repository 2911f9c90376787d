import type SQLite from 'better-sqlite3';
import {
	CompiledQuery,
	SqliteAdapter,
	SqliteIntrospector,
	SqliteQueryCompiler,
	type DatabaseConnection,
	type DatabaseIntrospector,
	type Dialect,
	type DialectAdapter,
	type Driver,
	type Kysely,
	type QueryCompiler,
	type QueryResult
} from 'kysely';

/*
 * A Kysely dialect over two better-sqlite3 connections to one WAL-mode file: a writer and a
 * read-only reader. Kysely's own SQLite driver serialises every query behind one connection, so
 * a long write transaction (approving a large batch) made every page wait for it. Here:
 *
 * - a statement outside a transaction that only reads (a SELECT that SQLite itself reports as
 *   read-only) runs on the reader at once. better-sqlite3 is synchronous, so the reader is never
 *   used by two statements at the same time and needs no lock. Under WAL it sees every committed
 *   transaction and nothing uncommitted, so a request reads its own earlier (committed) writes;
 * - everything else, and every statement inside `db.transaction()`, runs on the writer, which
 *   one holder at a time owns (first come, first served) for a statement or a whole transaction.
 *
 * Readers therefore wait for no writer; writers wait only for the transaction in progress, which
 * is why long jobs commit in short transactions (see curation/reviews.ts).
 */

export interface SqliteConnections {
	writer: SQLite.Database;
	/** Null for an in-memory database, which a second connection would not share. */
	reader: SQLite.Database | null;
}

export interface ReadWriteOptions {
	/** Told how long the writer was held each time it is released (benchmarks measure with it). */
	onWriterReleased?: (heldMs: number) => void;
}

export class ReadWriteSqliteDialect implements Dialect {
	constructor(
		private readonly open: () => SqliteConnections,
		private readonly options: ReadWriteOptions = {}
	) {}

	createDriver(): Driver {
		return new ReadWriteSqliteDriver(this.open, this.options);
	}
	createQueryCompiler(): QueryCompiler {
		return new SqliteQueryCompiler();
	}
	createAdapter(): DialectAdapter {
		// Kysely's migrator relies on the adapter's no-op migration lock; migrations run at start-up
		// (init) or from the CLI before requests arrive, and every DDL statement takes the writer.
		return new SqliteAdapter();
	}
	createIntrospector(db: Kysely<unknown>): DatabaseIntrospector {
		return new SqliteIntrospector(db);
	}
}

/** A first-come, first-served lock for the writer connection. */
class WriterLock {
	private held = false;
	private heldSince = 0;
	private readonly waiting: (() => void)[] = [];

	constructor(private readonly onReleased?: (heldMs: number) => void) {}

	async acquire(): Promise<void> {
		if (this.held) await new Promise<void>((resolve) => this.waiting.push(resolve));
		this.held = true;
		if (this.onReleased) this.heldSince = performance.now();
	}

	release(): void {
		this.onReleased?.(performance.now() - this.heldSince);
		const next = this.waiting.shift();
		// The lock passes straight to the next in line; nobody can slip in between.
		if (next) next();
		else this.held = false;
	}
}

/** Statements that may run on the reader, if SQLite also reports them read-only. */
const READ_STATEMENT = /^\s*(select|with|values)\b/i;

/**
 * Prepared statements of one connection by SQL text, the most recently added kept. Kysely sends
 * the same few hundred statements over and over; preparing each anew cost about a quarter of an
 * approval's time. SQLite re-prepares a cached statement itself when the schema changes.
 */
class StatementCache {
	private readonly statements = new Map<string, SQLite.Statement>();

	constructor(
		readonly sqlite: SQLite.Database,
		private readonly size = 500
	) {}

	get(sql: string): SQLite.Statement {
		let stmt = this.statements.get(sql);
		if (!stmt) {
			stmt = this.sqlite.prepare(sql);
			if (this.statements.size >= this.size) {
				const oldest = this.statements.keys().next();
				if (!oldest.done) this.statements.delete(oldest.value);
			}
			this.statements.set(sql, stmt);
		}
		return stmt;
	}
}

function run<R>(statement: SQLite.Statement, query: CompiledQuery): QueryResult<R> {
	const parameters = query.parameters as unknown[];
	if (statement.reader) return { rows: statement.all(parameters) as R[] };
	const { changes, lastInsertRowid } = statement.run(parameters);
	return { numAffectedRows: BigInt(changes), insertId: BigInt(lastInsertRowid), rows: [] };
}

/** The two connections of a database, each with its statement cache. */
interface Connections {
	writer: StatementCache;
	reader: StatementCache | null;
}

/**
 * What Kysely holds between acquiring and releasing a "connection": for a single query, or for
 * a whole transaction. It routes each statement to the reader or the writer.
 */
class RoutedConnection implements DatabaseConnection {
	private inTransaction = false;
	private holdsWriter = false;

	constructor(
		private readonly connections: Connections,
		private readonly lock: WriterLock
	) {}

	async executeQuery<R>(query: CompiledQuery): Promise<QueryResult<R>> {
		const { writer, reader } = this.connections;
		if (this.inTransaction) return run<R>(writer.get(query.sql), query);
		if (reader && READ_STATEMENT.test(query.sql)) {
			const stmt = reader.get(query.sql);
			if (stmt.readonly) return run<R>(stmt, query);
		}
		await this.takeWriter();
		try {
			return run<R>(writer.get(query.sql), query);
		} finally {
			this.releaseWriter();
		}
	}

	async *streamQuery<R>(query: CompiledQuery): AsyncIterableIterator<QueryResult<R>> {
		// An open iterator occupies its connection, so streams use the writer (owned meanwhile),
		// never the shared reader.
		const owned = !this.inTransaction;
		if (owned) await this.takeWriter();
		try {
			// A statement of its own: a cached one may be wanted while this one iterates.
			const stmt = this.connections.writer.sqlite.prepare(query.sql);
			if (!stmt.reader) throw new Error('only statements returning rows can be streamed');
			for (const row of stmt.iterate(query.parameters as unknown[])) yield { rows: [row as R] };
		} finally {
			if (owned) this.releaseWriter();
		}
	}

	async begin(): Promise<void> {
		await this.takeWriter();
		try {
			// IMMEDIATE takes SQLite's write lock now (waiting up to busy_timeout for another
			// process), so a transaction that reads first never fails to upgrade later.
			this.connections.writer.get('begin immediate').run();
		} catch (e) {
			this.releaseWriter();
			throw e;
		}
		this.inTransaction = true;
	}

	async end(command: 'commit' | 'rollback'): Promise<void> {
		const { writer } = this.connections;
		try {
			// A statement that failed with some errors (disk full, for one) has already rolled back.
			if (command === 'commit' || writer.sqlite.inTransaction) writer.get(command).run();
		} finally {
			this.inTransaction = false;
			this.releaseWriter();
		}
	}

	release(): void {
		// A transaction Kysely gave up on without commit or rollback must not keep the writer.
		if (this.inTransaction && this.connections.writer.sqlite.inTransaction) {
			this.connections.writer.get('rollback').run();
		}
		this.inTransaction = false;
		this.releaseWriter();
	}

	private async takeWriter(): Promise<void> {
		await this.lock.acquire();
		this.holdsWriter = true;
	}

	private releaseWriter(): void {
		if (!this.holdsWriter) return;
		this.holdsWriter = false;
		this.lock.release();
	}
}

class ReadWriteSqliteDriver implements Driver {
	private connections: Connections | null = null;
	private readonly lock: WriterLock;

	constructor(
		private readonly open: () => SqliteConnections,
		options: ReadWriteOptions
	) {
		this.lock = new WriterLock(options.onWriterReleased);
	}

	async init(): Promise<void> {
		const { writer, reader } = this.open();
		this.connections = {
			writer: new StatementCache(writer),
			reader: reader ? new StatementCache(reader) : null
		};
	}

	async acquireConnection(): Promise<DatabaseConnection> {
		if (!this.connections) throw new Error('the database driver was not initialised');
		return new RoutedConnection(this.connections, this.lock);
	}

	async beginTransaction(connection: DatabaseConnection): Promise<void> {
		await routed(connection).begin();
	}

	async commitTransaction(connection: DatabaseConnection): Promise<void> {
		await routed(connection).end('commit');
	}

	async rollbackTransaction(connection: DatabaseConnection): Promise<void> {
		await routed(connection).end('rollback');
	}

	async savepoint(connection: DatabaseConnection, name: string): Promise<void> {
		await connection.executeQuery(CompiledQuery.raw(`savepoint "${savepointName(name)}"`));
	}

	async rollbackToSavepoint(connection: DatabaseConnection, name: string): Promise<void> {
		await connection.executeQuery(CompiledQuery.raw(`rollback to "${savepointName(name)}"`));
	}

	async releaseSavepoint(connection: DatabaseConnection, name: string): Promise<void> {
		await connection.executeQuery(CompiledQuery.raw(`release "${savepointName(name)}"`));
	}

	async releaseConnection(connection: DatabaseConnection): Promise<void> {
		routed(connection).release();
	}

	async destroy(): Promise<void> {
		// The reader first: the last connection to close checkpoints and removes the WAL.
		this.connections?.reader?.sqlite.close();
		this.connections?.writer.sqlite.close();
		this.connections = null;
	}
}

function routed(connection: DatabaseConnection): RoutedConnection {
	if (!(connection instanceof RoutedConnection)) throw new Error('not a connection of this driver');
	return connection;
}

function savepointName(name: string): string {
	if (!/^[A-Za-z_][A-Za-z0-9_]*$/.test(name)) throw new Error(`invalid savepoint name ${name}`);
	return name;
}
