import { sql, type Kysely } from 'kysely';
import type { ListedPotential } from '$lib/catalogue/conflicts';
import type { LadderCentre, LadderDistance } from '$lib/catalogue/ladder';
import type { Database } from '../db/schema';
import { listCentres } from '../kinds/centre';
import { listDistances } from '../kinds/distance';
import { COMPARABLE_COLUMNS, toComparable } from './comparablePotential';
import { potentialIsVisible, type Viewer } from './visibility';

/*
 * What a protein's energy ladder is drawn from, read with bounds however large the protein:
 * its centres (at most LADDER_MAX_CENTRES, else no ladder), one representative potential per
 * centre chosen in SQL (the one nearest pH 7 and 25 °C, as the ladder would choose), and the
 * distances between its centres (at most LADDER_MAX_DISTANCES).
 */
export const LADDER_MAX_CENTRES = 100;
export const LADDER_MAX_DISTANCES = 1000;

export type LadderInputs =
	| {
			ok: true;
			centres: LadderCentre[];
			potentials: ListedPotential[];
			distances: LadderDistance[];
	  }
	| { ok: false; reason: string };

export async function ladderInputs(
	db: Kysely<Database>,
	proteinAccession: string,
	viewer: Viewer | null
): Promise<LadderInputs> {
	const centres = await listCentres(
		db,
		{ protein: proteinAccession },
		{ limit: LADDER_MAX_CENTRES, offset: 0, sort: 'protein' },
		viewer
	);
	if (centres.total > LADDER_MAX_CENTRES) {
		return {
			ok: false,
			reason: `This protein has ${centres.total} centres; the energy ladder is drawn for proteins of at most ${LADDER_MAX_CENTRES}.`
		};
	}
	const protein = db
		.selectFrom('entry')
		.select('entry.id')
		.where('entry.accession', '=', proteinAccession);
	const ranked = await db
		.selectFrom((eb) =>
			eb
				.selectFrom('potential as p')
				.select([
					...COMPARABLE_COLUMNS,
					// The same score as the ladder's own choice of a representative value.
					sql<number>`row_number() over (partition by p.centre_entry_id order by abs(coalesce(p.ph, 7) - 7) + abs(coalesce(p.temperature_k, 298.15) - 298.15) / 10, p.entry_id)`.as(
						'rank'
					)
				])
				.where('p.protein_entry_id', 'in', protein)
				.where((e2) => potentialIsVisible(e2, 'p', viewer))
				.as('ranked')
		)
		.selectAll()
		.where('rank', '=', 1)
		.limit(LADDER_MAX_CENTRES)
		.execute();
	const distances = await listDistances(
		db,
		{ protein: proteinAccession },
		{ limit: LADDER_MAX_DISTANCES, offset: 0, sort: 'accession' },
		viewer
	);
	return {
		ok: true,
		centres: centres.items,
		potentials: ranked.map(toComparable),
		distances: distances.items
	};
}
