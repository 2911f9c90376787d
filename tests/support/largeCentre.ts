import type { Kysely } from 'kysely';
import { normalisePotential, potentialInputSchema } from '$lib/schemas/potential';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import type { Database } from '$lib/server/db/schema';
import { loadDemoScenario } from '$seed/load';

/**
 * The demo scenario plus `count` approved potentials on one centre, all at the same pH and
 * temperature and spread over 2 V, so that nearly every pair conflicts: the worst case for
 * anything that compares a centre's values with each other.
 */
export async function buildLargeCentre(
	db: Kysely<Database>,
	count: number
): Promise<{ centre: string; protein: string; onePotential: string }> {
	await loadDemoScenario(db);
	const some = await db
		.selectFrom('potential')
		.select(['centre_accession', 'protein_accession', 'couple'])
		.orderBy('entry_id')
		.limit(1)
		.executeTakeFirstOrThrow();
	let onePotential = '';
	await db.transaction().execute(async (trx) => {
		for (let i = 0; i < count; i++) {
			const data = normalisePotential(
				potentialInputSchema.parse({
					centreAccession: some.centre_accession,
					couple: some.couple,
					reportedValue: -1000 + (i % 2000),
					reportedUnit: 'mV',
					referenceElectrode: 'SHE',
					ph: 7,
					temperatureK: 298.15,
					method: 'epr_titration',
					nElectrons: 1,
					uncertaintyMv: 5,
					sourceAccession: null
				})
			);
			const entry = await createEntry(trx, { kind: 'potential' });
			const versionId = await addVersion(trx, entry.id, data, { status: 'submitted' });
			await approveVersion(trx, versionId);
			if (i === 0) onePotential = entry.accession;
		}
	});
	return { centre: some.centre_accession, protein: some.protein_accession, onePotential };
}
