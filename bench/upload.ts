// CSV upload: a generated 100 000-row potentials file checked and committed through the app's
// own services on a copy of the benchmark catalogue, beside raw better-sqlite3 prepared inserts
// of the same rows in one transaction. Figures are printed, never asserted.
import SQLite from 'better-sqlite3';
import { copyFileSync, existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { formatAccession } from '../src/lib/schemas/accession';
import { openDatabase } from '../src/lib/server/db/connect';
import { migrateToLatest } from '../src/lib/server/db/migrate';
import { checkUpload } from '../src/lib/server/uploads/checkUpload';
import { commitUpload } from '../src/lib/server/uploads/commitUpload';
import { uploadCsvLimits } from '../src/lib/server/uploads/readCsv';
import { benchUser, generatedPotentialsCsv } from './potentialsCsv';

const ROWS = 100_000;

function copyOf(dataset: string, dir: string, name: string): string {
	const path = join(dir, name);
	copyFileSync(dataset, path);
	if (existsSync(`${dataset}-wal`)) copyFileSync(`${dataset}-wal`, `${path}-wal`);
	return path;
}

export async function benchUpload(dataset: string): Promise<void> {
	const dir = mkdtempSync(join(tmpdir(), 'hopline-bench-upload-'));
	try {
		const appPath = copyOf(dataset, dir, 'app.sqlite');
		const db = openDatabase(appPath);
		await migrateToLatest(db);
		const { text, centres } = await generatedPotentialsCsv(db, ROWS);
		const user = await benchUser(db, 'contributor', 'bench@lab.test');

		const delay = monitorEventLoopDelay({ resolution: 10 });
		delay.enable();
		const t0 = performance.now();
		const check = await checkUpload(db, text, 'potential', {
			viewer: null,
			limits: uploadCsvLimits
		});
		const t1 = performance.now();
		const result = await db.transaction().execute((trx) =>
			commitUpload(trx, user, check, {
				filename: 'bench.csv',
				visibility: { visibility: 'public', groupId: null, embargoUntil: null },
				changeNote: null,
				origin: 'http://bench.test',
				pendingRowsMax: 1_000_000
			})
		);
		const t2 = performance.now();
		delay.disable();
		await db.destroy();

		// The yardstick: the same entry and version rows through prepared statements, one transaction.
		const rawPath = copyOf(dataset, dir, 'raw.sqlite');
		const raw = new SQLite(rawPath);
		raw.pragma('journal_mode = WAL');
		const next = (
			raw.prepare('select coalesce(max(id), 0) + 1 as id from entry').get() as { id: number }
		).id;
		const insertEntry = raw.prepare(
			"insert into entry (id, accession, kind, visibility, is_demo) values (?, ?, 'potential', 'public', 0)"
		);
		const insertVersion = raw.prepare(
			"insert into entry_version (entry_id, version, status, data, submission_id) values (?, null, 'submitted', ?, null)"
		);
		const data = check.entries.map((e) => JSON.stringify(e.entry.data));
		const r0 = performance.now();
		raw.transaction(() => {
			for (let i = 0; i < data.length; i++) {
				insertEntry.run(next + i, formatAccession(next + i));
				insertVersion.run(next + i, data[i]);
			}
		})();
		const r1 = performance.now();
		raw.close();

		const rowsPerSecond = (rows: number, ms: number) => Math.round((rows / ms) * 1000);
		const appRate = rowsPerSecond(result.created, t2 - t0);
		const commitRate = rowsPerSecond(result.created, t2 - t1);
		const rawRate = rowsPerSecond(data.length, r1 - r0);
		console.log(
			`\nCSV upload, ${ROWS.toLocaleString('en')} potential rows (${(Buffer.byteLength(text) / 1e6).toFixed(1)} MB), against ${centres} centres`
		);
		console.log(
			`  check (parse + validate)  ${((t1 - t0) / 1000).toFixed(2)} s   errors ${check.errorCount}, warnings ${check.warningCount}`
		);
		console.log(`  commit (one transaction)  ${((t2 - t1) / 1000).toFixed(2)} s`);
		console.log(`  total                     ${((t2 - t0) / 1000).toFixed(2)} s   (target ≤ 10 s)`);
		console.log(
			`  throughput: check + commit ${appRate.toLocaleString('en')} rows/s, commit alone ${commitRate.toLocaleString('en')} rows/s; raw prepared inserts ${rawRate.toLocaleString('en')} rows/s`
		);
		console.log(
			`  ratio ${(appRate / rawRate).toFixed(2)}× raw end to end, ${(commitRate / rawRate).toFixed(2)}× for the commit alone   (target ≥ 0.25×)`
		);
		console.log(
			`  event loop: longest stall ${(delay.max / 1e6).toFixed(0)} ms, p99 ${(delay.percentile(99) / 1e6).toFixed(0)} ms   (target ≤ ~100 ms)`
		);
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}
