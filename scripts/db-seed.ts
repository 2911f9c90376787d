// `npm run db:seed`: migrates, then loads the invented demo scenario into an empty database.
import { config } from '../src/lib/server/config';
import { openDatabase } from '../src/lib/server/db/connect';
import { migrateToLatest } from '../src/lib/server/db/migrate';
import { catalogueIsEmpty, loadDemoScenario } from '../seed/load';
import { appAttachmentDeps } from '../seed/demoAttachments';
import { closeImagePool } from '../src/lib/server/attachments/imaging';

const db = openDatabase(config.DATABASE_PATH);
try {
	await migrateToLatest(db);
	if (!(await catalogueIsEmpty(db))) {
		console.log(`${config.DATABASE_PATH} already holds entries; the demo scenario was not loaded.`);
	} else {
		const started = performance.now();
		const summary = await loadDemoScenario(db, { attachments: appAttachmentDeps() });
		const seconds = ((performance.now() - started) / 1000).toFixed(1);
		console.log(`Loaded in ${seconds} s.`);
		console.log(`Loaded the demo scenario into ${config.DATABASE_PATH}:`, summary);
	}
} finally {
	await closeImagePool();
	await db.destroy();
}
