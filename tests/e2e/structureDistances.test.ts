import { gzipSync } from 'node:zlib';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium, signedInPage } from '../support/browser';
import { STRUCTURE_PDB } from '../support/structureFixture';

// Distances from a structure in Chromium: upload (gzipped PDB of known geometry, awkwardly
// formatted: tests/support/structureFixture.ts) → match → proposed distances with warnings →
// submit → the curator approves → the distances and the matrix on the protein page.
const base = inject('baseUrl');
let browser: Browser;
let contributor: Page;
let curator: Page;
let hyl = '';

beforeAll(async () => {
	browser = await launchChromium();
	contributor = await signedInPage(
		browser,
		base,
		'contributor@demo.hopline.test',
		'demo-contributor-pass'
	);
	curator = await signedInPage(browser, base, 'curator@demo.hopline.test', 'demo-curator-pass');
	const res = await fetch(`${base}/api/v1/proteins?q=HylSL`);
	const body = (await res.json()) as { items: { accession: string; name: string }[] };
	hyl = body.items.find((p) => p.name.startsWith('HylSL'))!.accession;
});
afterAll(async () => browser?.close());

describe('distances from an uploaded structure, end to end', () => {
	let submissionPath = '';
	it('uploads a gzipped PDB file from the protein page and proposes the match', async () => {
		await contributor.setViewportSize({ width: 1366, height: 900 });
		await contributor.goto(`/e/${hyl}`);
		await contributor
			.getByRole('link', { name: 'Propose distances from a structure file' })
			.click();
		await contributor.waitForURL(/\/submissions\/upload\/structure\?protein=/);
		await contributor.locator('input[type=file]').setInputFiles({
			name: 'hyl-model.pdb.gz',
			mimeType: 'application/gzip',
			buffer: gzipSync(Buffer.from(STRUCTURE_PDB))
		});
		await contributor.getByRole('button', { name: 'Read the file' }).click();
		await contributor.getByTestId('structure-match').waitFor();
		const labels = await contributor
			.locator('[data-testid=structure-group] td:first-child span.font-mono')
			.allTextContents();
		expect(labels).toEqual([
			'SF4 S301',
			'F3S S302A',
			'SF4 S10000',
			'HEM M401',
			'HEM M402',
			'FMN X900'
		]);
		const chosen = await contributor
			.locator('[data-testid=structure-group] select')
			.evaluateAll((els) =>
				els.map((e) => (e as HTMLSelectElement).selectedOptions[0]?.textContent?.split(' (')[0])
			);
		expect(chosen).toEqual([
			'Proximal',
			'Medial',
			'Distal',
			'Heme b1',
			'Heme b2',
			'— not a centre here —'
		]);
		await contributor.screenshot({ path: 'test-results/structure-match-1366.png', fullPage: true });
	});

	it('measures, warns about the demo’s own distances in the same structure, and submits the ticked ones', async () => {
		await contributor.getByLabel('Structure identifier').fill('DS-HYL-02');
		await contributor.getByRole('button', { name: 'Measure distances' }).click();
		await contributor.getByTestId('proposed-distance').first().waitFor();
		expect(await contributor.getByTestId('proposed-distance').count()).toBe(6);
		const first = await contributor.getByTestId('proposed-distance').first().textContent();
		// Hand computation (fixture): Proximal–Medial 9.00 Å between S1 and S1, centres 10.00 Å;
		// the demo records 9.8 Å in DS-HYL-02 (seed/demo.ts): a conflict, said once and unticked.
		expect(first).toContain('9.00 Å');
		expect(first).toMatch(/SF4 S301\sS1 – F3S S302A\sS1/);
		expect(first).toMatch(/HL\d{6}: 9.8 Å in DS-HYL-02\s+— conflicts: same structure/);
		expect(first).not.toContain('already in the registry');
		expect(first?.match(/HL\d{6}/g)).toHaveLength(1);
		expect(await contributor.getByLabel('Submit Proximal – Medial').isChecked()).toBe(false);
		// The four pairs the demo records in DS-HYL-02 unticked, the two new ones ticked.
		const ticked = await contributor
			.locator('[data-testid=proposed-distance] input[name=pair]')
			.evaluateAll((els) => els.map((e) => (e as HTMLInputElement).checked));
		expect(ticked).toEqual([false, false, false, false, true, true]);
		await contributor.screenshot({
			path: 'test-results/structure-proposed-1366.png',
			fullPage: true
		});
		await contributor.setViewportSize({ width: 390, height: 844 });
		await contributor.screenshot({
			path: 'test-results/structure-proposed-390.png',
			fullPage: true
		});
		await contributor.setViewportSize({ width: 1366, height: 900 });

		await contributor.getByLabel('Structure identifier').fill('SYN-E2E-1');
		await contributor.getByRole('button', { name: 'Measure again' }).click();
		await contributor.waitForFunction(() => !document.body.textContent?.includes('left unticked'));
		await contributor.getByLabel('Submit Medial – Heme b1').uncheck();
		await contributor.getByRole('button', { name: 'Submit ticked distances for review' }).click();
		await contributor.waitForURL(/\/submissions\/\d+\?uploaded/);
		submissionPath = new URL(contributor.url()).pathname;
		expect(await contributor.getByTestId('batch-rows').locator('tbody tr').count()).toBe(5);
	});

	it('the curator approves, and the distances and matrix show on the protein page', async () => {
		const id = submissionPath.split('/').pop();
		await curator.goto(`/review/${id}`);
		await curator.getByLabel('Approve (except any rows listed below)').check();
		await curator.getByRole('button', { name: 'Record decision' }).click();
		await curator.getByTestId('batch-done').waitFor();
		expect(await curator.getByTestId('batch-done').textContent()).toContain('5 row(s) approved');

		await curator.setViewportSize({ width: 1366, height: 900 });
		await curator.goto(`/e/${hyl}`);
		const matrix = curator.getByTestId('distance-matrix');
		await matrix.waitFor();
		// Proximal–Distal exists only in the new structure: 19.0 Å, beyond a plausible hop.
		const proxDist = matrix.locator('td[title^="Proximal – Distal"]');
		expect(await proxDist.getAttribute('title')).toMatch(/19\.0\sÅ in SYN-E2E-1/);
		expect(await proxDist.getAttribute('data-hop')).toBe('no');
		// Proximal–Medial: 9.0 Å (new) is shorter than the demo's 9.8 Å, a plausible hop.
		const proxMed = matrix.locator('td[title^="Proximal – Medial"]');
		expect(await proxMed.getAttribute('title')).toContain('SYN-E2E-1');
		expect(await proxMed.getAttribute('data-hop')).toBe('yes');
		// The ladder names the shortest distance between neighbours: 9.0 Å (new) for Proximal–Medial
		// and Medial–Distal, where the demo alone gave 9.8 and 10.3 Å.
		const ladder = await curator.getByRole('img', { name: /^Energy ladder/ }).textContent();
		expect(ladder?.match(/9\.0\sÅ/g)).toHaveLength(2);
		await curator.screenshot({ path: 'test-results/structure-protein-1366.png', fullPage: true });
		await curator.setViewportSize({ width: 390, height: 844 });
		await curator.screenshot({ path: 'test-results/structure-protein-390.png', fullPage: true });
		await matrix.screenshot({ path: 'test-results/structure-matrix-390.png' });
	});

	it('answers hostile and broken files with a clear 4xx over HTTP, and the server stays up', async () => {
		const post = (name: string, buffer: Buffer) =>
			contributor.request.post(`/submissions/upload/structure?protein=${hyl}&/read`, {
				headers: { origin: base, accept: 'application/json' },
				multipart: { file: { name, mimeType: 'application/octet-stream', buffer } }
			});
		const cases: [string, Buffer, number, RegExp][] = [
			['image.pdb', Buffer.from([0x89, 0x50, 0x4e, 0x47, 0xff, 0xfe]), 400, /not text/],
			// 64 MB of spaces packs into about 64 KB: refused at the unpacking cap (30 MB).
			['bomb.pdb.gz', gzipSync(Buffer.alloc(64 * 1024 * 1024, 0x20)), 413, /unpacks to more than/],
			[
				'truncated.gz',
				gzipSync(Buffer.from(STRUCTURE_PDB)).subarray(0, 40),
				400,
				/could not be unpacked/
			],
			['empty.pdb', Buffer.alloc(0), 400, /choose a PDB or mmCIF file/],
			['text.pdb', Buffer.from('HEADER nothing\n'), 400, /no ATOM or HETATM/]
		];
		for (const [name, buffer, status, message] of cases) {
			const res = await post(name, buffer);
			const body = await res.text();
			expect([name, res.status(), message.test(body)]).toEqual([name, 200, true]);
			expect(body).toContain(`"status":${status}`);
		}
		expect((await contributor.request.get('/')).status()).toBe(200);
	});
});
