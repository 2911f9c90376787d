import { sql, type RawBuilder, type SqlBool } from 'kysely';
import type { Page } from '$lib/catalogue/dto';
import {
	encodeCursor,
	type KeyValue,
	type KeysetCursor,
	type PageCursor,
	type RowKey
} from '$lib/schemas/pagination';
import { CursorMismatchError } from './errors';

/*
 * Keyset paging for every catalogue list (see $lib/schemas/pagination.ts for the cursor).
 *
 * A list is ordered by its sort's columns in the chosen direction, missing values last in
 * either direction, then by entry id in the same direction: a total order, so "the rows after
 * (key, id)" is exact. The SQL lists (src/lib/server/kinds) build their WHERE and ORDER BY from
 * `sqlKeyset`; the potentials, paged by the in-memory index, compare keys there
 * (search/potentialIndex.ts) and share the cursor checks and the page shape from here.
 *
 * What a walk guarantees: a row that stays visible and keeps its sort key is returned exactly
 * once, whatever is approved, hidden or renamed meanwhile. A row whose own sort key changes
 * mid-walk (the renamed protein, when sorting by name) is returned where it stands when each
 * page is read — possibly a second time under its new name, or not at all if it moved behind
 * the walk; sort by accession (the id never changes) where that matters.
 */

export interface ListOptions<S extends string> {
	sort?: S;
	order?: 'asc' | 'desc';
	limit: number;
	/** Rows to skip (entry pages' numbered related lists); ignored when `cursor` is given. */
	offset?: number;
	/** A cursor from the client, already decoded ($lib/schemas/pagination.ts). */
	cursor?: PageCursor;
}

/** One column of a sort key: an SQL reference (or a name, for the index) and its type. */
export interface KeyColumn {
	ref: string;
	type: 'text' | 'number';
	nullable?: boolean;
}

/** How a list is ordered: its name (cursors carry it), entry id column, and its sorts. */
export interface ListOrder<S extends string> {
	list: string;
	id: string;
	defaultSort: S;
	sorts: Record<S, KeyColumn[]>;
}

/** Where a page starts: the first page, an offset, or after / before a row's key. */
export type ListPosition =
	| { kind: 'offset'; offset: number }
	| { kind: 'after'; key: RowKey }
	| { kind: 'before'; key: RowKey };

function keyFits(columns: readonly KeyColumn[], key: readonly KeyValue[]): boolean {
	return (
		key.length === columns.length &&
		columns.every((c, i) => {
			const v = key[i];
			if (v === null) return c.nullable === true;
			return c.type === 'text' ? typeof v === 'string' : typeof v === 'number';
		})
	);
}

/**
 * Where the client's cursor puts the page, checked against the list, sort and order of this
 * request: a cursor of another list or order, or whose key does not fit the sort, is a 400
 * naming the `cursor` parameter (not silently the first page, which would restart a walk).
 */
export function positionOf(
	list: string,
	sort: string,
	order: 'asc' | 'desc',
	columns: readonly KeyColumn[],
	options: Pick<ListOptions<string>, 'cursor' | 'offset'>
): ListPosition {
	const cursor = options.cursor;
	if (!cursor) return { kind: 'offset', offset: options.offset ?? 0 };
	if (cursor.kind === 'offset') return cursor;
	if (cursor.list !== list)
		throw new CursorMismatchError(`this cursor belongs to the ${cursor.list} list, not ${list}`);
	if (cursor.sort !== sort || cursor.order !== order)
		throw new CursorMismatchError(
			`this cursor was issued for sort=${cursor.sort}&order=${cursor.order}, not sort=${sort}&order=${order}; keep the parameters of the first page, or start again without a cursor`
		);
	if (!keyFits(columns, cursor.key))
		throw new CursorMismatchError(
			'not a cursor issued by this API; pass nextCursor back unchanged'
		);
	const key = { key: cursor.key, id: cursor.id };
	return cursor.direction === 'next' ? { kind: 'after', key } : { kind: 'before', key };
}

/** The page as the API returns it, with cursors to the rows after and before it. */
export function pageWithCursors<T>(
	meta: { list: string; sort: string; order: 'asc' | 'desc' },
	items: T[],
	keys: { first: RowKey | null; last: RowKey | null },
	total: number,
	offset: number
): Page<T> {
	const cursor = (direction: KeysetCursor['direction'], at: RowKey) =>
		encodeCursor({ ...meta, direction, key: at.key, id: at.id });
	const next =
		keys.last && items.length > 0 && offset + items.length < total
			? cursor('next', keys.last)
			: null;
	const prev = keys.first && items.length > 0 && offset > 0 ? cursor('prev', keys.first) : null;
	return { items, total, offset, nextCursor: next, prevCursor: prev };
}

/** Key columns selected beside a row, read back by `rowKeyOf` (at most three sort columns). */
type KeyRow = { k0: KeyValue; k1: KeyValue; k2: KeyValue; kid: number };

/**
 * The SQL side of one request's paging: WHERE, ORDER BY and the count of rows before the page,
 * for the request's sort, order and cursor. A `before` position reads the rows right before the
 * key in reverse order and turns them round.
 */
export function sqlKeyset<S extends string>(spec: ListOrder<S>, options: ListOptions<S>) {
	const sort = options.sort ?? spec.defaultSort;
	const order = options.order ?? 'asc';
	const columns = spec.sorts[sort];
	if (columns.length > 3) throw new Error(`${spec.list}: a sort key of more than three columns`);
	const position = positionOf(spec.list, sort, order, columns, options);
	const reversed = position.kind === 'before';
	const desc = (order === 'desc') !== reversed;
	// Missing values are last in the list's order, so first when it is read backwards.
	const nullsFirst = reversed;

	/** Rows strictly after `at` in the order read (forward, or backward for `before`). */
	function beyond(at: RowKey): RawBuilder<SqlBool> {
		let tail: RawBuilder<SqlBool> = desc
			? sql<SqlBool>`${sql.ref(spec.id)} < ${at.id}`
			: sql<SqlBool>`${sql.ref(spec.id)} > ${at.id}`;
		for (let i = columns.length - 1; i >= 0; i--) {
			const column = columns[i]!;
			const c = sql.ref(column.ref);
			const v = at.key[i] ?? null;
			if (v === null) {
				tail = nullsFirst
					? sql<SqlBool>`(${c} is not null or (${c} is null and ${tail}))`
					: sql<SqlBool>`(${c} is null and ${tail})`;
				continue;
			}
			const further = desc ? sql<SqlBool>`${c} < ${v}` : sql<SqlBool>`${c} > ${v}`;
			tail =
				column.nullable && !nullsFirst
					? sql<SqlBool>`(${further} or ${c} is null or (${c} = ${v} and ${tail}))`
					: sql<SqlBool>`(${further} or (${c} = ${v} and ${tail}))`;
		}
		return tail;
	}

	return {
		sort,
		order,
		position,
		/** The condition the page's rows meet (true on the first page and for offsets). */
		where(): RawBuilder<SqlBool> {
			return position.kind === 'offset' ? sql<SqlBool>`1` : beyond(position.key);
		},
		/**
		 * Selected beside the total: the matching rows that come before the page's position
		 * (before the cursor, for `before`; not after it, for `after`).
		 */
		rowsBefore(): RawBuilder<number> {
			if (position.kind === 'offset') return sql<number>`0`;
			if (position.kind === 'after')
				return sql<number>`coalesce(sum(case when ${beyond(position.key)} then 0 else 1 end), 0)`;
			return sql<number>`coalesce(sum(case when ${beyond(position.key)} then 1 else 0 end), 0)`;
		},
		/** ORDER BY items, in the direction the rows are read. */
		orderBy(): RawBuilder<unknown> {
			const dir = desc ? sql`desc` : sql`asc`;
			const nulls = nullsFirst ? sql`nulls first` : sql`nulls last`;
			return sql.join([
				...columns.map((c) => sql`${sql.ref(c.ref)} ${dir} ${nulls}`),
				sql`${sql.ref(spec.id)} ${dir}`
			]);
		},
		limit: options.limit,
		offset: position.kind === 'offset' ? position.offset : 0,
		/** The sort key columns and entry id, selected as k0…k2 and kid. */
		keyColumns() {
			const k = (i: number) =>
				columns[i] ? sql<KeyValue>`${sql.ref(columns[i].ref)}` : sql<KeyValue>`null`;
			return [
				k(0).as('k0'),
				k(1).as('k1'),
				k(2).as('k2'),
				sql<number>`${sql.ref(spec.id)}`.as('kid')
			] as const;
		},
		/**
		 * A `before` page shorter than the limit reached the start of the list: the caller then
		 * reads the first page instead, so "previous" always shows a full page.
		 */
		restartsAtFirstPage(rowsRead: number): boolean {
			return position.kind === 'before' && rowsRead < options.limit;
		},
		/** The rows in the list's order, with their keys, the offset of the first, and the page. */
		page<R extends KeyRow, T>(rows: R[], toItem: (row: R) => T, total: number, before: number) {
			const ordered = reversed ? [...rows].reverse() : rows;
			const rowKey = (r: R): RowKey => ({
				key: columns.map((_, i) => [r.k0, r.k1, r.k2][i] ?? null),
				id: r.kid
			});
			const offset =
				position.kind === 'offset'
					? position.offset
					: position.kind === 'after'
						? before
						: Math.max(0, before - ordered.length);
			return pageWithCursors(
				{ list: spec.list, sort, order },
				ordered.map(toItem),
				{
					first: ordered.length > 0 ? rowKey(ordered[0]!) : null,
					last: ordered.length > 0 ? rowKey(ordered.at(-1)!) : null
				},
				total,
				offset
			);
		}
	};
}
