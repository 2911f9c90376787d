import { isAccession, VERSION_SEGMENT_PATTERN } from '$lib/schemas/accession';

/*
 * The pages served as documents: rendered on the server and not hydrated (`csr = false` beside
 * them), each with one small script of its own for what needs a script. Today: an entry at its
 * latest or a given version (/e/HL000123, /e/HL000123/v2). See DEVELOPERS.md, "Documents without
 * hydration".
 */

/** Whether the path is one of the document pages (the entry page's route and matchers). */
export function isDocumentPath(pathname: string): boolean {
	const [empty, e, accession, version, ...rest] = pathname.split('/');
	return (
		empty === '' &&
		e === 'e' &&
		accession !== undefined &&
		isAccession(accession) &&
		rest.length === 0 &&
		(version === undefined || VERSION_SEGMENT_PATTERN.test(version))
	);
}

/**
 * What the browser's router is told such a path leads to: a path no route matches, so that it
 * leaves the navigation to the browser (src/hooks.ts).
 */
export const NO_CLIENT_ROUTE = '/_document';
