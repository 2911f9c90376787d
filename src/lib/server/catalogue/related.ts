import type { Kysely } from 'kysely';
import type { CentreDto, DistanceDto, PotentialDto, SpinRecordDto } from '$lib/catalogue/dto';
import { RELATED_PAGE_SIZE } from '$lib/schemas/relatedLists';
import type { RelatedPages } from '$lib/schemas/relatedPages';
import type { EntryKind } from '$lib/kinds';
import type { Database } from '../db/schema';
import { listCentres } from '../kinds/centre';
import { listDistances } from '../kinds/distance';
import { listSpinRecords } from '../kinds/spinRecord';
import { listPotentials } from './potentials';
import type { Viewer } from './visibility';

/** One page of a related list: never more than RELATED_PAGE_SIZE rows, with the total. */
export interface RelatedPage<T> {
	items: T[];
	total: number;
	page: number;
	pageCount: number;
}

/** What an entry page shows beside a protein or a centre: its current related records, paged. */
export interface RelatedRecords {
	centres: RelatedPage<CentreDto> | null;
	potentials: RelatedPage<PotentialDto>;
	spinRecords: RelatedPage<SpinRecordDto>;
	distances: RelatedPage<DistanceDto>;
}

function paged<T>(p: { items: T[]; total: number }, page: number): RelatedPage<T> {
	return {
		items: p.items,
		total: p.total,
		page,
		pageCount: Math.max(1, Math.ceil(p.total / RELATED_PAGE_SIZE))
	};
}

const window = (page: number) => ({
	limit: RELATED_PAGE_SIZE,
	offset: (page - 1) * RELATED_PAGE_SIZE
});

export async function relatedRecords(
	db: Kysely<Database>,
	kind: EntryKind,
	accession: string,
	viewer: Viewer | null,
	pages: RelatedPages
): Promise<RelatedRecords | null> {
	if (kind !== 'protein' && kind !== 'centre') return null;
	const filter = kind === 'protein' ? { protein: accession } : { centre: accession };
	const [centres, potentials, spinRecords, distances] = await Promise.all([
		kind === 'protein'
			? listCentres(
					db,
					{ protein: accession },
					{ ...window(pages.centres), sort: 'protein' },
					viewer
				)
			: null,
		listPotentials(db, filter, { ...window(pages.potentials), sort: 'protein' }, viewer),
		listSpinRecords(db, filter, { ...window(pages.spinRecords), sort: 'centre' }, viewer),
		listDistances(db, filter, { ...window(pages.distances), sort: 'centre' }, viewer)
	]);
	return {
		centres: centres ? paged(centres, pages.centres) : null,
		potentials: paged(potentials, pages.potentials),
		spinRecords: paged(spinRecords, pages.spinRecords),
		distances: paged(distances, pages.distances)
	};
}
