import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '$lib/server/auth/roles';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import { suggestEntries } from '$lib/server/catalogue/suggestions';
import { checkFormEntry, warningsSeen } from '$lib/server/curation/formCheck';
import type { Database } from '$lib/server/db/schema';
import type { EntryData } from '$lib/schemas/entryData';
import { suggestionQuerySchema } from '$lib/schemas/suggestions';
import { buildHiddenFixtures, HIDDEN_MARKS, type HiddenFixtures } from '../support/hiddenFixtures';
import { potentialAtPh7 } from '../support/largeCentre';
import { createTempDatabase } from '../support/tempDb';

// Issue 14 §3: the suggestions behind the entry forms' reference fields never name an entry the
// reader may not see, and the forms' check step gives the warnings of the review pages.

let db: Kysely<Database>;
let remove: () => Promise<void>;
let hidden: HiddenFixtures;
let member: { groupIds: number[] };
const outsider = { groupIds: [] as number[] };

const suggest = (type: string, q: string, viewer: { groupIds: number[] } | null, limit?: number) =>
	suggestEntries(db, suggestionQuerySchema.parse({ type, q, limit }), viewer);
const accessions = async (...args: Parameters<typeof suggest>) =>
	(await suggest(...args)).map((s) => s.accession);

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	hidden = await buildHiddenFixtures(db);
	member = { groupIds: [hidden.groupId] };
	// Migrating and loading the demo scenario takes seconds on a shared machine.
}, 60_000);
afterAll(async () => remove());

describe('suggestions for reference fields', () => {
	it('find centres by label, protein words and accession, naming what tells them apart', async () => {
		const byAccession = await suggest('centre', hidden.publicCentre, null);
		expect(byAccession[0]?.accession).toBe(hidden.publicCentre);
		const label = byAccession[0]?.title ?? '';
		const byLabel = await accessions('centre', label, null);
		expect(byLabel).toContain(hidden.publicCentre);
		// Several words, each matching some column (label and protein name), in any order.
		const protein = await db
			.selectFrom('centre')
			.innerJoin('protein', 'protein.entry_id', 'centre.protein_entry_id')
			.innerJoin('entry', 'entry.id', 'centre.entry_id')
			.select(['protein.name'])
			.where('entry.accession', '=', hidden.publicCentre)
			.executeTakeFirstOrThrow();
		const word = protein.name.split(/\s+/).find((w) => w.length > 3) ?? protein.name;
		expect(await accessions('centre', `${word} ${label}`, null)).toContain(hidden.publicCentre);
		expect(byAccession[0]?.detail).toContain(protein.name);
	});
	it('never suggest a hidden centre, protein or source to someone outside its group', async () => {
		expect(await accessions('centre', HIDDEN_MARKS.centreLabel, outsider)).toEqual([]);
		expect(await accessions('centre', HIDDEN_MARKS.centreLabel, null)).toEqual([]);
		expect(await accessions('centre', HIDDEN_MARKS.centreLabel, member)).toEqual([
			hidden.hiddenCentre
		]);
		expect(await accessions('protein', 'Hiddenase', outsider)).toEqual([]);
		expect(await accessions('protein', hidden.hiddenProtein, outsider)).toEqual([]);
		expect(await accessions('protein', 'Hiddenase', member)).toEqual([hidden.hiddenProtein]);
		expect(await accessions('source', 'Zzyzxhidden', outsider)).toEqual([]);
		expect(await accessions('source', HIDDEN_MARKS.sourceDoi, outsider)).toEqual([]);
		expect(await accessions('source', 'Zzyzxhidden', member)).toEqual([hidden.hiddenSource]);
	});
	it('never suggest a public centre of a hidden protein, nor an entry awaiting review', async () => {
		const { centreOfHidden, pendingProtein } = await db.transaction().execute(async (trx) => {
			const centre = await createEntry(trx, { kind: 'centre' });
			const v = await addVersion(
				trx,
				centre.id,
				{
					proteinAccession: hidden.hiddenProtein,
					label: 'Ypubliconhidden',
					cofactorKind: 'fe4s4',
					ligation: null,
					chainId: null,
					residues: [],
					coordinatesA: null
				},
				{ status: 'submitted', visibility: null }
			);
			await approveVersion(trx, v);
			const pending = await createEntry(trx, { kind: 'protein' });
			await addVersion(
				trx,
				pending.id,
				{ name: 'Pendingase', organism: 'Nowhere', structureIds: [], description: null },
				{ status: 'submitted', visibility: null }
			);
			return { centreOfHidden: centre.accession, pendingProtein: pending.accession };
		});
		expect(await accessions('centre', 'Ypubliconhidden', outsider)).toEqual([]);
		expect(await accessions('centre', 'Ypubliconhidden', member)).toEqual([centreOfHidden]);
		expect(await accessions('protein', 'Pendingase', member)).toEqual([]);
		expect(await accessions('protein', pendingProtein, member)).toEqual([]);
	});
	it('take LIKE wildcards literally and stop at the limit', async () => {
		expect(await accessions('protein', '%', null)).toEqual([]);
		expect(await accessions('protein', '_', null)).toEqual([]);
		expect((await suggest('centre', 'HL', null, 3)).length).toBe(3);
	});
});

describe('the check step of entry forms', () => {
	const contributor = (groupIds: number[]): SessionUser => ({
		id: 'no-such-user',
		email: 'c@lab.test',
		name: 'c',
		role: 'contributor',
		groupIds
	});
	const potential = (value: number, centreAccession = hidden.publicCentre): EntryData => ({
		kind: 'potential',
		data: potentialAtPh7(centreAccession, hidden.publicCentreCouple, value)
	});

	it('names the references a submission would be refused for', async () => {
		const r = await checkFormEntry(db, contributor([]), potential(-300, hidden.hiddenCentre), null);
		expect(r.errors.centreAccession?.[0]).toMatch(/not visible to you/);
		expect(r.check.warnings).toEqual([]);
	});
	it('gives the warnings the submission and review pages give, against what the contributor may see', async () => {
		// The hidden potential (−777.7 mV, ±5 mV) lies on the same centre and couple.
		const outside = await checkFormEntry(db, contributor([]), potential(-777), null);
		const inside = await checkFormEntry(db, contributor([hidden.groupId]), potential(-777), null);
		const conflictsWith = (w: typeof outside.check.warnings) =>
			w.filter((x) => x.kind === 'conflict').map((x) => x.accession);
		expect(conflictsWith(outside.check.warnings)).not.toContain(hidden.hiddenPotential);
		expect(JSON.stringify(outside.check.warnings)).not.toContain('777.7');
		expect(conflictsWith(inside.check.warnings)).not.toContain(hidden.hiddenPotential);
		// −700 mV (±5) against −777.7 (±5): 77.7 mV > 2·√50 = 14.1 mV (conflicts.ts, k = 2).
		const near = await checkFormEntry(db, contributor([hidden.groupId]), potential(-700), null);
		expect(conflictsWith(near.check.warnings)).toContain(hidden.hiddenPotential);
		const far = await checkFormEntry(db, contributor([]), potential(+900), null);
		expect(far.check.warnings.map((w) => w.kind)).toContain('range');
	});
	it('lets Submit through only with the very warnings shown', async () => {
		const a = await checkFormEntry(db, contributor([]), potential(+900), null);
		const b = await checkFormEntry(db, contributor([]), potential(+900), null);
		const c = await checkFormEntry(db, contributor([]), potential(+950), null);
		expect(a.check.seen).toBe(b.check.seen);
		expect(warningsSeen(a.check, b.check.seen)).toBe(true);
		expect(warningsSeen(c.check, a.check.seen)).toBe(false);
		expect(warningsSeen(c.check, undefined)).toBe(false);
		expect(warningsSeen({ warnings: [], seen: 'x' }, undefined)).toBe(true);
	});
});
