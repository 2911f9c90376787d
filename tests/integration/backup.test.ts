import Database from 'better-sqlite3';
import { execFile } from 'node:child_process';
import {
	copyFileSync,
	existsSync,
	mkdtempSync,
	openSync,
	rmSync,
	writeSync,
	closeSync
} from 'node:fs';
import { tmpdir } from 'node:os';
import { setImmediate } from 'node:timers/promises';
import { join } from 'node:path';
import { promisify } from 'node:util';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	BackupError,
	backupDatabase,
	backupHistory,
	inspectDatabaseFile,
	restoreDatabase,
	type TableDigest
} from '$lib/server/db/backup';
import { openDatabase } from '$lib/server/db/connect';
import type { Database as Schema } from '$lib/server/db/schema';
import { bumpCatalogueRevision, readCatalogueRevision } from '$lib/server/db/revision';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';

// Backups under WAL: a plain copy of the database file missed transactions still in the -wal
// file. backupDatabase uses SQLite's online backup; restoreDatabase checks before replacing.
let db: Kysely<Schema>;
let path: string;
let remove: () => Promise<void>;
let userId: string;
const dir = mkdtempSync(join(tmpdir(), 'hopline-backup-'));

beforeAll(async () => {
	({ db, path, remove } = await createTempDatabase());
	await loadDemoScenario(db);
	({ id: userId } = await db
		.insertInto('User')
		.values({
			email: 'writer@lab.test',
			name: 'writer',
			role: 'reader',
			emailVerified: null,
			image: null,
			passwordHash: null,
			disabledAt: null
		})
		.returning('id')
		.executeTakeFirstOrThrow());
});
afterAll(async () => {
	await remove();
	rmSync(dir, { recursive: true, force: true });
});

const without = (tables: TableDigest[], ...names: string[]) =>
	tables.filter((t) => !names.includes(t.name));

/**
 * Writes until stopped: each transaction adds a saved search numbered i and bumps the catalogue
 * revision, so a consistent snapshot holds searches 1..m and the revision moved by exactly m.
 */
function keepWriting() {
	let committed = 0;
	let running = true;
	const done = (async () => {
		while (running) {
			const i = committed + 1;
			await db.transaction().execute(async (trx) => {
				await trx
					.insertInto('saved_search')
					.values({ user_id: userId, name: `write ${i}`, query: `n=${i}` })
					.execute();
				await bumpCatalogueRevision(trx);
			});
			committed = i;
			await setImmediate();
		}
	})();
	return {
		committed: () => committed,
		stop: async () => {
			running = false;
			await done;
		}
	};
}

describe('a backup taken during writes', () => {
	const backupFile = join(dir, 'during-writes.sqlite');
	let snapshot: number;

	it('holds every transaction committed before it began, and whole transactions only', async () => {
		const revision0 = await readCatalogueRevision(db);
		const writer = keepWriting();
		while (writer.committed() < 50) await new Promise((resolve) => setTimeout(resolve, 5));
		const committedBefore = writer.committed();
		const summary = await backupDatabase(db, path, backupFile);
		await writer.stop();
		expect(summary.recorded).toBe(true);
		expect(summary.file).toBe(backupFile);

		const copy = new Database(backupFile, { readonly: true });
		try {
			expect(copy.pragma('integrity_check', { simple: true })).toBe('ok');
			// A single file: no write-ahead log was needed to read it.
			expect(copy.pragma('journal_mode', { simple: true })).toBe('delete');
			const names = copy
				.prepare("select name from saved_search where name like 'write %' order by id")
				.pluck()
				.all() as string[];
			snapshot = names.length;
			expect(snapshot).toBeGreaterThanOrEqual(committedBefore);
			expect(names).toEqual(Array.from({ length: snapshot }, (_, i) => `write ${i + 1}`));
			const revision = copy.prepare('select revision from catalogue_state').pluck().get();
			expect(revision).toBe(revision0 + snapshot);
		} finally {
			copy.close();
		}
		console.log(
			`backup of ${summary.tables.length} tables in ${summary.seconds.toFixed(2)} s while writing: ` +
				`${committedBefore} transactions committed before it began, ${snapshot} in it, ${writer.committed()} in all`
		);
		expect(existsSync(`${backupFile}-wal`)).toBe(false);
	});

	it('equals the database in every table the writes did not touch', () => {
		const live = inspectDatabaseFile(path);
		const backup = inspectDatabaseFile(backupFile);
		const changed = ['saved_search', 'catalogue_state', 'backup_log'];
		expect(without(backup.tables, ...changed)).toEqual(without(live.tables, ...changed));
		expect(backup.migrations).toEqual(live.migrations);
	});

	it('is recorded in the backup log', async () => {
		const [last] = await backupHistory(db, 1);
		expect(last).toMatchObject({ kind: 'backup', file: backupFile });
		expect(last?.row_count).toBe(
			inspectDatabaseFile(backupFile).tables.reduce((n, t) => n + t.rows, 0)
		);
	});

	it('restores into a new database with the same rows in every table', async () => {
		const target = join(dir, 'restored', 'hopline.sqlite');
		const summary = await restoreDatabase(backupFile, target);
		expect(summary.keptAside).toBeNull();
		const backup = inspectDatabaseFile(backupFile);
		const restored = inspectDatabaseFile(target);
		expect(restored.integrity).toBe('ok');
		expect(restored.migrations).toEqual(backup.migrations);
		// Every table, row count and checksum, except the log that now records the restore.
		expect(without(restored.tables, 'backup_log')).toEqual(without(backup.tables, 'backup_log'));
		const rowsOf = (tables: TableDigest[], name: string) =>
			tables.find((t) => t.name === name)?.rows;
		expect(rowsOf(restored.tables, 'backup_log')).toBe(
			(rowsOf(backup.tables, 'backup_log') ?? 0) + 1
		);
		const restoredDb = openDatabase(target);
		try {
			const [last] = await backupHistory(restoredDb, 1);
			expect(last).toMatchObject({ kind: 'restore', file: backupFile });
			const searches = await restoredDb
				.selectFrom('saved_search')
				.select((eb) => eb.fn.countAll<number>().as('n'))
				.where('name', 'like', 'write %')
				.executeTakeFirstOrThrow();
			expect(Number(searches.n)).toBe(snapshot);
		} finally {
			await restoredDb.destroy();
		}
	});
});

describe('restoring', () => {
	it('refuses while the database is open elsewhere (the running app)', async () => {
		const backupFile = join(dir, 'for-refusal.sqlite');
		await backupDatabase(db, path, backupFile);
		await expect(restoreDatabase(backupFile, path)).rejects.toThrow(/in use/);
	});

	it('keeps the replaced database aside, whole', async () => {
		const backupFile = join(dir, 'to-restore.sqlite');
		await backupDatabase(db, path, backupFile);
		// A stopped app's database, with changes since that backup (some still in its WAL).
		const target = join(dir, 'stopped', 'hopline.sqlite');
		await restoreDatabase(backupFile, target);
		const stopped = openDatabase(target);
		await bumpCatalogueRevision(stopped);
		await stopped.destroy();
		const before = inspectDatabaseFile(target);

		const now = new Date('2026-01-02T03:04:05.678Z');
		const summary = await restoreDatabase(backupFile, target, now);
		expect(summary.keptAside).toBe(`${target}.before-restore-2026-01-02T03-04-05-678Z`);
		expect(inspectDatabaseFile(summary.keptAside ?? '').tables).toEqual(before.tables);
	});

	it('refuses a damaged file, a file that is no database, and a backup from a newer version', async () => {
		const good = join(dir, 'good.sqlite');
		await backupDatabase(db, path, good);
		const target = join(dir, 'untouched.sqlite');

		const notDb = join(dir, 'notes.txt');
		const fd = openSync(notDb, 'w');
		writeSync(
			fd,
			'not a database, just some text that is long enough to have a header '.repeat(20)
		);
		closeSync(fd);
		await expect(restoreDatabase(notDb, target)).rejects.toBeInstanceOf(BackupError);

		// A page of a table overwritten in the middle of the file.
		const damaged = join(dir, 'damaged.sqlite');
		copyFileSync(good, damaged);
		const pageSize = 4096;
		const raw = new Database(good, { readonly: true });
		const { rootpage } = raw
			.prepare("select rootpage from sqlite_schema where name = 'entry_version'")
			.get() as { rootpage: number };
		raw.close();
		const df = openSync(damaged, 'r+');
		writeSync(df, Buffer.alloc(pageSize, 0xa5), 0, pageSize, (rootpage - 1) * pageSize);
		closeSync(df);
		await expect(restoreDatabase(damaged, target)).rejects.toBeInstanceOf(BackupError);

		const newer = join(dir, 'newer.sqlite');
		copyFileSync(good, newer);
		const edit = new Database(newer);
		edit
			.prepare('insert into kysely_migration (name, timestamp) values (?, ?)')
			.run('9999_from_the_future', new Date().toISOString());
		edit.close();
		await expect(restoreDatabase(newer, target)).rejects.toThrow(/newer version/);

		expect(existsSync(target)).toBe(false);
	});

	it('works from the command line', async () => {
		const run = promisify(execFile);
		const target = join(dir, 'cli', 'hopline.sqlite');
		const backupFile = join(dir, 'cli-backup.sqlite');
		const env = { ...process.env, DATABASE_PATH: path };
		const backup = await run(
			process.execPath,
			['--import', 'tsx', 'scripts/db-backup.ts', backupFile],
			{ env }
		);
		expect(backup.stdout).toMatch(/integrity ok/);
		const restore = await run(
			process.execPath,
			['--import', 'tsx', 'scripts/db-restore.ts', backupFile],
			{
				env: { ...env, DATABASE_PATH: target }
			}
		);
		expect(restore.stdout).toMatch(/There was no database there before/);
		expect(without(inspectDatabaseFile(target).tables, 'backup_log')).toEqual(
			without(inspectDatabaseFile(backupFile).tables, 'backup_log')
		);
		await expect(
			run(process.execPath, ['--import', 'tsx', 'scripts/db-restore.ts', backupFile], { env })
		).rejects.toMatchObject({ stderr: expect.stringMatching(/Restore refused: .* in use/) });
	}, 120_000);
});
