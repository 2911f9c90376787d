import type { Kysely } from 'kysely';
import type { Page, SpinRecordDto } from '$lib/catalogue/dto';
import type { SPIN_SORTS, SpinRecordApiQuery } from '$lib/schemas/catalogueQuery';

import { readJson } from '../db/json';
import type { Database, Row } from '../db/schema';
import { withVisibleSource } from '../catalogue/lists';
import {
	toCentreRef,
	toProteinRef,
	toSourceRef,
	type CentreRefColumns,
	type ProteinRefColumns,
	type SourceRefColumns
} from '../catalogue/mappers';
import { sqlKeyset, type ListOptions, type ListOrder } from '../catalogue/keyset';

import { entryIsVisible, type Viewer } from '../catalogue/visibility';
import { checkDuplicateKey, findCentre } from '../uploads/rows';
import { PAGE, centreAccessionsById, paged } from '../uploads/lookups';
import { defineUpload, upsertReadModel, type KindOnServer } from './kind';
import type { SpinMethod } from '$lib/schemas/vocabulary';
import type { JsonColumn } from '../db/json';

type SpinSort = (typeof SPIN_SORTS)[number];

/** The kind's read-model table (see KindTables in db/schema.ts). */
export interface SpinRecordTable {
	entry_id: number;
	version: number;
	centre_entry_id: number;
	oxidation_level: string;
	spin_s: number;
	/** JSON array of principal g-values, largest first. */
	g_values: JsonColumn<number[]>;
	temperature_k: number | null;
	method: SpinMethod;
	source_entry_id: number | null;
}

declare module '../db/schema' {
	interface KindTables {
		spin_record: SpinRecordTable;
	}
}

/** What makes two spin records the same measurement. */
const spinKey = (centre: string, level: string, method: string, t: number | null) =>
	`${centre}|${level}|${method}|${t ?? ''}`;

export const spinRecord: KindOnServer<'spin_record'> = {
	async project(trx, { entryId, version, data: d, refs }) {
		await upsertReadModel(trx, 'spin_record', entryId, {
			version,
			centre_entry_id: refs.centreAccession as number,
			oxidation_level: d.oxidationLevel,
			spin_s: d.spinS,
			// Principal values largest first, whatever order they were typed in.
			g_values: JSON.stringify([...d.gValues].sort((a, b) => b - a)),
			temperature_k: d.temperatureK,
			method: d.method,
			source_entry_id: refs.sourceAccession ?? null
		});
	},
	async dependsOn(db, entryId) {
		const r = await db
			.selectFrom('spin_record')
			.select('centre_entry_id')
			.where('entry_id', '=', entryId)
			.executeTakeFirst();
		return r ? [{ id: r.centre_entry_id, kind: 'centre' }] : [];
	},
	title: (d, refs) =>
		refs.centreAccession
			? `Spin state of ${d.oxidationLevel}, centre ${refs.centreAccession.label}`
			: `Spin state of ${d.oxidationLevel}`,
	potentialRowsColumn: null,
	upload: defineUpload({
		async loadExisting(db, viewer, shared) {
			const accessionOf = centreAccessionsById(shared);
			const existing = new Map<string, string>();
			await paged(
				(after) =>
					db
						.selectFrom('spin_record')
						.innerJoin('entry', 'entry.id', 'spin_record.entry_id')
						.select([
							'spin_record.entry_id',
							'entry.accession',
							'spin_record.centre_entry_id',
							'spin_record.oxidation_level',
							'spin_record.method',
							'spin_record.temperature_k'
						])
						.where('spin_record.entry_id', '>', after)
						.where((eb) => entryIsVisible(eb, 'entry', viewer))
						.orderBy('spin_record.entry_id')
						.limit(PAGE)
						.execute(),
				(row) =>
					existing.set(
						spinKey(
							accessionOf.get(row.centre_entry_id) ?? '',
							row.oxidation_level,
							row.method,
							row.temperature_k
						),
						row.accession
					)
			);
			return existing;
		},
		resolve(r) {
			const c = findCentre(r.state, r.values, r.texts, 'centreAccession', 'centreLabel', r.fail);
			return c ? { centres: [c], newProtein: null, proteinEntryId: c.proteinEntryId } : null;
		},
		check: (r, d, _resolved, approved) =>
			checkDuplicateKey(
				r,
				spinKey(d.centreAccession, d.oxidationLevel, d.method, d.temperatureK),
				approved,
				{ inFile: 'oxidationLevel', warn: 'oxidationLevel', value: d.oxidationLevel }
			)
	})
};

export type SpinRecordRowColumns = CentreRefColumns &
	ProteinRefColumns &
	SourceRefColumns &
	Pick<
		Row<'spin_record'>,
		'version' | 'oxidation_level' | 'spin_s' | 'g_values' | 'temperature_k' | 'method'
	> &
	Pick<Row<'entry'>, 'accession' | 'is_demo'>;

export function toSpinRecordDto(r: SpinRecordRowColumns): SpinRecordDto {
	return {
		accession: r.accession,
		version: r.version,
		centre: toCentreRef(r),
		protein: toProteinRef(r),
		oxidationLevel: r.oxidation_level,
		spinS: r.spin_s,
		gValues: readJson(r.g_values),
		temperatureK: r.temperature_k,
		method: r.method,
		source: toSourceRef(r),
		isDemo: r.is_demo === 1
	};
}

/** How the spin-record list is ordered, by each of its sorts (keyset paging: catalogue/keyset.ts). */
export const SPIN_RECORD_ORDER: ListOrder<SpinSort> = {
	list: 'spin-records',
	id: 'r.entry_id',
	defaultSort: 'accession',
	sorts: {
		accession: [{ ref: 'e.accession', type: 'text' }],
		centre: [{ ref: 'c.label', type: 'text' }],
		spin: [{ ref: 'r.spin_s', type: 'number' }],
		temperature: [{ ref: 'r.temperature_k', type: 'number', nullable: true }]
	}
};

/** The spin records a reader may see, filtered, sorted and paged, for pages and the API. */
export async function listSpinRecords(
	db: Kysely<Database>,
	filter: Pick<SpinRecordApiQuery, 'kind' | 'organism' | 'protein' | 'centre' | 'method' | 'spin'>,
	options: ListOptions<SpinSort>,
	viewer: Viewer | null
): Promise<Page<SpinRecordDto>> {
	const keyset = sqlKeyset(SPIN_RECORD_ORDER, options);
	let query = db
		.selectFrom('spin_record as r')
		.innerJoin('entry as e', 'e.id', 'r.entry_id')
		.innerJoin('centre as c', 'c.entry_id', 'r.centre_entry_id')
		.innerJoin('entry as ce', 'ce.id', 'c.entry_id')
		.innerJoin('protein as pr', 'pr.entry_id', 'c.protein_entry_id')
		.innerJoin('entry as pe', 'pe.id', 'pr.entry_id')
		.where((eb) =>
			eb.and([
				entryIsVisible(eb, 'e', viewer),
				entryIsVisible(eb, 'ce', viewer),
				entryIsVisible(eb, 'pe', viewer)
			])
		);
	if (filter.kind?.length) query = query.where('c.cofactor_kind', 'in', filter.kind);
	if (filter.organism?.length) query = query.where('pr.organism', 'in', filter.organism);
	if (filter.protein) query = query.where('pe.accession', '=', filter.protein);
	if (filter.centre) query = query.where('ce.accession', '=', filter.centre);
	if (filter.method?.length) query = query.where('r.method', 'in', filter.method);
	if (filter.spin !== undefined) query = query.where('r.spin_s', '=', filter.spin);
	const { n, before } = await query
		.select((eb) => [eb.fn.countAll<number>().as('n'), keyset.rowsBefore().as('before')])
		.executeTakeFirstOrThrow();
	const rows = await query
		.$call((q) => withVisibleSource(q, 'r.source_entry_id', viewer))
		.select([
			'e.accession',
			'r.version',
			'r.oxidation_level',
			'r.spin_s',
			'r.g_values',
			'r.temperature_k',
			'r.method',
			'e.is_demo',
			'ce.accession as centre_accession',
			'c.label as centre_label',
			'c.cofactor_kind',
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
		return listSpinRecords(db, filter, { ...options, cursor: undefined, offset: 0 }, viewer);
	return keyset.page(rows, toSpinRecordDto, Number(n), Number(before));
}
