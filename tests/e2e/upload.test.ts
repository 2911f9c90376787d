import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import '../support/fast-check';
import { launchChromium, signedInPage } from '../support/browser';
import { signInCookie } from '../support/session';
import { UPLOAD_KINDS } from '$lib/kinds';
import { EXAMPLE_ROW_MESSAGE, EXAMPLE_ROW_NOTE } from '$lib/kinds/csvColumns';

// The CSV story in Chromium: three errors, the report, the fix, a dry run, the commit, the
// curator's approval, and the values in search. Plus limits and templates over HTTP.
const base = inject('baseUrl');
let browser: Browser;
let contributor: Page;
let curator: Page;
const dir = mkdtempSync(join(tmpdir(), 'hopline-upload-'));

const signedIn = (email: string, password: string) =>
	signedInPage(browser, base, email, password, { acceptDownloads: true });

beforeAll(async () => {
	browser = await launchChromium();
	contributor = await signedIn('contributor@demo.hopline.test', 'demo-contributor-pass');
	curator = await signedIn('curator@demo.hopline.test', 'demo-curator-pass');
});
afterAll(async () => browser?.close());

describe('CSV upload, end to end', () => {
	let submissionId = '';
	it('reports three errors by row and column, as a table and a downloadable CSV', async () => {
		await contributor.goto('/submissions/upload');
		await contributor
			.locator('input[type=file]')
			.setInputFiles('tests/fixtures/csv/potentials-bad.csv');
		await contributor.getByTestId('csv-preview').waitFor();
		expect(await contributor.getByTestId('csv-preview').textContent()).toContain('4 data rows');
		await contributor.getByRole('button', { name: 'Check only' }).click();
		await contributor.getByTestId('error-count').waitFor();
		expect(await contributor.getByTestId('error-count').textContent()).toContain('3 error(s)');
		const errors = await contributor
			.locator('[data-testid=issues] tr[data-severity=error] td.font-mono')
			.allTextContents();
		expect(errors).toEqual(['2', 'method', '3', 'centreAccession', '4', 'ph']);
		const [download] = await Promise.all([
			contributor.waitForEvent('download'),
			contributor.getByTestId('download-report').click()
		]);
		const report = readFileSync((await download.path()) as string, 'utf8');
		expect(report.split(/\r?\n/)[0]).toBe('row,column,value,severity,message');
		expect(report).toContain('3,centreAccession,HL000999,error,no centre HL000999 in the registry');
		await contributor.screenshot({ path: 'test-results/upload-errors.png', fullPage: true });
	});

	it('checks the fixed file, commits it, and the curator approves every row', async () => {
		const fixed = readFileSync('tests/fixtures/csv/potentials-bad.csv', 'utf8')
			.replace('epr_titraton', 'epr_titration')
			.replace('HL000999', 'HL000013')
			.replace(',15,', ',7.9,');
		const path = join(dir, 'potentials-fixed.csv');
		writeFileSync(path, fixed);
		await contributor.goto('/submissions/upload');
		await contributor.locator('input[type=file]').setInputFiles(path);
		await contributor.getByRole('button', { name: 'Check only' }).click();
		await contributor.getByTestId('would-create').waitFor();
		expect(
			(await contributor.getByTestId('would-create').textContent())?.replace(/\s+/g, ' ')
		).toContain('4 potentials');
		expect(await contributor.getByTestId('dry-run-preview').locator('tbody tr').count()).toBe(4);
		await contributor.getByRole('button', { name: 'Submit for review' }).click();
		await contributor.waitForURL(/\/submissions\/\d+\?uploaded/);
		submissionId = new URL(contributor.url()).pathname.split('/').pop() ?? '';
		expect(await contributor.getByTestId('batch-rows').locator('tbody tr').count()).toBe(4);

		// The same file again is recognised.
		await contributor.goto('/submissions/upload');
		await contributor.locator('input[type=file]').setInputFiles(path);
		await contributor.getByRole('button', { name: 'Check only' }).click();
		await contributor.getByTestId('previous-upload').waitFor();
		expect(await contributor.getByTestId('previous-upload').textContent()).toContain(
			`#${submissionId}`
		);

		await curator.goto(`/review/${submissionId}`);
		await curator.getByLabel('Approve (except any rows listed below)').check();
		await curator.getByRole('button', { name: 'Record decision' }).click();
		await curator.getByTestId('batch-done').waitFor();
		expect(await curator.getByTestId('batch-done').textContent()).toContain('4 row(s) approved');
		await curator.screenshot({ path: 'test-results/upload-approved.png', fullPage: true });
	});

	it('shows the approved values in search', async () => {
		const rows = await curator
			.locator('[data-testid=batch-rows] tbody tr td:nth-child(2) a')
			.allTextContents();
		expect(rows).toHaveLength(4);
		const api = (await (
			await fetch(`${base}/api/v1/potentials?centre=HL000013&limit=100`)
		).json()) as {
			items: { accession: string }[];
		};
		const accessions = api.items.map((i) => i.accession);
		expect(rows.some((a) => accessions.includes(a))).toBe(true);
		const visitor = await (await browser.newContext({ baseURL: base })).newPage();
		await visitor.goto('/search?centre=HL000013');
		const shown = await visitor.locator('table a[href^="/e/HL"]').allTextContents();
		expect(shown.some((a) => rows.includes(a.trim()))).toBe(true);
	});
});

describe('limits, templates and the column reference', () => {
	it('answers 413 with the limit for a file over it, before reading it', async () => {
		const cookie = await signInCookie(
			base,
			'contributor@demo.hopline.test',
			'demo-contributor-pass'
		);
		const form = new FormData();
		form.set('kind', 'potential');
		form.set('file', new Blob(['x'.repeat(21 * 1024 * 1024)], { type: 'text/csv' }), 'big.csv');
		const res = await fetch(`${base}/api/v1/uploads/check`, {
			method: 'POST',
			headers: { origin: base, cookie },
			body: form
		});
		expect(res.status).toBe(413);
		const body = (await res.json()) as { error: { code: string; message: string } };
		expect(body.error.code).toBe('payload_too_large');
		expect(body.error.message).toMatch(/the limit is 20\.0 MB per file/);
	});
	it('never answers a malformed file or form with a server error', async () => {
		const cookie = await signInCookie(
			base,
			'contributor@demo.hopline.test',
			'demo-contributor-pass'
		);
		await fc.assert(
			fc.asyncProperty(
				fc.constantFrom('potential', 'spin_record', 'distance', 'centre', 'nonsense', ''),
				fc.string({ maxLength: 400 }),
				fc.constantFrom(
					'/api/v1/uploads/check',
					'/submissions/upload?/check',
					'/submissions/upload?/commit'
				),
				async (kind, text, path) => {
					const form = new FormData();
					form.set('kind', kind);
					form.set('file', new Blob([`centreAccession,couple,reportedValue\n${text}`]), 'f.csv');
					const res = await fetch(`${base}${path}`, {
						method: 'POST',
						headers: {
							origin: base,
							cookie,
							...(path.includes('?/') ? { 'x-sveltekit-action': 'true' } : {})
						},
						body: form
					});
					await res.arrayBuffer();
					expect(res.status).toBeLessThan(500);
				}
			),
			{ numRuns: 60 }
		);
	});
	it('offers templates whose example row a check refuses as data, and only for that', async () => {
		const cookie = await signInCookie(
			base,
			'contributor@demo.hopline.test',
			'demo-contributor-pass'
		);
		const check = async (kind: string, text: string) => {
			const form = new FormData();
			form.set('kind', kind);
			form.set('file', new Blob([text], { type: 'text/csv' }), `${kind}.csv`);
			const res = await fetch(`${base}/api/v1/uploads/check`, {
				method: 'POST',
				headers: { origin: base, cookie },
				body: form
			});
			return (await res.json()) as {
				errorCount: number;
				issues: { row: number; column: string; message: string; severity: string }[];
			};
		};
		// Every upload kind, a new one included (the table of kinds is the one list of them).
		expect(UPLOAD_KINDS.length).toBeGreaterThanOrEqual(4);
		for (const kind of UPLOAD_KINDS) {
			const res = await fetch(`${base}/csv/templates/${kind}.csv`);
			expect(res.headers.get('content-type')).toContain('text/csv');
			const template = await res.text();
			const body = await check(kind, template);
			const errors = body.issues.filter((i) => i.severity === 'error');
			expect(errors, `${kind}: ${JSON.stringify(body.issues)}`).toEqual([
				expect.objectContaining({ row: 2, column: 'note', message: EXAMPLE_ROW_MESSAGE })
			]);
			// The rest of the row is well formed: without the mark it passes.
			const unmarked = await check(kind, template.replace(EXAMPLE_ROW_NOTE, 'our own row'));
			expect(unmarked.errorCount, `${kind}: ${JSON.stringify(unmarked.issues)}`).toBe(0);
		}
	});
	it('lists every column with its unit and allowed values', async () => {
		const page = await (await browser.newContext({ baseURL: base })).newPage();
		await page.goto('/csv/columns');
		const text = (await page.locator('table[data-kind=potential]').textContent()) ?? '';
		expect(text).toContain('referenceElectrode');
		expect(text).toContain('AgAgCl_sat');
	});
});
