import type { EntryKind } from '$lib/kinds';
import { orcidUrl } from '$lib/schemas/orcidId';
import {
	fillAccessDate,
	isAccessDateForm,
	type AccessDateForm,
	type CalendarDate,
	type DatedText
} from './accessDate';
import { toLatex } from './latex';
import { displayNameParts, initialledName, storedAuthorParts, type NameParts } from './personName';

/*
 * Citations of one entry version in four open formats: BibTeX, RIS, CSL-JSON and plain text.
 *
 * - Each names the registry record (versioned permalink, accession and version in the fields
 *   the format has for them, never inside the title) with the people credited for it: the
 *   contributors as authors, the approving curator as editor, with their ORCID iDs.
 * - A value taken from a paper (a potential, spin record or distance) carries a second entry,
 *   "cite the original measurement": its source's authors, year, title and DOI. A source entry
 *   carries the publication (or dataset) itself the same way.
 * - The access date is the reader's, known only in their browser: without it (downloads without
 *   scripts, content negotiation) the citations say nothing about access rather than something
 *   wrong, and stay the same bytes forever. Each citation is written once with holes where the
 *   date goes (`citationTemplates`); the files fill them here, an entry page in the browser
 *   (accessDate.ts), so that both give the same bytes for the same date.
 * - BibTeX is written for classic styles and pdflatex: the title in braces so styles keep its
 *   case ("[4Fe-4S]", "NADH"), the permalink in `howpublished` as `\url{…}` (classic styles print
 *   neither `url` nor `urldate`), and ASCII only (latex.ts).
 */

export const PUBLISHER = 'Hopline';
/** Who a version crediting nobody by name is cited as. */
export const UNNAMED_AUTHORS = 'Hopline contributors';

/** A person a version's citation names (as frozen when the version was approved). */
export interface CitedPerson {
	name: string;
	orcid: string | null;
}

/** The publication or dataset a value was taken from, as its source entry describes it. */
export interface OriginalWork {
	/** Citation key: first author's family name, year, and the source's accession. */
	key: string;
	sourceKind: 'publication' | 'dataset';
	title: string;
	/** "Family, Given", or a literal name, in the order published. */
	authors: string[];
	journal: string | null;
	year: number | null;
	doi: string | null;
	pubmedId: string | null;
	/** The source entry in the registry, at the version this description is taken from. */
	record: { accession: string; version: number; permalink: string };
}

export interface CitableRecord {
	accession: string;
	version: number;
	kind: EntryKind;
	/** The version's title as its page gives it (no accession or version inside). */
	title: string;
	/** Absolute URL of the versioned permalink. */
	permalink: string;
	/** When this version was approved (ISO 8601). */
	approvedAt: string;
	authors: CitedPerson[];
	editors: CitedPerson[];
	/** The paper or dataset behind the record, where its source is known and visible. */
	original: OriginalWork | null;
}

export interface Citations {
	bibtex: string;
	ris: string;
	cslJson: string;
	text: string;
}

export type CitationFormat = keyof Citations;

/** The downloadable formats: file extension → format, media type and name. */
export const CITATION_FILES = {
	bib: { format: 'bibtex', mediaType: 'application/x-bibtex', label: 'BibTeX' },
	ris: { format: 'ris', mediaType: 'application/x-research-info-systems', label: 'RIS' },
	json: {
		format: 'cslJson',
		mediaType: 'application/vnd.citationstyles.csl+json',
		label: 'CSL-JSON'
	}
} as const satisfies Record<string, { format: CitationFormat; mediaType: string; label: string }>;

export type CitationFileExtension = keyof typeof CITATION_FILES;
export const CITATION_FILE_EXTENSIONS: readonly CitationFileExtension[] = ['bib', 'ris', 'json'];

/** Path of a version's citation file, e.g. /e/HL000123/v2/cite.bib. */
export function citationFilePath(
	accession: string,
	version: number,
	extension: CitationFileExtension
): string {
	return `/e/${accession}/v${version}/cite.${extension}`;
}

/** What the original work is to the record: the measurement behind a value, or the source itself. */
export function originalRole(kind: EntryKind): string {
	return kind === 'source' ? 'the publication itself' : 'the original measurement';
}

export function recordKey(record: Pick<CitableRecord, 'accession' | 'version'>): string {
	return `hopline_${record.accession}_v${record.version}`;
}

/** Citation key of a source's work: "Lovelace2020_HL000012" (ASCII letters of the family name). */
export function originalKey(authors: string[], year: number | null, accession: string): string {
	const first = authors[0] ? storedAuthorParts(authors[0]) : null;
	const name = first ? ('literal' in first ? first.literal : first.family) : '';
	const ascii = name
		.normalize('NFKD')
		.replace(/[^A-Za-z]/g, '')
		.slice(0, 30);
	return `${ascii || 'source'}${year ?? 'nd'}_${accession}`;
}

function approvalDate(record: CitableRecord): [number, number, number] {
	const d = new Date(record.approvedAt);
	return [d.getUTCFullYear(), d.getUTCMonth() + 1, d.getUTCDate()];
}

function isoDate([y, m, d]: [number, number, number]): string {
	return `${y}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`;
}

/**
 * Writes a hole for the access date in the form named: the form between two marks, a character
 * the record's own text does not hold (`holesOf` finds them again).
 */
type AccessHole = (form: AccessDateForm) => string;

/**
 * A URL as `\url{…}` and the `url` field take it: characters BibTeX would count as braces or
 * LaTeX would read as a command are percent-encoded.
 */
function safeUrl(url: string): string {
	return url.replace(/[{}\\\s"<>^`|]/g, (ch) => encodeURIComponent(ch));
}

/** The DOI's resolver URL; characters the DOI Handbook says to encode in URLs are encoded. */
export function doiUrl(doi: string): string {
	return `https://doi.org/${doi.replace(/[%"#\s?<>{}^[\]`|\\]/g, (ch) => encodeURIComponent(ch))}`;
}

function personParts(person: CitedPerson): NameParts {
	return displayNameParts(person.name);
}

/* ---------------------------------------------------------------- BibTeX */

function bibName(parts: NameParts): string {
	if ('literal' in parts) return `{${toLatex(parts.literal)}}`;
	// A family name holding the word "and" would split the list: keep it whole.
	const family = /\band\b/i.test(parts.family)
		? `{${toLatex(parts.family)}}`
		: toLatex(parts.family);
	return parts.given ? `${family}, ${toLatex(parts.given)}` : family;
}

function bibEntry(type: string, key: string, fields: [string, string | null][]): string {
	const lines = fields
		.filter((f): f is [string, string] => f[1] !== null && f[1] !== '')
		.map(([name, value]) => `  ${name} = {${value}}`);
	return `@${type}{${key},\n${lines.join(',\n')}\n}`;
}

/** The people who gave an ORCID iD, with it. */
function withOrcid(people: CitedPerson[]): { name: string; orcid: string }[] {
	return people.flatMap((p) => (p.orcid ? [{ name: p.name, orcid: p.orcid }] : []));
}

function orcidNote(people: CitedPerson[]): string | null {
	const named = withOrcid(people);
	if (named.length === 0) return null;
	return `ORCID iDs: ${named.map((p) => `${toLatex(p.name)} \\url{${orcidUrl(p.orcid)}}`).join(', ')}`;
}

function bibtexOf(record: CitableRecord, accessed: AccessHole | null): string {
	const approved = approvalDate(record);
	const url = safeUrl(record.permalink);
	const note = [
		accessed ? `Accessed ${accessed('iso')}` : null,
		orcidNote([...record.authors, ...record.editors])
	]
		.filter(Boolean)
		.join('. ');
	const entries = [
		bibEntry('misc', recordKey(record), [
			[
				'author',
				record.authors.length > 0
					? record.authors.map((p) => bibName(personParts(p))).join(' and ')
					: `{${UNNAMED_AUTHORS}}`
			],
			['editor', record.editors.map((p) => bibName(personParts(p))).join(' and ')],
			['title', `{${toLatex(record.title)}}`],
			[
				'howpublished',
				`${PUBLISHER} record ${record.accession}, version ${record.version}, \\url{${url}}`
			],
			['publisher', PUBLISHER],
			['year', String(approved[0])],
			['date', isoDate(approved)],
			['version', String(record.version)],
			['url', url],
			['urldate', accessed ? accessed('iso') : null],
			['note', note]
		])
	];
	const o = record.original;
	if (o) {
		const doi = o.doi ? o.doi.replace(/[{}\\]/g, (ch) => encodeURIComponent(ch)) : null;
		const isArticle = o.sourceKind === 'publication' && o.journal !== null;
		entries.push(
			`% Cite ${originalRole(record.kind)} too (${PUBLISHER} record ${o.record.accession}, version ${o.record.version}):`,
			bibEntry(isArticle ? 'article' : 'misc', o.key, [
				['author', o.authors.map((a) => bibName(storedAuthorParts(a))).join(' and ')],
				['title', `{${toLatex(o.title)}}`],
				['journal', isArticle && o.journal ? toLatex(o.journal) : null],
				[
					'howpublished',
					isArticle
						? null
						: o.sourceKind === 'dataset'
							? 'Unpublished dataset'
							: o.journal
								? toLatex(o.journal)
								: null
				],
				['year', o.year === null ? null : String(o.year)],
				['doi', doi],
				['url', o.doi ? doiUrl(o.doi) : null],
				['pmid', o.pubmedId]
			])
		);
	}
	return entries.join('\n\n') + '\n';
}

/* ---------------------------------------------------------------- RIS */

/** RIS values are single lines; line breaks would start a new tag. */
function risValue(text: string): string {
	return text.replace(/[\r\n]+/g, ' ').trim();
}

function risName(parts: NameParts): string {
	return 'literal' in parts
		? parts.literal
		: [parts.family, parts.given].filter(Boolean).join(', ');
}

function risRecord(lines: [string, string | null][]): string {
	return [
		...lines
			.filter((l): l is [string, string] => l[1] !== null && l[1] !== '')
			.map(([tag, value]) => `${tag}  - ${risValue(value)}`),
		'ER  - '
	].join('\r\n');
}

function risOf(record: CitableRecord, accessed: AccessHole | null): string {
	const approved = approvalDate(record);
	const orcids = withOrcid([...record.authors, ...record.editors]);
	const records = [
		risRecord([
			['TY', 'DATA'],
			...(record.authors.length > 0
				? record.authors.map((p): [string, string] => ['AU', risName(personParts(p))])
				: [['AU', UNNAMED_AUTHORS] as [string, string]]),
			...record.editors.map((p): [string, string] => ['A2', risName(personParts(p))]),
			['TI', record.title],
			['PY', String(approved[0])],
			['DA', isoDate(approved).replaceAll('-', '/')],
			['PB', PUBLISHER],
			['DB', PUBLISHER],
			['AN', record.accession],
			['ET', String(record.version)],
			['UR', record.permalink],
			['Y2', accessed ? accessed('slashed') : null],
			[
				'N1',
				orcids.length > 0
					? `ORCID iDs: ${orcids.map((p) => `${p.name} ${orcidUrl(p.orcid)}`).join(', ')}`
					: null
			]
		])
	];
	const o = record.original;
	if (o) {
		const isArticle = o.sourceKind === 'publication' && o.journal !== null;
		records.push(
			risRecord([
				['TY', isArticle ? 'JOUR' : o.sourceKind === 'dataset' ? 'DATA' : 'GEN'],
				...o.authors.map((a): [string, string] => ['AU', risName(storedAuthorParts(a))]),
				['TI', o.title],
				['T2', o.journal],
				['PY', o.year === null ? null : String(o.year)],
				['DO', o.doi],
				['UR', o.doi ? doiUrl(o.doi) : null],
				['N1', o.pubmedId ? `PubMed ID ${o.pubmedId}` : null],
				[
					'N1',
					`Cite ${originalRole(record.kind)} of ${PUBLISHER} record ${record.accession}, version ${record.version}.`
				]
			])
		);
	}
	return records.join('\r\n') + '\r\n';
}

/* ---------------------------------------------------------------- CSL-JSON */

type CslName = { family: string; given?: string; ORCID?: string } | { literal: string };

function cslName(parts: NameParts, orcid: string | null = null): CslName {
	// Extra ORCID on a name, as DOI registration agencies' CSL-JSON carries it.
	const withOrcid = orcid ? { ORCID: orcidUrl(orcid) } : {};
	if ('literal' in parts) return { literal: parts.literal, ...withOrcid };
	return parts.given
		? { family: parts.family, given: parts.given, ...withOrcid }
		: { family: parts.family, ...withOrcid };
}

/**
 * The CSL-JSON items: the record, then the original work when there is one. The access date's
 * parts are holes written as JSON strings; `holesOf` takes the quotes with them, so that the
 * date fills them as numbers.
 */
function cslItemsWith(
	record: CitableRecord,
	accessed: AccessHole | null
): Record<string, unknown>[] {
	const items: Record<string, unknown>[] = [
		{
			id: recordKey(record),
			type: 'dataset',
			title: record.title,
			author:
				record.authors.length > 0
					? record.authors.map((p) => cslName(personParts(p), p.orcid))
					: [{ literal: UNNAMED_AUTHORS }],
			...(record.editors.length > 0
				? { editor: record.editors.map((p) => cslName(personParts(p), p.orcid)) }
				: {}),
			publisher: PUBLISHER,
			number: record.accession,
			version: String(record.version),
			issued: { 'date-parts': [approvalDate(record)] },
			...(accessed
				? { accessed: { 'date-parts': [[accessed('year'), accessed('month'), accessed('day')]] } }
				: {}),
			URL: record.permalink
		}
	];
	const o = record.original;
	if (o) {
		items.push({
			id: o.key,
			type: o.sourceKind === 'dataset' ? 'dataset' : o.journal ? 'article-journal' : 'article',
			title: o.title,
			author: o.authors.map((a) => cslName(storedAuthorParts(a))),
			...(o.journal ? { 'container-title': o.journal } : {}),
			...(o.year !== null ? { issued: { 'date-parts': [[o.year]] } } : {}),
			...(o.doi ? { DOI: o.doi } : {}),
			...(o.pubmedId ? { PMID: o.pubmedId } : {}),
			note: `Cite ${originalRole(record.kind)} of ${PUBLISHER} record ${record.accession}, version ${record.version}.`
		});
	}
	return items;
}

/* ---------------------------------------------------------------- plain text */

function textAuthors(names: string[]): string {
	if (names.length <= 1) return names[0] ?? '';
	return `${names.slice(0, -1).join(', ')}, & ${names.at(-1)}`;
}

function plainWith(
	record: CitableRecord,
	accessed: AccessHole | null
): { record: string; original: string | null } {
	const year = approvalDate(record)[0];
	const authors =
		record.authors.length > 0
			? textAuthors(record.authors.map((p) => initialledName(personParts(p))))
			: UNNAMED_AUTHORS;
	const own = `${authors} (${year}). ${record.title} (${PUBLISHER} record ${record.accession}, version ${record.version}) [Data set]. ${PUBLISHER}. ${record.permalink}${accessed ? ` (accessed ${accessed('iso')})` : ''}`;
	const o = record.original;
	if (!o) return { record: own, original: null };
	const who = textAuthors(o.authors.map((a) => initialledName(storedAuthorParts(a))));
	const where = o.sourceKind === 'dataset' ? 'Unpublished dataset' : o.journal;
	return {
		record: own,
		original: `${who} (${o.year ?? 'n.d.'}). ${o.title}.${where ? ` ${where.replace(/\.$/, '')}.` : ''}${o.doi ? ` ${doiUrl(o.doi)}` : ''}`
	};
}

function textOf(record: CitableRecord, accessed: AccessHole | null): string {
	const parts = plainWith(record, accessed);
	return parts.original === null
		? parts.record
		: `${parts.record}\nCite ${originalRole(record.kind)}: ${parts.original}`;
}

/* ---------------------------------------------------------------- holes for the access date */

/** A character in the Private Use Area that the record's text does not hold, to mark holes. */
function freeMark(record: CitableRecord): string {
	const text = JSON.stringify(record);
	for (let code = 0xe000; code <= 0xf8ff; code++) {
		const mark = String.fromCharCode(code);
		if (!text.includes(mark)) return mark;
	}
	throw new RangeError('the record holds every private-use character: no mark is left');
}

/** Text written with `mark`ed holes, in pieces. A CSL-JSON hole takes its quotes with it. */
function holesOf(text: string, mark: string): DatedText {
	const hole = new RegExp(`"${mark}(year|month|day)${mark}"|${mark}(iso|slashed)${mark}`, 'g');
	const pieces: (string | { accessed: AccessDateForm })[] = [];
	let last = 0;
	for (const match of text.matchAll(hole)) {
		const form = match[1] ?? match[2] ?? '';
		if (!isAccessDateForm(form)) throw new Error(`no access date form "${form}"`);
		pieces.push(text.slice(last, match.index), { accessed: form });
		last = match.index + match[0].length;
	}
	pieces.push(text.slice(last));
	const out = pieces.filter((p) => p !== '');
	if (out.some((p) => typeof p === 'string' && p.includes(mark)))
		throw new Error('an access date hole was written in a form holesOf does not read');
	return out;
}

export interface CitationTemplates {
	/** Each format, with holes for the access date (none when made without one). */
	formats: Record<CitationFormat, DatedText>;
	/** The plain-text citation of the version (with holes) and of the original work. */
	plain: { record: DatedText; original: string | null };
}

/**
 * The version's citations with holes where the reader's access date goes (`withAccessDate`), or
 * without any access date; fillAccessDate (accessDate.ts) writes a date into the holes.
 */
export function citationTemplates(
	record: CitableRecord,
	withAccessDate: boolean
): CitationTemplates {
	const mark = freeMark(record);
	const hole: AccessHole | null = withAccessDate ? (form) => `${mark}${form}${mark}` : null;
	const holes = (text: string) => holesOf(text, mark);
	const plain = plainWith(record, hole);
	return {
		formats: {
			bibtex: holes(bibtexOf(record, hole)),
			ris: holes(risOf(record, hole)),
			cslJson: holes(JSON.stringify(cslItemsWith(record, hole), null, 2) + '\n'),
			text: holes(textOf(record, hole))
		},
		plain: { record: holes(plain.record), original: plain.original }
	};
}

const filled = (text: DatedText, accessed: CalendarDate | null) =>
	fillAccessDate(text, accessed ?? '');

/** The version's citations; `accessed` is the reader's date, or null where it is not known. */
export function citeRecord(record: CitableRecord, accessed: CalendarDate | null): Citations {
	const { formats } = citationTemplates(record, accessed !== null);
	return {
		bibtex: filled(formats.bibtex, accessed),
		ris: filled(formats.ris, accessed),
		cslJson: filled(formats.cslJson, accessed),
		text: filled(formats.text, accessed)
	};
}

/** The plain-text citations, apart: the record's version, and the original work where known. */
export function plainCitations(
	record: CitableRecord,
	accessed: CalendarDate | null
): { record: string; original: string | null } {
	const { plain } = citationTemplates(record, accessed !== null);
	return { record: filled(plain.record, accessed), original: plain.original };
}

/** The CSL-JSON items: the record, then the original work when there is one. */
export function cslItems(
	record: CitableRecord,
	accessed: CalendarDate | null
): Record<string, unknown>[] {
	return JSON.parse(citeRecord(record, accessed).cslJson);
}

/** A citation format an entry page offers to copy or download. */
export interface PageCitationFile {
	extension: CitationFileExtension;
	label: string;
	mediaType: string;
	/** The file without an access date; the page adds `?accessed=` when it knows the date. */
	path: string;
	/** What Copy puts on the clipboard, with holes for the reader's access date. */
	text: DatedText;
}

/**
 * What an entry page's "How to cite" box shows, copies and links to, made on the server so that
 * the page carries no code that writes citations: the texts without an access date (the page
 * as rendered, and as it stays without scripts), and with holes the browser fills with the
 * reader's date.
 */
export interface PageCitation {
	accession: string;
	version: number;
	authors: CitedPerson[];
	editors: CitedPerson[];
	/** Plain text, with no access date. */
	plain: { record: string; original: string | null };
	/** The version's plain text with holes for the access date. */
	datedRecord: DatedText;
	/** What the original work is to the record ("the original measurement"); null without one. */
	originalRole: string | null;
	files: PageCitationFile[];
}

export function pageCitation(record: CitableRecord): PageCitation {
	const undated = citationTemplates(record, false);
	const dated = citationTemplates(record, true);
	return {
		accession: record.accession,
		version: record.version,
		authors: record.authors,
		editors: record.editors,
		plain: {
			record: fillAccessDate(undated.plain.record, ''),
			original: undated.plain.original
		},
		datedRecord: dated.plain.record,
		originalRole: record.original ? originalRole(record.kind) : null,
		files: CITATION_FILE_EXTENSIONS.map((extension) => {
			const file = CITATION_FILES[extension];
			return {
				extension,
				label: file.label,
				mediaType: file.mediaType,
				path: citationFilePath(record.accession, record.version, extension),
				text: dated.formats[file.format]
			};
		})
	};
}
