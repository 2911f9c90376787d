import Papa from 'papaparse';
import type { z } from 'zod';
import { API_ERROR_CODES, type ApiErrorBody, type ApiErrorCode } from '$lib/schemas/apiError';
import { LIST_KEYS } from '$lib/schemas/catalogueQuery';
import { decodeCursor } from '$lib/schemas/pagination';
import { parseSearchParams, type FieldErrors, type ParamsResult } from '$lib/schemas/searchParams';
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

/** Offset a validated cursor stands for (0 on the first page). */
export function offsetOf(cursor: string | undefined): number {
	return cursor === undefined ? 0 : (decodeCursor(cursor) ?? 0);
}

/** A page as JSON (`{ items, total, nextCursor, links }`) or as CSV with paging in headers. */
export function respondWithPage<T>(
	url: URL,
	page: Page<T>,
	format: 'json' | 'csv',
	toCsvRow: (item: T) => Record<string, unknown>,
	filename: string
): Response {
	const next = page.nextCursor === null ? null : withCursor(url, page.nextCursor);
	if (format === 'csv') {
		// Text cells starting with = + - @ are prefixed so spreadsheets never run them as formulae.
		const csv = Papa.unparse(page.items.map(toCsvRow), { newline: '\r\n', escapeFormulae: true });
		const headers = new Headers({
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${filename}.csv"`,
			'x-total-count': String(page.total)
		});
		if (next) headers.set('link', `<${next}>; rel="next"`);
		return new Response(csv, { headers });
	}
	return Response.json({ ...page, links: { next } });
}

function withCursor(url: URL, cursor: string): string {
	const next = new URL(url);
	next.searchParams.set('cursor', cursor);
	return next.pathname + next.search;
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
