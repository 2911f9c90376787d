// `npm run db:migrate`: brings the configured database (DATABASE_PATH) to the newest schema.
import { config } from '../src/lib/server/config';
import { openDatabase } from '../src/lib/server/db/connect';
import { migrateToLatest } from '../src/lib/server/db/migrate';

const db = openDatabase(config.DATABASE_PATH);
try {
	const applied = await migrateToLatest(db);
	console.log(
		applied.length > 0
			? `Applied ${applied.length} migration(s) to ${config.DATABASE_PATH}: ${applied.join(', ')}`
			: `${config.DATABASE_PATH} is already at the newest schema.`
	);
} finally {
	await db.destroy();
}
