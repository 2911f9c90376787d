import { sql, type Kysely } from 'kysely';
import type { FacetCount } from '$lib/catalogue/dto';
import { coupleKey, coupleMatches, type CoupleKey } from '$lib/catalogue/searchTerms';
import type { PotentialSort } from '$lib/catalogue/searchTable';
import type { PotentialFilter } from '$lib/schemas/catalogueQuery';
import { accessionNumber } from '$lib/schemas/accession';
import type { KeyValue, RowKey } from '$lib/schemas/pagination';
import type { Database } from '../db/schema';
import { bulkWriteInProgress, readCatalogueRevision } from '../db/revision';

/*
 * The potential read model held as columns in memory, for searching: filters, counts, facet
 * counts and every sort order are answered by one pass over typed arrays (about a millisecond
 * for 100 000 rows), and SQLite is then asked only for the rows of the page shown. SQLite stays
 * the source of truth: the columns are rebuilt from the `potential` table whenever the
 * catalogue revision has moved (each approval bumps it), so a search never sees stale rows —
 * except while a large approval runs (`duringBulkWrite`): it moves the revision with every chunk
 * it commits, and a rebuild per search (a second or more of the event loop at 100 000 rows)
 * would then take most of the process's time, so the columns are rebuilt at most once a minute
 * (or every 10 × the last rebuild) and lag that much behind; the next search after it rebuilds.
 * Rows of a page are read from SQLite in any case, with the visibility rule applied again.
 *
 * Semantics match SQL on the same columns: a missing pH or temperature fails any bound on it;
 * sorts put missing values last in either direction; ties follow the accession, in the
 * direction of the sort.
 *
 * Pages are found by keyset (catalogue/keyset.ts): "after (key, id)" is the first place in the
 * query's order where a row's key comes after the cursor's, found by binary search — each order
 * is sorted by its key, so the comparison below must agree with the order exactly. Text keys
 * compare by Unicode code point, which is how SQLite's BINARY collation orders UTF-8 (the text
 * orders come from SQLite); the index keeps the text it sorts by for this: each protein's name
 * and centre's label once, and the couples as codes.
 *
 * Who may see a row is not decided here: callers pass the reader's test
 * (`potentialRowVisibility` in catalogue/visibility.ts, beside its SQL twin), so this folder
 * knows nothing of viewers and never imports the catalogue, which imports it.
 */

/**
 * Whether the reader may see a row, given its denormalised visibility columns: `public_from`
 * as epoch milliseconds (+Infinity while it has none) and `group_id` (null when it has none).
 */
export type RowVisibility = (publicFromMs: number, groupId: number | null) => boolean;

type OrderKey = Exclude<PotentialSort, 'relevance'>;

/** Orders on text columns, computed by SQLite (binary collation) once per rebuild. */
const TEXT_ORDERS = ['protein', 'centre', 'kind', 'couple', 'method'] as const;
const TEXT_ORDER_SQL: Record<(typeof TEXT_ORDERS)[number], string> = {
	protein: 'protein_name, centre_label, couple, entry_id',
	centre: 'centre_label, protein_name, entry_id',
	kind: 'cofactor_kind, protein_name, centre_label, entry_id',
	couple: 'couple, entry_id',
	method: 'method, entry_id'
};

export interface Columns {
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
	/** Text sort keys: names by protein, labels by centre, couples coded per row. */
	proteinNames: Map<number, string>;
	centreLabels: Map<number, string>;
	couple: Int32Array;
	couples: string[];
	/** Each couple's comparable form (`coupleKey`), by code. */
	coupleKeys: (CoupleKey | null)[];
	/** The source entry id of each row, 0 for none. */
	source: Int32Array;
	rowsOfCentre: Map<number, number[]>;
	rowsOfProtein: Map<number, number[]>;
	rowsOfSource: Map<number, number[]>;
	/** Rows by method code and by couple code. */
	rowsOfMethod: number[][];
	rowsOfCouple: number[][];
	orders: Map<OrderKey, { rows: Int32Array; nonNull: number }>;
}

export interface IndexQuery {
	filter: Omit<PotentialFilter, 'q'>;
	/** Exact accession from the text box, if it held one. */
	accession?: number;
	/** Terms of the text, if it was words: every row must match each (and is ranked by them). */
	text?: readonly TextTerm[];
	sort: PotentialSort;
	order: 'asc' | 'desc';
	limit: number;
	/** Where the page starts: rows to skip, or right after / right before a row's key. */
	offset?: number;
	after?: RowKey;
	before?: RowKey;
}

/**
 * One term of a text query and what it reached (search/centreSearch.ts `match`): a row matches
 * the term when its centre, protein, source or method is among these or its couple matches;
 * its score for the term is the sum of those scores.
 */
export interface TextTerm {
	centres?: ReadonlyMap<number, number>;
	proteins?: ReadonlyMap<number, number>;
	/** Sources the reader may see only (the caller filters them). */
	sources?: ReadonlyMap<number, number>;
	/** Method identifiers. */
	methods?: ReadonlyMap<string, number>;
	couple?: CoupleKey;
}

/** The score a couple match adds, on the scale of the text scores. */
const COUPLE_SCORE = 3;

/** Each row's text score (0: no match) and the rows that matched, in no order. */
interface TextScores {
	score: Float64Array;
	rows: number[];
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

/**
 * One potential as the rebuild reads it: entry, centre and protein ids, Em (mV vs SHE), pH,
 * temperature (K), cofactor kind, method, organism, public_from, group_id and couple.
 */
type LoadedRow = [
	number,
	number,
	number,
	number,
	number | null,
	number | null,
	string,
	string,
	string,
	string | null,
	number | null,
	string,
	number | null
];

/**
 * Text in SQLite's BINARY order (UTF-8 bytes, that is Unicode code points): JavaScript's `<`
 * compares UTF-16 units, which puts characters beyond U+FFFF (surrogate pairs) before U+E000–U+FFFF.
 */
export function compareCodePoints(a: string, b: string): number {
	if (a === b) return 0;
	const n = Math.min(a.length, b.length);
	for (let i = 0; i < n; i++) {
		const x = a.charCodeAt(i);
		const y = b.charCodeAt(i);
		if (x === y) continue;
		const xs = x >= 0xd800 && x <= 0xdfff;
		const ys = y >= 0xd800 && y <= 0xdfff;
		if (xs !== ys) return xs ? 1 : -1;
		return x - y;
	}
	return a.length - b.length;
}

/** Two key values in ascending order, missing values (null) last. */
function compareValues(a: KeyValue, b: KeyValue): number {
	if (a === null || b === null) return a === b ? 0 : a === null ? 1 : -1;
	if (typeof a === 'number' && typeof b === 'number') return a - b;
	return compareCodePoints(String(a), String(b));
}

/** Numeric column values in ascending order, missing values (NaN) last, ties by accession. */
function numericOrder(n: number, values: Float64Array | Int32Array, entryId: Int32Array) {
	const rows = new Int32Array(n);
	for (let i = 0; i < n; i++) rows[i] = i;
	rows.sort((a, b) => {
		const x = values[a]!;
		const y = values[b]!;
		const xMissing = Number.isNaN(x);
		if (xMissing !== Number.isNaN(y)) return xMissing ? 1 : -1;
		return (xMissing ? 0 : x - y) || entryId[a]! - entryId[b]!;
	});
	let nonNull = n;
	while (nonNull > 0 && Number.isNaN(values[rows[nonNull - 1]!])) nonNull--;
	return { rows, nonNull };
}

/** Reads the `potential` table into columns; exported for the test that checks them row by row. */
export async function loadColumns(db: Kysely<Database>): Promise<Columns> {
	// One aggregate value instead of 100 000 row objects keeps rebuilds quick. Each potential is
	// one JSON array inside it, so its columns cannot drift apart (separate aggregates per column
	// only line up as long as SQLite feeds them the same sequence, and a separator inside a text
	// value — an organism may hold any character — would shift every later value). JSON also
	// keeps NULLs and every digit of the numbers. The order is explicit: by entry id.
	const { rows } = await sql<{ potentials: string | null }>`select json_group_array(
		json_array(entry_id, centre_entry_id, protein_entry_id, em_mv_she, ph, temperature_k,
			cofactor_kind, method, organism, public_from, group_id, couple, source_entry_id)
		order by entry_id) as potentials
		from potential`.execute(db);
	const loaded = JSON.parse(rows[0]?.potentials ?? '[]') as LoadedRow[];
	const n = loaded.length;
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
		proteinNames: new Map(),
		centreLabels: new Map(),
		couple: new Int32Array(n),
		couples: [],
		coupleKeys: [],
		source: new Int32Array(n),
		rowsOfCentre: new Map(),
		rowsOfProtein: new Map(),
		rowsOfSource: new Map(),
		rowsOfMethod: [],
		rowsOfCouple: [],
		orders: new Map()
	};
	const kindCodes = new Map<string, number>();
	const methodCodes = new Map<string, number>();
	const organismCodes = new Map<string, number>();
	const dates = new Map<string, number>();
	const coupleCodes = new Map<string, number>();
	for (let i = 0; i < n; i++) {
		const [
			entry,
			centre,
			protein,
			em,
			ph,
			t,
			kind,
			method,
			organism,
			publicFrom,
			group,
			couple,
			source
		] = loaded[i]!;
		c.source[i] = source ?? 0;
		c.couple[i] = codeOf(c.couples, coupleCodes, couple);
		c.entryId[i] = entry;
		c.centreId[i] = centre;
		c.proteinId[i] = protein;
		c.em[i] = em;
		c.ph[i] = ph ?? Number.NaN;
		c.temperature[i] = t ?? Number.NaN;
		c.kind[i] = codeOf(c.kinds, kindCodes, kind);
		c.method[i] = codeOf(c.methods, methodCodes, method);
		c.organism[i] = codeOf(c.organisms, organismCodes, organism);
		if (publicFrom === null) {
			c.publicFrom[i] = Number.POSITIVE_INFINITY;
		} else {
			let ms = dates.get(publicFrom);
			if (ms === undefined) dates.set(publicFrom, (ms = Date.parse(publicFrom)));
			c.publicFrom[i] = ms;
		}
		c.group[i] = group ?? 0;
	}
	const rowOfEntry = new Map<number, number>();
	for (let i = 0; i < n; i++) {
		rowOfEntry.set(c.entryId[i]!, i);
		const rowsOfCentre = c.rowsOfCentre.get(c.centreId[i]!);
		if (rowsOfCentre) rowsOfCentre.push(i);
		else c.rowsOfCentre.set(c.centreId[i]!, [i]);
	}
	for (const rowsOfCentre of c.rowsOfCentre.values())
		rowsOfCentre.sort((a, b) => c.entryId[a]! - c.entryId[b]!);
	const push = <K>(map: Map<K, number[]>, key: K, r: number) => {
		const list = map.get(key);
		if (list) list.push(r);
		else map.set(key, [r]);
	};
	c.rowsOfMethod = c.methods.map(() => []);
	c.rowsOfCouple = c.couples.map(() => []);
	for (let i = 0; i < n; i++) {
		push(c.rowsOfProtein, c.proteinId[i]!, i);
		if (c.source[i] !== 0) push(c.rowsOfSource, c.source[i]!, i);
		c.rowsOfMethod[c.method[i]!]!.push(i);
		c.rowsOfCouple[c.couple[i]!]!.push(i);
	}
	c.coupleKeys = c.couples.map((couple) => coupleKey(couple));

	// The names the text orders sort by, as the potential rows carry them (one per protein and
	// centre: refreshPotentialRows keeps every row of one in step).
	const { rows: names } = await sql<{
		protein: number;
		centre: number;
		protein_name: string;
		centre_label: string;
	}>`select protein_entry_id as protein, centre_entry_id as centre, protein_name, centre_label
		from potential group by centre_entry_id`.execute(db);
	for (const r of names) {
		c.proteinNames.set(r.protein, r.protein_name);
		c.centreLabels.set(r.centre, r.centre_label);
	}

	c.orders.set('accession', numericOrder(n, c.entryId, c.entryId));
	c.orders.set('em', numericOrder(n, c.em, c.entryId));
	c.orders.set('ph', numericOrder(n, c.ph, c.entryId));
	c.orders.set('temperature', numericOrder(n, c.temperature, c.entryId));
	for (const key of TEXT_ORDERS) {
		// TEXT_ORDER_SQL holds constants only; nothing from a request reaches this statement.
		// Each order has an index (migration 0001), so SQLite reads it without sorting.
		const { rows: ids } = await sql<{
			entry_id: number;
		}>`select entry_id from potential order by ${sql.raw(TEXT_ORDER_SQL[key])}`.execute(db);
		const orderRows = new Int32Array(n);
		ids.forEach((r, i) => (orderRows[i] = rowOfEntry.get(r.entry_id) ?? 0));
		c.orders.set(key, { rows: orderRows, nonNull: n });
	}
	return c;
}

export interface IndexResult {
	total: number;
	/** Entry ids of the requested page, in display order. */
	page: number[];
	/** Matching rows before the page's first row. */
	offset: number;
	/** Sort keys of the page's first and last rows (for the cursors), null when it is empty. */
	first: RowKey | null;
	last: RowKey | null;
}

/** The rows of one query's order, by position (without materialising sorted orders). */
interface Sequence {
	length: number;
	at: (position: number) => number;
}

/** While a bulk write runs, rebuilds are this far apart at least (and 10 × a rebuild's time). */
const BULK_REBUILD_INTERVAL_MS = 60_000;

export class PotentialIndex {
	private columns: Columns | null = null;
	private revision = -1;
	private refreshing: Promise<void> | null = null;
	private builtAt = 0;
	private buildMs = 0;

	/** @param now a clock in milliseconds (tests pass their own). */
	constructor(private readonly now: () => number = () => performance.now()) {}

	/** Rebuilds the columns when the catalogue revision has moved since the last build. */
	async ensureCurrent(db: Kysely<Database>): Promise<void> {
		while (this.refreshing) await this.refreshing;
		const revision = await readCatalogueRevision(db);
		if (revision === this.revision && this.columns) return;
		if (
			this.columns &&
			bulkWriteInProgress() &&
			this.now() - this.builtAt < Math.max(BULK_REBUILD_INTERVAL_MS, 10 * this.buildMs)
		) {
			return;
		}
		const started = this.now();
		this.refreshing = loadColumns(db)
			.then((columns) => {
				this.columns = columns;
				this.revision = revision;
				this.builtAt = this.now();
				this.buildMs = this.builtAt - started;
			})
			.finally(() => {
				this.refreshing = null;
			});
		await this.refreshing;
	}

	/** The catalogue revision the columns were built at (-1 before the first build). */
	get builtRevision(): number {
		return this.revision;
	}

	private get data(): Columns {
		if (!this.columns) throw new Error('PotentialIndex used before ensureCurrent()');
		return this.columns;
	}

	/**
	 * Tests of one row: against the reader's visibility, the text and every filter but the three
	 * facets (`rest`), and against each facet's filter. A row matches when it passes all four.
	 */
	private tests(
		query: Pick<IndexQuery, 'filter' | 'accession'>,
		visible: RowVisibility,
		text: TextScores | null
	) {
		const c = this.data;
		const f = query.filter;
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
		const score = text?.score ?? null;
		return {
			rest: (r: number) =>
				(score === null || score[r]! > 0) &&
				visible(c.publicFrom[r]!, c.group[r] === 0 ? null : c.group[r]!) &&
				(protein === null || c.proteinId[r] === protein) &&
				(centre === null || c.centreId[r] === centre) &&
				(accession === null ||
					c.entryId[r] === accession ||
					c.centreId[r] === accession ||
					c.proteinId[r] === accession) &&
				(!hasEm || within(c.em[r]!, f.emMin, f.emMax)) &&
				(!hasPh || (!Number.isNaN(c.ph[r]) && within(c.ph[r]!, f.phMin, f.phMax))) &&
				(!hasT || (!Number.isNaN(c.temperature[r]) && within(c.temperature[r]!, f.tMin, f.tMax))),
			kind: (r: number) => kinds === null || kinds.has(c.kind[r]!),
			method: (r: number) => methods === null || methods.has(c.method[r]!),
			organism: (r: number) => organisms === null || organisms.has(c.organism[r]!)
		};
	}

	/** A test of one row against the reader's visibility, the text and every filter. */
	private predicate(
		query: Pick<IndexQuery, 'filter' | 'accession'>,
		visible: RowVisibility,
		text: TextScores | null
	): (r: number) => boolean {
		const t = this.tests(query, visible, text);
		return (r) => t.rest(r) && t.kind(r) && t.method(r) && t.organism(r);
	}

	/**
	 * Each row's score for the text: the sum over terms of what the row matched, 0 when a term
	 * matched nothing of it. Candidates come from the term that reaches the fewest rows (all rows
	 * when even that one reaches more than half).
	 */
	private textScores(terms: readonly TextTerm[]): TextScores {
		const c = this.data;
		const prepared = terms.map((t) => {
			const methodScore = new Float64Array(c.methods.length);
			c.methods.forEach((m, code) => (methodScore[code] = t.methods?.get(m) ?? 0));
			const coupleScore = new Float64Array(c.couples.length);
			if (t.couple) {
				const wanted = t.couple;
				c.coupleKeys.forEach((k, code) => {
					if (k && coupleMatches(wanted, k)) coupleScore[code] = COUPLE_SCORE;
				});
			}
			const lists: (readonly number[])[] = [];
			for (const id of t.centres?.keys() ?? []) lists.push(c.rowsOfCentre.get(id) ?? []);
			for (const id of t.proteins?.keys() ?? []) lists.push(c.rowsOfProtein.get(id) ?? []);
			for (const id of t.sources?.keys() ?? []) lists.push(c.rowsOfSource.get(id) ?? []);
			methodScore.forEach((v, code) => v > 0 && lists.push(c.rowsOfMethod[code]!));
			coupleScore.forEach((v, code) => v > 0 && lists.push(c.rowsOfCouple[code]!));
			const reach = lists.reduce((sum, l) => sum + l.length, 0);
			return { t, methodScore, coupleScore, lists, reach };
		});
		const score = new Float64Array(c.n);
		const rows: number[] = [];
		const rowScore = (r: number) => {
			let total = 0;
			for (const { t, methodScore, coupleScore } of prepared) {
				const source = c.source[r]!;
				const s =
					(t.centres?.get(c.centreId[r]!) ?? 0) +
					(t.proteins?.get(c.proteinId[r]!) ?? 0) +
					(source !== 0 ? (t.sources?.get(source) ?? 0) : 0) +
					methodScore[c.method[r]!]! +
					coupleScore[c.couple[r]!]!;
				if (!(s > 0)) return 0;
				total += s;
			}
			return total;
		};
		if (prepared.length === 0) return { score, rows };
		const seed = prepared.reduce((best, p) => (p.reach < best.reach ? p : best));
		const consider = (r: number) => {
			if (score[r] !== 0) return;
			const s = rowScore(r);
			if (s > 0) {
				score[r] = s;
				rows.push(r);
			}
		};
		if (seed.reach > c.n / 2) for (let r = 0; r < c.n; r++) consider(r);
		else for (const list of seed.lists) for (const r of list) consider(r);
		return { score, rows };
	}

	/** The query's order as positions: a sorted order read forwards or backwards, or the ranking. */
	private sequence(
		query: IndexQuery,
		text: TextScores | null,
		test: (r: number) => boolean
	): Sequence {
		const c = this.data;
		if (query.sort === 'relevance' && text) {
			// Best score first, ties by centre, then by accession; desc reverses it all.
			const score = text.score;
			const rows = text.rows
				.filter(test)
				.sort(
					(a, b) =>
						score[b]! - score[a]! ||
						c.centreId[a]! - c.centreId[b]! ||
						c.entryId[a]! - c.entryId[b]!
				);
			if (query.order === 'desc') rows.reverse();
			return { length: rows.length, at: (i) => rows[i]! };
		}
		const key: OrderKey = query.sort === 'relevance' ? 'protein' : query.sort;
		const { rows, nonNull } = c.orders.get(key) ?? { rows: new Int32Array(0), nonNull: 0 };
		const n = rows.length;
		if (query.order === 'asc') return { length: n, at: (i) => rows[i]! };
		// Descending: known values from the top, then the missing ones, ties by accession descending.
		return {
			length: n,
			at: (i) => (i < nonNull ? rows[nonNull - 1 - i]! : rows[n - 1 - (i - nonNull)]!)
		};
	}

	/** A row's sort key in the query's sort (see catalogue/potentials.ts for the shapes). */
	private keyOf(sort: PotentialSort, r: number, text: TextScores | null): RowKey {
		const c = this.data;
		const id = c.entryId[r]!;
		const orNull = (v: number) => (Number.isNaN(v) ? null : v);
		const kind = () => c.kinds[c.kind[r]!]!;
		const protein = () => c.proteinNames.get(c.proteinId[r]!) ?? '';
		const centre = () => c.centreLabels.get(c.centreId[r]!) ?? '';
		const couple = () => c.couples[c.couple[r]!]!;
		switch (sort === 'relevance' && !text ? 'protein' : sort) {
			case 'accession':
				return { key: [], id };
			case 'em':
				return { key: [c.em[r]!], id };
			case 'ph':
				return { key: [orNull(c.ph[r]!)], id };
			case 'temperature':
				return { key: [orNull(c.temperature[r]!)], id };
			case 'protein':
				return { key: [protein(), centre(), couple()], id };
			case 'centre':
				return { key: [centre(), protein()], id };
			case 'kind':
				return { key: [kind(), protein(), centre()], id };
			case 'couple':
				return { key: [couple()], id };
			case 'method':
				return { key: [c.methods[c.method[r]!]!], id };
			case 'relevance':
				return { key: [text?.score[r] ?? 0, c.centreId[r]!], id };
		}
	}

	/**
	 * Where a row stands against a key in the query's order: negative before it, 0 the same row,
	 * positive after it. Agrees with `sequence`: values ascending (the score descending for
	 * relevance), missing values last, then the accession; desc turns every part round but
	 * keeps missing values last.
	 */
	private compareToKey(query: IndexQuery, text: TextScores | null, r: number, at: RowKey): number {
		const sign = query.order === 'desc' ? -1 : 1;
		const own = this.keyOf(query.sort, r, text);
		const relevance = query.sort === 'relevance' && text !== null;
		for (let i = 0; i < own.key.length; i++) {
			const a = own.key[i] ?? null;
			const b = at.key[i] ?? null;
			if (a === null || b === null) {
				if (a !== b) return a === null ? 1 : -1;
				continue;
			}
			const d = compareValues(a, b) * (relevance && i === 0 ? -1 : 1);
			if (d !== 0) return d * sign;
		}
		return (own.id - at.id) * sign;
	}

	/** Total matches and the entry ids of one page. Call ensureCurrent() first. */
	query(query: IndexQuery, visible: RowVisibility): IndexResult {
		const c = this.data;
		const text = query.text ? this.textScores(query.text) : null;
		const test = this.predicate(query, visible, text);
		const seq = this.sequence(query, text, test);
		/** The first position whose row is past the key (or, `orSame`, at it). */
		const boundary = (at: RowKey, orSame: boolean) => {
			let lo = 0;
			let hi = seq.length;
			while (lo < hi) {
				const mid = (lo + hi) >>> 1;
				const d = this.compareToKey(query, text, seq.at(mid), at);
				if (d > 0 || (orSame && d === 0)) hi = mid;
				else lo = mid + 1;
			}
			return lo;
		};
		const limit = query.limit;
		let total = 0;
		let before = 0;
		let page: number[] = [];
		if (query.after) {
			// Matches ahead of the key are counted; the page is the first `limit` past it.
			const start = boundary(query.after, false);
			for (let i = 0; i < start; i++) if (test(seq.at(i))) before++;
			total = before;
			for (let i = start; i < seq.length; i++) {
				const r = seq.at(i);
				if (!test(r)) continue;
				total++;
				if (page.length < limit) page.push(r);
			}
		} else if (query.before) {
			// The last `limit` matches ahead of the key; if fewer than a page remain, the first page
			// instead (see sqlKeyset's restartsAtFirstPage).
			const start = boundary(query.before, true);
			for (let i = 0; i < start; i++) {
				const r = seq.at(i);
				if (!test(r)) continue;
				before++;
				page.push(r);
				if (page.length > 2 * limit) page = page.slice(-limit);
			}
			page = page.slice(-limit);
			total = before;
			for (let i = start; i < seq.length; i++) {
				const r = seq.at(i);
				if (!test(r)) continue;
				total++;
				if (page.length < limit) page.push(r);
			}
			// `page` is now at least the rows before the key; a short one becomes the first page.
			if (before < limit) before = 0;
			else {
				page = page.slice(0, limit);
				before -= limit;
			}
		} else {
			const offset = query.offset ?? 0;
			for (let i = 0; i < seq.length; i++) {
				const r = seq.at(i);
				if (!test(r)) continue;
				if (total >= offset && page.length < limit) page.push(r);
				total++;
			}
			before = Math.min(offset, total);
		}
		return {
			total,
			offset: before,
			page: page.map((r) => c.entryId[r]!),
			first: page.length > 0 ? this.keyOf(query.sort, page[0]!, text) : null,
			last: page.length > 0 ? this.keyOf(query.sort, page.at(-1)!, text) : null
		};
	}

	/**
	 * Counts per cofactor kind, organism and method among the rows the query matches, most
	 * first: what ticking one more choice would give. Each facet's counts apply every filter but
	 * that facet's own (choices within one facet are alternatives), so a chosen kind's siblings
	 * keep their counts; `total` applies them all. Only rows the reader may see are counted, and
	 * only values with a count are listed.
	 */
	facets(
		query: Pick<IndexQuery, 'filter' | 'accession' | 'text'>,
		visible: RowVisibility
	): {
		kinds: FacetCount[];
		organisms: FacetCount[];
		methods: FacetCount[];
		total: number;
	} {
		const c = this.data;
		const text = query.text ? this.textScores(query.text) : null;
		const t = this.tests(query, visible, text);
		const kinds = new Array<number>(c.kinds.length).fill(0);
		const methods = new Array<number>(c.methods.length).fill(0);
		const organisms = new Array<number>(c.organisms.length).fill(0);
		let total = 0;
		const count = (r: number) => {
			if (!t.rest(r)) return;
			const k = t.kind(r);
			const m = t.method(r);
			const o = t.organism(r);
			if (m && o) kinds[c.kind[r]!]!++;
			if (k && o) methods[c.method[r]!]!++;
			if (k && m) organisms[c.organism[r]!]!++;
			if (k && m && o) total++;
		};
		if (text) for (const r of text.rows) count(r);
		else for (let r = 0; r < c.n; r++) count(r);
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

/** One per server process; it holds catalogue data only, filtered per reader at query time. */
export const potentialIndex = new PotentialIndex();
