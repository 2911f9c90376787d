import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { citeRecord } from '$lib/catalogue/citation';
import { POTENTIAL } from '../support/citations';

/*
 * Hopline's BibTeX through a real LaTeX toolchain — Debian's `bibtex` and `pdflatex` (packages
 * texlive-latex-base and its dependencies; .ci/run installs them where it may) — with the
 * classic `plain` style, in a document with LaTeX's default font encoding (OT1) and one with
 * T1. Skipped, saying so, where TeX is not installed.
 */

function which(command: string): boolean {
	return spawnSync('sh', ['-c', `command -v ${command}`]).status === 0;
}
const haveTex = which('pdflatex') && which('bibtex');
if (!haveTex) {
	console.warn(
		'texToolchain.test.ts skipped: pdflatex and bibtex are not installed (apt-get install texlive-latex-base)'
	);
}

/** The hard cases at once: specials, Greek, sub/superscripts, accents, a name no table covers. */
const HOSTILE = citeRecord(
	{
		...POTENTIAL,
		accession: 'HL000047',
		title: 'Em of NADH–FMN α/β {site} #2: 5 Å, 25 °C, ± 3 µM, x_1 ~ y^2, 100% <tail> | → Fe₂S₂²⁺',
		authors: [
			{ name: 'Zoë Ångström-Łukasz', orcid: '0000-0002-1694-233X' },
			{ name: '李小龙', orcid: null }
		],
		original: POTENTIAL.original && {
			...POTENTIAL.original,
			key: 'Nguyen2019_HL000004',
			authors: ['Nguyễn, Thị Minh', 'Çelik, Ömer', 'The Demo Consortium'],
			doi: '10.5555/a_b%c#d'
		}
	},
	'2026-12-02'
).bibtex;

const dir = mkdtempSync(join(tmpdir(), 'hopline-tex-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(command: string, args: string[], cwd: string) {
	const result = spawnSync(command, args, { cwd, encoding: 'utf8', timeout: 60_000 });
	return { status: result.status, output: `${result.stdout}${result.stderr}` };
}

function typeset(name: string, preamble: string) {
	const work = join(dir, name);
	spawnSync('mkdir', ['-p', work]);
	writeFileSync(
		join(work, 'refs.bib'),
		citeRecord(POTENTIAL, '2026-12-02').bibtex + '\n' + HOSTILE
	);
	writeFileSync(
		join(work, 'doc.tex'),
		[
			'\\documentclass{article}',
			preamble,
			'\\usepackage{url}',
			'\\begin{document}',
			'Cited: \\cite{hopline_HL000046_v2,hopline_HL000047_v2}.',
			'\\nocite{*}',
			'\\bibliographystyle{plain}',
			'\\bibliography{refs}',
			'\\end{document}',
			''
		].join('\n')
	);
	const latex = ['-interaction=nonstopmode', '-halt-on-error', 'doc.tex'];
	const steps = [
		run('pdflatex', latex, work),
		run('bibtex', ['doc'], work),
		run('pdflatex', latex, work),
		run('pdflatex', latex, work)
	];
	return {
		steps,
		bbl: readFileSync(join(work, 'doc.bbl'), 'utf8'),
		blg: readFileSync(join(work, 'doc.blg'), 'utf8'),
		log: readFileSync(join(work, 'doc.log'), 'latin1'),
		pdf: join(work, 'doc.pdf')
	};
}

describe.skipIf(!haveTex).each([
	['OT1 (LaTeX default)', ''],
	['T1', '\\usepackage[T1]{fontenc}']
])('bibtex + pdflatex, %s', (name, preamble) => {
	let result: ReturnType<typeof typeset> | undefined;
	beforeAll(() => {
		result = typeset(name.slice(0, 2), preamble);
	}, 120_000);

	it('run to the end without an error', () => {
		const [first, bib, second, third] = result?.steps ?? [];
		expect(first?.status, first?.output).toBe(0);
		// bibtex exits 1 for warnings, 2 and more for errors.
		expect(bib?.status, bib?.output).toBeLessThanOrEqual(1);
		expect(result?.blg).not.toMatch(/error message/);
		expect(second?.status, second?.output).toBe(0);
		expect(third?.status, third?.output).toBe(0);
		expect(result?.log).not.toMatch(/^! /m);
		expect(result?.log).not.toMatch(/Unicode character|Missing character|Undefined control/);
		expect(result?.log).not.toMatch(/Citation .* undefined/);
		expect(existsSync(result?.pdf ?? '') && statSync(result?.pdf ?? '').size).toBeGreaterThan(1000);
	});

	it('keep the case of the titles and print the permalink', () => {
		// plain.bst lower-cases titles outside braces: "[4fe-4s]", "roxa--h", "nadh" without them.
		expect(result?.bbl).toContain('{Em of [4Fe-4S]2+/1+ of FS1 in RoxA--H \\& NADH\\_site');
		expect(result?.bbl).toContain('{Em of NADH--FMN $\\alpha$/$\\beta$');
		expect(result?.bbl).toContain('\\url{https://hopline.example/e/HL000046/v2}');
		expect(result?.bbl).toContain('Accessed 2026-12-02');
	});
});
