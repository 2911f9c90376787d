// `npm run db:backup -- <file or folder>`: an online backup of the configured database
// (DATABASE_PATH), safe while the app runs. Given a folder, the file is named by the time.
// See src/lib/server/db/backup.ts and DEVELOPERS.md "Backups".
import { existsSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { config } from '../src/lib/server/config';
import { BackupError, backupDatabase } from '../src/lib/server/db/backup';
import { openDatabase } from '../src/lib/server/db/connect';

const [arg] = process.argv.slice(2);
if (!arg) {
	console.error('usage: npm run db:backup -- <backup file, or a folder to put it in>');
	process.exit(2);
}
if (!existsSync(config.DATABASE_PATH)) {
	console.error(`There is no database at ${config.DATABASE_PATH} (DATABASE_PATH) to back up.`);
	process.exit(1);
}
const stamp = new Date().toISOString().replace(/[:.]/g, '-');
const target =
	arg.endsWith('/') || (existsSync(arg) && statSync(arg).isDirectory())
		? join(arg, `hopline-${stamp}.sqlite`)
		: arg;

const db = openDatabase(config.DATABASE_PATH);
try {
	const s = await backupDatabase(db, config.DATABASE_PATH, target);
	const rows = s.tables.reduce((n, t) => n + t.rows, 0);
	console.log(
		`Backed up ${config.DATABASE_PATH} to ${s.file} in ${s.seconds.toFixed(1)} s: ` +
			`${(s.bytes / 1e6).toFixed(1)} MB, ${s.tables.length} tables, ${rows} rows, ` +
			`schema at ${s.lastMigration}, integrity ok.\nSHA-256 ${s.sha256}`
	);
	if (!s.recorded) {
		console.log('Not recorded in the backup log: migrate the database first (npm run db:migrate).');
	}
} catch (e) {
	if (!(e instanceof BackupError)) throw e;
	console.error(`Backup refused: ${e.message}`);
	process.exitCode = 1;
} finally {
	await db.destroy();
}
