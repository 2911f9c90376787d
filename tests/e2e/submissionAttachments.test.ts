import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { connect } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { attachmentAnswerSchema } from '$lib/schemas/attachmentResponse';
import { createPasswordUser } from '$lib/server/auth/users';
import { openDatabase } from '$lib/server/db/connect';
import { migrateToLatest } from '$lib/server/db/migrate';
import { ensureDemoAccounts } from '../../seed/accounts';
import { loadDemoScenario } from '../../seed/load';
import { seriousViolations } from '../support/axe';
import { launchChromium, signedInPage } from '../support/browser';
import { createTokenOnAccount } from '../support/apiTokens';
import { HTML_PAGE, pngOf } from '../support/hostileFiles';
import { startServer, type RunningServer } from '../support/server';
import { signInCookie } from '../support/session';

/*
 * Attaching files to a submission, against the production build on a server of its own (a
 * second contributor, and a small ATTACHMENT_MAX_BYTES so that an oversized upload is cheap):
 * the API driven by curl (multipart built by curl, not by our code), the declared length
 * refused before the body is sent, and the submission page's form in Chromium at 1366 and
 * 390 px (screenshots in test-results/), with axe.
 */

const run = promisify(execFile);
const OTHER = { email: 'second-contributor@lab.test', password: 'second-contributor-pass' };
/** 1 MiB for an image here (the default is 10 MB): the request limit is 1 + 1 MB + 64 KiB. */
const MAX_BYTES = 1024 * 1024;
let server: RunningServer;
let base = '';
let dir = '';
let token = '';
let otherToken = '';
let readToken = '';
let cookie = '';
let png = '';
let numbers = '';
let html = '';

async function newDraft(name: string): Promise<number> {
	const res = await fetch(`${base}/api/v1/submissions`, {
		method: 'POST',
		headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
		body: JSON.stringify({ kind: 'protein', data: { name, organism: 'Testus attachii' } })
	});
	expect(res.status).toBe(201);
	return ((await res.json()) as { id: number }).id;
}

/** curl with the given arguments; the answer's status and body. */
async function curl(args: string[]): Promise<{ status: number; body: string }> {
	const { stdout } = await run('curl', ['-sS', '-w', '\n%{http_code}', ...args], {
		maxBuffer: 1024 * 1024
	});
	const cut = stdout.lastIndexOf('\n');
	return { status: Number(stdout.slice(cut + 1)), body: stdout.slice(0, cut) };
}

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'hopline-attach-'));
	const path = join(dir, 'a.sqlite');
	const db = openDatabase(path);
	await migrateToLatest(db);
	await loadDemoScenario(db);
	await ensureDemoAccounts(db);
	await createPasswordUser(db, { ...OTHER, name: 'Second', role: 'contributor', verified: true });
	await db.destroy();
	server = await startServer(path, { ATTACHMENT_MAX_BYTES: String(MAX_BYTES) });
	base = server.baseUrl;
	cookie = await signInCookie(base, 'contributor@demo.hopline.test', 'demo-contributor-pass');
	token = await createTokenOnAccount(base, cookie, { name: 'files', scope: 'read+submit' });
	readToken = await createTokenOnAccount(base, cookie, { name: 'read only', scope: 'read' });
	const otherCookie = await signInCookie(base, OTHER.email, OTHER.password);
	otherToken = await createTokenOnAccount(base, otherCookie, {
		name: 'other',
		scope: 'read+submit'
	});
	png = join(dir, 'spectrum.png');
	writeFileSync(png, await pngOf(900, 560));
	numbers = join(dir, 'spectrum.csv');
	writeFileSync(
		numbers,
		'Field (mT),Signal (a.u.)\n' +
			Array.from({ length: 400 }, (_, i) => `${320 + i * 0.1},${Math.sin(i / 12).toFixed(4)}`).join(
				'\n'
			) +
			'\n'
	);
	html = join(dir, 'figure.png');
	writeFileSync(html, HTML_PAGE);
}, 180_000);

afterAll(async () => {
	await server?.stop();
	if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('the attachments API, driven by curl', () => {
	it('attaches an image with its numbers (201), lists it on GET, removes it (204)', async () => {
		const id = await newDraft('Curl protein');
		const url = `${base}/api/v1/submissions/${id}/attachments`;
		const res = await curl([
			'-H',
			`Authorization: Bearer ${token}`,
			'-F',
			'kind=epr_spectrum',
			'-F',
			'caption=X-band EPR of the reduced protein',
			'-F',
			'temperature=15',
			'-F',
			'microwaveFrequencyGHz=9.40',
			'-F',
			'microwavePowerMw=2',
			'-F',
			'modulationAmplitudeMt=0.5',
			'-F',
			`file=@${png};type=image/png`,
			'-F',
			`numbers=@${numbers};type=text/csv`,
			url
		]);
		expect(res.status, res.body).toBe(201);
		const a = attachmentAnswerSchema.parse(JSON.parse(res.body));
		expect(a).toMatchObject({
			kind: 'epr_spectrum',
			role: 'image',
			mediaType: 'image/png',
			width: 900,
			height: 560,
			conditions: { temperatureK: 15, microwaveFrequencyGHz: 9.4, modulationAmplitudeMt: 0.5 },
			numbers: { fileName: 'spectrum.csv' },
			urls: { thumbnail: `${base}/files/${a.id}/thumbnail`, data: `${base}/files/${a.id}/data` }
		});
		// Its files answer its contributor, and nobody signed out (a draft's files are private).
		const thumb = await fetch(a.urls.thumbnail as string, { headers: { cookie } });
		expect(thumb.status).toBe(200);
		expect(thumb.headers.get('content-type')).toBe('image/png');
		expect((await fetch(a.urls.original)).status).toBe(404);

		const view = await fetch(`${base}/api/v1/submissions/${id}`, {
			headers: { authorization: `Bearer ${token}` }
		});
		const versions = ((await view.json()) as { versions: { attachments: { id: number }[] }[] })
			.versions;
		expect(versions[0]?.attachments.map((x) => x.id)).toEqual([a.id]);

		// Another contributor's token: the same 404 as for a submission that does not exist.
		const stranger = await curl([
			'-H',
			`Authorization: Bearer ${otherToken}`,
			'-F',
			'kind=other',
			'-F',
			'caption=x',
			'-F',
			`file=@${png}`,
			url
		]);
		expect(stranger.status).toBe(404);
		expect(JSON.parse(stranger.body)).toEqual({
			error: { code: 'not_found', message: `no submission ${id}` }
		});
		const strangerDelete = await curl([
			'-X',
			'DELETE',
			'-H',
			`Authorization: Bearer ${otherToken}`,
			`${url}/${a.id}`
		]);
		expect(strangerDelete.status).toBe(404);
		// A token of scope read may not write.
		const readOnly = await curl([
			'-H',
			`Authorization: Bearer ${readToken}`,
			'-F',
			'kind=other',
			'-F',
			'caption=x',
			'-F',
			`file=@${png}`,
			url
		]);
		expect([401, 403]).toContain(readOnly.status);

		const removed = await curl([
			'-X',
			'DELETE',
			'-H',
			`Authorization: Bearer ${token}`,
			`${url}/${a.id}`
		]);
		expect(removed.status).toBe(204);
		const again = await curl([
			'-X',
			'DELETE',
			'-H',
			`Authorization: Bearer ${token}`,
			`${url}/${a.id}`
		]);
		expect(again.status).toBe(404);
	});

	it('answers 415 for HTML named .png and 400 for conditions of another kind, beside the field', async () => {
		const id = await newDraft('Hostile protein');
		const url = `${base}/api/v1/submissions/${id}/attachments`;
		const hostile = await curl([
			'-H',
			`Authorization: Bearer ${token}`,
			'-F',
			'kind=optical_spectrum',
			'-F',
			'caption=x',
			'-F',
			`file=@${html};type=image/png`,
			url
		]);
		expect(hostile.status).toBe(415);
		expect(JSON.parse(hostile.body).error).toMatchObject({
			code: 'unsupported_media_type',
			fields: { file: [expect.stringMatching(/HTML page, whatever its name says/)] }
		});
		const wrong = await curl([
			'-H',
			`Authorization: Bearer ${token}`,
			'-F',
			'kind=voltammogram',
			'-F',
			'caption=x',
			'-F',
			'microwaveFrequencyGHz=9.4',
			'-F',
			`file=@${png}`,
			url
		]);
		expect(wrong.status).toBe(400);
		expect(JSON.parse(wrong.body).error.fields.conditions).toEqual([
			'microwave frequency, power and modulation apply to EPR spectra only'
		]);
	});

	it('refuses an upload over the limit with 413 naming the limit (curl -F)', async () => {
		const id = await newDraft('Large protein');
		const big = join(dir, 'big.png');
		writeFileSync(big, Buffer.alloc(2 * MAX_BYTES + 200 * 1024, 7));
		const res = await curl([
			'-H',
			`Authorization: Bearer ${token}`,
			'-F',
			'kind=other',
			'-F',
			'caption=x',
			'-F',
			`file=@${big};type=image/png`,
			`${base}/api/v1/submissions/${id}/attachments`
		]);
		expect(res.status).toBe(413);
		expect(JSON.parse(res.body).error).toMatchObject({
			code: 'payload_too_large',
			message: expect.stringMatching(/the limit is 1\.0 MB for the image and 1\.0 MB/)
		});
	});

	it('answers the page’s action over the limit beside its file field (413)', async () => {
		const id = await newDraft('Large page protein');
		const big = join(dir, 'big-page.png');
		writeFileSync(big, Buffer.alloc(2 * MAX_BYTES + 200 * 1024, 7));
		const res = await curl([
			'-H',
			`Cookie: ${cookie}`,
			'-H',
			`Origin: ${base}`,
			'-H',
			'x-sveltekit-action: true',
			'-F',
			'kind=other',
			'-F',
			'caption=x',
			'-F',
			`file=@${big};type=image/png`,
			`${base}/submissions/${id}?/attach`
		]);
		const result = JSON.parse(res.body) as { type: string; status: number; data: string };
		expect(result).toMatchObject({ type: 'failure', status: 413 });
		expect(result.data).toMatch(
			/the limit is 1\.0 MB for the image and 1\.0 MB for its numbers file/
		);
	});

	it('answers a declared length over the limit before any of the body is sent', async () => {
		const id = await newDraft('Declared protein');
		// A raw request: headers only, declaring 200 MB, and not one byte of body.
		const answer = await new Promise<string>((resolve, reject) => {
			const url = new URL(base);
			const socket = connect(Number(url.port), url.hostname, () => {
				socket.write(
					[
						`POST /api/v1/submissions/${id}/attachments HTTP/1.1`,
						`Host: ${url.host}`,
						`Authorization: Bearer ${token}`,
						'Content-Type: multipart/form-data; boundary=x',
						'Content-Length: 200000000',
						'',
						''
					].join('\r\n')
				);
			});
			let text = '';
			socket.setTimeout(5000, () => reject(new Error(`no answer within 5 s: ${text}`)));
			socket.on('data', (d) => {
				text += d;
				if (text.includes('payload_too_large')) {
					socket.destroy();
					resolve(text);
				}
			});
			socket.on('error', reject);
		});
		expect(answer).toMatch(/^HTTP\/1\.1 413/);
		expect(answer).toMatch(/the limit is 1\.0 MB for the image/);
	});
});

describe('the submission page in Chromium', () => {
	let browser: Browser;
	let page: Page;
	let path = '';

	beforeAll(async () => {
		browser = await launchChromium();
		page = await signedInPage(
			browser,
			base,
			'contributor@demo.hopline.test',
			'demo-contributor-pass',
			{
				bypassCSP: true
			}
		);
		path = `/submissions/${await newDraft('Browser protein')}`;
	}, 60_000);
	afterAll(async () => browser?.close());

	async function attach(kind: string, caption: string, files: { file?: string; numbers?: string }) {
		const form = page.getByTestId('attach-form');
		if (!(await form.isVisible())) await page.getByText('Attach a file').click();
		await form.getByLabel('Type', { exact: true }).selectOption({ label: kind });
		await form.getByLabel('Caption', { exact: true }).fill(caption);
		if (files.file) await form.getByLabel('Image', { exact: true }).setInputFiles(files.file);
		if (files.numbers)
			await form.getByLabel('Numbers (optional)', { exact: true }).setInputFiles(files.numbers);
		return form;
	}

	it('attaches a PNG with its numbers and lists it with thumbnail, conditions and sizes', async () => {
		await page.setViewportSize({ width: 1366, height: 900 });
		await page.goto(path);
		const form = await attach('EPR spectrum', 'X-band EPR, reduced with dithionite', {
			file: png,
			numbers
		});
		// Only the conditions of the chosen type are offered once the page's script runs.
		await expect(form.getByLabel('Scan rate (mV/s)', { exact: true }).count()).resolves.toBe(0);
		await form.getByLabel('Temperature', { exact: true }).fill('15');
		await form.getByLabel('Microwave frequency (GHz)', { exact: true }).fill('9,40');
		await form.getByLabel('Microwave power (mW)', { exact: true }).fill('2');
		await form.getByLabel('Modulation amplitude (mT)', { exact: true }).fill('0.5');
		await form.getByRole('button', { name: 'Attach' }).click();
		await page.getByTestId('notice').getByText('File attached.').waitFor();
		const list = page.getByTestId('attachments');
		await expect(list.getByText('X-band EPR, reduced with dithionite').count()).resolves.toBe(1);
		await expect(
			list
				.getByText(
					'temperature 15\u00a0K · microwave frequency 9.4\u00a0GHz · microwave power 2\u00a0mW · modulation amplitude 0.5\u00a0mT'
				)
				.count()
		).resolves.toBe(1);
		await expect(list.getByRole('link', { name: 'spectrum.csv' }).count()).resolves.toBe(1);
		const img = list.locator('img');
		await expect(img.getAttribute('src')).resolves.toMatch(
			/^https?:\/\/[^/]+\/files\/\d+\/thumbnail$/
		);
		await expect(
			img.evaluate((el: HTMLImageElement) => el.complete && el.naturalWidth)
		).resolves.toBe(320);
		await page.screenshot({ path: 'test-results/submission-attachments-1366.png', fullPage: true });
		expect(await seriousViolations(page)).toEqual([]);
	});

	it('shows a hostile file’s message beside the file field, and keeps the caption', async () => {
		const form = await attach('Optical spectrum', 'Not really a PNG', { file: html });
		await form.getByRole('button', { name: 'Attach' }).click();
		const message = form.locator('[data-field-error=file]');
		await message.waitFor();
		await expect(message.textContent()).resolves.toMatch(/HTML page, whatever its name says/);
		await expect(form.getByLabel('Caption', { exact: true }).inputValue()).resolves.toBe(
			'Not really a PNG'
		);
		await page.setViewportSize({ width: 390, height: 844 });
		await page.screenshot({ path: 'test-results/submission-attachments-390.png', fullPage: true });
		expect(await seriousViolations(page)).toEqual([]);
		// Nothing was attached.
		await expect(page.getByTestId('attachments').locator('li').count()).resolves.toBe(1);
	});

	it('removes a file', async () => {
		await page.setViewportSize({ width: 1366, height: 900 });
		await page.goto(path);
		await page.getByRole('button', { name: 'Remove spectrum.png' }).click();
		await page.getByTestId('notice').getByText('File removed').waitFor();
		await expect(
			page.getByTestId('attachments').getByText('No files attached.').count()
		).resolves.toBe(1);
	});

	it('works without JavaScript: every conditions field shows, the empty ones are not refused', async () => {
		const context = await browser.newContext({ baseURL: base, javaScriptEnabled: false });
		await context.addCookies([
			{ name: cookie.split('=')[0]!, value: cookie.slice(cookie.indexOf('=') + 1), url: base }
		]);
		const plain = await context.newPage();
		await plain.goto(path);
		await plain.getByText('Attach a file').click();
		const form = plain.getByTestId('attach-form');
		await expect(form.getByLabel('Scan rate (mV/s)', { exact: true }).count()).resolves.toBe(1);
		await form.getByLabel('Type', { exact: true }).selectOption({ label: 'Voltammogram' });
		await form.getByLabel('Caption', { exact: true }).fill('Protein-film voltammogram');
		await form.getByLabel('Scan rate (mV/s)', { exact: true }).fill('20');
		await form.getByLabel('Reference electrode', { exact: true }).selectOption('SHE');
		await form.getByLabel('Image', { exact: true }).setInputFiles(png);
		await form.getByRole('button', { name: 'Attach' }).click();
		await plain.getByTestId('notice').getByText('File attached.').waitFor();
		await expect(plain.getByText('20 mV/s').count()).resolves.toBe(1);
		await context.close();
	});
});
