import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Migrator, sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrations } from '$migrations/index';
import { citeRecord } from '$lib/catalogue/citation';
import {
	addVersion,
	approveVersion,
	createEntry,
	setEntryVisibility
} from '$lib/server/catalogue/entries';
import { versionCredit } from '$lib/server/catalogue/credit';
import { getEntryView } from '$lib/server/catalogue/entryView';
import type { Viewer } from '$lib/server/catalogue/visibility';
import { entryCitation } from '$lib/server/citations/citable';
import { AccessDateError, citationFile } from '$lib/server/citations/files';
import { orcidOf, setOrcid } from '$lib/server/citations/orcid';
import { openDatabase } from '$lib/server/db/connect';
import { readJson } from '$lib/server/db/json';
import { migrateToLatest } from '$lib/server/db/migrate';
import type { Database } from '$lib/server/db/schema';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';

/*
 * Who a version's citation names, and that it stays as approved: credit copied at approval
 * (catalogue/credit.ts), the source's work at the version the value was approved against,
 * and the backfill of migration 0010.
 */

const ORIGIN = 'https://hopline.example';
let db: Kysely<Database>;
let remove: () => Promise<void>;

async function user(name: string | null, role: 'contributor' | 'curator'): Promise<string> {
	const { id } = await db
		.insertInto('User')
		.values({ email: `${name ?? 'nameless'}@credit.test`, name, role })
		.returning('id')
		.executeTakeFirstOrThrow();
	return id;
}

/** A few milliseconds, so that a change and an approval never share a timestamp. */
const tick = () => new Promise((resolve) => setTimeout(resolve, 5));

/** Adds a version by `by` and approves it by `curator`, now. */
async function approved(entryId: number, data: unknown, by: string, curator: string) {
	await tick();
	const result = await db.transaction().execute(async (trx) => {
		const versionId = await addVersion(trx, entryId, data, { status: 'submitted', createdBy: by });
		return approveVersion(trx, versionId, { approvedBy: curator });
	});
	await tick();
	return result;
}

async function citationOf(accession: string, version: number, viewer: Viewer | null = null) {
	const view = await getEntryView(db, accession, version, viewer);
	return entryCitation(db, view, ORIGIN);
}

const names = (people: { name: string }[]) => people.map((p) => p.name);

describe('credit at approval', () => {
	const ids = { ada: '', bob: '', carl: '', nameless: '' };
	let source: { id: number; accession: string };
	let potential: { id: number; accession: string };
	let template: Record<string, unknown>;
	const paper = (title: string) => ({
		sourceKind: 'publication',
		doi: '10.5555/credit.1',
		title,
		authors: ['Müller, Jürgen', 'Nguyễn, Thị'],
		journal: 'J. Demo Biochem.',
		year: 2020
	});

	beforeAll(async () => {
		({ db, remove } = await createTempDatabase());
		await loadDemoScenario(db);
		ids.ada = await user('Ada Lovelace', 'contributor');
		ids.bob = await user('Bob Builder', 'contributor');
		ids.carl = await user('Carl Curator', 'curator');
		ids.nameless = await user(null, 'contributor');
		await db.transaction().execute((trx) => setOrcid(trx, ids.ada, '0000-0002-1825-0097'));

		const demo = await db
			.selectFrom('entry_version')
			.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
			.select('entry_version.data')
			.where('entry.kind', '=', 'potential')
			.where('entry_version.status', '=', 'approved')
			.orderBy('entry_version.id')
			.executeTakeFirstOrThrow();
		template = readJson(demo.data);

		source = await db.transaction().execute((trx) => createEntry(trx, { kind: 'source' }));
		await approved(source.id, paper('Titration of the first kind'), ids.ada, ids.carl);
		potential = await db.transaction().execute((trx) => createEntry(trx, { kind: 'potential' }));
		const value = { ...template, sourceAccession: source.accession };
		await approved(potential.id, value, ids.bob, ids.carl); // v1 by Bob
		await approved(potential.id, { ...value, ph: 7.5 }, ids.ada, ids.carl); // v2 by Ada
		await approved(potential.id, { ...value, ph: 7.6 }, ids.nameless, ids.carl); // v3
	});
	afterAll(async () => remove());

	it('names the contributors up to each version as authors, the approving curator as editor', async () => {
		const v1 = await versionCredit(db, potential.id, 1);
		expect(names(v1.authors)).toEqual(['Bob Builder']);
		expect(names(v1.editors)).toEqual(['Carl Curator']);
		const v2 = await versionCredit(db, potential.id, 2);
		expect(v2.authors).toEqual([
			{ name: 'Bob Builder', orcid: null },
			{ name: 'Ada Lovelace', orcid: '0000-0002-1825-0097' }
		]);
		// A contributor without a name is not named (nor anything else of theirs).
		expect(names((await versionCredit(db, potential.id, 3)).authors)).toEqual([
			'Bob Builder',
			'Ada Lovelace'
		]);
	});

	it('a potential cites its paper at the source version it was approved against', async () => {
		const { record, basedOn } = await citationOf(potential.accession, 1);
		expect(record.original).toMatchObject({
			title: 'Titration of the first kind',
			doi: '10.5555/credit.1',
			record: { accession: source.accession, version: 1 }
		});
		expect(basedOn.map((r) => [r.accession, r.version])).toContainEqual([source.accession, 1]);
	});

	it('a source entry cites its publication itself', async () => {
		const { record } = await citationOf(source.accession, 1);
		expect(record.original?.title).toBe('Titration of the first kind');
		expect(citeRecord(record, null).text).toContain('Cite the publication itself:');
	});

	it('keeps an approved version citing what it was approved with: names, iDs and the paper', async () => {
		const before = citeRecord((await citationOf(potential.accession, 2)).record, null);
		// Ada changes her name and iD; the source is corrected in a new version.
		await db.updateTable('User').set({ name: 'Ada King' }).where('id', '=', ids.ada).execute();
		await db.transaction().execute((trx) => setOrcid(trx, ids.ada, '0000-0002-1694-233X'));
		await approved(source.id, paper('Titration, corrected'), ids.bob, ids.carl);
		const after = citeRecord((await citationOf(potential.accession, 2)).record, null);
		expect(after).toEqual(before);

		// The next version carries the new name, iD and source version.
		const { version } = await approved(
			potential.id,
			{ ...template, sourceAccession: source.accession, ph: 7.7 },
			ids.ada,
			ids.carl
		);
		const { record } = await citationOf(potential.accession, version);
		expect(record.authors).toContainEqual({ name: 'Ada King', orcid: '0000-0002-1694-233X' });
		expect(record.original?.title).toBe('Titration, corrected');
		expect(record.original?.record.version).toBe(2);
	});

	it('the credit history cannot be changed or removed', async () => {
		await expect(
			db.updateTable('user_credit_history').set({ name: 'Someone else' }).execute()
		).rejects.toThrow(/immutable/);
		await expect(db.deleteFrom('user_credit_history').execute()).rejects.toThrow(
			/cannot be deleted/
		);
	});

	it('the ORCID iD column refuses a malformed iD even past the form', async () => {
		await expect(
			db.updateTable('User').set({ orcid: 'not-an-orcid' }).where('id', '=', ids.bob).execute()
		).rejects.toThrow(/CHECK constraint/);
	});

	it('setting an iD is audited, setting the same again is not', async () => {
		const count = async () =>
			Number(
				(
					await db
						.selectFrom('audit_log')
						.select((eb) => eb.fn.countAll().as('n'))
						.where('action', '=', 'account.orcid')
						.where('actor_id', '=', ids.bob)
						.executeTakeFirstOrThrow()
				).n
			);
		await db.transaction().execute((trx) => setOrcid(trx, ids.bob, '0000-0001-5109-3700'));
		await db.transaction().execute((trx) => setOrcid(trx, ids.bob, '0000-0001-5109-3700'));
		expect(await count()).toBe(1);
		expect(await orcidOf(db, ids.bob)).toBe('0000-0001-5109-3700');
	});

	it('a source the reader may not see is neither named nor cited', async () => {
		const { id: groupId } = await db
			.insertInto('research_group')
			.values({ slug: 'credit', name: 'Credit group' })
			.returning('id')
			.executeTakeFirstOrThrow();
		await db
			.transaction()
			.execute((trx) =>
				setEntryVisibility(trx, source.id, { visibility: 'group', groupId, embargoUntil: null })
			);
		const outsider = await citationOf(potential.accession, 1, { groupIds: [] });
		expect(outsider.record.original).toBeNull();
		expect(outsider.basedOn.map((r) => r.accession)).not.toContain(source.accession);
		const bib = citeRecord(outsider.record, null).bibtex;
		expect(bib).not.toContain(source.accession);
		expect(bib).not.toContain('10.5555/credit.1');
		const member = await citationOf(potential.accession, 1, { groupIds: [groupId] });
		expect(member.record.original?.record.accession).toBe(source.accession);
	});

	it('a citation file is the same bytes on any day, and takes only a plausible access date', async () => {
		const request = {
			accession: potential.accession,
			version: 1,
			extension: 'bib' as const,
			accessed: null
		};
		const monday = await citationFile(db, request, null, ORIGIN, new Date('2026-03-02T08:00Z'));
		const later = await citationFile(db, request, null, ORIGIN, new Date('2029-11-30T23:00Z'));
		expect(later).toEqual(monday);
		expect(monday.filename).toBe(`${potential.accession}-v1.bib`);
		expect(monday.mediaType).toBe('application/x-bibtex; charset=utf-8');
		const dated = await citationFile(
			db,
			{ ...request, accessed: '2026-03-02' },
			null,
			ORIGIN,
			new Date('2026-03-02T08:00Z')
		);
		expect(dated.body).toContain('urldate = {2026-03-02}');
		await expect(
			citationFile(
				db,
				{ ...request, accessed: '2026-03-05' },
				null,
				ORIGIN,
				new Date('2026-03-02T08:00Z')
			)
		).rejects.toThrow(AccessDateError);
	});
});

describe('migration 0010 credits the versions approved before it', () => {
	let dir: string;
	const provider = { getMigrations: async () => migrations };

	beforeAll(async () => {
		dir = mkdtempSync(join(tmpdir(), 'hopline-0010-'));
		db = openDatabase(join(dir, 'test.sqlite'));
		const { error } = await new Migrator({ db, provider }).migrateTo('0008_create_entry_kinds');
		if (error) throw error;
		// Rows as the code before 0010 wrote them: versions with their author and approver.
		for (const [id, name] of [
			['ada', 'Ada Lovelace'],
			['bob', ' Bob Builder '],
			['carl', 'Carl Curator'],
			['anon', null]
		] as const) {
			await db
				.insertInto('User')
				.values({ id, email: `${id}@0010.test`, name })
				.execute();
		}
		await db
			.insertInto('entry')
			.values({ id: 1, accession: 'HL000001', kind: 'protein' })
			.execute();
		const version = (n: number | null, status: string, by: string, approver: string | null) =>
			sql`insert into entry_version (entry_id, version, status, data, created_by, approved_by, approved_at)
				values (1, ${n}, ${status}, '{}', ${by}, ${approver}, ${n ? `2024-01-0${n}T00:00:00.000Z` : null})`.execute(
				db
			);
		await version(1, 'approved', 'bob', 'carl');
		await version(2, 'approved', 'ada', null);
		await version(3, 'approved', 'bob', 'carl');
		await version(4, 'approved', 'anon', 'carl');
		await version(null, 'submitted', 'carl', null);
		await migrateToLatest(db);
	});
	afterAll(async () => {
		await db.destroy();
		rmSync(dir, { recursive: true, force: true });
	});

	const credit = async (v: number) => {
		const c = await versionCredit(db, 1, v);
		return [names(c.authors), names(c.editors)];
	};

	it('names everyone as they are named today, by the rule approvals follow', async () => {
		expect(await credit(1)).toEqual([['Bob Builder'], ['Carl Curator']]);
		expect(await credit(2)).toEqual([['Bob Builder', 'Ada Lovelace'], []]);
		expect(await credit(3)).toEqual([['Bob Builder', 'Ada Lovelace'], ['Carl Curator']]);
		expect(await credit(4)).toEqual([['Bob Builder', 'Ada Lovelace'], ['Carl Curator']]);
	});

	it('records every later change of name or iD, whoever makes it, and no other change', async () => {
		await db.updateTable('User').set({ name: 'Ada King' }).where('id', '=', 'ada').execute();
		await db.updateTable('User').set({ role: 'curator' }).where('id', '=', 'bob').execute();
		await db
			.insertInto('User')
			.values({ id: 'dan', email: 'dan@0010.test', name: 'Dan' })
			.execute();
		const rows = await db
			.selectFrom('user_credit_history')
			.select(['user_id', 'name'])
			.orderBy('id')
			.execute();
		expect(rows.map((r) => [r.user_id, r.name])).toEqual([
			['ada', 'Ada Lovelace'],
			['bob', ' Bob Builder '],
			['carl', 'Carl Curator'],
			['anon', null],
			['ada', 'Ada King'],
			['dan', 'Dan']
		]);
		// Versions approved before the change keep the name they had.
		expect(await credit(2)).toEqual([['Bob Builder', 'Ada Lovelace'], []]);
	});
});
