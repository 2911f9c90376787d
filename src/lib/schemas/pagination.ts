import { z } from 'zod';

/*
 * Opaque page cursors for the API and the search page. Clients pass back what they were given
 * and never build one.
 *
 * A cursor is a keyset position: the sort key and the entry id of the row it follows (the next
 * page) or precedes (the previous page), with the list, sort and order it was issued for. A page
 * read from it starts right after (or ends right before) that key in the list's order as it is
 * *now*, so rows approved, hidden or renamed elsewhere in the list between two requests never
 * shift the rows of later pages: nothing is repeated, nothing skipped. (Offsets did shift: one
 * approval before the cursor repeated a row, one hiding skipped one.)
 *
 * Cursors of the older form, an offset (`o:<n>`), are still read — a walk that began before
 * keyset cursors were issued goes on from the same offset — and the page they return carries
 * keyset cursors. They are never issued any more.
 */

/** One value of a sort key: text, a number, or null (a missing value, sorted last). */
export type KeyValue = string | number | null;

/** A row's place in its list's order: its sort key (the sort's columns) and its entry id. */
export interface RowKey {
	key: KeyValue[];
	id: number;
}

export interface KeysetCursor extends RowKey {
	kind: 'keyset';
	/** The list it belongs to (`potentials`, `proteins`, …). */
	list: string;
	sort: string;
	order: 'asc' | 'desc';
	/** `next`: rows after the key; `prev`: the rows right before it. */
	direction: 'next' | 'prev';
}

export interface OffsetCursor {
	kind: 'offset';
	offset: number;
}

export type PageCursor = KeysetCursor | OffsetCursor;

/** Longest cursor accepted: keys hold names (at most a few hundred characters each). */
export const MAX_CURSOR_LENGTH = 4096;
export const MAX_OFFSET = 10_000_000;

function toBase64Url(text: string): string {
	const bytes = new TextEncoder().encode(text);
	let binary = '';
	for (const b of bytes) binary += String.fromCharCode(b);
	return btoa(binary).replaceAll('+', '-').replaceAll('/', '_').replace(/=+$/, '');
}

function fromBase64Url(text: string): string | null {
	if (!/^[A-Za-z0-9_-]*$/.test(text)) return null;
	try {
		const binary = atob(text.replaceAll('-', '+').replaceAll('_', '/'));
		const bytes = Uint8Array.from(binary, (c) => c.charCodeAt(0));
		return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
	} catch {
		return null;
	}
}

const keyValue = z.union([z.string().max(1000), z.number().refine(Number.isFinite), z.null()]);
/** The JSON inside a keyset cursor: list, sort, order, direction (n/p), key, id. */
const keysetJson = z.tuple([
	z.string().max(40),
	z.string().max(40),
	z.enum(['asc', 'desc']),
	z.enum(['n', 'p']),
	z.array(keyValue).max(4),
	z.number().int().positive()
]);

export function encodeCursor(cursor: Omit<KeysetCursor, 'kind'>): string {
	const json: z.infer<typeof keysetJson> = [
		cursor.list,
		cursor.sort,
		cursor.order,
		cursor.direction === 'next' ? 'n' : 'p',
		cursor.key,
		cursor.id
	];
	return toBase64Url(`k:${JSON.stringify(json)}`);
}

/** An offset cursor, as issued before keyset cursors (kept for tests of the old form). */
export function encodeOffsetCursor(offset: number): string {
	return toBase64Url(`o:${offset}`);
}

/** What a cursor stands for, or null when it is not a cursor this API issued. */
export function decodeCursor(cursor: string): PageCursor | null {
	if (cursor.length > MAX_CURSOR_LENGTH) return null;
	const text = fromBase64Url(cursor);
	if (text === null) return null;
	const offset = /^o:(\d{1,8})$/.exec(text);
	if (offset) {
		const n = Number(offset[1]);
		return n <= MAX_OFFSET ? { kind: 'offset', offset: n } : null;
	}
	if (!text.startsWith('k:')) return null;
	let json: unknown;
	try {
		json = JSON.parse(text.slice(2));
	} catch {
		return null;
	}
	const parsed = keysetJson.safeParse(json);
	if (!parsed.success) return null;
	const [list, sort, order, direction, key, id] = parsed.data;
	return {
		kind: 'keyset',
		list,
		sort,
		order,
		direction: direction === 'n' ? 'next' : 'prev',
		key,
		id
	};
}
