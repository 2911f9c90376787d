import Database from 'better-sqlite3';
import { spawn } from 'node:child_process';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '$lib/server/auth/roles';
import type { Database as Schema } from '$lib/server/db/schema';
import { checkUpload } from '$lib/server/uploads/checkUpload';
import { commitUpload } from '$lib/server/uploads/commitUpload';
import { uploadCsvLimits } from '$lib/server/uploads/readCsv';
import { APPROVAL_CHUNK_ROWS, decideBatch, decideSubmission } from '$lib/server/curation/reviews';
import { withdrawSubmission } from '$lib/server/curation/submissions';
import { SubmissionInvalidError, SubmissionStateError } from '$lib/server/curation/errors';
import { addComment } from '$lib/server/curation/reviews';
import { duringBulkWrite } from '$lib/server/db/revision';
import { PotentialIndex } from '$lib/server/search/potentialIndex';
import { potentialRowVisibility } from '$lib/server/catalogue/visibility';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';
import { insertSessionUser } from '../support/users';

// Approving a large batch commits in chunks of APPROVAL_CHUNK_ROWS versions: other reads and
// writes go on meanwhile, and an approval killed half-way is finished by approving again.
let db: Kysely<Schema>;
let path: string;
let remove: () => Promise<void>;
let contributor: SessionUser;
let curator: SessionUser;
const origin = 'http://hopline.test';

const user = (role: 'contributor' | 'curator', email: string) => insertSessionUser(db, role, email);

/** A CSV batch of `rows` new potentials of one demo [4Fe-4S] centre, each row distinct. */
async function largeBatch(rows: number, tag: number): Promise<number> {
	const lines = [
		'centreAccession,couple,reportedValue,reportedUnit,referenceElectrode,ph,temperatureK,method'
	];
	for (let i = 0; i < rows; i++) {
		const ph = (4 + (Math.floor(i / 500) % 100) * 0.05).toFixed(2);
		lines.push(
			`HL000011,[4Fe-4S]2+/1+,${(-200 - (i % 500) * 0.1 - tag).toFixed(1)},mV,SHE,${ph},298.15,optical_titration`
		);
	}
	const check = await checkUpload(db, lines.join('\n'), 'potential', {
		viewer: null,
		limits: uploadCsvLimits
	});
	expect(check.errorCount).toBe(0);
	const result = await db.transaction().execute((trx) =>
		commitUpload(trx, contributor, check, {
			filename: `large-${tag}.csv`,
			visibility: { visibility: 'public', groupId: null, embargoUntil: null },
			changeNote: null,
			origin,
			pendingRowsMax: 1_000_000
		})
	);
	return result.submissionId;
}

async function versionCounts(submissionId: number): Promise<Record<string, number>> {
	const rows = await db
		.selectFrom('entry_version')
		.select((eb) => ['status', eb.fn.countAll<number>().as('n')])
		.where('submission_id', '=', submissionId)
		.groupBy('status')
		.execute();
	return Object.fromEntries(rows.map((r) => [r.status, Number(r.n)]));
}

beforeAll(async () => {
	({ db, path, remove } = await createTempDatabase());
	await loadDemoScenario(db);
	contributor = await user('contributor', 'c@lab.test');
	curator = await user('curator', 'k@lab.test');
});
afterAll(async () => remove());

describe('a large approval', () => {
	it('lets a read and a write through before it ends', async () => {
		const rows = APPROVAL_CHUNK_ROWS * 6;
		const submissionId = await largeBatch(rows, 0);
		const events: string[] = [];
		const approval = decideBatch(
			db,
			curator,
			submissionId,
			{ returnRows: [], comment: '' },
			origin
		).then((outcome) => {
			events.push('approval');
			return outcome;
		});
		// Once the first chunk has committed, a page's read and a comment (a write) are sent.
		for (let i = 0; i < 2000 && !((await versionCounts(submissionId)).approved ?? 0); i++) {
			await new Promise((resolve) => setTimeout(resolve, 5));
		}
		const readStart = performance.now();
		const read = db
			.selectFrom('potential')
			.select((eb) => eb.fn.countAll<number>().as('n'))
			.executeTakeFirstOrThrow()
			.then(() => {
				events.push('read');
				return performance.now() - readStart;
			});
		const writeStart = performance.now();
		const write = db
			.transaction()
			.execute((trx) => addComment(trx, curator, submissionId, 'looking at it', origin))
			.then(() => {
				events.push('write');
				return performance.now() - writeStart;
			});
		const [readMs, writeMs, outcome] = await Promise.all([read, write, approval]);
		console.log(
			`during a ${rows}-row approval: a read took ${readMs.toFixed(1)} ms, a comment (write) ${writeMs.toFixed(1)} ms`
		);
		// Under the old single connection and one transaction, both waited for the whole approval.
		expect(events.indexOf('read')).toBeLessThan(events.indexOf('approval'));
		expect(events.indexOf('write')).toBeLessThan(events.indexOf('approval'));
		expect(outcome.approved).toHaveLength(rows);
		expect(await versionCounts(submissionId)).toEqual({ approved: rows });
	}, 120_000);

	it('killed half-way leaves whole chunks approved, and approving again finishes it', async () => {
		const rows = APPROVAL_CHUNK_ROWS * 10;
		const submissionId = await largeBatch(rows, 1);
		// node itself with tsx's loader: the tsx command would run the script in a grandchild.
		const child = spawn(
			process.execPath,
			[
				'--import',
				'tsx',
				'tests/support/approveInChild.ts',
				path,
				String(submissionId),
				JSON.stringify(curator)
			],
			{ stdio: ['ignore', 'pipe', 'pipe'] }
		);
		let output = '';
		child.stdout.on('data', (d) => (output += d));
		child.stderr.on('data', (d) => (output += d));
		const exited = new Promise((resolve) => child.once('exit', resolve));
		// Kill once two chunks have committed (or after 60 s).
		const deadline = Date.now() + 60_000;
		while (Date.now() < deadline && child.exitCode === null) {
			if (((await versionCounts(submissionId)).approved ?? 0) >= 2 * APPROVAL_CHUNK_ROWS) break;
			await new Promise((resolve) => setTimeout(resolve, 5));
		}
		child.kill('SIGKILL');
		await exited;
		expect(output).not.toContain('finished');

		const raw = new Database(path, { readonly: true });
		try {
			expect(raw.pragma('integrity_check', { simple: true })).toBe('ok');
		} finally {
			raw.close();
		}
		const counts = await versionCounts(submissionId);
		const approvedRows = counts.approved ?? 0;
		expect(approvedRows).toBeGreaterThanOrEqual(2 * APPROVAL_CHUNK_ROWS);
		expect(approvedRows).toBeLessThan(rows);
		// Chunks commit whole: never part of one.
		expect(approvedRows % APPROVAL_CHUNK_ROWS).toBe(0);
		expect(counts).toEqual({ approved: approvedRows, submitted: rows - approvedRows });
		// Every approved version is in the read model; the outcome is not recorded yet.
		const projected = await db
			.selectFrom('potential')
			.innerJoin('entry_version', 'entry_version.entry_id', 'potential.entry_id')
			.select((eb) => eb.fn.countAll<number>().as('n'))
			.where('entry_version.submission_id', '=', submissionId)
			.executeTakeFirstOrThrow();
		expect(Number(projected.n)).toBe(approvedRows);
		const submission = await db
			.selectFrom('submission')
			.select('status')
			.where('id', '=', submissionId)
			.executeTakeFirstOrThrow();
		expect(submission.status).toBe('submitted');
		const reviews = () =>
			db
				.selectFrom('review')
				.select('decision')
				.where('submission_id', '=', submissionId)
				.execute();
		expect(await reviews()).toEqual([]);

		// Nor can its contributor withdraw it half-way.
		await expect(
			db.transaction().execute((trx) => withdrawSubmission(trx, contributor, submissionId))
		).rejects.toThrow(/is being approved and can no longer be withdrawn/);

		// A half-approved batch cannot be rejected whole, nor its approved rows returned.
		await expect(
			decideSubmission(
				db,
				curator,
				submissionId,
				{ decision: 'reject', comment: 'not this one' },
				origin
			)
		).rejects.toBeInstanceOf(SubmissionStateError);
		await expect(
			decideBatch(db, curator, submissionId, { returnRows: [2], comment: 'check row 2' }, origin)
		).rejects.toBeInstanceOf(SubmissionInvalidError);

		const outcome = await decideBatch(
			db,
			curator,
			submissionId,
			{ returnRows: [], comment: '' },
			origin
		);
		expect(outcome.approved).toHaveLength(rows);
		expect(outcome.mails.map((m) => m.to)).toEqual(['c@lab.test']);
		expect(await versionCounts(submissionId)).toEqual({ approved: rows });
		expect(
			(
				await db
					.selectFrom('submission')
					.select('status')
					.where('id', '=', submissionId)
					.executeTakeFirstOrThrow()
			).status
		).toBe('approved');
		expect(await reviews()).toEqual([{ decision: 'approve' }]);
		const audits = await db
			.selectFrom('audit_log')
			.select('after')
			.where('submission_id', '=', submissionId)
			.where('action', '=', 'review.batch')
			.execute();
		expect(audits.map((a) => JSON.parse(a.after ?? '{}').approved)).toEqual([rows]);
		// Version numbers: each new entry got exactly one, version 1.
		const numbers = await db
			.selectFrom('entry_version')
			.select('version')
			.distinct()
			.where('submission_id', '=', submissionId)
			.execute();
		expect(numbers).toEqual([{ version: 1 }]);

		// Deciding again is refused: the batch is approved.
		await expect(
			decideBatch(db, curator, submissionId, { returnRows: [], comment: '' }, origin)
		).rejects.toBeInstanceOf(SubmissionStateError);
	}, 120_000);
});

describe('the potential search index while a large approval runs', () => {
	it('refreshes at most once a minute meanwhile, and at the next search afterwards', async () => {
		let clock = 0;
		const index = new PotentialIndex(() => clock);
		await index.ensureCurrent(db);
		const total = () => index.facets({ filter: {} }, potentialRowVisibility(null)).total;
		const before = total();
		const approveThree = async (tag: number) => {
			const id = await largeBatch(3, tag);
			await db
				.transaction()
				.execute((trx) => decideBatch(trx, curator, id, { returnRows: [], comment: '' }, origin));
		};
		await duringBulkWrite(async () => {
			await approveThree(2);
			clock = 59_000;
			await index.ensureCurrent(db);
			expect(total()).toBe(before);
			clock = 60_000;
			await index.ensureCurrent(db);
			expect(total()).toBe(before + 3);
		});
		await approveThree(3);
		await index.ensureCurrent(db);
		expect(total()).toBe(before + 6);
	});
});
