import type { Kysely } from 'kysely';
import type { CentreDto, DistanceDto, PotentialDto, SpinRecordDto } from '$lib/catalogue/dto';
import type { EntryKind } from '$lib/schemas/vocabulary';
import type { Database } from '../db/schema';
import { listCentres, listDistances, listSpinRecords } from './lists';
import { listPotentials } from './potentials';
import type { Viewer } from './visibility';

/** What an entry page shows beside a protein or a centre: its current related records. */
export interface RelatedRecords {
	centres: CentreDto[];
	potentials: PotentialDto[];
	spinRecords: SpinRecordDto[];
	distances: DistanceDto[];
}

const ALL = { limit: 2000, offset: 0 };

export async function relatedRecords(
	db: Kysely<Database>,
	kind: EntryKind,
	accession: string,
	viewer: Viewer | null
): Promise<RelatedRecords | null> {
	if (kind !== 'protein' && kind !== 'centre') return null;
	const filter = kind === 'protein' ? { protein: accession } : { centre: accession };
	const [centres, potentials, spinRecords, distances] = await Promise.all([
		kind === 'protein'
			? listCentres(db, { protein: accession }, { ...ALL, sort: 'protein' }, viewer)
			: null,
		listPotentials(db, filter, { ...ALL, sort: 'protein' }, viewer),
		listSpinRecords(db, filter, { ...ALL, sort: 'centre' }, viewer),
		listDistances(db, filter, { ...ALL, sort: 'centre' }, viewer)
	]);
	return {
		centres: centres?.items ?? [],
		potentials: potentials.items,
		spinRecords: spinRecords.items,
		distances: distances.items
	};
}
