import { sql, type Kysely } from 'kysely';
import type { FacetCount } from '$lib/catalogue/dto';
import type { PotentialFilter, PotentialSort } from '$lib/schemas/catalogueQuery';
import { accessionNumber } from '$lib/schemas/accession';
import type { Database } from '../db/schema';
import { readCatalogueRevision } from '../catalogue/revision';
import type { Viewer } from '../catalogue/visibility';

/**
 * The potential read model held as columns in memory, for searching: filters, counts, facet
 * counts and every sort order are answered by one pass over typed arrays (about a millisecond
 * for 100 000 rows), and SQLite is then asked only for the rows of the page shown. SQLite stays
 * the source of truth: the columns are rebuilt from the `potential` table whenever the
 * catalogue revision has moved (each approval bumps it), so a search never sees stale rows.
 *
 * Semantics match SQL on the same columns: a missing pH or temperature fails any bound on it;
 * sorts put missing values last in either direction; ties follow the accession, in the
 * direction of the sort.
 */

type OrderKey = Exclude<PotentialSort, 'relevance'>;

/** SQL ORDER BY of each sort; SQLite computes the orderings once per rebuild. */
const ORDER_SQL: Record<OrderKey, string> = {
	accession: 'entry_id',
	protein: 'protein_name, centre_label, couple, entry_id',
	centre: 'centre_label, protein_name, entry_id',
	kind: 'cofactor_kind, protein_name, centre_label, entry_id',
	couple: 'couple, entry_id',
	em: 'em_mv_she, entry_id',
	ph: 'ph is null, ph, entry_id',
	temperature: 'temperature_k is null, temperature_k, entry_id',
	method: 'method, entry_id'
};

interface Columns {
	n: number;
	entryId: Int32Array;
	centreId: Int32Array;
	proteinId: Int32Array;
	em: Float64Array;
	ph: Float64Array;
	temperature: Float64Array;
	kind: Int32Array;
	method: Int32Array;
	organism: Int32Array;
	publicFrom: Float64Array;
	group: Int32Array;
	kinds: string[];
	methods: string[];
	organisms: string[];
	rowsOfCentre: Map<number, number[]>;
	orders: Map<OrderKey, { rows: Int32Array; nonNull: number }>;
}

export interface IndexQuery {
	filter: Omit<PotentialFilter, 'q'>;
	/** Exact accession from the text box, if it held one. */
	accession?: number;
	/** Centres found by text, best first, if the text was words. */
	rankedCentres?: number[];
	sort: PotentialSort;
	order: 'asc' | 'desc';
	offset: number;
	limit: number;
}

function codeOf(values: string[], codes: Map<string, number>, value: string): number {
	let code = codes.get(value);
	if (code === undefined) {
		code = values.length;
		values.push(value);
		codes.set(value, code);
	}
	return code;
}

async function loadColumns(db: Kysely<Database>): Promise<Columns> {
	const rows = await db
		.selectFrom('potential')
		.select([
			'entry_id',
			'centre_entry_id',
			'protein_entry_id',
			'em_mv_she',
			'ph',
			'temperature_k',
			'cofactor_kind',
			'method',
			'organism',
			'public_from',
			'group_id'
		])
		.orderBy('entry_id')
		.execute();
	const n = rows.length;
	const c: Columns = {
		n,
		entryId: new Int32Array(n),
		centreId: new Int32Array(n),
		proteinId: new Int32Array(n),
		em: new Float64Array(n),
		ph: new Float64Array(n),
		temperature: new Float64Array(n),
		kind: new Int32Array(n),
		method: new Int32Array(n),
		organism: new Int32Array(n),
		publicFrom: new Float64Array(n),
		group: new Int32Array(n),
		kinds: [],
		methods: [],
		organisms: [],
		rowsOfCentre: new Map(),
		orders: new Map()
	};
	const codes = {
		kind: new Map<string, number>(),
		method: new Map<string, number>(),
		organism: new Map<string, number>()
	};
	const rowOfEntry = new Map<number, number>();
	rows.forEach((r, i) => {
		c.entryId[i] = r.entry_id;
		c.centreId[i] = r.centre_entry_id;
		c.proteinId[i] = r.protein_entry_id;
		c.em[i] = r.em_mv_she;
		c.ph[i] = r.ph ?? Number.NaN;
		c.temperature[i] = r.temperature_k ?? Number.NaN;
		c.kind[i] = codeOf(c.kinds, codes.kind, r.cofactor_kind);
		c.method[i] = codeOf(c.methods, codes.method, r.method);
		c.organism[i] = codeOf(c.organisms, codes.organism, r.organism);
		c.publicFrom[i] = r.public_from === null ? Number.POSITIVE_INFINITY : Date.parse(r.public_from);
		c.group[i] = r.group_id ?? 0;
		rowOfEntry.set(r.entry_id, i);
		const list = c.rowsOfCentre.get(r.centre_entry_id);
		if (list) list.push(i);
		else c.rowsOfCentre.set(r.centre_entry_id, [i]);
	});
	for (const key of Object.keys(ORDER_SQL) as OrderKey[]) {
		// ORDER_SQL holds constants only; nothing from a request reaches this statement.
		const { rows: ordered } = await sql<{
			entry_id: number;
		}>`select entry_id from potential order by ${sql.raw(ORDER_SQL[key])}`.execute(db);
		const orderRows = new Int32Array(n);
		ordered.forEach((r, i) => (orderRows[i] = rowOfEntry.get(r.entry_id) ?? 0));
		const column = key === 'ph' ? c.ph : key === 'temperature' ? c.temperature : null;
		let nonNull = n;
		if (column)
			while (nonNull > 0 && Number.isNaN(column[orderRows[nonNull - 1] as number])) nonNull--;
		c.orders.set(key, { rows: orderRows, nonNull });
	}
	return c;
}

export interface IndexResult {
	total: number;
	/** Entry ids of the requested page, in display order. */
	page: number[];
}

export class PotentialIndex {
	private columns: Columns | null = null;
	private revision = -1;
	private refreshing: Promise<void> | null = null;

	/** Rebuilds the columns when the catalogue revision has moved since the last build. */
	async ensureCurrent(db: Kysely<Database>): Promise<void> {
		while (this.refreshing) await this.refreshing;
		const revision = await readCatalogueRevision(db);
		if (revision === this.revision && this.columns) return;
		this.refreshing = loadColumns(db)
			.then((columns) => {
				this.columns = columns;
				this.revision = revision;
			})
			.finally(() => {
				this.refreshing = null;
			});
		await this.refreshing;
	}

	private get data(): Columns {
		if (!this.columns) throw new Error('PotentialIndex used before ensureCurrent()');
		return this.columns;
	}

	/** A test of one row against the viewer's visibility and every filter. */
	private predicate(
		query: Pick<IndexQuery, 'filter' | 'accession'>,
		viewer: Viewer | null
	): (r: number) => boolean {
		const c = this.data;
		const f = query.filter;
		const now = Date.now();
		const groups = new Set(viewer?.groupIds ?? []);
		const codes = (values: string[], wanted: readonly string[] | undefined) =>
			wanted?.length ? new Set(wanted.map((w) => values.indexOf(w))) : null;
		const kinds = codes(c.kinds, f.kind);
		const methods = codes(c.methods, f.method);
		const organisms = codes(c.organisms, f.organism);
		const protein = f.protein ? accessionNumber(f.protein) : null;
		const centre = f.centre ? accessionNumber(f.centre) : null;
		const accession = query.accession ?? null;
		const within = (v: number, min: number | undefined, max: number | undefined) =>
			(min === undefined || v >= min) && (max === undefined || v <= max);
		const hasEm = f.emMin !== undefined || f.emMax !== undefined;
		const hasPh = f.phMin !== undefined || f.phMax !== undefined;
		const hasT = f.tMin !== undefined || f.tMax !== undefined;
		return (r) =>
			(c.publicFrom[r]! <= now || (c.group[r] !== 0 && groups.has(c.group[r]!))) &&
			(kinds === null || kinds.has(c.kind[r]!)) &&
			(methods === null || methods.has(c.method[r]!)) &&
			(organisms === null || organisms.has(c.organism[r]!)) &&
			(protein === null || c.proteinId[r] === protein) &&
			(centre === null || c.centreId[r] === centre) &&
			(accession === null ||
				c.entryId[r] === accession ||
				c.centreId[r] === accession ||
				c.proteinId[r] === accession) &&
			(!hasEm || within(c.em[r]!, f.emMin, f.emMax)) &&
			(!hasPh || (!Number.isNaN(c.ph[r]) && within(c.ph[r]!, f.phMin, f.phMax))) &&
			(!hasT || (!Number.isNaN(c.temperature[r]) && within(c.temperature[r]!, f.tMin, f.tMax)));
	}

	/** Total matches and the entry ids of one page. Call ensureCurrent() first. */
	query(query: IndexQuery, viewer: Viewer | null): IndexResult {
		const c = this.data;
		const test = this.predicate(query, viewer);
		const page: number[] = [];
		let total = 0;
		const take = (r: number) => {
			if (!test(r)) return;
			if (total >= query.offset && page.length < query.limit) page.push(c.entryId[r]!);
			total++;
		};
		if (query.sort === 'relevance' && query.rankedCentres) {
			const ranked =
				query.order === 'desc' ? [...query.rankedCentres].reverse() : query.rankedCentres;
			for (const centre of ranked) for (const r of c.rowsOfCentre.get(centre) ?? []) take(r);
		} else {
			const key: OrderKey = query.sort === 'relevance' ? 'protein' : query.sort;
			const { rows, nonNull } = c.orders.get(key) ?? { rows: new Int32Array(0), nonNull: 0 };
			if (query.order === 'asc') {
				for (let i = 0; i < rows.length; i++) take(rows[i]!);
			} else {
				// Descending: known values from the top, then the missing ones, ties by accession descending.
				for (let i = nonNull - 1; i >= 0; i--) take(rows[i]!);
				for (let i = rows.length - 1; i >= nonNull; i--) take(rows[i]!);
			}
		}
		return { total, page };
	}

	/** Visible potentials per cofactor kind, organism and method, most first. */
	facets(viewer: Viewer | null): {
		kinds: FacetCount[];
		organisms: FacetCount[];
		methods: FacetCount[];
		total: number;
	} {
		const c = this.data;
		const test = this.predicate({ filter: {} }, viewer);
		const kinds = new Array<number>(c.kinds.length).fill(0);
		const methods = new Array<number>(c.methods.length).fill(0);
		const organisms = new Array<number>(c.organisms.length).fill(0);
		let total = 0;
		for (let r = 0; r < c.n; r++) {
			if (!test(r)) continue;
			total++;
			kinds[c.kind[r]!]!++;
			methods[c.method[r]!]!++;
			organisms[c.organism[r]!]!++;
		}
		const counts = (values: string[], n: number[]) =>
			values
				.map((value, i) => ({ value, count: n[i] ?? 0 }))
				.filter((f) => f.count > 0)
				.sort((a, b) => b.count - a.count || a.value.localeCompare(b.value));
		return {
			kinds: counts(c.kinds, kinds),
			organisms: counts(c.organisms, organisms),
			methods: counts(c.methods, methods),
			total
		};
	}
}

/** One per server process; it holds catalogue data only, filtered per viewer at query time. */
export const potentialIndex = new PotentialIndex();
