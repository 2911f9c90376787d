import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { KINDS } from '$lib/kinds';
import { attachmentsOfVersion, type AttachmentDeps } from '$lib/server/attachments/attachments';
import { diskStore } from '$lib/server/attachments/diskStore';
import { closeImagePool, renderImage } from '$lib/server/attachments/imaging';
import {
	AttachmentFileError,
	MAX_ATTACHMENTS_PER_VERSION,
	attachToSubmission,
	detachFromSubmission,
	type AttachInput
} from '$lib/server/attachments/submissionAttachments';
import type { SessionUser } from '$lib/server/auth/roles';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import { createDraft, submitForReview } from '$lib/server/curation/submissions';
import type { Database } from '$lib/server/db/schema';
import { HTML_PAGE, pngOf } from '../support/hostileFiles';
import { createTempDatabase } from '../support/tempDb';
import { insertSessionUser } from '../support/users';

// The upload path of attachments on submissions, asserted on rows of a fresh SQLite file
// migrated by the production path and on the files of a temporary disk store. The rules under
// test are the brief's and DEVELOPERS.md's: only the owner, only while editable (the `edit`
// transition), 404 for what one may not see, nothing written on a refusal, a bound per version,
// and a proposed change starting with its base version's files.

let db: Kysely<Database>;
let remove: () => Promise<void>;
const root = mkdtempSync(join(tmpdir(), 'hopline-sub-attachments-'));
const deps: AttachmentDeps = {
	store: diskStore(root),
	limits: { maxBytes: 10 * 1024 * 1024, maxPixels: 40_000_000 },
	render: (bytes, photo) => renderImage(bytes, photo)
};
let owner: SessionUser;
let other: SessionUser;
let curator: SessionUser;
let png: Uint8Array;
const origin = 'http://127.0.0.1';
const EPR_NUMBERS = new TextEncoder().encode(
	'Field (mT),Signal (a.u.)\n320,0.1\n330,0.5\n340,-0.4\n350,0.05\n'
);

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	owner = await insertSessionUser(db, 'contributor', 'owner@test.invalid');
	other = await insertSessionUser(db, 'contributor', 'other@test.invalid');
	curator = await insertSessionUser(db, 'curator', 'cur@test.invalid');
	png = await pngOf(64, 40);
});
afterAll(async () => {
	await closeImagePool();
	await remove();
	rmSync(root, { recursive: true, force: true });
});

const tx = <T>(work: (trx: Kysely<Database>) => Promise<T>) => db.transaction().execute(work);

const protein = (name: string) => ({
	kind: 'protein' as const,
	data: KINDS.protein.schema.parse({ name, organism: 'Testus attachii', structureIds: ['T1'] })
});
const PUBLIC = { visibility: 'public' as const, groupId: null, embargoUntil: null };

async function draft(user = owner) {
	return tx((trx) =>
		createDraft(trx, user, {
			entry: protein(`Draft ${Math.random()}`),
			visibility: PUBLIC,
			changeNote: null,
			editAccession: null,
			pendingRowsMax: 1000
		})
	);
}

async function versionOf(submissionId: number) {
	return db
		.selectFrom('entry_version')
		.select(['id', 'status'])
		.where('submission_id', '=', submissionId)
		.executeTakeFirstOrThrow();
}

function epr(overrides: Partial<AttachInput> = {}): AttachInput {
	return {
		accession: null,
		meta: {
			kind: 'epr_spectrum',
			caption: 'X-band EPR, reduced',
			conditions: {
				temperatureK: 15,
				microwaveFrequencyGHz: 9.4,
				microwavePowerMw: 2,
				modulationAmplitudeMt: 1,
				scanRateMvPerS: null,
				referenceElectrode: null
			}
		},
		file: { fileName: 'spectrum.png', bytes: png },
		numbers: { fileName: 'spectrum.csv', bytes: EPR_NUMBERS },
		numbersOnly: false,
		...overrides
	};
}

const counts = async () => ({
	attachments: Number(
		(
			await db
				.selectFrom('attachment')
				.select((eb) => eb.fn.countAll().as('n'))
				.executeTakeFirstOrThrow()
		).n
	),
	files: readdirSync(root, { recursive: true }).length
});

describe('attaching files to a submission', () => {
	it('stores an image with its numbers and lists it on the draft version', async () => {
		const { submissionId } = await draft();
		const { attachment, target } = await attachToSubmission(db, deps, owner, submissionId, epr());
		const version = await versionOf(submissionId);
		expect(target.versionId).toBe(version.id);
		const listed = await attachmentsOfVersion(db, version.id);
		expect(listed.map((a) => a.id)).toEqual([attachment.id]);
		expect(listed[0]).toMatchObject({
			kind: 'epr_spectrum',
			role: 'image',
			mediaType: 'image/png',
			numbers: { fileName: 'spectrum.csv', byteSize: EPR_NUMBERS.byteLength }
		});
		expect(listed[0]?.thumbnail).not.toBeNull();
		const audit = await db
			.selectFrom('audit_log')
			.select('action')
			.where('submission_id', '=', submissionId)
			.execute();
		expect(audit.map((a) => a.action)).toContain('submission.attach');
	});

	it('attaches numbers alone as a data attachment', async () => {
		const { submissionId } = await draft();
		const { attachment } = await attachToSubmission(
			db,
			deps,
			owner,
			submissionId,
			epr({
				file: { fileName: 'only.csv', bytes: EPR_NUMBERS },
				numbers: null,
				numbersOnly: true
			})
		);
		expect(attachment.role).toBe('data');
		expect(attachment.thumbnail).toBeNull();
	});

	it('answers another contributor 404 and a curator 403, writing nothing', async () => {
		const { submissionId } = await draft();
		const before = await counts();
		await expect(attachToSubmission(db, deps, other, submissionId, epr())).rejects.toMatchObject({
			code: 'not_found'
		});
		await expect(attachToSubmission(db, deps, curator, submissionId, epr())).rejects.toMatchObject({
			code: 'forbidden'
		});
		await expect(attachToSubmission(db, deps, owner, 999_999, epr())).rejects.toMatchObject({
			code: 'not_found'
		});
		expect(await counts()).toEqual(before);
	});

	it('refuses a submitted submission with 409 (the edit rule) and writes nothing', async () => {
		const { submissionId } = await draft();
		await tx((trx) => submitForReview(trx, owner, submissionId, origin));
		const before = await counts();
		await expect(attachToSubmission(db, deps, owner, submissionId, epr())).rejects.toMatchObject({
			code: 'conflict',
			message: expect.stringMatching(/only drafts and returned submissions can be edited/)
		});
		expect(await counts()).toEqual(before);
	});

	it('refuses a hostile file beside its field, before anything is stored', async () => {
		const { submissionId } = await draft();
		const before = await counts();
		const html = new TextEncoder().encode(HTML_PAGE);
		const refusal = await attachToSubmission(
			db,
			deps,
			owner,
			submissionId,
			epr({ file: { fileName: 'figure.png', bytes: html } })
		).catch((e: unknown) => e);
		expect(refusal).toBeInstanceOf(AttachmentFileError);
		expect(refusal).toMatchObject({ code: 'unsupported_media_type', field: 'file' });
		// A good image with numbers that cannot be plotted: the numbers field is named.
		const numbers = await attachToSubmission(
			db,
			deps,
			owner,
			submissionId,
			epr({ numbers: { fileName: 'n.csv', bytes: new TextEncoder().encode('a,b\nx,y\n') } })
		).catch((e: unknown) => e);
		expect(numbers).toMatchObject({ code: 'unprocessable_content', field: 'numbers' });
		expect(await counts()).toEqual(before);
		expect(await attachmentsOfVersion(db, (await versionOf(submissionId)).id)).toEqual([]);
	});

	it(`stops at ${MAX_ATTACHMENTS_PER_VERSION} files per version with a clear 409`, async () => {
		const { submissionId } = await draft();
		const version = await versionOf(submissionId);
		// The same bytes each time: stored once, listed as distinct attachments.
		for (let i = 0; i < MAX_ATTACHMENTS_PER_VERSION; i++)
			await attachToSubmission(db, deps, owner, submissionId, epr({ numbers: null }));
		const before = await counts();
		await expect(
			attachToSubmission(db, deps, owner, submissionId, epr({ numbers: null }))
		).rejects.toMatchObject({
			code: 'conflict',
			message: expect.stringMatching(/already carries 12 files.*remove one/)
		});
		expect(await counts()).toEqual(before);
		expect(await attachmentsOfVersion(db, version.id)).toHaveLength(MAX_ATTACHMENTS_PER_VERSION);
	});

	it('needs `entry` when the submission holds several versions, and attaches to the one named', async () => {
		const { submissionId, accession: first } = await draft();
		const second = await tx(async (trx) => {
			const entry = await createEntry(trx, {
				kind: 'protein',
				visibility: 'public',
				groupId: null,
				createdBy: owner.id
			});
			const versionId = await addVersion(trx, entry.id, protein('Second').data, {
				status: 'draft',
				submissionId,
				createdBy: owner.id
			});
			return { accession: entry.accession, versionId };
		});
		const before = await counts();
		await expect(attachToSubmission(db, deps, owner, submissionId, epr())).rejects.toMatchObject({
			code: 'bad_request',
			fields: { entry: [expect.stringMatching(/several entries: name the one/)] }
		});
		await expect(
			attachToSubmission(db, deps, owner, submissionId, epr({ accession: 'HL999998' }))
		).rejects.toMatchObject({
			fields: { entry: [`HL999998 is not in submission ${submissionId}`] }
		});
		expect(await counts()).toEqual(before);
		const { attachment } = await attachToSubmission(
			db,
			deps,
			owner,
			submissionId,
			epr({ accession: second.accession })
		);
		expect((await attachmentsOfVersion(db, second.versionId)).map((a) => a.id)).toEqual([
			attachment.id
		]);
		expect(first).not.toBe(second.accession);
	});

	it('removes a file from a draft, and refuses others and unknown ids', async () => {
		const { submissionId } = await draft();
		const { attachment } = await attachToSubmission(db, deps, owner, submissionId, epr());
		await expect(
			detachFromSubmission(db, other, submissionId, attachment.id)
		).rejects.toMatchObject({ code: 'not_found' });
		await expect(detachFromSubmission(db, owner, submissionId, 999_999)).rejects.toMatchObject({
			code: 'not_found'
		});
		await detachFromSubmission(db, owner, submissionId, attachment.id);
		expect(await attachmentsOfVersion(db, (await versionOf(submissionId)).id)).toEqual([]);
	});
});

describe('a proposed change', () => {
	async function approvedProteinWithFile(visibility: 'public' | 'group', groupId: number | null) {
		const { submissionId } = await draft();
		const { attachment } = await attachToSubmission(db, deps, owner, submissionId, epr());
		const version = await versionOf(submissionId);
		const entryId = (
			await db
				.selectFrom('entry_version')
				.select('entry_id')
				.where('id', '=', version.id)
				.executeTakeFirstOrThrow()
		).entry_id;
		await tx(async (trx) => {
			await submitForReview(trx, owner, submissionId, origin);
			await trx
				.updateTable('entry')
				.set({ visibility, group_id: groupId })
				.where('id', '=', entryId)
				.execute();
			await approveVersion(trx, version.id, { approvedBy: curator.id });
		});
		const accession = (
			await db
				.selectFrom('entry')
				.select('accession')
				.where('id', '=', entryId)
				.executeTakeFirstOrThrow()
		).accession;
		return { accession, baseVersionId: version.id, attachment, entryId };
	}

	it('starts with its base version’s files; dropping one leaves the approved version as it was', async () => {
		const base = await approvedProteinWithFile('public', null);
		const change = await tx((trx) =>
			createDraft(trx, owner, {
				entry: protein('Renamed'),
				visibility: PUBLIC,
				changeNote: 'new name',
				editAccession: base.accession,
				pendingRowsMax: 1000
			})
		);
		const proposed = await versionOf(change.submissionId);
		expect((await attachmentsOfVersion(db, proposed.id)).map((a) => a.id)).toEqual([
			base.attachment.id
		]);
		await detachFromSubmission(db, owner, change.submissionId, base.attachment.id);
		expect(await attachmentsOfVersion(db, proposed.id)).toEqual([]);
		expect((await attachmentsOfVersion(db, base.baseVersionId)).map((a) => a.id)).toEqual([
			base.attachment.id
		]);
	});

	it('answers 404 once the entry it changes is hidden from its contributor', async () => {
		const base = await approvedProteinWithFile('public', null);
		const change = await tx((trx) =>
			createDraft(trx, owner, {
				entry: protein('Renamed again'),
				visibility: PUBLIC,
				changeNote: null,
				editAccession: base.accession,
				pendingRowsMax: 1000
			})
		);
		// Moved into a group the contributor is not in (a curator's visibility change).
		const { id: groupId } = await db
			.insertInto('research_group')
			.values({ name: 'Hidden group', slug: `hidden-${Date.now()}` })
			.returning('id')
			.executeTakeFirstOrThrow();
		await db
			.updateTable('entry')
			.set({ visibility: 'group', group_id: groupId })
			.where('id', '=', base.entryId)
			.execute();
		const before = await counts();
		await expect(
			attachToSubmission(db, deps, owner, change.submissionId, epr())
		).rejects.toMatchObject({ code: 'not_found' });
		expect(await counts()).toEqual(before);
	});

	it('refuses an approved version of a returned batch with 409, writing nothing', async () => {
		// A batch approved in part and returned: the approved row is frozen, its files too.
		const { submissionId, accession } = await draft();
		const version = await versionOf(submissionId);
		await tx(async (trx) => {
			await trx
				.updateTable('entry_version')
				.set({ status: 'submitted' })
				.where('id', '=', version.id)
				.execute();
			await approveVersion(trx, version.id, { approvedBy: curator.id });
			await trx
				.updateTable('submission')
				.set({ status: 'returned' })
				.where('id', '=', submissionId)
				.execute();
		});
		const before = await counts();
		await expect(
			attachToSubmission(db, deps, owner, submissionId, epr({ accession }))
		).rejects.toMatchObject({ code: 'conflict', message: expect.stringMatching(/approved/) });
		expect(await counts()).toEqual(before);
	});
});
