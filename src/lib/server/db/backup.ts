import SQLite from 'better-sqlite3';
import { createHash } from 'node:crypto';
import {
	copyFileSync,
	createReadStream,
	existsSync,
	mkdirSync,
	renameSync,
	rmSync,
	statSync
} from 'node:fs';
import { dirname, resolve } from 'node:path';
import type { Kysely } from 'kysely';
import { migrations } from '$migrations/index';
import { openDatabase } from './connect';
import { migrateToLatest } from './migrate';
import type { Database } from './schema';

/*
 * Backups of the SQLite file, taken while the app runs, and restores (with the app stopped).
 *
 * Under WAL, committed transactions live in the `-wal` file until a checkpoint copies them into
 * the database file, so copying the database file alone loses them. A backup here goes through
 * SQLite's online backup API (better-sqlite3's `backup()`): it reads one consistent snapshot and
 * never blocks the app's writers. The copy is then turned into a single self-contained file
 * (rollback journal, no `-wal`), checked with `integrity_check`, and only then given its name.
 * Each backup and restore is recorded in `backup_log` (migration 0005), which /admin/backups shows.
 */

export class BackupError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'BackupError';
	}
}

export interface TableDigest {
	name: string;
	rows: number;
	/** SHA-256 of the table's rows, ordered by every column, so equal contents give equal digests. */
	sha256: string;
}

export interface DatabaseFileReport {
	/** `ok`, or what `PRAGMA integrity_check` found. */
	integrity: string;
	/** The migrations the file has had applied, in order. */
	migrations: string[];
	tables: TableDigest[];
}

const quoted = (name: string) => `"${name.replaceAll('"', '""')}"`;

/** Every table of an open database with its row count and checksum. */
function tableDigests(sqlite: SQLite.Database): TableDigest[] {
	const tables = sqlite
		.prepare(
			"select name from sqlite_schema where type = 'table' and name not like 'sqlite_%' order by name"
		)
		.pluck()
		.all() as string[];
	return tables.map((name) => {
		const columns = sqlite.prepare(`select * from ${quoted(name)} limit 0`).columns().length;
		const order = Array.from({ length: columns }, (_, i) => i + 1).join(', ');
		const hash = createHash('sha256');
		let rows = 0;
		const stmt = sqlite.prepare(`select * from ${quoted(name)} order by ${order}`).raw(true);
		for (const row of stmt.iterate()) {
			hash.update(JSON.stringify(row) + '\n');
			rows++;
		}
		return { name, rows, sha256: hash.digest('hex') };
	});
}

/** Reads a database file without changing it: integrity, migrations applied, every table's digest. */
export function inspectDatabaseFile(path: string): DatabaseFileReport {
	const sqlite = new SQLite(path, { readonly: true, fileMustExist: true });
	try {
		const problems = sqlite.pragma('integrity_check', { simple: false }) as {
			integrity_check: string;
		}[];
		const integrity = problems.map((p) => p.integrity_check).join('; ');
		const hasMigrations = sqlite
			.prepare("select 1 from sqlite_schema where type = 'table' and name = 'kysely_migration'")
			.get();
		const applied = hasMigrations
			? (sqlite
					.prepare('select name from kysely_migration order by name')
					.pluck()
					.all() as string[])
			: [];
		return { integrity, migrations: applied, tables: tableDigests(sqlite) };
	} finally {
		sqlite.close();
	}
}

async function sha256OfFile(path: string): Promise<string> {
	const hash = createHash('sha256');
	for await (const chunk of createReadStream(path)) hash.update(chunk as Buffer);
	return hash.digest('hex');
}

export interface BackupSummary {
	file: string;
	/** False when the database has no backup log yet (not migrated to 0005): start the app first. */
	recorded: boolean;
	bytes: number;
	sha256: string;
	tables: TableDigest[];
	lastMigration: string | null;
	seconds: number;
}

const sumRows = (tables: readonly TableDigest[]) => tables.reduce((n, t) => n + t.rows, 0);

/**
 * Backs up the database at `sourcePath` (in use or not) to `targetPath`, which must not exist,
 * and records it in the source's backup log through `db` (the Kysely instance on that file).
 * @throws {BackupError} when the target exists or the copy fails its integrity check.
 */
export async function backupDatabase(
	db: Kysely<Database>,
	sourcePath: string,
	targetPath: string
): Promise<BackupSummary> {
	const source = resolve(sourcePath);
	const target = resolve(targetPath);
	if (target === source) throw new BackupError('the backup cannot replace the database itself');
	if (existsSync(target)) throw new BackupError(`${target} exists already; choose a new name`);
	const partial = `${target}.partial`;
	rmSync(partial, { force: true });
	const started = performance.now();
	const sqlite = new SQLite(source, { fileMustExist: true });
	try {
		sqlite.pragma('busy_timeout = 5000');
		// Everything in one step after the first: one snapshot, never restarted by a write.
		await sqlite.backup(partial, { progress: () => 0x7fffffff });
	} finally {
		sqlite.close();
	}
	try {
		// The copy carries the WAL flag of its source; a backup should be one file on its own.
		const copy = new SQLite(partial, { fileMustExist: true });
		try {
			copy.pragma('journal_mode = DELETE');
		} finally {
			copy.close();
		}
		const report = inspectDatabaseFile(partial);
		if (report.integrity !== 'ok') {
			throw new BackupError(`the copy failed its integrity check: ${report.integrity}`);
		}
		renameSync(partial, target);
		const summary: BackupSummary = {
			file: target,
			recorded: report.tables.some((t) => t.name === 'backup_log'),
			bytes: statSync(target).size,
			sha256: await sha256OfFile(target),
			tables: report.tables,
			lastMigration: report.migrations.at(-1) ?? null,
			seconds: (performance.now() - started) / 1000
		};
		if (summary.recorded) await recordInLog(db, 'backup', summary);
		return summary;
	} finally {
		rmSync(partial, { force: true });
	}
}

async function recordInLog(db: Kysely<Database>, kind: 'backup' | 'restore', s: BackupSummary) {
	await db
		.insertInto('backup_log')
		.values({
			kind,
			file: s.file,
			bytes: s.bytes,
			sha256: s.sha256,
			table_count: s.tables.length,
			row_count: sumRows(s.tables),
			last_migration: s.lastMigration,
			seconds: Math.round(s.seconds * 1000) / 1000
		})
		.execute();
}

/**
 * Refuses while another process has the database open: the app keeps its connections open, and
 * in WAL mode an exclusive lock cannot be had while any other connection exists. When the lock
 * is had, closing this last connection checkpoints the WAL into the file and removes it.
 */
function assertNotInUse(path: string): void {
	const sqlite = new SQLite(path, { fileMustExist: true, timeout: 0 });
	try {
		sqlite.pragma('locking_mode = EXCLUSIVE');
		sqlite.exec('begin exclusive');
		sqlite.exec('commit');
	} catch (e) {
		if (e instanceof SQLite.SqliteError && e.code.startsWith('SQLITE_BUSY')) {
			throw new BackupError(
				`${path} is in use (is the app running?); stop it before restoring over its database`
			);
		}
		throw e;
	} finally {
		sqlite.close();
	}
}

export interface RestoreSummary extends BackupSummary {
	/** Where the database that was replaced now is, with its -wal and -shm; null when none. */
	keptAside: string | null;
	/** Migrations applied after the restore, bringing an older backup up to this version. */
	migrated: string[];
}

/**
 * Replaces the database at `targetPath` with the backup at `backupPath`, after checking the
 * backup: integrity, a Hopline database, no migration this version does not know. The database
 * it replaces is renamed to `<target>.before-restore-<time>` (with its -wal and -shm), never
 * deleted; the restored file is migrated to this version and the restore recorded in its log.
 * @throws {BackupError} when the backup is unfit or the database is in use.
 */
export async function restoreDatabase(
	backupPath: string,
	targetPath: string,
	now: Date = new Date()
): Promise<RestoreSummary> {
	const backup = resolve(backupPath);
	const target = resolve(targetPath);
	if (!existsSync(backup)) throw new BackupError(`no backup file at ${backup}`);
	if (backup === target) throw new BackupError('the backup is the database itself');
	const started = performance.now();
	let report: DatabaseFileReport;
	try {
		report = inspectDatabaseFile(backup);
	} catch (e) {
		if (!(e instanceof SQLite.SqliteError)) throw e;
		throw new BackupError(`${backup} cannot be read as a SQLite database: ${e.message}`);
	}
	if (report.integrity !== 'ok') {
		throw new BackupError(`the backup failed its integrity check: ${report.integrity}`);
	}
	if (report.migrations.length === 0) {
		throw new BackupError(`${backup} is not a Hopline database (it has no migrations table)`);
	}
	const unknown = report.migrations.filter((m) => !(m in migrations));
	if (unknown.length > 0) {
		throw new BackupError(
			`the backup was made by a newer version of Hopline (migrations ${unknown.join(', ')} are unknown here)`
		);
	}
	if (existsSync(target)) assertNotInUse(target);
	const staging = `${target}.restoring`;
	let keptAside: string | null = null;
	try {
		mkdirSync(dirname(target), { recursive: true });
		rmSync(staging, { force: true });
		copyFileSync(backup, staging);
		const copied = inspectDatabaseFile(staging);
		if (JSON.stringify(copied.tables) !== JSON.stringify(report.tables)) {
			throw new BackupError('the copy of the backup differs from the backup; nothing was replaced');
		}
		if (existsSync(target)) {
			// Checked again just before the swap: the copy took a while.
			assertNotInUse(target);
			keptAside = `${target}.before-restore-${now.toISOString().replace(/[:.]/g, '-')}`;
			for (const suffix of ['', '-wal', '-shm']) {
				if (existsSync(target + suffix)) renameSync(target + suffix, keptAside + suffix);
			}
		}
		renameSync(staging, target);
	} finally {
		rmSync(staging, { force: true });
	}
	const db = openDatabase(target);
	try {
		const migrated = await migrateToLatest(db);
		const summary: RestoreSummary = {
			file: backup,
			recorded: true,
			bytes: statSync(backup).size,
			sha256: await sha256OfFile(backup),
			tables: report.tables,
			lastMigration: report.migrations.at(-1) ?? null,
			seconds: (performance.now() - started) / 1000,
			keptAside,
			migrated
		};
		await recordInLog(db, 'restore', summary);
		return summary;
	} finally {
		await db.destroy();
	}
}

/** When the last backup was taken, or null when none is recorded. */
export async function lastBackupAt(db: Kysely<Database>): Promise<string | null> {
	const row = await db
		.selectFrom('backup_log')
		.select('at')
		.where('kind', '=', 'backup')
		.orderBy('at', 'desc')
		.limit(1)
		.executeTakeFirst();
	return row?.at ?? null;
}

/** The backup log, newest first, for the admin page. */
export async function backupHistory(db: Kysely<Database>, limit = 20) {
	return db
		.selectFrom('backup_log')
		.selectAll()
		.orderBy('at', 'desc')
		.orderBy('id', 'desc')
		.limit(limit)
		.execute();
}
