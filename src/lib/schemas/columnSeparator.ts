/*
 * Which character separates the two columns of pasted text (titration points, a sampled
 * potential), decided once for the whole text: a tab if any line has one, else a semicolon if any
 * line has one, else spaces when every line is words separated by spaces with no comma beside a
 * space ("−400 0,98", "-400 0.98"), else a comma ("-400,0.98", "-400, 0.98"). The server's reader
 * (schemas/twoColumnText.ts) and the page that converts pasted energies share it, so both
 * read the same cells. Wherever commas do not separate the columns, a comma is a decimal comma.
 */

export type Separator = '\t' | ';' | ',' | ' ';

export function separatorOf(text: string): Separator {
	if (text.includes('\t')) return '\t';
	if (text.includes(';')) return ';';
	const lines = text
		.split(/\r?\n|\r/)
		.map((line) => line.trim())
		.filter((line) => !/^[\s,]*$/.test(line));
	const spaced = (line: string) => /^\S+(\s+\S+)+$/.test(line) && !/,\s|\s,/.test(line);
	return lines.length > 0 && lines.every(spaced) ? ' ' : ',';
}
