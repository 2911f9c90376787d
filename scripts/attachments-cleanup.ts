// `npm run attachments:cleanup`: removes attachments that no version can still show (listed by
// no version, or only by rejected and withdrawn ones, for more than a day) and the files no
// attachment names any more, from the configured store (disk or S3). Safe to run while the app runs.
import { config } from '../src/lib/server/config';
import { openDatabase } from '../src/lib/server/db/connect';
import { migrateToLatest } from '../src/lib/server/db/migrate';
import { removeOrphans } from '../src/lib/server/attachments/attachments';
import { storeFromConfig } from '../src/lib/server/attachments/store';

const db = openDatabase(config.DATABASE_PATH);
try {
	await migrateToLatest(db);
	const store = storeFromConfig(config);
	const removed = await removeOrphans(db, store);
	console.log(
		`Removed ${removed.attachments} orphaned attachment(s) and ${removed.files} file(s) from the ${store.kind} store.`
	);
} finally {
	await db.destroy();
}
