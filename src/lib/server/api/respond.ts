import Papa from 'papaparse';
import type { z } from 'zod';
import { API_ERROR_CODES, type ApiErrorBody, type ApiErrorCode } from '$lib/schemas/apiError';
import { LIST_KEYS } from '$lib/schemas/catalogueQuery';
import { decodeCursor, type PageCursor } from '$lib/schemas/pagination';
import { parseSearchParams, type FieldErrors, type ParamsResult } from '$lib/schemas/searchParams';
import type { CsvTable } from '$lib/catalogue/csvRows';
import type { Page } from '$lib/catalogue/dto';

/* Building API responses: the error shape, query parsing, JSON and CSV pages. */

export function apiError(code: ApiErrorCode, message: string, fields?: FieldErrors): Response {
	const body: ApiErrorBody = { error: { code, message, ...(fields ? { fields } : {}) } };
	return Response.json(body, { status: API_ERROR_CODES[code] });
}

export function badQuery(fields: FieldErrors): Response {
	const names = Object.keys(fields).join(', ');
	return apiError('bad_request', `Invalid query parameter(s): ${names}`, fields);
}

export function parseApiQuery<S extends z.ZodObject>(
	url: URL,
	schema: S
): ParamsResult<z.infer<S>> {
	return parseSearchParams(schema, url.searchParams, LIST_KEYS);
}

/** The cursor a validated `cursor` parameter holds (the query schema refused any other). */
export function cursorOf(cursor: string | undefined): PageCursor | undefined {
	return cursor === undefined ? undefined : (decodeCursor(cursor) ?? undefined);
}

/**
 * A page as JSON (`{ items, total, offset, nextCursor, prevCursor, links }`) or as CSV (the
 * header row even when nothing matches), with absolute URLs of the next and previous pages in
 * `links` and in the `Link` header, and the total in `X-Total-Count`.
 */
export function respondWithPage<T>(
	url: URL,
	page: Page<T>,
	format: 'json' | 'csv',
	table: CsvTable<T>,
	filename: string
): Response {
	const next = page.nextCursor === null ? null : withCursor(url, page.nextCursor);
	const prev = page.prevCursor === null ? null : withCursor(url, page.prevCursor);
	const link = [
		next ? `<${next}>; rel="next"` : null,
		prev ? `<${prev}>; rel="prev"` : null
	].filter((l) => l !== null);
	const headers = new Headers({ 'x-total-count': String(page.total) });
	if (link.length > 0) headers.set('link', link.join(', '));
	if (format === 'csv') {
		headers.set('content-type', 'text/csv; charset=utf-8');
		headers.set('content-disposition', `attachment; filename="${filename}.csv"`);
		return new Response(csvText(table, page.items), { headers });
	}
	return Response.json({ ...page, links: { next, prev } }, { headers });
}

/**
 * The CSV of a table's rows, header first (and alone when there are none), lines ended by CRLF
 * except the last.
 */
export function csvText<T>(table: CsvTable<T>, items: readonly T[], header = true): string {
	// Text cells starting with = + - @ are prefixed so spreadsheets never run them as formulae.
	const text = Papa.unparse(
		{ fields: [...table.fields], data: items.map(table.row) },
		{ newline: '\r\n', escapeFormulae: true, header }
	);
	return text.endsWith('\r\n') ? text.slice(0, -2) : text;
}

/** The request's URL with another cursor: absolute, as Link headers and `links` give it. */
function withCursor(url: URL, cursor: string): string {
	const next = new URL(url);
	next.searchParams.set('cursor', cursor);
	return next.href;
}

/**
 * JSON for computed results: a non-finite number here is a bug, never something to send
 * (JSON would silently turn it into null), so it fails loudly instead.
 */
export function computedJson(value: unknown): Response {
	const body = JSON.stringify(value, (key, v: unknown) => {
		if (typeof v === 'number' && !Number.isFinite(v))
			throw new Error(`non-finite number in result field "${key}"`);
		return v;
	});
	return new Response(body, { headers: { 'content-type': 'application/json' } });
}
