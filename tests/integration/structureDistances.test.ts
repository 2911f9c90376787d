import { gzipSync } from 'node:zlib';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '$lib/server/auth/roles';
import type { Database } from '$lib/server/db/schema';
import { decideBatch } from '$lib/server/curation/reviews';
import { commitUpload } from '$lib/server/uploads/commitUpload';
import { planFromForm, proteinOr404, readUpload } from '$lib/server/structures/flow';
import { loadStructureBytes } from '$lib/server/structures/store';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';
import { insertSessionUser } from '../support/users';
import { STRUCTURE_CIF, STRUCTURE_PDB } from '../support/structureFixture';

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
	it('reads a gzipped PDB file, stores it by SHA-256 and proposes the match', async () => {
		const protein = await proteinOr404(db, hylAccession, contributor);
		const gz = gzipSync(bytes(STRUCTURE_PDB));
		const read = await readUpload(protein, gz, 'C:\\lab\\hyl model.pdb.gz');
		expect(read.gzipped).toBe(true);
		expect(read.filename).toBe('hyl model.pdb.gz');
		expect(Buffer.from((await loadStructureBytes(read.sha256))!)).toEqual(Buffer.from(gz));
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
		const read = await readUpload(protein, bytes(STRUCTURE_CIF), 'hyl.cif');
		const values: Record<string, string> = {
			sha256: read.sha256,
			filename: read.filename,
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
		// The demo has Proximal–Medial at 9.8 Å in DS-HYL-02 (seed/demo.ts): duplicate and conflict.
		const first = r.plan.proposed[0]!;
		expect(first.existing).toEqual([
			expect.objectContaining({ edgeToEdgeA: 9.8, sameStructure: true, conflict: true })
		]);
		expect(first.warnings.join(' ')).toMatch(/already in the registry as HL\d{6}/);
		expect(first.warnings.join(' ')).toMatch(/conflicts with HL\d{6}: 9.8 Å/);
		expect(r.plan.proposed[4]!.existing).toEqual([]);

		// Untick all but two: only those are submitted, with the file's checksum as the batch's.
		const only = await planFromForm(db, contributor, protein, values, new Set(['0-2', '1-3']));
		if (!only.ok) throw new Error('plan failed');
		expect(only.plan.proposed.map((p) => p.key)).toEqual(['0-2', '1-3']);
		const result = await db.transaction().execute((trx) =>
			commitUpload(trx, contributor, only.plan.check, {
				filename: 'hyl.cif',
				visibility: PUBLIC,
				changeNote: null,
				origin: 'http://hopline.test',
				pendingRowsMax: 1000,
				title: 'two distances from a structure'
			})
		);
		const submission = await db
			.selectFrom('submission')
			.selectAll()
			.where('id', '=', result.submissionId)
			.executeTakeFirstOrThrow();
		expect(submission).toMatchObject({
			content_sha256: read.sha256,
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
		expect(JSON.parse(approved[0]!.data).note).toContain(`SHA-256 ${read.sha256}`);
		expect(JSON.parse(approved[0]!.data).note).toContain('SF4 S301 FE1 and SF4 S10000 S1');
		expect(JSON.parse(approved[1]!.data).note).toContain('F3S S302A S1 and HEM M401 NA');
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
		const read = await readUpload(protein, bytes(STRUCTURE_PDB), 'hyl.pdb');
		expect(read.reading.proposals[1]!.centreId).toBeNull();
		const values: Record<string, string> = {
			sha256: read.sha256,
			filename: 'hyl.pdb',
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

	it('answers bad files and forms with a clear 4xx reason', async () => {
		const protein = await proteinOr404(db, hylAccession, contributor);
		await expect(readUpload(protein, bytes('HEADER only\n'), 'x.pdb')).rejects.toMatchObject({
			code: 'bad_request',
			message: 'the structure file could not be read: no ATOM or HETATM records found'
		});
		const noCofactor = STRUCTURE_PDB.split('\r\n')
			.filter((l) => l.startsWith('ATOM') && l.includes('CYS'))
			.join('\n');
		await expect(readUpload(protein, bytes(noCofactor), 'x.pdb')).rejects.toThrow(
			/no cofactor groups/
		);
		await expect(
			readUpload(protein, Uint8Array.of(0x89, 0x50, 0x4e, 0x47, 0xff), 'x.pdb')
		).rejects.toThrow(/not text/);
		const missing = await planFromForm(
			db,
			contributor,
			protein,
			{ sha256: 'a'.repeat(64), filename: 'x', structureId: 'X1', method: 'crystal_structure' },
			null
		);
		expect(missing).toMatchObject({ ok: false, status: 404 });
		const bad = await planFromForm(
			db,
			contributor,
			protein,
			{ sha256: 'nope', filename: 'x', structureId: 'bad id!', method: 'guess', cutoffA: '99' },
			null
		);
		expect(bad.ok ? {} : Object.keys(bad.errors).sort()).toEqual([
			'cutoffA',
			'method',
			'sha256',
			'structureId'
		]);
		await expect(proteinOr404(db, 'HL999999', contributor)).rejects.toMatchObject({
			code: 'not_found'
		});
	});
});
