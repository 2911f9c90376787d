import type { LinkedReference } from './dto';
import { orcidUrl } from '$lib/schemas/orcidId';
import {
	CITATION_FILES,
	CITATION_FILE_EXTENSIONS,
	PUBLISHER,
	UNNAMED_AUTHORS,
	citationFilePath,
	doiUrl,
	type CitableRecord,
	type CitedPerson,
	type OriginalWork
} from './citation';
import { displayNameParts, storedAuthorParts } from './personName';

/*
 * What an entry page's <head> tells reference managers, search engines and link previews,
 * built from the same frozen citation as its "Cite" box: a canonical link to the versioned
 * permalink; Highwire-style `citation_*` tags (read by Google Scholar and by Zotero's and
 * Mendeley's page importers); Dublin Core `DC.*` tags (DC-HTML, with the `schema.DC` link);
 * Open Graph title and description; `<link rel="alternate">` to the entry's JSON and each
 * citation format; and JSON-LD describing the version as a schema.org `Dataset`.
 *
 * No `citation_doi`: a registry record has no DOI of its own, and the DOI of the paper behind
 * it would make importers file the record as the paper. The paper appears as what it is: a
 * `citation_reference`, `DC.source` and the JSON-LD `citation`.
 */

/** A version's citation and the entries it is based on, as pages and downloads use them. */
export interface EntryCitation {
	record: CitableRecord;
	basedOn: LinkedReference[];
}

export interface HeadMeta {
	/** `name` for citation_* and DC.*, `property` for Open Graph. */
	attribute: 'name' | 'property';
	key: string;
	content: string;
}

export interface HeadLink {
	rel: string;
	href: string;
	type?: string;
	title?: string;
}

export interface EntryHead {
	title: string;
	description: string;
	meta: HeadMeta[];
	links: HeadLink[];
	/** JSON-LD, safe to place inside <script type="application/ld+json"> as it is. */
	jsonLd: string;
}

/** The entry's JSON in the API, at this version. */
export function entryApiPath(accession: string, version: number): string {
	return `/api/v1/entries/${accession}?version=${version}`;
}

function isoDay(iso: string): string {
	return new Date(iso).toISOString().slice(0, 10);
}

function authorsOrRegistry(record: CitableRecord): string[] {
	return record.authors.length > 0 ? record.authors.map((p) => p.name) : [UNNAMED_AUTHORS];
}

function firstAuthorFamily(authors: string[]): string {
	const first = authors[0] ? storedAuthorParts(authors[0]) : null;
	if (!first) return '';
	return 'literal' in first ? first.literal : first.family;
}

/** One line saying what the page holds, for search results and link previews. */
export function entryDescription(record: CitableRecord, kindLabel: string): string {
	const o = record.original;
	const from = o
		? ` Taken from ${firstAuthorFamily(o.authors)}${o.authors.length > 1 ? ' et al.' : ''}${o.year ? ` (${o.year})` : ''}.`
		: '';
	return `${kindLabel} record ${record.accession}, version ${record.version}, approved ${isoDay(record.approvedAt)} in ${PUBLISHER}, a curated registry of biological redox centres: ${record.title}.${from}`;
}

/** Google Scholar's form for a cited work: "citation_title=…; citation_author=…; …". */
function referenceContent(o: OriginalWork): string {
	const clean = (s: string) => s.replaceAll(';', ',');
	return [
		`citation_title=${clean(o.title)}`,
		...o.authors.map((a) => `citation_author=${clean(a)}`),
		...(o.year !== null ? [`citation_publication_date=${o.year}`] : []),
		...(o.journal ? [`citation_journal_title=${clean(o.journal)}`] : []),
		...(o.doi ? [`citation_doi=${clean(o.doi)}`] : [])
	].join('; ');
}

function personLd(person: CitedPerson) {
	const parts = displayNameParts(person.name);
	return {
		'@type': 'Person',
		...(person.orcid ? { '@id': orcidUrl(person.orcid), identifier: orcidUrl(person.orcid) } : {}),
		name: person.name,
		...('literal' in parts ? {} : { familyName: parts.family, givenName: parts.given || undefined })
	};
}

function workLd(o: OriginalWork) {
	return {
		'@type': o.sourceKind === 'dataset' ? 'Dataset' : 'ScholarlyArticle',
		...(o.doi ? { '@id': doiUrl(o.doi), identifier: doiUrl(o.doi), url: doiUrl(o.doi) } : {}),
		name: o.title,
		author: o.authors.map((a) => {
			const parts = storedAuthorParts(a);
			return 'literal' in parts
				? { '@type': 'Organization', name: parts.literal }
				: {
						'@type': 'Person',
						name: [parts.given, parts.family].filter(Boolean).join(' '),
						familyName: parts.family,
						givenName: parts.given || undefined
					};
		}),
		...(o.year !== null ? { datePublished: String(o.year) } : {}),
		...(o.journal ? { isPartOf: { '@type': 'Periodical', name: o.journal } } : {}),
		...(o.pubmedId ? { sameAs: `https://pubmed.ncbi.nlm.nih.gov/${o.pubmedId}/` } : {})
	};
}

/**
 * JSON for an HTML <script> element: `<`, `>` and `&` escaped, so that no text inside (a title
 * holding "</script>", say) can end the element or start markup. JSON.parse reads it unchanged.
 */
export function jsonForScript(value: unknown): string {
	return JSON.stringify(value)
		.replaceAll('<', '\\u003c')
		.replaceAll('>', '\\u003e')
		.replaceAll('&', '\\u0026')
		.replaceAll('\u2028', '\\u2028')
		.replaceAll('\u2029', '\\u2029');
}

export function entryJsonLd(
	citation: EntryCitation,
	description: string,
	origin: string
): Record<string, unknown> {
	const { record, basedOn } = citation;
	const o = record.original;
	const catalogue = { '@type': 'DataCatalog', name: PUBLISHER, url: `${origin}/` };
	const basis = [
		...basedOn.map((r) => ({
			'@type': 'Dataset',
			'@id': r.permalink,
			name: r.title,
			url: r.permalink,
			identifier: r.accession,
			version: String(r.version)
		})),
		...(o && record.kind === 'source' ? [workLd(o)] : [])
	];
	return {
		'@context': 'https://schema.org',
		'@type': 'Dataset',
		'@id': record.permalink,
		name: record.title,
		description,
		url: record.permalink,
		identifier: [
			record.permalink,
			{ '@type': 'PropertyValue', propertyID: `${PUBLISHER} accession`, value: record.accession }
		],
		version: String(record.version),
		datePublished: isoDay(record.approvedAt),
		creator:
			record.authors.length > 0
				? record.authors.map(personLd)
				: [{ '@type': 'Organization', name: UNNAMED_AUTHORS }],
		...(record.editors.length > 0 ? { editor: record.editors.map(personLd) } : {}),
		publisher: { '@type': 'Organization', name: PUBLISHER, url: `${origin}/` },
		includedInDataCatalog: catalogue,
		...(o ? { citation: workLd(o) } : {}),
		...(basis.length > 0 ? { isBasedOn: basis } : {}),
		distribution: [
			{
				'@type': 'DataDownload',
				encodingFormat: 'application/json',
				contentUrl: `${origin}${entryApiPath(record.accession, record.version)}`
			},
			...CITATION_FILE_EXTENSIONS.map((extension) => ({
				'@type': 'DataDownload',
				name: `Citation (${CITATION_FILES[extension].label})`,
				encodingFormat: CITATION_FILES[extension].mediaType,
				contentUrl: `${origin}${citationFilePath(record.accession, record.version, extension)}`
			}))
		]
	};
}

/** Everything an entry page puts in its <head>. */
export function entryHead(citation: EntryCitation, kindLabel: string, origin: string): EntryHead {
	const { record } = citation;
	const o = record.original;
	const description = entryDescription(record, kindLabel);
	const name = (key: string, content: string): HeadMeta => ({ attribute: 'name', key, content });
	const property = (key: string, content: string): HeadMeta => ({
		attribute: 'property',
		key,
		content
	});
	const day = isoDay(record.approvedAt);
	const people = record.authors.length > 0 ? record.authors : null;

	const meta: HeadMeta[] = [
		name('description', description),
		name('citation_title', record.title),
		...(people
			? people.flatMap((p) => [
					name('citation_author', p.name),
					...(p.orcid ? [name('citation_author_orcid', orcidUrl(p.orcid))] : [])
				])
			: [name('citation_author', UNNAMED_AUTHORS)]),
		name('citation_publication_date', day.replaceAll('-', '/')),
		name('citation_version', String(record.version)),
		name('citation_publisher', PUBLISHER),
		name('citation_public_url', record.permalink),
		name('citation_language', 'en'),
		...(o ? [name('citation_reference', referenceContent(o))] : []),
		name('DC.title', record.title),
		...authorsOrRegistry(record).map((a) => name('DC.creator', a)),
		...record.editors.map((p) => name('DC.contributor', p.name)),
		name('DC.date', day),
		name('DC.identifier', record.permalink),
		name('DC.publisher', PUBLISHER),
		name('DC.type', 'Dataset'),
		name('DC.format', 'text/html'),
		name('DC.language', 'en'),
		...(o ? [name('DC.source', o.doi ? doiUrl(o.doi) : o.record.permalink)] : []),
		...citation.basedOn.map((r) => name('DC.relation', r.permalink)),
		property('og:type', 'website'),
		property('og:site_name', PUBLISHER),
		property('og:title', `${record.title} (${record.accession}, version ${record.version})`),
		property('og:description', description),
		property('og:url', record.permalink)
	];
	const links: HeadLink[] = [
		{ rel: 'canonical', href: record.permalink },
		{ rel: 'schema.DC', href: 'http://purl.org/dc/elements/1.1/' },
		{
			rel: 'alternate',
			type: 'application/json',
			href: entryApiPath(record.accession, record.version),
			title: 'JSON'
		},
		...CITATION_FILE_EXTENSIONS.map((extension) => ({
			rel: 'alternate',
			type: CITATION_FILES[extension].mediaType,
			href: citationFilePath(record.accession, record.version, extension),
			title: `Citation (${CITATION_FILES[extension].label})`
		}))
	];
	return {
		title: `${record.accession} v${record.version} · ${record.title} — ${PUBLISHER}`,
		description,
		meta,
		links,
		jsonLd: jsonForScript(entryJsonLd(citation, description, origin))
	};
}
