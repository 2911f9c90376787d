// `npm run structures:migrate`: moves structure files kept before they were attachments
// (`<data folder>/structures/<SHA-256>`) into the attachment store, listed on the distances still
// under review whose note names them (src/lib/server/structures/legacyFolder.ts). Approved
// versions are frozen, so files only they name stay in the folder; nothing is deleted.
import { dirname, join, resolve } from 'node:path';
import { config } from '../src/lib/server/config';
import { openDatabase } from '../src/lib/server/db/connect';
import { migrateToLatest } from '../src/lib/server/db/migrate';
import { storeFromConfig } from '../src/lib/server/attachments/store';
import { moveLegacyStructureFiles } from '../src/lib/server/structures/legacyFolder';

const folder = join(dirname(resolve(config.DATABASE_PATH)), 'structures');
const db = openDatabase(config.DATABASE_PATH);
try {
	await migrateToLatest(db);
	const store = storeFromConfig(config);
	const r = await moveLegacyStructureFiles(db, store, folder);
	console.log(
		`${folder}: ${r.files} structure file(s); listed on ${r.listed} distance version(s) under review (${store.kind} store).`
	);
	if (r.leftInFolder.length > 0)
		console.log(
			`Left in the folder (named by no distance under review; approved versions are frozen): ${r.leftInFolder.join(', ')}`
		);
	if (r.skipped.length > 0)
		console.log(`Skipped (not a SHA-256 of their bytes): ${r.skipped.join(', ')}`);
} finally {
	await db.destroy();
}
