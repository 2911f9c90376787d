import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium, signedInPage } from '../support/browser';
import { signInCookie } from '../support/session';

// Hostile CSV files against the production build (default limits: 200 columns, 65 536
// characters a row, 10 000 a cell, 200 000 rows): each is refused with a 413 that names the row
// and the limit, through the API, on the upload page beside the file field, and in the browser
// preview, which stops as soon as it meets the limit.
const base = inject('baseUrl');
const dir = mkdtempSync(join(tmpdir(), 'hopline-csv-limits-'));
let cookie = '';
let browser: Browser;

/** 10 MB: a header of five million empty columns. */
const WIDE = ','.repeat(10 * 1024 * 1024);
const WIDE_MESSAGE =
	'Row 1 has more than 200 columns, the limit per file; delete unused columns (spreadsheets sometimes export empty ones) and try again.';

beforeAll(async () => {
	cookie = await signInCookie(base, 'contributor@demo.hopline.test', 'demo-contributor-pass');
	browser = await launchChromium();
});
afterAll(async () => {
	await browser?.close();
	rmSync(dir, { recursive: true, force: true });
});

async function checkThroughApi(text: string) {
	const form = new FormData();
	form.set('kind', 'potential');
	form.set('file', new Blob([text], { type: 'text/csv' }), 'hostile.csv');
	const res = await fetch(`${base}/api/v1/uploads/check`, {
		method: 'POST',
		headers: { origin: base, cookie },
		body: form
	});
	return {
		status: res.status,
		body: (await res.json()) as { error: { code: string; message: string; fields?: unknown } }
	};
}

describe('hostile CSV files through POST /api/v1/uploads/check', () => {
	it('5 million empty columns: 413 naming row 1 and the column limit', async () => {
		const { status, body } = await checkThroughApi(WIDE);
		expect(status).toBe(413);
		expect(body).toEqual({
			error: { code: 'payload_too_large', message: WIDE_MESSAGE, fields: { file: [WIDE_MESSAGE] } }
		});
	});
	it('one huge quoted cell (a quote never closed): 413 naming its row', async () => {
		const { status, body } = await checkThroughApi(
			`centreAccession,couple,reportedValue\nHL000013,"${'x'.repeat(5_000_000)}\n`
		);
		expect(status).toBe(413);
		expect(body.error.message).toBe(
			'Row 2 has a cell longer than 10,000 characters, the limit for one cell. The cell starts with a quote: check that every quote is closed.'
		);
	});
	it('millions of rows of one comma each: 413 at the row limit', async () => {
		const { status, body } = await checkThroughApi(
			`centreAccession,couple\n${',\n'.repeat(3_000_000)}`
		);
		expect(status).toBe(413);
		expect(body.error.message).toContain('more than 200,000 rows after the header');
	});
	it('a row too long: 413 naming the row and the limit', async () => {
		const cells = Array.from({ length: 20 }, () => 'y'.repeat(5000)).join(',');
		const { status, body } = await checkThroughApi(
			`centreAccession,couple\nHL000013,x\n${cells}\n`
		);
		expect(status).toBe(413);
		expect(body.error.message).toBe(
			'Row 3 is longer than 65,536 characters, the limit for one row.'
		);
	});
});

describe('hostile CSV files on the upload page, in Chromium', () => {
	it('the preview stops with the limit, and the check answers beside the file field', async () => {
		const path = join(dir, 'wide.csv');
		writeFileSync(path, WIDE);
		const page = await signedInPage(
			browser,
			base,
			'contributor@demo.hopline.test',
			'demo-contributor-pass'
		);
		await page.goto('/submissions/upload');
		await page.locator('input[type=file]').setInputFiles(path);
		await page.getByTestId('preview-error').waitFor();
		expect((await page.getByTestId('preview-error').textContent())?.trim()).toBe(WIDE_MESSAGE);
		expect(await page.getByTestId('csv-preview').count()).toBe(0);
		await page.getByRole('button', { name: 'Check only' }).click();
		await page.locator('[data-field-error=file]').waitFor();
		expect(await page.locator('[data-field-error=file]').textContent()).toBe(WIDE_MESSAGE);
		expect(await page.getByTestId('upload-report').count()).toBe(0);
	});
});
