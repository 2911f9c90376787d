import { redirect } from '@sveltejs/kit';
import Negotiator from 'negotiator';
import {
	CITATION_FILES,
	CITATION_FILE_EXTENSIONS,
	citationFilePath,
	type CitationFileExtension
} from '$lib/catalogue/citation';
import { entryApiPath } from '$lib/catalogue/entryMetadata';

/*
 * Content negotiation on an entry's permalink (/e/HL000123, /e/HL000123/v2): a client that asks
 * for a citation format or JSON in `Accept`, and prefers it to HTML, is sent (303 See Other, as
 * DOI resolvers do) to the version's citation file or its JSON in the API, where the answer is
 * the same bytes for that version forever. Everyone else — browsers, crawlers, clients accepting
 * anything — gets the page. Called by the entry page's load with one line, after the entry view
 * has checked that the reader may see the version, so a hidden entry answers 404 whatever is
 * asked.
 */

/** What a permalink answers with: the page, the entry's JSON, or a citation file (by extension). */
export type EntryRepresentation = 'html' | 'entry-json' | CitationFileExtension;

const HTML_TYPES = ['text/html', 'application/xhtml+xml'];
const OFFERED = [
	...HTML_TYPES,
	...CITATION_FILE_EXTENSIONS.map((extension) => CITATION_FILES[extension].mediaType),
	'application/json'
];

/**
 * The representation an `Accept` header prefers (RFC 9110 §12.5.1): its q-values decide; between
 * equals, and for a missing or wildcard header, HTML.
 */
export function preferredRepresentation(accept: string | null): EntryRepresentation {
	if (!accept) return 'html';
	const chosen = new Negotiator({ headers: { accept } }).mediaType(OFFERED);
	if (chosen === undefined || HTML_TYPES.includes(chosen)) return 'html';
	if (chosen === 'application/json') return 'entry-json';
	return CITATION_FILE_EXTENSIONS.find((e) => CITATION_FILES[e].mediaType === chosen) ?? 'html';
}

/**
 * The hook of the entry page's load: for a client that prefers a citation format or JSON,
 * throws SvelteKit's redirect to it; otherwise returns and the page renders. Either way the
 * answer varies with `Accept`.
 */
export function negotiateEntryRepresentation(
	event: {
		request: Request;
		isDataRequest: boolean;
		setHeaders: (headers: Record<string, string>) => void;
	},
	version: { accession: string; version: number }
): void {
	// Client-side navigation fetches the page's data, never a citation.
	if (event.isDataRequest) return;
	event.setHeaders({ vary: 'Accept' });
	const wanted = preferredRepresentation(event.request.headers.get('accept'));
	if (wanted === 'html') return;
	redirect(
		303,
		wanted === 'entry-json'
			? entryApiPath(version.accession, version.version)
			: citationFilePath(version.accession, version.version, wanted)
	);
}
