/*
 * Opaque page cursors for the API. A cursor encodes the position of the next page; clients
 * pass back what they were given and never build one. Offsets keep every sort order (including
 * search relevance) paginable with one mechanism.
 */

const PREFIX = 'o';
export const MAX_OFFSET = 10_000_000;

function toBase64Url(text: string): string {
	return btoa(text).replaceAll('+', '-').replaceAll('/', '_').replace(/=+$/, '');
}

function fromBase64Url(text: string): string | null {
	if (!/^[A-Za-z0-9_-]*$/.test(text)) return null;
	try {
		return atob(text.replaceAll('-', '+').replaceAll('_', '/'));
	} catch {
		return null;
	}
}

export function encodeCursor(offset: number): string {
	return toBase64Url(`${PREFIX}:${offset}`);
}

/** The offset a cursor stands for, or null when it is not a cursor this API issued. */
export function decodeCursor(cursor: string): number | null {
	const text = fromBase64Url(cursor);
	const match = text === null ? null : /^o:(\d{1,8})$/.exec(text);
	if (!match) return null;
	const offset = Number(match[1]);
	return offset <= MAX_OFFSET ? offset : null;
}
