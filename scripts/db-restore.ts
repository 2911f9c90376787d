// `npm run db:restore -- <backup file>`: replaces the configured database (DATABASE_PATH) with a
// backup, with the app stopped. The backup is checked first (integrity, migrations); the
// replaced database is kept beside it as <file>.before-restore-<time>. See DEVELOPERS.md "Backups".
import { config } from '../src/lib/server/config';
import { BackupError, restoreDatabase } from '../src/lib/server/db/backup';

const [backup] = process.argv.slice(2);
if (!backup) {
	console.error('usage: npm run db:restore -- <backup file>   (stop the app first)');
	process.exit(2);
}
try {
	const s = await restoreDatabase(backup, config.DATABASE_PATH);
	const rows = s.tables.reduce((n, t) => n + t.rows, 0);
	console.log(
		`Restored ${config.DATABASE_PATH} from ${s.file} (${s.tables.length} tables, ${rows} rows, ` +
			`schema at ${s.lastMigration}) in ${s.seconds.toFixed(1)} s.`
	);
	if (s.migrated.length > 0) console.log(`Migrated to this version: ${s.migrated.join(', ')}.`);
	console.log(
		s.keptAside
			? `The database it replaced is kept at ${s.keptAside}.`
			: 'There was no database there before.'
	);
} catch (e) {
	if (!(e instanceof BackupError)) throw e;
	console.error(`Restore refused: ${e.message}`);
	process.exitCode = 1;
}
