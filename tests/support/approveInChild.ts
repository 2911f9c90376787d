// Run by tests/integration/chunkedApproval.test.ts in a child process (tsx), so that the test
// can SIGKILL a real approval in the middle: decides on a CSV batch, approving every row.
// Arguments: database path, submission id, curator as JSON.
import { openDatabase } from '../../src/lib/server/db/connect';
import { decideBatch } from '../../src/lib/server/curation/reviews';
import type { SessionUser } from '../../src/lib/server/auth/roles';

const [path, submissionId, curatorJson] = process.argv.slice(2);
if (!path || !submissionId || !curatorJson)
	throw new Error('usage: approveInChild <db> <id> <curator>');
const curator = JSON.parse(curatorJson) as SessionUser;
const db = openDatabase(path);
process.stdout.write('started\n');
await decideBatch(
	db,
	curator,
	Number(submissionId),
	{ returnRows: [], comment: '' },
	'http://hopline.test'
);
await db.destroy();
process.stdout.write('finished\n');
