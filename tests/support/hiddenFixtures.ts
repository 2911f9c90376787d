import { sql, type Kysely } from 'kysely';
import type { EntryKind } from '$lib/kinds';
import { createPasswordUser } from '$lib/server/auth/users';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import type { Database } from '$lib/server/db/schema';
import { DEMO_GROUP, ensureDemoAccounts } from '$seed/accounts';
import { loadDemoScenario } from '$seed/load';
import { potentialAtPh7 } from './largeCentre';

/**
 * A demo catalogue plus entries only the demo consortium may see, and accounts outside it: the
 * ground for confidentiality tests. Every hidden value is distinctive, so a test can search any
 * response for it.
 */
export const OUTSIDERS = {
	reader: { email: 'outside-reader@lab.test', password: 'outside-reader-pass', role: 'reader' },
	contributor: {
		email: 'outside-contributor@lab.test',
		password: 'outside-contributor-pass',
		role: 'contributor'
	}
} as const;

export const HIDDEN_MARKS = {
	sourceDoi: '10.5555/hidden.source.77',
	sourceAuthor: 'Zzyzxhidden, Q.',
	centreLabel: 'Qhiddencentre',
	potentialMv: -777.7,
	/** Far from every demo value, so a comparison would call it a conflict. */
	potentialReported: -777.7
} as const;

export interface HiddenFixtures {
	groupId: number;
	/** A public centre (of a public protein) that holds the hidden potential. */
	publicCentre: string;
	publicCentreCouple: string;
	publicProtein: string;
	/** Group-only potential on the public centre. */
	hiddenPotential: string;
	/** Embargoed (far future) potential on the public centre. */
	embargoedPotential: string;
	/** Group-only source, and a public potential that cites it. */
	hiddenSource: string;
	potentialCitingHiddenSource: string;
	/** Group-only centre on the public protein. */
	hiddenCentre: string;
	/** A group-only protein. */
	hiddenProtein: string;
}

export async function buildHiddenFixtures(db: Kysely<Database>): Promise<HiddenFixtures> {
	await loadDemoScenario(db);
	await ensureDemoAccounts(db);
	for (const o of Object.values(OUTSIDERS))
		await createPasswordUser(db, { ...o, name: o.role, verified: true });
	const group = await db
		.selectFrom('research_group')
		.select('id')
		.where('slug', '=', DEMO_GROUP.slug)
		.executeTakeFirstOrThrow();
	const some = await db
		.selectFrom('potential')
		.select(['centre_accession', 'couple', 'protein_accession'])
		.orderBy('entry_id')
		.limit(1)
		.executeTakeFirstOrThrow();
	const GROUP = { visibility: 'group' as const, groupId: group.id, embargoUntil: null };
	const EMBARGO = {
		visibility: 'embargoed' as const,
		groupId: group.id,
		embargoUntil: '2099-01-01T00:00:00.000Z'
	};

	return db.transaction().execute(async (trx) => {
		// Hidden accessions far from HL000123, the example the interface itself prints.
		await sql`update sqlite_sequence set seq = max(seq, 700) where name = 'entry'`.execute(trx);
		const add = async (
			kind: EntryKind,
			data: Record<string, unknown>,
			visibility: typeof GROUP | typeof EMBARGO | null
		) => {
			const entry = await createEntry(trx, { kind });
			const versionId = await addVersion(trx, entry.id, data, {
				status: 'submitted',
				visibility
			});
			await approveVersion(trx, versionId);
			return entry.accession;
		};
		const potential = (value: number, sourceAccession: string | null) =>
			potentialAtPh7(some.centre_accession, some.couple, value, sourceAccession);
		const hiddenSource = await add(
			'source',
			{
				sourceKind: 'publication',
				doi: HIDDEN_MARKS.sourceDoi,
				title: 'Unpublished titrations of the consortium',
				authors: [HIDDEN_MARKS.sourceAuthor],
				journal: 'Consortium report',
				year: 2031
			},
			GROUP
		);
		return {
			groupId: group.id,
			publicCentre: some.centre_accession,
			publicCentreCouple: some.couple,
			publicProtein: some.protein_accession,
			hiddenPotential: await add(
				'potential',
				potential(HIDDEN_MARKS.potentialReported, null),
				GROUP
			),
			embargoedPotential: await add('potential', potential(-666.6, null), EMBARGO),
			hiddenSource,
			potentialCitingHiddenSource: await add('potential', potential(-301.2, hiddenSource), null),
			hiddenCentre: await add(
				'centre',
				{
					proteinAccession: some.protein_accession,
					label: HIDDEN_MARKS.centreLabel,
					cofactorKind: 'fe4s4',
					ligation: 'Cys4',
					chainId: 'A',
					residues: [11, 14, 17, 58],
					coordinatesA: null
				},
				GROUP
			),
			hiddenProtein: await add(
				'protein',
				{
					name: 'Hiddenase of the consortium',
					organism: 'Thermofictus hiddenensis',
					structureIds: [],
					description: null
				},
				GROUP
			)
		};
	});
}
