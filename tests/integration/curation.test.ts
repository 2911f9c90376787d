import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '$lib/server/auth/roles';
import type { Database, Role } from '$lib/server/db/schema';
import { parseEntryInput } from '$lib/schemas/submission';
import type { EntryData } from '$lib/schemas/entryData';
import {
	createDraft,
	submitForReview,
	updateDraft,
	withdrawSubmission
} from '$lib/server/curation/submissions';
import { addComment, decideSubmission } from '$lib/server/curation/reviews';
import { listQueue } from '$lib/server/curation/submissionLists';
import { loadSubmissionView } from '$lib/server/curation/submissionView';
import { dueDigests } from '$lib/server/curation/notices';
import {
	SubmissionAccessError,
	SubmissionInvalidError,
	SubmissionStateError
} from '$lib/server/curation/errors';
import { listAudit } from '$lib/server/audit/log';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';

let db: Kysely<Database>;
let remove: () => Promise<void>;
const origin = 'http://hopline.test';
const PUBLIC = { visibility: 'public' as const, groupId: null, embargoUntil: null };

async function makeUser(role: Role, email: string, notices = 'immediate'): Promise<SessionUser> {
	const { id } = await db
		.insertInto('User')
		.values({
			email,
			name: email.split('@')[0] ?? email,
			role,
			emailVerified: null,
			image: null,
			passwordHash: null,
			disabledAt: null,
			curationNotices: notices as 'immediate'
		})
		.returning('id')
		.executeTakeFirstOrThrow();
	return { id, email, name: email.split('@')[0] ?? email, role, groupIds: [] };
}

function potential(centreAccession: string, reportedValue: number, extra = {}): EntryData {
	const parsed = parseEntryInput('potential', {
		centreAccession,
		couple: '[4Fe-4S]2+/1+',
		reportedValue,
		reportedUnit: 'mV',
		referenceElectrode: 'SHE',
		ph: 7,
		temperatureK: 298.15,
		method: 'epr_titration',
		uncertaintyMv: 10,
		...extra
	});
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.fields));
	return parsed.entry;
}

let contributor: SessionUser;
let curator: SessionUser;
let dailyCurator: SessionUser;
let centre: string;

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	await loadDemoScenario(db);
	contributor = await makeUser('contributor', 'contrib@lab.test');
	curator = await makeUser('curator', 'curator@lab.test');
	dailyCurator = await makeUser('curator', 'daily@lab.test', 'daily');
	await makeUser('curator', 'quiet@lab.test', 'off');
	// A [4Fe-4S] centre of the demo scenario whose approved potential is about −250 mV at pH 7.
	const row = await db
		.selectFrom('potential')
		.select(['centre_accession', 'em_mv_she'])
		.where('couple', '=', '[4Fe-4S]2+/1+')
		.where('ph', '=', 7)
		.where('temperature_k', '=', 298.15)
		.orderBy('entry_id')
		.executeTakeFirstOrThrow();
	centre = row.centre_accession;
});
afterAll(async () => remove());

const tx = <T>(fn: (trx: Kysely<Database>) => Promise<T>) => db.transaction().execute(fn);

describe('the curation workflow', () => {
	it('takes a potential from draft to approval, through a return and a fix', async () => {
		const approvedBefore = await db
			.selectFrom('potential')
			.select('em_mv_she')
			.where('centre_accession', '=', centre)
			.where('couple', '=', '[4Fe-4S]2+/1+')
			.where('ph', '=', 7)
			.executeTakeFirstOrThrow();
		// +250 instead of −250: a sign slip, far outside the [4Fe-4S]2+/1+ range.
		const { submissionId, accession } = await tx((trx) =>
			createDraft(trx, contributor, {
				entry: potential(centre, 250),
				visibility: PUBLIC,
				changeNote: null,
				editAccession: null,
				pendingRowsMax: 1000
			})
		);
		expect(accession).toMatch(/^HL\d{6}$/);
		// A draft is invisible: no read-model row, no version number.
		expect(
			await db
				.selectFrom('potential')
				.select('entry_id')
				.where('accession', '=', accession)
				.execute()
		).toEqual([]);

		const draftView = await loadSubmissionView(db, contributor, submissionId);
		const kinds = draftView.versions[0]?.warnings.map((w) => w.kind);
		expect(kinds).toContain('range');
		expect(kinds).toContain('conflict');
		expect(draftView.versions[0]?.warnings.find((w) => w.kind === 'range')?.source).toMatch(
			/Liu et al/
		);

		const submitted = await tx((trx) => submitForReview(trx, contributor, submissionId, origin));
		// One mail for the curator on immediate notices; the daily one is queued; "off" gets none.
		// The contributor gets a receipt.
		expect(submitted.mails.map((m) => m.to)).toEqual(['curator@lab.test', 'contrib@lab.test']);
		expect(submitted.mails[0]?.text).toContain(`${origin}/review/${submissionId}`);
		const queued = await db
			.selectFrom('curation_notice')
			.select('user_id')
			.where('submission_id', '=', submissionId)
			.execute();
		expect(queued.map((q) => q.user_id)).toEqual([dailyCurator.id]);

		const queue = await listQueue(db, { status: 'submitted' });
		const row = queue.find((r) => r.id === submissionId);
		expect(row?.rangeWarnings).toBe(1);
		expect(row?.conflicts).toBeGreaterThanOrEqual(1);
		expect(
			(await listQueue(db, { status: 'submitted', flag: 'conflicts' })).map((r) => r.id)
		).toContain(submissionId);

		// Editing is closed while the curators have it.
		await expect(
			tx((trx) =>
				updateDraft(trx, contributor, submissionId, {
					entry: potential(centre, -250),
					visibility: PUBLIC,
					changeNote: null
				})
			)
		).rejects.toBeInstanceOf(SubmissionStateError);

		const returned = await tx((trx) =>
			decideSubmission(
				trx,
				curator,
				submissionId,
				{ decision: 'return', comment: 'Sign of the value?' },
				origin
			)
		);
		expect(returned.mails).toHaveLength(1);
		expect(returned.mails[0]).toMatchObject({
			to: 'contrib@lab.test',
			subject: `Submission #${submissionId} returned for changes`
		});
		expect(returned.mails[0]?.text).toContain('Sign of the value?');

		await tx((trx) =>
			updateDraft(trx, contributor, submissionId, {
				entry: potential(centre, approvedBefore.em_mv_she - 5),
				visibility: PUBLIC,
				changeNote: 'sign fixed'
			})
		);
		const fixed = await loadSubmissionView(db, contributor, submissionId);
		expect(fixed.versions[0]?.warnings).toEqual([]);
		expect(fixed.comments.map((c) => c.body)).toEqual(['Sign of the value?']);
		await tx((trx) => submitForReview(trx, contributor, submissionId, origin));

		const outcome = await tx((trx) =>
			decideSubmission(trx, curator, submissionId, { decision: 'approve', comment: '' }, origin)
		);
		expect(outcome.approved).toEqual([{ accession, version: 1 }]);
		expect(outcome.mails[0]?.text).toContain(`${origin}/e/${accession}/v1`);
		const projected = await db
			.selectFrom('potential')
			.select(['em_mv_she', 'version'])
			.where('accession', '=', accession)
			.executeTakeFirstOrThrow();
		expect(projected).toEqual({ em_mv_she: approvedBefore.em_mv_she - 5, version: 1 });

		const audit = await listAudit(db, { submissionId, limit: 50 });
		expect(audit.rows.map((r) => r.action).reverse()).toEqual([
			'submission.create',
			'submission.submit',
			'review.return',
			'submission.edit',
			'submission.resubmit',
			'review.approve'
		]);
	});

	it('proposes a new version of an approved entry and shows the differences', async () => {
		const existing = await db
			.selectFrom('potential')
			.select(['accession', 'version', 'em_mv_she'])
			.where('centre_accession', '=', centre)
			.orderBy('entry_id')
			.executeTakeFirstOrThrow();
		const { submissionId, accession } = await tx((trx) =>
			createDraft(trx, contributor, {
				entry: potential(centre, existing.em_mv_she, { uncertaintyMv: 5, note: 'remeasured' }),
				visibility: PUBLIC,
				changeNote: 'tighter uncertainty',
				editAccession: existing.accession,
				pendingRowsMax: 1000
			})
		);
		expect(accession).toBe(existing.accession);
		const view = await loadSubmissionView(db, contributor, submissionId);
		expect(view.submission.title).toMatch(new RegExp(`${existing.accession}, new version`));
		expect(view.versions[0]?.current?.version).toBe(existing.version);
		expect(view.versions[0]?.changes.map((c) => c.field)).toEqual(
			expect.arrayContaining(['uncertaintyMv', 'note'])
		);
		await tx((trx) => submitForReview(trx, contributor, submissionId, origin));
		const outcome = await tx((trx) =>
			decideSubmission(
				trx,
				curator,
				submissionId,
				{ decision: 'approve', comment: 'thanks' },
				origin
			)
		);
		expect(outcome.approved).toEqual([{ accession, version: existing.version + 1 }]);
	});

	it('applies the visibility a version asks for on approval', async () => {
		const { id: groupId } = await db
			.insertInto('research_group')
			.values({ slug: 'embargo-lab', name: 'Embargo lab' })
			.returning('id')
			.executeTakeFirstOrThrow();
		await db
			.insertInto('group_member')
			.values({ group_id: groupId, user_id: contributor.id })
			.execute();
		const member = { ...contributor, groupIds: [groupId] };
		const { submissionId, accession } = await tx((trx) =>
			createDraft(trx, member, {
				entry: potential(centre, -255, { ph: 9 }),
				visibility: { visibility: 'embargoed', groupId, embargoUntil: '2099-01-01T00:00:00.000Z' },
				changeNote: null,
				editAccession: null,
				pendingRowsMax: 1000
			})
		);
		await tx((trx) => submitForReview(trx, member, submissionId, origin));
		await tx((trx) =>
			decideSubmission(trx, curator, submissionId, { decision: 'approve', comment: '' }, origin)
		);
		const entry = await db
			.selectFrom('entry')
			.select(['visibility', 'group_id', 'embargo_until'])
			.where('accession', '=', accession)
			.executeTakeFirstOrThrow();
		expect(entry).toEqual({
			visibility: 'embargoed',
			group_id: groupId,
			embargo_until: '2099-01-01T00:00:00.000Z'
		});
		const row = await db
			.selectFrom('potential')
			.select(['public_from', 'group_id'])
			.where('accession', '=', accession)
			.executeTakeFirstOrThrow();
		expect(row).toEqual({ public_from: '2099-01-01T00:00:00.000Z', group_id: groupId });
	});

	it('refuses a group the contributor does not belong to', async () => {
		const { id: groupId } = await db
			.insertInto('research_group')
			.values({ slug: 'other-lab', name: 'Other lab' })
			.returning('id')
			.executeTakeFirstOrThrow();
		await expect(
			tx((trx) =>
				createDraft(trx, contributor, {
					entry: potential(centre, -250),
					visibility: { visibility: 'group', groupId, embargoUntil: null },
					changeNote: null,
					editAccession: null,
					pendingRowsMax: 1000
				})
			)
		).rejects.toBeInstanceOf(SubmissionInvalidError);
	});

	it('names a reference that does not resolve when submitting, and writes nothing', async () => {
		const { submissionId } = await tx((trx) =>
			createDraft(trx, contributor, {
				entry: potential('HL999999', -250),
				visibility: PUBLIC,
				changeNote: null,
				editAccession: null,
				pendingRowsMax: 1000
			})
		);
		const error = await tx((trx) => submitForReview(trx, contributor, submissionId, origin)).catch(
			(e: unknown) => e
		);
		expect(error).toBeInstanceOf(SubmissionInvalidError);
		expect((error as SubmissionInvalidError).fields).toEqual({
			centreAccession: ['no centre HL999999 in the registry (or not visible to you)']
		});
		const s = await db
			.selectFrom('submission')
			.select('status')
			.where('id', '=', submissionId)
			.executeTakeFirstOrThrow();
		expect(s.status).toBe('draft');
	});

	it('keeps reviewing to curators other than the submitter, and drafts to their owner', async () => {
		const { submissionId } = await tx((trx) =>
			createDraft(trx, curator, {
				entry: potential(centre, -250, { ph: 6 }),
				visibility: PUBLIC,
				changeNote: null,
				editAccession: null,
				pendingRowsMax: 1000
			})
		);
		await tx((trx) => submitForReview(trx, curator, submissionId, origin));
		await expect(
			tx((trx) =>
				decideSubmission(trx, curator, submissionId, { decision: 'approve', comment: '' }, origin)
			)
		).rejects.toBeInstanceOf(SubmissionAccessError);
		await expect(
			tx((trx) => withdrawSubmission(trx, contributor, submissionId))
		).rejects.toBeInstanceOf(SubmissionAccessError);
		await expect(loadSubmissionView(db, contributor, submissionId)).rejects.toThrow(
			/no submission/
		);
		await tx((trx) =>
			decideSubmission(
				trx,
				dailyCurator,
				submissionId,
				{ decision: 'reject', comment: 'duplicate of an existing value' },
				origin
			)
		);
		await expect(
			tx((trx) =>
				decideSubmission(
					trx,
					dailyCurator,
					submissionId,
					{ decision: 'approve', comment: '' },
					origin
				)
			)
		).rejects.toBeInstanceOf(SubmissionStateError);
	});

	it('lets a contributor withdraw, and a curator comment with a mail to the contributor', async () => {
		const { submissionId } = await tx((trx) =>
			createDraft(trx, contributor, {
				entry: potential(centre, -250, { ph: 5 }),
				visibility: PUBLIC,
				changeNote: null,
				editAccession: null,
				pendingRowsMax: 1000
			})
		);
		await tx((trx) => submitForReview(trx, contributor, submissionId, origin));
		const comment = await tx((trx) =>
			addComment(trx, curator, submissionId, 'Which buffer?', origin)
		);
		expect(comment.mails.map((m) => m.to)).toEqual(['contrib@lab.test']);
		const own = await tx((trx) => addComment(trx, contributor, submissionId, 'Tris', origin));
		expect(own.mails).toEqual([]);
		await tx((trx) => withdrawSubmission(trx, contributor, submissionId));
		const versions = await db
			.selectFrom('entry_version')
			.select('status')
			.where('submission_id', '=', submissionId)
			.execute();
		expect(versions).toEqual([{ status: 'withdrawn' }]);
		await expect(
			tx((trx) => withdrawSubmission(trx, contributor, submissionId))
		).rejects.toBeInstanceOf(SubmissionStateError);
	});

	it('sends daily digests once a day after the chosen hour', async () => {
		const before = new Date('2030-01-01T05:00:00Z');
		expect(await tx((trx) => dueDigests(trx, { now: before, hourUtc: 7, origin }))).toEqual([]);
		const at = new Date('2030-01-01T08:00:00Z');
		const mails = await tx((trx) => dueDigests(trx, { now: at, hourUtc: 7, origin }));
		expect(mails.map((m) => m.to)).toEqual(['daily@lab.test']);
		expect(mails[0]?.subject).toMatch(/daily digest: \d+ new submission/);
		expect(mails[0]?.text).toContain(`${origin}/review/`);
		// Nothing twice: the notices are marked sent and the day is done.
		expect(
			await tx((trx) =>
				dueDigests(trx, { now: new Date('2030-01-01T09:00:00Z'), hourUtc: 7, origin })
			)
		).toEqual([]);
		const unsent = await db
			.selectFrom('curation_notice')
			.select('id')
			.where('sent_at', 'is', null)
			.execute();
		expect(unsent).toEqual([]);
	});
});
