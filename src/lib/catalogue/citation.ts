/*
 * Citations of one entry version in four open formats: BibTeX, RIS, CSL-JSON and plain text.
 * Each carries the versioned permalink, the version and the access date, so that a reader can
 * retrieve exactly what was cited.
 */

export interface CitableEntry {
	accession: string;
	version: number;
	title: string;
	/** Absolute URL of the versioned permalink. */
	permalink: string;
	/** When this version was approved (ISO 8601). */
	approvedAt: string;
	accessed: Date;
}

export interface Citations {
	bibtex: string;
	ris: string;
	cslJson: string;
	text: string;
}

const PUBLISHER = 'Hopline';
const AUTHOR = 'Hopline contributors';

function isoDate(d: Date): string {
	return d.toISOString().slice(0, 10);
}

function dateParts(d: Date): [number, number, number] {
	return [d.getUTCFullYear(), d.getUTCMonth() + 1, d.getUTCDate()];
}

/** Escapes the characters BibTeX treats specially in field values. */
export function escapeBibtex(text: string): string {
	// One pass, so that the braces of a replacement are never escaped again.
	const replacements: Record<string, string> = {
		'\\': '\\textbackslash{}',
		'~': '\\textasciitilde{}',
		'^': '\\textasciicircum{}'
	};
	return text.replace(/[\\{}%&#_$~^]/g, (ch) => replacements[ch] ?? `\\${ch}`);
}

/** RIS values are single lines; line breaks would start a new tag. */
function risValue(text: string): string {
	return text.replace(/[\r\n]+/g, ' ').trim();
}

export function citeEntry(entry: CitableEntry): Citations {
	const approved = new Date(entry.approvedAt);
	const year = approved.getUTCFullYear();
	const accessed = isoDate(entry.accessed);
	const key = `hopline_${entry.accession}_v${entry.version}`;
	const fullTitle = `${entry.title} (${entry.accession}, version ${entry.version})`;

	const bibtex = [
		`@misc{${key},`,
		`  author = {{${AUTHOR}}},`,
		`  title = {${escapeBibtex(fullTitle)}},`,
		`  howpublished = {${PUBLISHER} entry ${entry.accession}, version ${entry.version}},`,
		`  year = {${year}},`,
		`  version = {${entry.version}},`,
		`  url = {${entry.permalink}},`,
		`  urldate = {${accessed}},`,
		`  note = {Accessed ${accessed}}`,
		`}`
	].join('\n');

	const ris = [
		'TY  - DATA',
		`AU  - ${AUTHOR}`,
		`TI  - ${risValue(fullTitle)}`,
		`PY  - ${year}`,
		`DA  - ${isoDate(approved).replaceAll('-', '/')}`,
		`DB  - ${PUBLISHER}`,
		`PB  - ${PUBLISHER}`,
		`ET  - ${entry.version}`,
		`M1  - ${entry.accession}`,
		`UR  - ${entry.permalink}`,
		`Y2  - ${accessed.replaceAll('-', '/')}`,
		'ER  - '
	].join('\r\n');

	const cslJson = JSON.stringify(
		[
			{
				id: key,
				type: 'dataset',
				title: fullTitle,
				author: [{ literal: AUTHOR }],
				publisher: PUBLISHER,
				number: entry.accession,
				version: String(entry.version),
				issued: { 'date-parts': [dateParts(approved)] },
				accessed: { 'date-parts': [dateParts(entry.accessed)] },
				URL: entry.permalink
			}
		],
		null,
		2
	);

	const text = `${AUTHOR} (${year}). ${fullTitle}. ${PUBLISHER}. ${entry.permalink} (accessed ${accessed}).`;

	return { bibtex, ris, cslJson, text };
}
