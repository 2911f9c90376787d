import type { Kysely } from 'kysely';
import type { DistanceDto, Page } from '$lib/catalogue/dto';
import type { DISTANCE_SORTS, DistanceApiQuery } from '$lib/schemas/catalogueQuery';
import type { CofactorKind } from '$lib/schemas/vocabulary';

import type { Database, Row } from '../db/schema';
import { withVisibleSource } from '../catalogue/lists';
import {
	toCentreRef,
	toProteinRef,
	toSourceRef,
	type ProteinRefColumns,
	type SourceRefColumns
} from '../catalogue/mappers';
import { sqlKeyset, type ListOptions, type ListOrder } from '../catalogue/keyset';

import { entryIsVisible, type Viewer } from '../catalogue/visibility';
import { checkDuplicateKey, findCentre } from '../uploads/rows';
import { PAGE, centreAccessionsById, paged } from '../uploads/lookups';
import { defineUpload, upsertReadModel, type KindOnServer } from './kind';
import type { DistanceMethod } from '$lib/schemas/vocabulary';

type DistanceSort = (typeof DISTANCE_SORTS)[number];

/** The kind's read-model table (see KindTables in db/schema.ts). */
export interface DistanceTable {
	entry_id: number;
	version: number;
	centre_a_entry_id: number;
	centre_b_entry_id: number;
	edge_to_edge_a: number;
	centre_to_centre_a: number | null;
	structure_id: string;
	method: DistanceMethod;
	source_entry_id: number | null;
}

declare module '../db/schema' {
	interface KindTables {
		distance: DistanceTable;
	}
}

/** What makes two distances the same: the pair in either order, and the structure. */
const distanceKey = (a: string, b: string, structure: string) =>
	`${a < b ? a : b}|${a < b ? b : a}|${structure.toLowerCase()}`;

export const distance: KindOnServer<'distance'> = {
	async project(trx, { entryId, version, data: d, refs }) {
		await upsertReadModel(trx, 'distance', entryId, {
			version,
			centre_a_entry_id: refs.centreAAccession as number,
			centre_b_entry_id: refs.centreBAccession as number,
			edge_to_edge_a: d.edgeToEdgeA,
			centre_to_centre_a: d.centreToCentreA,
			structure_id: d.structureId,
			method: d.method,
			source_entry_id: refs.sourceAccession ?? null
		});
	},
	async dependsOn(db, entryId) {
		const d = await db
			.selectFrom('distance')
			.select(['centre_a_entry_id', 'centre_b_entry_id'])
			.where('entry_id', '=', entryId)
			.executeTakeFirst();
		return d
			? [
					{ id: d.centre_a_entry_id, kind: 'centre' },
					{ id: d.centre_b_entry_id, kind: 'centre' }
				]
			: [];
	},
	title: (_d, refs) =>
		`Distance ${refs.centreAAccession?.label ?? 'centre'} – ${refs.centreBAccession?.label ?? 'centre'}`,
	potentialRowsColumn: null,
	upload: defineUpload({
		async loadExisting(db, viewer, shared) {
			const accessionOf = centreAccessionsById(shared);
			const existing = new Map<string, string>();
			await paged(
				(after) =>
					db
						.selectFrom('distance')
						.innerJoin('entry', 'entry.id', 'distance.entry_id')
						.select([
							'distance.entry_id',
							'entry.accession',
							'distance.centre_a_entry_id',
							'distance.centre_b_entry_id',
							'distance.structure_id'
						])
						.where('distance.entry_id', '>', after)
						.where((eb) => entryIsVisible(eb, 'entry', viewer))
						.orderBy('distance.entry_id')
						.limit(PAGE)
						.execute(),
				(row) =>
					existing.set(
						distanceKey(
							accessionOf.get(row.centre_a_entry_id) ?? '',
							accessionOf.get(row.centre_b_entry_id) ?? '',
							row.structure_id
						),
						row.accession
					)
			);
			return existing;
		},
		resolve(r) {
			const a = findCentre(r.state, r.values, r.texts, 'centreAAccession', 'centreALabel', r.fail);
			const b = findCentre(r.state, r.values, r.texts, 'centreBAccession', 'centreBLabel', r.fail);
			return a && b
				? { centres: [a, b], newProtein: null, proteinEntryId: a.proteinEntryId }
				: null;
		},
		check: (r, d, _resolved, approved) =>
			checkDuplicateKey(
				r,
				distanceKey(d.centreAAccession, d.centreBAccession, d.structureId),
				approved,
				{
					inFile: 'edgeToEdgeA',
					warn: 'structureId',
					value: d.structureId
				}
			)
	})
};

export type DistanceRowColumns = ProteinRefColumns &
	SourceRefColumns &
	Pick<
		Row<'distance'>,
		'version' | 'edge_to_edge_a' | 'centre_to_centre_a' | 'structure_id' | 'method'
	> &
	Pick<Row<'entry'>, 'accession' | 'is_demo'> & {
		a_accession: string;
		a_label: string;
		a_kind: CofactorKind;
		b_accession: string;
		b_label: string;
		b_kind: CofactorKind;
	};

export function toDistanceDto(r: DistanceRowColumns): DistanceDto {
	return {
		accession: r.accession,
		version: r.version,
		centreA: toCentreRef({
			centre_accession: r.a_accession,
			centre_label: r.a_label,
			cofactor_kind: r.a_kind
		}),
		centreB: toCentreRef({
			centre_accession: r.b_accession,
			centre_label: r.b_label,
			cofactor_kind: r.b_kind
		}),
		protein: toProteinRef(r),
		edgeToEdgeAngstrom: r.edge_to_edge_a,
		centreToCentreAngstrom: r.centre_to_centre_a,
		structureId: r.structure_id,
		method: r.method,
		source: toSourceRef(r),
		isDemo: r.is_demo === 1
	};
}

/** How the distance list is ordered, by each of its sorts (keyset paging: catalogue/keyset.ts). */
export const DISTANCE_ORDER: ListOrder<DistanceSort> = {
	list: 'distances',
	id: 'd.entry_id',
	defaultSort: 'accession',
	sorts: {
		accession: [{ ref: 'e.accession', type: 'text' }],
		edge: [{ ref: 'd.edge_to_edge_a', type: 'number' }],
		centre: [{ ref: 'a.label', type: 'text' }]
	}
};

/** The distances a reader may see, filtered, sorted and paged, for pages and the API. */
export async function listDistances(
	db: Kysely<Database>,
	filter: Pick<
		DistanceApiQuery,
		'organism' | 'protein' | 'centre' | 'method' | 'edgeMin' | 'edgeMax'
	>,
	options: ListOptions<DistanceSort>,
	viewer: Viewer | null
): Promise<Page<DistanceDto>> {
	const keyset = sqlKeyset(DISTANCE_ORDER, options);
	let query = db
		.selectFrom('distance as d')
		.innerJoin('entry as e', 'e.id', 'd.entry_id')
		.innerJoin('centre as a', 'a.entry_id', 'd.centre_a_entry_id')
		.innerJoin('entry as ae', 'ae.id', 'a.entry_id')
		.innerJoin('centre as b', 'b.entry_id', 'd.centre_b_entry_id')
		.innerJoin('entry as be', 'be.id', 'b.entry_id')
		.innerJoin('protein as pr', 'pr.entry_id', 'a.protein_entry_id')
		.innerJoin('entry as pe', 'pe.id', 'pr.entry_id')
		// Centre B may sit on another protein (a distance across subunits): it counts too.
		.innerJoin('entry as pbe', 'pbe.id', 'b.protein_entry_id')
		.where((eb) =>
			eb.and([
				entryIsVisible(eb, 'e', viewer),
				entryIsVisible(eb, 'ae', viewer),
				entryIsVisible(eb, 'be', viewer),
				entryIsVisible(eb, 'pe', viewer),
				entryIsVisible(eb, 'pbe', viewer)
			])
		);
	if (filter.organism?.length) query = query.where('pr.organism', 'in', filter.organism);
	if (filter.protein) query = query.where('pe.accession', '=', filter.protein);
	if (filter.centre) {
		const c = filter.centre;
		query = query.where((eb) => eb.or([eb('ae.accession', '=', c), eb('be.accession', '=', c)]));
	}
	if (filter.method?.length) query = query.where('d.method', 'in', filter.method);
	if (filter.edgeMin !== undefined) query = query.where('d.edge_to_edge_a', '>=', filter.edgeMin);
	if (filter.edgeMax !== undefined) query = query.where('d.edge_to_edge_a', '<=', filter.edgeMax);
	const { n, before } = await query
		.select((eb) => [eb.fn.countAll<number>().as('n'), keyset.rowsBefore().as('before')])
		.executeTakeFirstOrThrow();
	const rows = await query
		.$call((q) => withVisibleSource(q, 'd.source_entry_id', viewer))
		.select([
			'e.accession',
			'd.version',
			'd.edge_to_edge_a',
			'd.centre_to_centre_a',
			'd.structure_id',
			'd.method',
			'e.is_demo',
			'ae.accession as a_accession',
			'a.label as a_label',
			'a.cofactor_kind as a_kind',
			'be.accession as b_accession',
			'b.label as b_label',
			'b.cofactor_kind as b_kind',
			'pe.accession as protein_accession',
			'pr.name as protein_name',
			'pr.organism',
			...keyset.keyColumns()
		])
		.where(keyset.where())
		.orderBy(keyset.orderBy())
		.limit(keyset.limit)
		.offset(keyset.offset)
		.execute();
	if (keyset.restartsAtFirstPage(rows.length))
		return listDistances(db, filter, { ...options, cursor: undefined, offset: 0 }, viewer);
	return keyset.page(rows, toDistanceDto, Number(n), Number(before));
}
