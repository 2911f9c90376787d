import { readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { CITATION_FILE_EXTENSIONS } from '$lib/catalogue/citation';
import { match as accession } from '../../src/params/accession';
import { match as attachmentVariant } from '../../src/params/attachmentVariant';
import { match as citeFormat } from '../../src/params/citeFormat';
import { match as id } from '../../src/params/id';
import { match as kind } from '../../src/params/kind';
import { match as version } from '../../src/params/version';

// Every route matcher in src/params, each with what it takes and what it refuses.
const MATCHERS: Record<string, { match: (param: string) => boolean; yes: string[]; no: string[] }> =
	{
		accession: {
			match: accession,
			yes: ['HL000123', 'HL999999', 'HL1000000'],
			no: ['HL12', 'hl000123', 'HL0000123', 'HL0100000', 'HL00012A', ' HL000123', '']
		},
		attachmentVariant: {
			match: attachmentVariant,
			yes: ['original', 'preview', 'thumbnail', 'data'],
			no: ['Original', 'thumb', 'Data', 'numbers', '../original', '']
		},
		citeFormat: {
			match: citeFormat,
			yes: ['bib', 'ris', 'json'],
			no: ['BIB', 'bibtex', 'txt', 'csl', 'bib ', '']
		},
		id: {
			match: id,
			yes: ['1', '42', '9999999999'],
			no: ['0', '01', '-1', '1.5', 'x', '12345678901', '']
		},
		kind: {
			match: kind,
			// The shape only: the route answers 404 for a well-formed name that is no kind.
			yes: ['potential', 'spin_record', 'distance', 'centre', 'protein', 'source', 'potentials'],
			no: ['spin-record', 'Potential', '_potential', 'x'.repeat(41), '']
		},
		version: {
			match: version,
			yes: ['v1', 'v2', 'v12'],
			no: ['v0', 'v01', '2', 'v', 'v1a', 'v-1', 'V1', '']
		}
	};

describe('route matchers (src/params)', () => {
	it('are all listed here', () => {
		const files = readdirSync('src/params')
			.filter((f) => f.endsWith('.ts') && !f.endsWith('.test.ts'))
			.map((f) => f.replace(/\.ts$/, ''))
			.sort();
		expect(Object.keys(MATCHERS).sort()).toEqual(files);
	});
	it('citeFormat takes exactly the citation formats of $lib/catalogue/citation', () => {
		expect([...CITATION_FILE_EXTENSIONS].sort()).toEqual(MATCHERS.citeFormat?.yes.sort());
	});
	for (const [name, { match, yes, no }] of Object.entries(MATCHERS)) {
		it(`${name} takes ${yes.join(', ')}`, () => {
			for (const param of yes) expect(match(param), param).toBe(true);
		});
		it(`${name} refuses ${no.map((x) => JSON.stringify(x)).join(', ')}`, () => {
			for (const param of no) expect(match(param), param).toBe(false);
		});
	}
});
