import { sql, type Kysely } from 'kysely';
import type { ListedPotential } from '$lib/catalogue/conflicts';
import { DEFAULT_CHAIN_CONDITIONS, type ChainConditions } from '$lib/schemas/chainConditions';
import type { CentreDto, DistanceDto } from '$lib/catalogue/dto';
import type { Database } from '../db/schema';
import { listCentres } from '../kinds/centre';
import { listDistances } from '../kinds/distance';
import { COMPARABLE_COLUMNS, toComparable } from './comparablePotential';
import { potentialIsVisible, type Viewer } from './visibility';

/*
 * What a protein's energy ladder and chain estimate are drawn from, read with bounds however large
 * the protein: its centres (at most LADDER_MAX_CENTRES, else no ladder), the potential of each
 * centre and couple measured nearest the chosen conditions (pH weighs 1 unit per 10 K, as the
 * ladder's own choice; at most LADDER_COUPLES_PER_CENTRE couples per centre, nearest first), and
 * the distances between its centres (at most LADDER_MAX_DISTANCES). One value per couple, not per
 * centre, because the chain estimate picks the couple by the centre's role (a flavin's sq/hq at
 * the entry, ox/sq elsewhere: calc/chainEstimate.ts).
 */
export const LADDER_MAX_CENTRES = 100;
export const LADDER_MAX_DISTANCES = 1000;
/** The vocabulary has at most four couples per cofactor kind; "other" centres may have more. */
export const LADDER_COUPLES_PER_CENTRE = 6;

export type LadderInputs =
	| {
			ok: true;
			centres: Pick<CentreDto, 'accession' | 'label' | 'cofactorKind'>[];
			potentials: ListedPotential[];
			/** Also what the protein page's distance matrix is drawn from (catalogue/distanceMatrix.ts). */
			distances: DistanceDto[];
	  }
	| { ok: false; reason: string };

export async function ladderInputs(
	db: Kysely<Database>,
	proteinAccession: string,
	viewer: Viewer | null,
	conditions: ChainConditions = DEFAULT_CHAIN_CONDITIONS
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
	// The same score as the ladder's own choice of a representative value (catalogue/ladder.ts).
	const score = sql<number>`abs(coalesce(p.ph, 7) - ${conditions.ph}) + abs(coalesce(p.temperature_k, 298.15) - ${conditions.temperatureK}) / 10`;
	const ranked = await db
		.selectFrom((eb) =>
			eb
				.selectFrom((inner) =>
					inner
						.selectFrom('potential as p')
						.select([
							...COMPARABLE_COLUMNS,
							'p.centre_entry_id',
							'p.entry_id',
							score.as('score'),
							sql<number>`row_number() over (partition by p.centre_entry_id, p.couple order by ${score}, p.entry_id)`.as(
								'rank'
							)
						])
						.where('p.protein_entry_id', 'in', protein)
						.where((e2) => potentialIsVisible(e2, 'p', viewer))
						.as('per_couple')
				)
				.selectAll()
				.select(
					sql<number>`row_number() over (partition by centre_entry_id order by score, entry_id)`.as(
						'couple_rank'
					)
				)
				.where('rank', '=', 1)
				.as('ranked')
		)
		.selectAll()
		.where('couple_rank', '<=', LADDER_COUPLES_PER_CENTRE)
		// Nearest first, so the ladder's first-best choice is the one SQL ranks first.
		.orderBy('score')
		.orderBy('entry_id')
		.limit(LADDER_MAX_CENTRES * LADDER_COUPLES_PER_CENTRE)
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
