import type { Kysely } from 'kysely';
import type { CentreDto, Page } from '$lib/catalogue/dto';
import type { CENTRE_SORTS, CentreApiQuery } from '$lib/schemas/catalogueQuery';

import { readJson } from '../db/json';
import type { Database } from '../db/schema';
import { toProteinRef } from '../catalogue/mappers';
import { sqlKeyset, type ListOptions, type ListOrder } from '../catalogue/keyset';
import { resolveTextQuery } from '../catalogue/textMatch';
import { entryIsVisible, type Viewer } from '../catalogue/visibility';
import { COFACTOR_KIND_LABELS } from '$lib/schemas/vocabulary';
import { refreshPotentialRows } from '../catalogue/potentialRows';
import { centreLabelKey } from '../uploads/lookups';
import { firstInFile, resolveCentreProtein } from '../uploads/rows';
import { upsertReadModel, type KindOnServer } from './kind';
import type { CofactorKind } from '$lib/schemas/vocabulary';
import type { JsonColumn } from '../db/json';

type CentreSort = (typeof CENTRE_SORTS)[number];

/** The kind's read-model table (see KindTables in db/schema.ts). */
export interface CentreTable {
	entry_id: number;
	version: number;
	protein_entry_id: number;
	label: string;
	cofactor_kind: CofactorKind;
	ligation: string | null;
	chain_id: string | null;
	/** JSON array of residue numbers. */
	residues: JsonColumn<number[]>;
	revision: number;
}

declare module '../db/schema' {
	interface KindTables {
		centre: CentreTable;
	}
}

export const centre: KindOnServer<'centre'> = {
	async project(trx, { entryId, version, revision, data: d, refs }) {
		await upsertReadModel(trx, 'centre', entryId, {
			version,
			protein_entry_id: refs.proteinAccession as number,
			label: d.label,
			cofactor_kind: d.cofactorKind,
			ligation: d.ligation,
			chain_id: d.chainId,
			residues: JSON.stringify(d.residues),
			revision
		});
		await refreshPotentialRows(trx, { column: 'centre_entry_id', entryId });
	},
	async dependsOn(db, entryId) {
		const c = await db
			.selectFrom('centre')
			.select('protein_entry_id')
			.where('entry_id', '=', entryId)
			.executeTakeFirst();
		return c ? [{ id: c.protein_entry_id, kind: 'protein' }] : [];
	},
	title(d, refs) {
		const kindLabel = COFACTOR_KIND_LABELS[d.cofactorKind];
		return refs.proteinAccession
			? `${d.label} (${kindLabel}) · ${refs.proteinAccession.name}`
			: `${d.label} (${kindLabel})`;
	},
	potentialRowsColumn: 'centre_entry_id',
	upload: {
		resolve: (r) => resolveCentreProtein(r.state, r.values, r.texts, r.fail),
		check(r, d, resolved) {
			const proteinKey = resolved.newProtein?.key ?? String(resolved.proteinEntryId);
			if (!firstInFile(r, `${proteinKey}|${d.label.toLowerCase()}`, 'label')) return false;
			if (resolved.proteinEntryId !== null) {
				const existing = r.state.lookups.centresByProteinLabel.get(
					centreLabelKey(resolved.proteinEntryId, d.label)
				);
				if (existing)
					r.warn(
						'duplicate',
						'label',
						d.label,
						`already in the registry as ${existing.accession}`,
						{ accession: existing.accession }
					);
			}
			if (resolved.newProtein) {
				// The protein is created by the first valid row that names it.
				const p = r.state.newProteins.get(resolved.newProtein.key);
				if (p && p.row === 0) p.row = r.row;
			}
			return true;
		}
	}
};

/** How the centre list is ordered, by each of its sorts (keyset paging: catalogue/keyset.ts). */
export const CENTRE_ORDER: ListOrder<CentreSort> = {
	list: 'centres',
	id: 'c.entry_id',
	defaultSort: 'protein',
	sorts: {
		accession: [{ ref: 'ce.accession', type: 'text' }],
		protein: [{ ref: 'pr.name', type: 'text' }],
		label: [{ ref: 'c.label', type: 'text' }],
		kind: [
			{ ref: 'c.cofactor_kind', type: 'text' },
			{ ref: 'pr.name', type: 'text' }
		]
	}
};

/** The centres a reader may see, filtered, sorted and paged, for pages and the API. */
export async function listCentres(
	db: Kysely<Database>,
	filter: Pick<CentreApiQuery, 'q' | 'kind' | 'organism' | 'protein'>,
	options: ListOptions<CentreSort>,
	viewer: Viewer | null
): Promise<Page<CentreDto>> {
	const keyset = sqlKeyset(CENTRE_ORDER, options);
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
	const { n, before } = await query
		.select((eb) => [eb.fn.countAll<number>().as('n'), keyset.rowsBefore().as('before')])
		.executeTakeFirstOrThrow();
	const rows = await query
		.select([
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
			'pr.organism',
			...keyset.keyColumns()
		])
		.where(keyset.where())
		.orderBy(keyset.orderBy())
		.limit(keyset.limit)
		.offset(keyset.offset)
		.execute();
	if (keyset.restartsAtFirstPage(rows.length))
		return listCentres(db, filter, { ...options, cursor: undefined, offset: 0 }, viewer);
	const toItem = (r: (typeof rows)[number]): CentreDto => ({
		accession: r.accession,
		version: r.version,
		label: r.label,
		cofactorKind: r.cofactor_kind,
		protein: toProteinRef(r),
		ligation: r.ligation,
		chainId: r.chain_id,
		residues: readJson(r.residues),
		isDemo: r.is_demo === 1
	});
	return keyset.page(rows, toItem, Number(n), Number(before));
}
