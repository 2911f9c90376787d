import type { Browser } from 'playwright-core';
import { parse, type DefaultTreeAdapterMap } from 'parse5';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { Cite } from '@citation-js/core';
import '@citation-js/plugin-bibtex';
import '@citation-js/plugin-ris';
import type { Page as ApiPage, PotentialDto } from '$lib/catalogue/dto';
import { launchChromium } from '../support/browser';
import { signInCookie } from '../support/session';

/*
 * Citations and page metadata against the production build, read by independent parsers:
 * the download files (citation-js), content negotiation on permalinks, and the <head> of entry
 * pages (parse5, the WHATWG HTML parser; JSON-LD with JSON.parse).
 */
const base = inject('baseUrl');
let accession = '';
let latest = 0;

beforeAll(async () => {
	const list = (await (
		await fetch(`${base}/api/v1/potentials?limit=500`)
	).json()) as ApiPage<PotentialDto>;
	const withSource = list.items.find((p) => p.source !== null && p.version >= 2);
	if (!withSource) throw new Error('the demo has a revised potential with a source');
	accession = withSource.accession;
	latest = withSource.version;
});

const FILES = {
	bib: { type: 'application/x-bibtex; charset=utf-8', parser: '@biblatex/text' },
	ris: { type: 'application/x-research-info-systems; charset=utf-8', parser: '@ris/file' },
	json: { type: 'application/vnd.citationstyles.csl+json; charset=utf-8', parser: null }
} as const;

/** Today somewhere on Earth for sure: the server's UTC date. */
const today = () => new Date().toISOString().slice(0, 10);

describe('citation files', () => {
	for (const [extension, file] of Object.entries(FILES)) {
		it(`cite.${extension} downloads with its type and name, holding the record and its paper`, async () => {
			const url = `${base}/e/${accession}/v1/cite.${extension}`;
			const res = await fetch(url);
			expect(res.status).toBe(200);
			expect(res.headers.get('content-type')).toBe(file.type);
			expect(res.headers.get('content-disposition')).toBe(
				`attachment; filename="${accession}-v1.${extension}"`
			);
			const body = await res.text();
			const items = file.parser
				? (await Cite.async(body, { forceType: file.parser })).data
				: (JSON.parse(body) as { id: string; type: string; URL?: string; DOI?: string }[]);
			expect(items).toHaveLength(2);
			expect(items[0]?.URL).toBe(`${base}/e/${accession}/v1`);
			expect(items[1]?.DOI).toMatch(/^10\.5555\//);
			// Frozen: no access date from the server, the same bytes on every request.
			expect(body).not.toMatch(/urldate|accessed|Y2 {2}-/i);
			expect(await (await fetch(url)).text()).toBe(body);
		});
	}

	it('names the access date the page passes, and refuses one that is today nowhere', async () => {
		const dated = await fetch(`${base}/e/${accession}/v1/cite.bib?accessed=${today()}`);
		expect(await dated.text()).toContain(`urldate = {${today()}}`);
		for (const query of ['accessed=2001-01-01', 'accessed=yesterday', 'accessed=2026-02-30']) {
			const res = await fetch(`${base}/e/${accession}/v1/cite.bib?${query}`);
			expect(res.status, query).toBe(400);
			const body = (await res.json()) as { error: { code: string; fields: object } };
			expect(body.error.code).toBe('bad_request');
			expect(Object.keys(body.error.fields)).toEqual(['accessed']);
		}
		expect((await fetch(`${base}/e/${accession}/v1/cite.bib?style=apa`)).status).toBe(400);
	});

	it('answers 404 for a version or entry that is not there, and sends the latest on', async () => {
		expect((await fetch(`${base}/e/${accession}/v99/cite.bib`)).status).toBe(404);
		expect((await fetch(`${base}/e/HL999999/v1/cite.ris`)).status).toBe(404);
		expect((await fetch(`${base}/e/${accession}/v1/cite.txt`)).status).toBe(404);
		const res = await fetch(`${base}/e/${accession}/cite.ris?accessed=${today()}`, {
			redirect: 'manual'
		});
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe(
			`/e/${accession}/v${latest}/cite.ris?accessed=${today()}`
		);
	});
});

describe('content negotiation on the permalink', () => {
	it.each([
		['application/x-bibtex', 'cite.bib', 'application/x-bibtex; charset=utf-8'],
		[
			'application/x-research-info-systems',
			'cite.ris',
			'application/x-research-info-systems; charset=utf-8'
		],
		[
			'application/vnd.citationstyles.csl+json',
			'cite.json',
			'application/vnd.citationstyles.csl+json; charset=utf-8'
		]
	])('Accept: %s is sent to the version’s %s', async (accept, file, type) => {
		const res = await fetch(`${base}/e/${accession}/v1`, {
			headers: { accept },
			redirect: 'manual'
		});
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe(`/e/${accession}/v1/${file}`);
		const followed = await fetch(`${base}/e/${accession}/v1`, { headers: { accept } });
		expect(followed.headers.get('content-type')).toBe(type);
		expect(await followed.text()).toBe(
			await (await fetch(`${base}/e/${accession}/v1/${file}`)).text()
		);
	});

	it('Accept: application/json is sent to the entry in the API, the latest to its version', async () => {
		const res = await fetch(`${base}/e/${accession}`, {
			headers: { accept: 'application/json' },
			redirect: 'manual'
		});
		expect(res.headers.get('location')).toBe(`/api/v1/entries/${accession}?version=${latest}`);
		const entry = (await (
			await fetch(`${base}/e/${accession}/v1`, { headers: { accept: 'application/json' } })
		).json()) as { accession: string; version: number };
		expect([entry.accession, entry.version]).toEqual([accession, 1]);
	});

	it('anything else gets the page, which says it varies with Accept', async () => {
		for (const accept of ['*/*', 'text/html,application/xhtml+xml;q=0.9,*/*;q=0.8', 'image/png']) {
			const res = await fetch(`${base}/e/${accession}/v1`, { headers: { accept } });
			expect(res.status, accept).toBe(200);
			expect(res.headers.get('content-type')).toBe('text/html; charset=utf-8');
			expect(res.headers.get('vary')).toMatch(/\bAccept\b/);
		}
	});

	it('a hidden or unknown entry is 404 whatever is asked for', async () => {
		const res = await fetch(`${base}/e/HL999999/v1`, {
			headers: { accept: 'application/x-bibtex' },
			redirect: 'manual'
		});
		expect(res.status).toBe(404);
	});
});

type Element = DefaultTreeAdapterMap['element'];
type Node = DefaultTreeAdapterMap['node'];

function elements(node: Node, tag: string, found: Element[] = []): Element[] {
	if ('tagName' in node && node.tagName === tag) found.push(node);
	if ('childNodes' in node) for (const child of node.childNodes) elements(child, tag, found);
	if ('content' in node && node.content) elements(node.content, tag, found);
	return found;
}
const attr = (el: Element, name: string) => el.attrs.find((a) => a.name === name)?.value;

async function headOf(path: string) {
	const res = await fetch(base + path);
	expect(res.headers.get('content-type')).toBe('text/html; charset=utf-8');
	const document = parse(await res.text());
	const [head] = elements(document, 'head');
	if (!head) throw new Error('no <head>');
	const meta = (key: string) =>
		elements(head, 'meta')
			.filter((m) => attr(m, 'name') === key || attr(m, 'property') === key)
			.map((m) => attr(m, 'content'));
	const links = elements(head, 'link').map((l) => ({
		rel: attr(l, 'rel'),
		href: attr(l, 'href'),
		type: attr(l, 'type')
	}));
	const scripts = elements(head, 'script').filter((s) => attr(s, 'type') === 'application/ld+json');
	const jsonLd = scripts.map((s) =>
		JSON.parse(s.childNodes.map((c) => ('value' in c ? c.value : '')).join(''))
	);
	return { meta, links, jsonLd };
}

describe('the head of an entry page', () => {
	it('points every reader at the versioned permalink, the JSON and each citation format', async () => {
		for (const path of [`/e/${accession}`, `/e/${accession}/v${latest}`]) {
			const { links } = await headOf(path);
			expect(links).toContainEqual({
				rel: 'canonical',
				href: `${base}/e/${accession}/v${latest}`,
				type: undefined
			});
			expect(links.filter((l) => l.rel === 'alternate').map((l) => l.type)).toEqual([
				'application/json',
				'application/x-bibtex',
				'application/x-research-info-systems',
				'application/vnd.citationstyles.csl+json'
			]);
			for (const link of links.filter((l) => l.rel === 'alternate')) {
				const res = await fetch(`${base}${link.href}`);
				expect(res.status, link.href).toBe(200);
				expect(res.headers.get('content-type')).toContain(link.type);
			}
		}
	});

	it('carries Highwire, Dublin Core and Open Graph tags for the version', async () => {
		const { meta } = await headOf(`/e/${accession}/v1`);
		expect(meta('citation_title')).toHaveLength(1);
		expect(meta('citation_author').length).toBeGreaterThan(0);
		expect(meta('citation_publication_date')[0]).toMatch(/^\d{4}\/\d{2}\/\d{2}$/);
		expect(meta('citation_version')).toEqual(['1']);
		expect(meta('citation_public_url')).toEqual([`${base}/e/${accession}/v1`]);
		expect(meta('citation_reference')[0]).toMatch(/citation_doi=10\.5555\//);
		expect(meta('DC.identifier')).toEqual([`${base}/e/${accession}/v1`]);
		expect(meta('DC.title')).toEqual(meta('citation_title'));
		expect(meta('DC.type')).toEqual(['Dataset']);
		expect(meta('og:title')[0]).toContain(`(${accession}, version 1)`);
		expect(meta('og:description')[0]).toMatch(
			new RegExp(`^Potential record ${accession}, version 1`)
		);
	});

	it('describes the version in JSON-LD as a schema.org Dataset', async () => {
		const { jsonLd } = await headOf(`/e/${accession}/v1`);
		expect(jsonLd).toHaveLength(1);
		const ld = jsonLd[0];
		for (const key of [
			'@context',
			'@type',
			'name',
			'url',
			'version',
			'identifier',
			'citation',
			'isBasedOn',
			'creator',
			'publisher'
		]) {
			expect(ld, key).toHaveProperty([key]);
		}
		expect(ld['@type']).toBe('Dataset');
		expect(ld.version).toBe('1');
		expect(ld.identifier).toContain(`${base}/e/${accession}/v1`);
		expect(ld.citation['@id']).toMatch(/^https:\/\/doi\.org\/10\.5555\//);
		expect(ld.isBasedOn.map((b: { url: string }) => b.url)).toEqual(
			expect.arrayContaining([expect.stringMatching(new RegExp(`^${base}/e/HL\\d+/v\\d+$`))])
		);
	});
});

describe('the Cite box in Chromium', () => {
	let browser: Browser;
	beforeAll(async () => {
		browser = await launchChromium();
	});
	afterAll(async () => browser?.close());

	// At any instant one of these zones has a calendar date other than UTC's (UTC+14, UTC−11).
	it.each(['Pacific/Kiritimati', 'Pacific/Pago_Pago'])(
		'takes the access date from the reader’s calendar (%s)',
		async (timezoneId) => {
			const context = await browser.newContext({ baseURL: base, timezoneId });
			await context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: base });
			const page = await context.newPage();
			const problems: string[] = [];
			page.on('console', (m) => m.type() === 'error' && problems.push(m.text()));
			await page.goto(`/e/${accession}/v1`);
			const local = await page.evaluate(() => {
				const d = new Date();
				return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
			});
			expect(local).toBe(
				new Intl.DateTimeFormat('en-CA', { timeZone: timezoneId }).format(new Date())
			);
			await page.getByTestId('cite-accessed').filter({ hasText: local }).waitFor();
			await page.getByTestId('cite-formats').click();
			await page.getByTestId('cite-copy-bib').click();
			await page.getByTestId('cite-status').filter({ hasText: 'BibTeX copied' }).waitFor();
			expect(await page.evaluate(() => navigator.clipboard.readText())).toContain(
				`urldate = {${local}}`
			);
			expect(await page.getByTestId('cite-text-record').textContent()).toContain(
				`(accessed ${local})`
			);
			const href = await page.getByTestId('cite-download-bib').getAttribute('href');
			expect(href).toBe(`/e/${accession}/v1/cite.bib?accessed=${local}`);
			const download = await page.evaluate(async (url) => (await fetch(url)).status, href ?? '');
			expect(download).toBe(200);
			expect(problems).toEqual([]);
			await context.close();
		}
	);

	it('without scripts names no access date, and the download links still work', async () => {
		const context = await browser.newContext({ baseURL: base, javaScriptEnabled: false });
		const page = await context.newPage();
		await page.goto(`/e/${accession}/v1`);
		expect(await page.getByTestId('cite-accessed').textContent()).toContain('No access date');
		expect(await page.getByTestId('cite-text-record').textContent()).not.toContain('accessed');
		expect(await page.getByTestId('cite-copy-bib').count()).toBe(0);
		const href = await page.getByTestId('cite-download-ris').getAttribute('href');
		expect(href).toBe(`/e/${accession}/v1/cite.ris`);
		await page.screenshot({ path: 'test-results/cite-without-scripts.png', fullPage: true });
		await context.close();
	});
});

describe('an ORCID iD on /account', () => {
	let cookie = '';
	beforeAll(async () => {
		cookie = await signInCookie(base, 'reader@demo.hopline.test', 'demo-reader-pass');
	});
	const send = (orcid: string) =>
		fetch(`${base}/account?/orcid`, {
			method: 'POST',
			headers: {
				origin: base,
				cookie,
				'content-type': 'application/x-www-form-urlencoded',
				'x-sveltekit-action': 'true'
			},
			body: new URLSearchParams({ orcid })
		});

	it('refuses a wrong check character with the one expected, and saves a good iD', async () => {
		const refused = await (await send('0000-0002-1825-0098')).json();
		expect(refused).toMatchObject({ type: 'failure', status: 400 });
		expect(JSON.stringify(refused)).toContain('its last character should be 7');
		const saved = await (await send('https://orcid.org/0000-0002-1825-0097')).json();
		expect(saved).toMatchObject({ type: 'success' });
		const page = await (await fetch(`${base}/account`, { headers: { cookie } })).text();
		expect(page).toContain('https://orcid.org/0000-0002-1825-0097');
		expect((await (await send('')).json()).type).toBe('success');
	});
});
