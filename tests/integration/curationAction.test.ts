import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseEntryInput } from '$lib/schemas/submission';
import type { SessionUser } from '$lib/server/auth/roles';
import { SubmissionStateError } from '$lib/server/curation/errors';
import { runCurationAction, type OutgoingMail } from '$lib/server/curation/outbox';
import { createDraft, submitForReview } from '$lib/server/curation/submissions';
import type { Database } from '$lib/server/db/schema';
import { insertSessionUser } from '../support/users';
import { createTempDatabase } from '../support/tempDb';

// runCurationAction: the action's transaction commits before its mail is sent, and a rolled-back
// action sends nothing. The services are the real ones (a draft sent for review, which mails
// every curator with immediate notices); only the sending is watched.

let db: Kysely<Database>;
let remove: () => Promise<void>;
let contributor: SessionUser;
const origin = 'http://hopline.test';

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	contributor = await insertSessionUser(db, 'contributor', 'contributor@hopline.test');
	await insertSessionUser(db, 'curator', 'curator@hopline.test'); // immediate notices by default
});
afterAll(() => remove());

function protein(name: string) {
	const parsed = parseEntryInput('protein', { name, organism: 'Escherichia coli' });
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.fields));
	return parsed.entry;
}

/** Creates a draft and sends it for review in `trx`; the mails are those submitForReview decided. */
async function submitProtein(trx: Kysely<Database>, name: string) {
	const draft = await createDraft(trx, contributor, {
		entry: protein(name),
		visibility: { visibility: 'public', groupId: null, embargoUntil: null },
		changeNote: null,
		editAccession: null,
		pendingRowsMax: 1000
	});
	const sent = await submitForReview(trx, contributor, draft.submissionId, origin);
	return { ...draft, mails: sent.mails };
}

const submissionCount = async () =>
	Number(
		(
			await db
				.selectFrom('submission')
				.select((eb) => eb.fn.countAll().as('n'))
				.executeTakeFirstOrThrow()
		).n
	);

describe('runCurationAction', () => {
	it('sends no mail when the action fails and its transaction rolls back', async () => {
		const before = await submissionCount();
		const sent: OutgoingMail[][] = [];
		let decided: OutgoingMail[] = [];
		const failure = new SubmissionStateError('stopped after deciding the mail');
		await expect(
			runCurationAction(
				db,
				async (trx) => {
					decided = (await submitProtein(trx, 'Rolled-back ferredoxin')).mails;
					throw failure;
				},
				{ send: async (mails) => void sent.push([...mails]) }
			)
		).rejects.toBe(failure);
		expect(decided.length).toBeGreaterThan(0); // there was mail to withhold
		expect(sent).toEqual([]);
		expect(await submissionCount()).toBe(before);
	});

	it('sends the mail once, after the transaction committed', async () => {
		const sent: OutgoingMail[][] = [];
		const statusWhenSent: (string | undefined)[] = [];
		let submissionId = 0;
		const action = async (trx: Kysely<Database>) => {
			const r = await submitProtein(trx, 'Committed ferredoxin');
			submissionId = r.submissionId;
			return r;
		};
		const result = await runCurationAction(db, action, {
			send: async (mails) => {
				sent.push([...mails]);
				// Read outside the transaction: only committed rows are visible here.
				const row = await db
					.selectFrom('submission')
					.select('status')
					.where('id', '=', submissionId)
					.executeTakeFirst();
				statusWhenSent.push(row?.status);
			}
		});
		expect(sent).toEqual([result.mails]);
		expect(result.mails.map((m) => m.to)).toEqual([
			'curator@hopline.test',
			'contributor@hopline.test'
		]);
		expect(statusWhenSent).toEqual(['submitted']);
		expect(result.submissionId).toBe(submissionId);
	});

	it('hands the database itself to an action that commits its own transactions', async () => {
		let handed: Kysely<Database> | null = null;
		const sent: OutgoingMail[][] = [];
		const mail = { to: 'a@hopline.test', subject: 's', text: 't' };
		await runCurationAction(
			db,
			async (database) => {
				handed = database;
				return { mails: [mail] };
			},
			{ ownTransactions: true, send: async (mails) => void sent.push([...mails]) }
		);
		expect(handed).toBe(db);
		expect(sent).toEqual([[mail]]);
	});
});
