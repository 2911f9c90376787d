import { sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { KINDS } from '$lib/kinds';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import { getEntryView } from '$lib/server/catalogue/entryView';
import type { Database } from '$lib/server/db/schema';
import { potentialAtPh7 } from '../support/largeCentre';
import { createTempDatabase } from '../support/tempDb';

/*
 * An approval pins the exact version of every entry its data names (entry_version_reference),
 * in its own transaction, and a version's title and references are read from those pinned
 * versions: renaming a protein or relabelling a centre later changes nothing in the versions
 * that named them before.
 */
let db: Kysely<Database>;
let remove: () => Promise<void>;

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
});
afterAll(async () => remove());

interface Approved {
	entryId: number;
	accession: string;
	versionId: number;
}

/** A new entry (or, given `entryId`, a new version of one), approved at once. */
async function approved(
	kind: 'protein' | 'centre' | 'potential' | 'source' | 'distance' | 'spin_record',
	data: unknown,
	existing?: { entryId: number; accession: string },
	visibility: Parameters<typeof addVersion>[3]['visibility'] = null
): Promise<Approved> {
	return db.transaction().execute(async (trx) => {
		const entry = existing ?? (await createEntry(trx, { kind }));
		const entryId = 'entryId' in entry ? entry.entryId : entry.id;
		const versionId = await addVersion(trx, entryId, data, { status: 'submitted', visibility });
		await approveVersion(trx, versionId);
		return { entryId, accession: entry.accession, versionId };
	});
}

const protein = (name: string) =>
	KINDS.protein.schema.parse({ name, organism: 'Testus frozenii', structureIds: ['T1'] });
const centre = (proteinAccession: string, label: string) =>
	KINDS.centre.schema.parse({ proteinAccession, label, cofactorKind: 'fe4s4', ligation: 'Cys4' });

const pinsOf = (versionId: number) =>
	db
		.selectFrom('entry_version_reference as r')
		.innerJoin('entry as e', 'e.id', 'r.referenced_entry_id')
		.select(['r.field', 'e.accession', 'r.referenced_version as version'])
		.where('r.entry_version_id', '=', versionId)
		.orderBy('r.field')
		.execute();

describe('pinning references on approval', () => {
	let p: Approved;
	let c: Approved;
	let pot: Approved;

	beforeAll(async () => {
		p = await approved('protein', protein('Frozen oxidase'));
		c = await approved('centre', centre(p.accession, 'N1'));
		pot = await approved('potential', potentialAtPh7(c.accession, '[4Fe-4S]2+/1+', -300));
		// Later: the protein renamed, the centre relabelled (against the renamed protein).
		await approved('protein', protein('Renamed oxidase'), p);
		await approved('centre', centre(p.accession, 'N1a'), c);
	});

	it('stores the referenced (accession, version) current when each version was approved', async () => {
		expect(await pinsOf(c.versionId)).toEqual([
			{ field: 'proteinAccession', accession: p.accession, version: 1 }
		]);
		expect(await pinsOf(pot.versionId)).toEqual([
			{ field: 'centreAccession', accession: c.accession, version: 1 }
		]);
		const centreV2 = await db
			.selectFrom('entry_version')
			.select('id')
			.where('entry_id', '=', c.entryId)
			.where('version', '=', 2)
			.executeTakeFirstOrThrow();
		expect(await pinsOf(centreV2.id)).toEqual([
			{ field: 'proteinAccession', accession: p.accession, version: 2 }
		]);
		// A blank reference (no source) pins nothing.
		expect((await pinsOf(pot.versionId)).map((r) => r.field)).not.toContain('sourceAccession');
	});

	it('titles a version from its own data and its pinned references, never the latest ones', async () => {
		const centreV1 = await getEntryView(db, c.accession, 1, null);
		expect(centreV1.title).toBe('N1 ([4Fe-4S]) · Frozen oxidase');
		expect(centreV1.references.proteinAccession).toEqual({
			accession: p.accession,
			kind: 'protein',
			version: 1,
			title: 'Frozen oxidase'
		});
		// What is live says the protein has moved on, apart from the frozen version.
		expect(centreV1.live).toMatchObject({
			latestVersion: 2,
			newerReferences: { proteinAccession: 2 }
		});

		const centreNow = await getEntryView(db, c.accession, undefined, null);
		expect(centreNow.title).toBe('N1a ([4Fe-4S]) · Renamed oxidase');
		expect(centreNow.live.newerReferences).toEqual({});

		// Two steps away: the potential's centre is titled with the protein as that centre's
		// version named it.
		const potential = await getEntryView(db, pot.accession, 1, null);
		expect(potential.title).toBe('Em of [4Fe-4S]2+/1+, centre N1');
		expect(potential.references.centreAccession).toMatchObject({
			version: 1,
			title: 'N1 ([4Fe-4S]) · Frozen oxidase'
		});
		expect(potential.live.newerReferences).toEqual({ centreAccession: 2 });
	});

	it('refuses to change or delete a pin, as it refuses to change an approved version', async () => {
		await expect(
			sql`update entry_version_reference set referenced_version = 2 where entry_version_id = ${c.versionId}`.execute(
				db
			)
		).rejects.toThrow(/immutable/);
		await expect(
			sql`delete from entry_version_reference where entry_version_id = ${c.versionId}`.execute(db)
		).rejects.toThrow(/cannot be deleted/);
		// A pin must name a version that exists.
		await expect(
			db
				.insertInto('entry_version_reference')
				.values({
					entry_version_id: pot.versionId,
					field: 'sourceAccession',
					referenced_entry_id: p.entryId,
					referenced_version: 99
				})
				.execute()
		).rejects.toThrow(/FOREIGN KEY/);
	});

	it('writes pins in the approving transaction: an approval refused later leaves none', async () => {
		// A couple that does not fit the centre is refused by the kind's projection, after the
		// references were resolved and pinned.
		const refused = await db
			.transaction()
			.execute(async (trx) => {
				const entry = await createEntry(trx, { kind: 'potential' });
				const versionId = await addVersion(
					trx,
					entry.id,
					potentialAtPh7(c.accession, '[2Fe-2S]2+/1+', -300),
					{ status: 'submitted', visibility: null }
				);
				await approveVersion(trx, versionId);
			})
			.then(
				() => null,
				(e: unknown) => e
			);
		expect(String(refused)).toMatch(/couple/);
		const orphan = await db
			.selectFrom('entry_version_reference as r')
			.leftJoin('entry_version as v', 'v.id', 'r.entry_version_id')
			.select('r.entry_version_id')
			.where((eb) => eb.or([eb('v.id', 'is', null), eb('v.status', '!=', 'approved')]))
			.execute();
		expect(orphan).toEqual([]);
	});

	it('leaves out a pinned reference the reader may not see, and titles without it', async () => {
		const group = await db
			.insertInto('research_group')
			.values({ name: 'Frozen lab', slug: 'frozen-lab' })
			.returning('id')
			.executeTakeFirstOrThrow();
		const source = await approved(
			'source',
			KINDS.source.schema.parse({
				sourceKind: 'dataset',
				title: 'Hidden notebook',
				authors: ['Quiet, Q.']
			}),
			undefined,
			{ visibility: 'group', groupId: group.id, embargoUntil: null }
		);
		const cited = await approved(
			'potential',
			potentialAtPh7(c.accession, '[4Fe-4S]2+/1+', -310, source.accession)
		);
		expect((await pinsOf(cited.versionId)).map((r) => r.field)).toEqual([
			'centreAccession',
			'sourceAccession'
		]);
		const outsider = await getEntryView(db, cited.accession, 1, null);
		expect(outsider.data.sourceAccession).toBeNull();
		expect(outsider.references.sourceAccession).toBeUndefined();
		expect(JSON.stringify(outsider)).not.toContain(source.accession);
		const member = await getEntryView(db, cited.accession, 1, { groupIds: [group.id] });
		expect(member.references.sourceAccession).toMatchObject({
			accession: source.accession,
			version: 1,
			title: 'Quiet: Hidden notebook'
		});
	});
});
