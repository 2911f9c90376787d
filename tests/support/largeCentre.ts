import type { Kysely } from 'kysely';
import { normalisePotential, potentialInputSchema } from '$lib/schemas/potential';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import type { Database } from '$lib/server/db/schema';
import { loadDemoScenario } from '$seed/load';

/**
 * A stored potential (as approval expects it) of one centre and couple at pH 7 and 25 °C,
 * reported in mV vs SHE with ±5 mV: the shape the confidentiality and size fixtures share.
 */
export function potentialAtPh7(
	centreAccession: string,
	couple: string,
	reportedValue: number,
	sourceAccession: string | null = null
) {
	return normalisePotential(
		potentialInputSchema.parse({
			centreAccession,
			couple,
			reportedValue,
			reportedUnit: 'mV',
			referenceElectrode: 'SHE',
			ph: 7,
			temperatureK: 298.15,
			method: 'epr_titration',
			nElectrons: 1,
			uncertaintyMv: 5,
			sourceAccession
		})
	);
}

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
			const data = potentialAtPh7(some.centre_accession, some.couple, -1000 + (i % 2000));
			const entry = await createEntry(trx, { kind: 'potential' });
			const versionId = await addVersion(trx, entry.id, data, { status: 'submitted' });
			await approveVersion(trx, versionId);
			if (i === 0) onePotential = entry.accession;
		}
	});
	return { centre: some.centre_accession, protein: some.protein_accession, onePotential };
}
