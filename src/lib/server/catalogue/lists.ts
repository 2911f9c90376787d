import { sql, type Kysely } from 'kysely';
import type { CentreDto, DistanceDto, Page, ProteinDto, SpinRecordDto } from '$lib/catalogue/dto';
import type {
	CentreApiQuery,
	DistanceApiQuery,
	ProteinApiQuery,
	SpinRecordApiQuery
} from '$lib/schemas/catalogueQuery';
import { encodeCursor } from '$lib/schemas/pagination';
import { readJson } from '../db/json';
import type { Database } from '../db/schema';
import { toDistanceDto, toProteinRef, toSpinRecordDto } from './mappers';
import { nullsLast } from './sortOrder';
import { resolveTextQuery } from './textMatch';
import type { ListOptions } from './potentials';
import { entryIsVisible, type Viewer } from './visibility';

/* Read-only lists of proteins, centres, spin records and distances for pages and the API. */

function pageOf<T>(items: T[], total: number, offset: number): Page<T> {
	const next = offset + items.length;
	return { items, total, nextCursor: next < total && items.length > 0 ? encodeCursor(next) : null };
}

export async function listProteins(
	db: Kysely<Database>,
	filter: Pick<ProteinApiQuery, 'q' | 'organism'>,
	options: ListOptions<'accession' | 'name' | 'organism'>,
	viewer: Viewer | null
): Promise<Page<ProteinDto>> {
	const text = await resolveTextQuery(db, filter.q);
	let query = db
		.selectFrom('protein as pr')
		.innerJoin('entry as pe', 'pe.id', 'pr.entry_id')
		.where((eb) => entryIsVisible(eb, 'pe', viewer));
	if (text.kind === 'accession') query = query.where('pe.accession', '=', text.accession);
	if (text.kind === 'centres') {
		const ids = text.ids.length > 0 ? text.ids : [-1];
		// Only centres the reader may see can bring their protein into the answer.
		query = query.where('pr.entry_id', 'in', (eb) =>
			eb
				.selectFrom('centre as tc')
				.innerJoin('entry as tce', 'tce.id', 'tc.entry_id')
				.select('tc.protein_entry_id')
				.where('tc.entry_id', 'in', ids)
				.where((e2) => entryIsVisible(e2, 'tce', viewer))
		);
	}
	if (filter.organism?.length) query = query.where('pr.organism', 'in', filter.organism);
	const { n } = await query
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.executeTakeFirstOrThrow();
	const column = { accession: 'pe.accession', name: 'pr.name', organism: 'pr.organism' }[
		options.sort ?? 'name'
	];
	const rows = await query
		.select((eb) => [
			'pe.accession as protein_accession',
			'pr.name as protein_name',
			'pr.organism',
			'pr.version',
			'pr.uniprot',
			'pr.structure_ids',
			'pe.is_demo',
			eb
				.selectFrom('centre as cc')
				.innerJoin('entry as cce', 'cce.id', 'cc.entry_id')
				.select((e2) => e2.fn.countAll<number>().as('c'))
				.whereRef('cc.protein_entry_id', '=', 'pr.entry_id')
				.where((e2) => entryIsVisible(e2, 'cce', viewer))
				.as('centre_count')
		])
		.orderBy(sql.ref(column), nullsLast(options.order ?? 'asc'))
		.orderBy('pr.entry_id')
		.limit(options.limit)
		.offset(options.offset)
		.execute();
	const items = rows.map((r): ProteinDto => ({
		...toProteinRef(r),
		version: r.version,
		uniprot: r.uniprot,
		structureIds: readJson(r.structure_ids),
		centreCount: Number(r.centre_count ?? 0),
		isDemo: r.is_demo === 1
	}));
	return pageOf(items, Number(n), options.offset);
}

export async function listCentres(
	db: Kysely<Database>,
	filter: Pick<CentreApiQuery, 'q' | 'kind' | 'organism' | 'protein'>,
	options: ListOptions<'accession' | 'protein' | 'label' | 'kind'>,
	viewer: Viewer | null
): Promise<Page<CentreDto>> {
	const text = await resolveTextQuery(db, filter.q);
	let query = db
		.selectFrom('centre as c')
		.innerJoin('entry as ce', 'ce.id', 'c.entry_id')
		.innerJoin('protein as pr', 'pr.entry_id', 'c.protein_entry_id')
		.innerJoin('entry as pe', 'pe.id', 'pr.entry_id')
		.where((eb) => eb.and([entryIsVisible(eb, 'ce', viewer), entryIsVisible(eb, 'pe', viewer)]));
	if (text.kind === 'accession') {
		const a = text.accession;
		query = query.where((eb) => eb.or([eb('ce.accession', '=', a), eb('pe.accession', '=', a)]));
	}
	if (text.kind === 'centres')
		query = query.where('c.entry_id', 'in', text.ids.length > 0 ? text.ids : [-1]);
	if (filter.kind?.length) query = query.where('c.cofactor_kind', 'in', filter.kind);
	if (filter.organism?.length) query = query.where('pr.organism', 'in', filter.organism);
	if (filter.protein) query = query.where('pe.accession', '=', filter.protein);
	const { n } = await query
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.executeTakeFirstOrThrow();
	const columns = {
		accession: ['ce.accession'],
		protein: ['pr.name', 'c.entry_id'],
		label: ['c.label'],
		kind: ['c.cofactor_kind', 'pr.name']
	}[options.sort ?? 'protein'];
	let ordered = query.select([
		'ce.accession',
		'c.version',
		'c.label',
		'c.cofactor_kind',
		'c.ligation',
		'c.chain_id',
		'c.residues',
		'ce.is_demo',
		'pe.accession as protein_accession',
		'pr.name as protein_name',
		'pr.organism'
	]);
	for (const column of columns)
		ordered = ordered.orderBy(sql.ref(column), nullsLast(options.order ?? 'asc'));
	const rows = await ordered
		.orderBy('c.entry_id')
		.limit(options.limit)
		.offset(options.offset)
		.execute();
	const items = rows.map((r): CentreDto => ({
		accession: r.accession,
		version: r.version,
		label: r.label,
		cofactorKind: r.cofactor_kind,
		protein: toProteinRef(r),
		ligation: r.ligation,
		chainId: r.chain_id,
		residues: readJson(r.residues),
		isDemo: r.is_demo === 1
	}));
	return pageOf(items, Number(n), options.offset);
}

export async function listSpinRecords(
	db: Kysely<Database>,
	filter: Pick<SpinRecordApiQuery, 'kind' | 'organism' | 'protein' | 'centre' | 'method' | 'spin'>,
	options: ListOptions<'accession' | 'centre' | 'spin' | 'temperature'>,
	viewer: Viewer | null
): Promise<Page<SpinRecordDto>> {
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
	const { n } = await query
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.executeTakeFirstOrThrow();
	const column = {
		accession: 'e.accession',
		centre: 'c.label',
		spin: 'r.spin_s',
		temperature: 'r.temperature_k'
	}[options.sort ?? 'accession'];
	const rows = await query
		.leftJoin('entry as se', (join) =>
			// A source the reader may not see is left out: its DOI and authors would leak.
			join.onRef('se.id', '=', 'r.source_entry_id').on((eb) => entryIsVisible(eb, 'se', viewer))
		)
		.leftJoin('source as s', 's.entry_id', 'se.id')
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
			'se.accession as source_accession',
			's.doi as source_doi',
			's.year as source_year',
			's.authors as source_authors'
		])
		.orderBy(sql.ref(column), nullsLast(options.order ?? 'asc'))
		.orderBy('r.entry_id')
		.limit(options.limit)
		.offset(options.offset)
		.execute();
	return pageOf(rows.map(toSpinRecordDto), Number(n), options.offset);
}

export async function listDistances(
	db: Kysely<Database>,
	filter: Pick<
		DistanceApiQuery,
		'organism' | 'protein' | 'centre' | 'method' | 'edgeMin' | 'edgeMax'
	>,
	options: ListOptions<'accession' | 'edge' | 'centre'>,
	viewer: Viewer | null
): Promise<Page<DistanceDto>> {
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
	const { n } = await query
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.executeTakeFirstOrThrow();
	const column = { accession: 'e.accession', edge: 'd.edge_to_edge_a', centre: 'a.label' }[
		options.sort ?? 'accession'
	];
	const rows = await query
		.leftJoin('entry as se', (join) =>
			// A source the reader may not see is left out: its DOI and authors would leak.
			join.onRef('se.id', '=', 'd.source_entry_id').on((eb) => entryIsVisible(eb, 'se', viewer))
		)
		.leftJoin('source as s', 's.entry_id', 'se.id')
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
			'se.accession as source_accession',
			's.doi as source_doi',
			's.year as source_year',
			's.authors as source_authors'
		])
		.orderBy(sql.ref(column), nullsLast(options.order ?? 'asc'))
		.orderBy('d.entry_id')
		.limit(options.limit)
		.offset(options.offset)
		.execute();
	return pageOf(rows.map(toDistanceDto), Number(n), options.offset);
}

/** Organisms present in the visible catalogue, for the organism facet. */
export async function listOrganisms(
	db: Kysely<Database>,
	viewer: Viewer | null
): Promise<string[]> {
	const rows = await db
		.selectFrom('protein as pr')
		.innerJoin('entry as pe', 'pe.id', 'pr.entry_id')
		.where((eb) => entryIsVisible(eb, 'pe', viewer))
		.select('pr.organism')
		.distinct()
		.orderBy('pr.organism')
		.execute();
	return rows.map((r) => r.organism);
}
