import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { SessionUser } from '$lib/server/auth/roles';
import type { Database } from '$lib/server/db/schema';
import { decideBatch } from '$lib/server/curation/reviews';
import { commitUpload } from '$lib/server/uploads/commitUpload';
import { planFromForm, proteinOr404, readUpload } from '$lib/server/structures/flow';
import { attachmentForReader } from '$lib/server/attachments/attachments';
import { attachmentStore } from '$lib/server/attachments/store';
import { listOnSubmission } from '$lib/server/structures/structureFile';
import { moveLegacyStructureFiles } from '$lib/server/structures/legacyFolder';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';
import { insertSessionUser } from '../support/users';
import { STRUCTURE_CIF, STRUCTURE_PDB } from '../support/structureFixture';

// Kept structure files go to a folder of this test's own (config is read once, on import).
await vi.hoisted(async () => {
	const { mkdtempSync } = await import('node:fs');
	const { tmpdir } = await import('node:os');
	const { join } = await import('node:path');
	process.env.ATTACHMENT_DIR = mkdtempSync(join(tmpdir(), 'hopline-structures-'));
});

// Distances and atoms: the hand computation in tests/support/structureFixture.ts.
let db: Kysely<Database>;
let remove: () => Promise<void>;
let contributor: SessionUser;
let curator: SessionUser;
let hylAccession: string;
const PUBLIC = { visibility: 'public' as const, groupId: null, embargoUntil: null };
const bytes = (text: string) => new TextEncoder().encode(text);

async function centreAccession(label: string): Promise<string> {
	const row = await db
		.selectFrom('centre')
		.innerJoin('entry', 'entry.id', 'centre.entry_id')
		.innerJoin('entry as pe', 'pe.id', 'centre.protein_entry_id')
		.select('entry.accession')
		.where('centre.label', '=', label)
		.where('pe.accession', '=', hylAccession)
		.executeTakeFirstOrThrow();
	return row.accession;
}

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	await loadDemoScenario(db);
	contributor = await insertSessionUser(db, 'contributor', 'c@lab.test');
	curator = await insertSessionUser(db, 'curator', 'k@lab.test');
	const p = await db
		.selectFrom('protein')
		.innerJoin('entry', 'entry.id', 'protein.entry_id')
		.select('entry.accession')
		.where('protein.name', 'like', 'HylSL%')
		.executeTakeFirstOrThrow();
	hylAccession = p.accession;
});
afterAll(async () => remove());

describe('distances from an uploaded structure', () => {
	it('reads a gzipped PDB file, keeps it as an unlisted attachment and proposes the match', async () => {
		const protein = await proteinOr404(db, hylAccession, contributor);
		const gz = gzipSync(bytes(STRUCTURE_PDB));
		const read = await readUpload(db, contributor, protein, gz, 'C:\\lab\\hyl model.pdb.gz');
		expect(read.gzipped).toBe(true);
		expect(read.file.fileName).toBe('hyl model.pdb.gz');
		const stored = await attachmentStore().get(read.file.sha256);
		expect(Buffer.from(stored!)).toEqual(Buffer.from(gz));
		// Unlisted: its uploader may fetch it, nobody else (not even a curator).
		expect(await attachmentForReader(db, read.file.attachmentId, contributor)).toMatchObject({
			kind: 'structure',
			role: 'structure',
			mediaType: 'application/gzip'
		});
		expect(await attachmentForReader(db, read.file.attachmentId, curator)).toBeNull();
		expect(await attachmentForReader(db, read.file.attachmentId, null)).toBeNull();
		expect(read.reading.rows.map((r) => [r.label, r.atomCount, r.ligands])).toEqual([
			['SF4 S301', 2, ['S17']],
			['F3S S302A', 2, ['S229']],
			['SF4 S10000', 2, ['S184']],
			['HEM M401', 3, ['M71']],
			['HEM M402', 2, ['M85']],
			['FMN X900', 1, []]
		]);
		const expected = await Promise.all(
			['Proximal', 'Medial', 'Distal', 'Heme b1', 'Heme b2'].map(centreAccession)
		);
		expect(read.reading.proposals.map((m) => m.centreId)).toEqual([...expected, null]);
	});

	it('plans the pairs within the cutoff with duplicate and conflict warnings, then commits and approves them', async () => {
		const protein = await proteinOr404(db, hylAccession, contributor);
		const read = await readUpload(db, contributor, protein, bytes(STRUCTURE_CIF), 'hyl.cif');
		const values: Record<string, string> = {
			attachment: String(read.file.attachmentId),
			structureId: 'DS-HYL-02',
			method: 'crystal_structure',
			cutoffA: '25'
		};
		read.reading.proposals.forEach((m, i) => (values[`match.${i}`] = m.centreId ?? ''));
		const r = await planFromForm(db, contributor, protein, values, null);
		if (!r.ok) throw new Error(JSON.stringify(r.errors));
		const shown = r.plan.proposed.map((p) => [
			`${p.centreA.label}–${p.centreB.label}`,
			p.edgeToEdgeA,
			p.atoms,
			p.centreToCentreA
		]);
		expect(shown).toEqual([
			['Proximal–Medial', 9, 'S1–S1', 10],
			['Medial–Distal', 9, 'FE1–S1', 10],
			['Distal–Heme b1', 18, 'FE1–NA', 20],
			['Heme b1–Heme b2', 18, 'FE–NA', 20],
			['Proximal–Distal', 19, 'FE1–S1', 20],
			['Medial–Heme b1', 19.42, 'S1–NA', 22.36]
		]);
		// The demo has Proximal–Medial at 9.8 Å in DS-HYL-02 (seed/demo.ts): duplicate and conflict,
		// said once (on the existing distance's line, not again among the warnings) and unticked.
		const first = r.plan.proposed[0]!;
		expect(first.existing).toEqual([
			expect.objectContaining({ edgeToEdgeA: 9.8, sameStructure: true, conflict: true })
		]);
		expect(first.warnings).toEqual([]);
		expect(first.preselected).toBe(false);
		// The four pairs the demo records in DS-HYL-02 are unticked; the two new ones ticked.
		expect(r.plan.proposed.map((p) => p.preselected)).toEqual([
			false,
			false,
			false,
			false,
			true,
			true
		]);
		expect(r.plan.proposed[4]!.existing).toEqual([]);
		// A second click reads nothing again: the groups come from the cache (same object).
		const again = await planFromForm(db, contributor, protein, values, null);
		expect(again.ok && again.reading).toBe(r.reading);

		// Untick all but two: only those are submitted, with the file's checksum as the batch's.
		const only = await planFromForm(db, contributor, protein, values, new Set(['0-2', '1-3']));
		if (!only.ok) throw new Error('plan failed');
		expect(only.plan.proposed.map((p) => p.key)).toEqual(['0-2', '1-3']);
		const result = await db.transaction().execute(async (trx) => {
			const committed = await commitUpload(trx, contributor, only.plan.check, {
				filename: 'hyl.cif',
				visibility: PUBLIC,
				changeNote: null,
				origin: 'http://hopline.test',
				pendingRowsMax: 1000,
				title: 'two distances from a structure'
			});
			expect(await listOnSubmission(trx, only.file, committed.submissionId, 'DS-HYL-02')).toBe(2);
			return committed;
		});
		const submission = await db
			.selectFrom('submission')
			.selectAll()
			.where('id', '=', result.submissionId)
			.executeTakeFirstOrThrow();
		expect(submission).toMatchObject({
			content_sha256: read.file.sha256,
			title: 'two distances from a structure'
		});
		await db
			.transaction()
			.execute((trx) =>
				decideBatch(trx, curator, result.submissionId, { returnRows: [], comment: '' }, 'x')
			);
		const approved = await db
			.selectFrom('distance')
			.innerJoin('entry_version as v', (j) =>
				j.onRef('v.entry_id', '=', 'distance.entry_id').onRef('v.version', '=', 'distance.version')
			)
			.select(['distance.edge_to_edge_a', 'distance.structure_id', 'v.data'])
			.where('v.submission_id', '=', result.submissionId)
			.orderBy('distance.edge_to_edge_a')
			.execute();
		expect(approved.map((d) => d.edge_to_edge_a)).toEqual([19, 19.42]);
		expect(JSON.parse(approved[0]!.data).note).toContain(`SHA-256 ${read.file.sha256}`);
		expect(JSON.parse(approved[0]!.data).note).toContain('SF4 S301 FE1 and SF4 S10000 S1');
		expect(JSON.parse(approved[1]!.data).note).toContain('F3S S302A S1 and HEM M401 NA');
		// Each approved distance lists the structure file (one stored file, one row per entry),
		// which anyone who may see the distance may now download.
		const listed = await db
			.selectFrom('entry_version_attachment as l')
			.innerJoin('entry_version as v', 'v.id', 'l.entry_version_id')
			.innerJoin('attachment as a', 'a.id', 'l.attachment_id')
			.select(['a.id', 'a.entry_id', 'v.entry_id as version_entry', 'a.original_sha256'])
			.where('v.submission_id', '=', result.submissionId)
			.execute();
		expect(listed).toHaveLength(2);
		for (const l of listed) {
			expect(l).toMatchObject({ entry_id: l.version_entry, original_sha256: read.file.sha256 });
			expect(await attachmentForReader(db, l.id, null)).toMatchObject({
				role: 'structure',
				caption: 'Structure DS-HYL-02 as uploaded, in which this distance was measured'
			});
		}
	});

	it('never lets a form name a structure file that is not the user’s own unlisted upload', async () => {
		const protein = await proteinOr404(db, hylAccession, contributor);
		const read = await readUpload(db, contributor, protein, bytes(STRUCTURE_PDB), 'hyl.pdb');
		const other = await insertSessionUser(db, 'contributor', 'other@lab.test');
		const values = {
			attachment: String(read.file.attachmentId),
			structureId: 'X1',
			method: 'crystal_structure',
			'match.0': await centreAccession('Proximal'),
			'match.1': await centreAccession('Medial')
		};
		const theirs = await planFromForm(db, other, protein, values, null);
		expect(theirs).toMatchObject({
			ok: false,
			status: 404,
			errors: { file: ['the structure file is no longer kept: upload it again'] }
		});
		// A listed copy (a distance's evidence) is not an upload either, not even for its uploader.
		const listedId = await db
			.selectFrom('entry_version_attachment')
			.select('attachment_id')
			.executeTakeFirstOrThrow();
		const listed = await planFromForm(
			db,
			contributor,
			protein,
			{ ...values, attachment: String(listedId.attachment_id) },
			null
		);
		expect(listed).toMatchObject({ ok: false, status: 404 });
		expect((await planFromForm(db, contributor, protein, values, null)).ok).toBe(true);
	});

	it('never matches, names or accepts a centre the contributor may not see', async () => {
		const medial = await centreAccession('Medial');
		const { id: groupId } = await db
			.insertInto('research_group')
			.values({ slug: 'closed', name: 'Closed lab' })
			.returning('id')
			.executeTakeFirstOrThrow();
		await db
			.updateTable('entry')
			.set({ visibility: 'group', group_id: groupId })
			.where('accession', '=', medial)
			.execute();
		const protein = await proteinOr404(db, hylAccession, contributor);
		expect(protein.centres.map((c) => c.accession)).not.toContain(medial);
		expect(JSON.stringify(protein.distances)).not.toContain(medial);
		const read = await readUpload(db, contributor, protein, bytes(STRUCTURE_PDB), 'hyl.pdb');
		expect(read.reading.proposals[1]!.centreId).toBeNull();
		const values: Record<string, string> = {
			attachment: String(read.file.attachmentId),
			structureId: 'X1',
			method: 'crystal_structure',
			'match.0': await centreAccession('Proximal'),
			'match.1': medial
		};
		const r = await planFromForm(db, contributor, protein, values, null);
		expect(r).toMatchObject({
			ok: false,
			status: 400,
			errors: { 'match.1': [`${medial} is not a centre of ${protein.name}`] }
		});
		// Same message as a centre that does not exist.
		const none = await planFromForm(
			db,
			contributor,
			protein,
			{ ...values, 'match.1': 'HL999999' },
			null
		);
		expect(none.ok ? '' : none.errors['match.1']![0]).toBe(
			`HL999999 is not a centre of ${protein.name}`
		);
	});

	it('moves files of the old structures folder onto the distances still under review', async () => {
		const protein = await proteinOr404(db, hylAccession, contributor);
		const gz = gzipSync(bytes(STRUCTURE_PDB.replace('REMARK', 'REMARK legacy')));
		const read = await readUpload(db, contributor, protein, gz, 'old.pdb.gz');
		const values: Record<string, string> = {
			attachment: String(read.file.attachmentId),
			structureId: 'OLD-1',
			method: 'crystal_structure',
			'match.0': await centreAccession('Proximal'),
			'match.2': await centreAccession('Distal')
		};
		const r = await planFromForm(db, contributor, protein, values, null);
		if (!r.ok) throw new Error(JSON.stringify(r.errors));
		// Committed as before attachments: the note names the SHA-256, nothing is listed.
		const { submissionId } = await db.transaction().execute((trx) =>
			commitUpload(trx, contributor, r.plan.check, {
				filename: 'old.pdb.gz',
				visibility: PUBLIC,
				changeNote: null,
				origin: 'http://hopline.test',
				pendingRowsMax: 1000
			})
		);
		const folder = mkdtempSync(join(tmpdir(), 'hopline-old-structures-'));
		writeFileSync(join(folder, read.file.sha256), gz);
		writeFileSync(join(folder, 'b'.repeat(64)), 'not what the name says');
		writeFileSync(join(folder, 'c'.repeat(64)), 'named by no version');
		writeFileSync(
			join(folder, createHash('sha256').update('named by no version').digest('hex')),
			'named by no version'
		);
		const store = attachmentStore();
		const report = await moveLegacyStructureFiles(db, store, folder);
		expect(report).toMatchObject({
			files: 2,
			listed: 1,
			skipped: ['b'.repeat(64), 'c'.repeat(64)]
		});
		expect(report.leftInFolder).toHaveLength(1);
		const listed = await db
			.selectFrom('entry_version as v')
			.innerJoin('entry_version_attachment as l', 'l.entry_version_id', 'v.id')
			.innerJoin('attachment as a', 'a.id', 'l.attachment_id')
			.select(['a.entry_id', 'v.entry_id as version_entry', 'a.file_name', 'a.original_sha256'])
			.where('v.submission_id', '=', submissionId)
			.execute();
		expect(listed).toEqual([
			{
				entry_id: listed[0]!.version_entry,
				version_entry: listed[0]!.version_entry,
				file_name: 'old.pdb.gz',
				original_sha256: read.file.sha256
			}
		]);
		// Run again: nothing is listed twice.
		expect((await moveLegacyStructureFiles(db, store, folder)).listed).toBe(0);
		expect(await moveLegacyStructureFiles(db, store, join(folder, 'none'))).toMatchObject({
			files: 0
		});
		rmSync(folder, { recursive: true, force: true });
	});

	it('answers bad files and forms with a clear 4xx reason', async () => {
		const protein = await proteinOr404(db, hylAccession, contributor);
		await expect(
			readUpload(db, contributor, protein, bytes('HEADER only\n'), 'x.pdb')
		).rejects.toMatchObject({
			code: 'bad_request',
			message: 'the structure file could not be read: no ATOM or HETATM records found'
		});
		const noCofactor = STRUCTURE_PDB.split('\r\n')
			.filter((l) => l.startsWith('ATOM') && l.includes('CYS'))
			.join('\n');
		await expect(readUpload(db, contributor, protein, bytes(noCofactor), 'x.pdb')).rejects.toThrow(
			/no cofactor groups/
		);
		await expect(
			readUpload(db, contributor, protein, Uint8Array.of(0x89, 0x50, 0x4e, 0x47, 0xff), 'x.pdb')
		).rejects.toThrow(/not text/);
		const missing = await planFromForm(
			db,
			contributor,
			protein,
			{ attachment: '999999', structureId: 'X1', method: 'crystal_structure' },
			null
		);
		expect(missing).toMatchObject({ ok: false, status: 404 });
		const bad = await planFromForm(
			db,
			contributor,
			protein,
			{ attachment: 'nope', structureId: 'bad id!', method: 'guess', cutoffA: '99' },
			null
		);
		expect(bad.ok ? {} : Object.keys(bad.errors).sort()).toEqual([
			'attachment',
			'cutoffA',
			'method',
			'structureId'
		]);
		await expect(proteinOr404(db, 'HL999999', contributor)).rejects.toMatchObject({
			code: 'not_found'
		});
	});
});
