import { insertSessionUser } from '../tests/support/users';
import type { Kysely } from 'kysely';
import { COUPLES_BY_KIND, type CofactorKind } from '../src/lib/schemas/vocabulary';
import { typicalRange } from '../src/lib/catalogue/typicalRanges';
import type { Database } from '../src/lib/server/db/schema';

/**
 * A CSV file of `rows` new potentials for centres of the benchmark catalogue: values inside
 * each kind's typical range, at pH 10.5–14 (the generated catalogue holds pH 5–10), so that rows
 * are compared but rarely conflict. Deterministic.
 */
export async function generatedPotentialsCsv(
	db: Kysely<Database>,
	rows: number
): Promise<{ text: string; centres: number }> {
	const centres = await db
		.selectFrom('centre')
		.innerJoin('entry', 'entry.id', 'centre.entry_id')
		.select(['entry.accession', 'centre.cofactor_kind'])
		.where('centre.cofactor_kind', '!=', 'other')
		.limit(2000)
		.execute();
	const lines = [
		'centreAccession,couple,reportedValue,reportedUnit,referenceElectrode,ph,temperatureK,method,uncertaintyMv'
	];
	for (let i = 0; i < rows; i++) {
		const c = centres[i % centres.length] as (typeof centres)[number];
		const kind = c.cofactor_kind as CofactorKind;
		const couple = COUPLES_BY_KIND[kind][0] as string;
		const range = typicalRange(kind, couple);
		const mid = range ? (range.minMv + range.maxMv) / 2 : -200;
		const ph = (10.5 + (Math.floor(i / centres.length) % 70) * 0.05).toFixed(2);
		lines.push(
			`${c.accession},${couple},${mid + (i % 41) - 20},mV,SHE,${ph},298.15,optical_titration,15`
		);
	}
	return { text: lines.join('\n'), centres: centres.length };
}

/** A user of the benchmark, with the role given. */
export const benchUser = insertSessionUser;
