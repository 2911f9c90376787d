import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium, signedInPage } from '../support/browser';
import { readDemoMail } from '../support/demoMail';

/**
 * The curation story in real Chromium: a contributor's value with a range warning goes to the
 * curator by e-mail, comes back with a comment, is fixed, approved, and appears at its permalink
 * and in search; an embargoed value stays hidden from signed-out readers everywhere.
 */
const base = inject('baseUrl');
let browser: Browser;
let contributor: Page;
let curator: Page;
let admin: Page;
let visitor: Page;

const mailTo = (to: string, subject: RegExp) => readDemoMail(admin, to, subject);
const signedIn = (email: string, password: string) => signedInPage(browser, base, email, password);

/** A demo [4Fe-4S] centre with an approved 2+/1+ potential at pH 7, and that potential. */
async function demoCentre(): Promise<{ centre: string; emMvShe: number }> {
	const res = await fetch(`${base}/api/v1/potentials?kind=fe4s4&phMin=7&phMax=7&limit=50`);
	const body = (await res.json()) as {
		items: { centre: { accession: string }; couple: string; emMvShe: number }[];
	};
	const p = body.items.find((i) => i.couple === '[4Fe-4S]2+/1+');
	if (!p) throw new Error('no demo [4Fe-4S]2+/1+ potential at pH 7');
	return { centre: p.centre.accession, emMvShe: p.emMvShe };
}

async function fillPotential(page: Page, values: Record<string, string>) {
	for (const [name, value] of Object.entries(values)) {
		const field = page.locator(`[name="${name}"]`);
		if ((await field.evaluate((el) => el.tagName)) === 'SELECT') await field.selectOption(value);
		else await field.fill(value);
	}
}

beforeAll(async () => {
	browser = await launchChromium();
	admin = await signedIn('admin@demo.hopline.test', 'demo-admin-pass');
	contributor = await signedIn('contributor@demo.hopline.test', 'demo-contributor-pass');
	curator = await signedIn('curator@demo.hopline.test', 'demo-curator-pass');
	visitor = await (await browser.newContext({ baseURL: base })).newPage();
});
afterAll(async () => browser?.close());

describe('curation, end to end', () => {
	let submissionUrl = '';
	let accession = '';
	let target: { centre: string; emMvShe: number };

	it('lets the contributor record an ORCID iD for the citations of what they contribute', async () => {
		await contributor.goto('/account');
		const form = contributor.getByTestId('orcid-form');
		await form.getByLabel('ORCID iD').fill('0000-0002-1825-0098');
		await form.getByRole('button', { name: 'Save' }).click();
		await form.locator('[data-field-error=orcid]').waitFor();
		expect(await form.locator('[data-field-error=orcid]').textContent()).toContain(
			'its last character should be 7'
		);
		await form.getByLabel('ORCID iD').fill('https://orcid.org/0000-0002-1825-0097');
		await form.getByRole('button', { name: 'Save' }).click();
		await form.getByRole('status').waitFor();
		expect(await form.textContent()).toContain('https://orcid.org/0000-0002-1825-0097');
	});

	it('shows the contributor a range warning with its source after submitting', async () => {
		target = await demoCentre();
		await contributor.goto('/submissions/new/potential');
		// Empty required fields are named by the server too (the browser's own check set aside).
		await contributor
			.getByTestId('entry-form')
			.evaluate((f) => ((f as HTMLFormElement).noValidate = true));
		await contributor.getByRole('button', { name: 'Submit for review' }).click();
		await contributor.getByTestId('form-alert').waitFor();
		expect(await contributor.locator('[data-field-error=centreAccession]').textContent()).toContain(
			'required'
		);

		await fillPotential(contributor, {
			centreAccession: target.centre,
			couple: '[4Fe-4S]2+/1+',
			reportedValue: '+250',
			reportedUnit: 'mV',
			referenceElectrode: 'SHE',
			ph: '7.5',
			temperatureK: '25 °C',
			method: 'epr_titration',
			uncertaintyMv: '10',
			changeNote: 'From our 2026 titration series'
		});
		// Warnings are shown before anything is sent; submitting again sends it as it is.
		await contributor.getByRole('button', { name: 'Submit for review' }).click();
		await contributor.getByTestId('unseen-warnings').waitFor();
		await contributor.getByRole('button', { name: 'Submit for review' }).click();
		await contributor.getByTestId('notice').waitFor();
		submissionUrl = contributor.url().split('?')[0] ?? '';
		expect(submissionUrl).toMatch(/\/submissions\/\d+$/);
		const warning = contributor.locator('[data-warning=range]');
		expect(await warning.textContent()).toContain('above the typical range');
		expect(await warning.textContent()).toContain('Liu et al.');
		accession =
			(await contributor.getByTestId('proposed-version').getAttribute('data-accession')) ?? '';
		expect(accession).toMatch(/^HL\d{6}$/);
		await contributor.screenshot({ path: 'test-results/curation-submitted.png', fullPage: true });
		// Not approved: invisible to a signed-out reader.
		expect((await fetch(`${base}/e/${accession}`)).status).toBe(404);
	});

	it('mails the curator, who returns it with a comment from the review page', async () => {
		const id = submissionUrl.split('/').pop();
		const mail = await mailTo('curator@demo.hopline.test', new RegExp(`New submission #${id}`));
		const link = new RegExp(`${base}/review/\\d+`).exec(mail)?.[0];
		expect(link).toBe(`${base}/review/${id}`);
		await curator.goto(link as string);
		expect(await curator.locator('[data-warning=range]').count()).toBe(1);
		// Returning without a comment is refused, by field.
		await curator.getByLabel('Return for changes', { exact: true }).check();
		await curator.getByRole('button', { name: 'Record decision' }).click();
		await curator.locator('[data-field-error=comment]').waitFor();
		await curator.getByLabel('Return for changes', { exact: true }).check();
		await curator
			.locator('textarea[name=comment]')
			.fill('+250 mV is far outside the [4Fe-4S]2+/1+ range: check the sign.');
		await curator.getByRole('button', { name: 'Record decision' }).click();
		await curator.getByTestId('decision-done').waitFor();
		await curator.screenshot({ path: 'test-results/curation-returned.png', fullPage: true });
	});

	it('lets the contributor fix and resubmit, and the curator approve', async () => {
		const mail = await mailTo('contributor@demo.hopline.test', /returned for changes/);
		expect(mail).toContain('check the sign');
		await contributor.goto(submissionUrl);
		expect(await contributor.getByTestId('comments').textContent()).toContain('check the sign');
		await contributor.locator('[name=reportedValue]').fill(String(target.emMvShe - 5));
		await contributor.getByRole('button', { name: 'Submit for review' }).click();
		await contributor.getByTestId('notice').waitFor();
		expect(await contributor.locator('[data-warning]').count()).toBe(0);

		await curator.goto('/review');
		await curator.locator(`[data-submission="${submissionUrl.split('/').pop()}"] a`).click();
		await curator.waitForURL(/\/review\/\d+$/);
		await curator.getByLabel('Approve', { exact: true }).check();
		await curator.getByRole('button', { name: 'Record decision' }).click();
		await curator.getByTestId('decision-done').waitFor();
		expect(await curator.getByTestId('decision-done').textContent()).toContain(`${accession} v1`);
	});

	it('shows the approved value at its permalink and in search, to everyone', async () => {
		await visitor.goto(`/e/${accession}/v1`);
		expect(await visitor.getByTestId('entry-accession').textContent()).toBe(accession);
		const api = (await (
			await fetch(`${base}/api/v1/potentials?centre=${target.centre}&limit=100`)
		).json()) as {
			items: { accession: string }[];
		};
		expect(api.items.map((i) => i.accession)).toContain(accession);
		await visitor.goto(`/search?centre=${target.centre}`);
		await visitor.locator(`tbody a[href="/e/${accession}"]`).first().waitFor();
		const mail = await mailTo('contributor@demo.hopline.test', /approved/);
		expect(mail).toContain(`/e/${accession}/v1`);
		// Its citation names the contributor (with the iD recorded above) and the curator.
		const bib = await (await fetch(`${base}/e/${accession}/v1/cite.bib`)).text();
		expect(bib).toContain('author = {Contributor, Demo}');
		expect(bib).toContain('editor = {Curator, Demo}');
		expect(bib).toContain('Demo Contributor \\url{https://orcid.org/0000-0002-1825-0097}');
	});

	it('keeps an embargoed value from signed-out readers in page, search, API and export', async () => {
		await contributor.goto('/submissions/new/potential');
		await fillPotential(contributor, {
			centreAccession: target.centre,
			couple: '[4Fe-4S]2+/1+',
			reportedValue: String(target.emMvShe),
			reportedUnit: 'mV',
			referenceElectrode: 'SHE',
			ph: '8.5',
			method: 'protein_film_voltammetry'
		});
		await contributor.getByLabel('A group now, everyone from a date').check();
		await contributor
			.locator('select[name=groupId]')
			.selectOption({ label: 'Thermophile redox consortium (demo)' });
		await contributor.locator('input[name=embargoUntil]').fill('2099-01-01');
		await contributor.getByRole('button', { name: 'Submit for review' }).click();
		await contributor.getByTestId('notice').waitFor();
		const embargoed =
			(await contributor.getByTestId('proposed-version').getAttribute('data-accession')) ?? '';
		const id = contributor.url().split('?')[0]?.split('/').pop();
		await curator.goto(`/review/${id}`);
		await curator.getByLabel('Approve', { exact: true }).check();
		await curator.getByRole('button', { name: 'Record decision' }).click();
		await curator.getByTestId('decision-done').waitFor();

		// Signed out: not at the permalink, not in the API (list, entry, CSV), not in search.
		expect((await fetch(`${base}/e/${embargoed}`)).status).toBe(404);
		expect((await fetch(`${base}/api/v1/entries/${embargoed}`)).status).toBe(404);
		const list = await (
			await fetch(`${base}/api/v1/potentials?centre=${target.centre}&limit=100`)
		).text();
		expect(list).not.toContain(embargoed);
		const csv = await (
			await fetch(`${base}/api/v1/potentials?centre=${target.centre}&format=csv&limit=500`)
		).text();
		expect(csv).toContain(accession);
		expect(csv).not.toContain(embargoed);
		await visitor.goto(`/search?centre=${target.centre}`);
		await visitor.locator(`tbody a[href="/e/${accession}"]`).first().waitFor();
		expect(await visitor.locator(`a[href="/e/${embargoed}"]`).count()).toBe(0);

		// A member of the group sees it already.
		await contributor.goto(`/e/${embargoed}`);
		expect(await contributor.getByTestId('entry-accession').textContent()).toBe(embargoed);
	});

	it('lets curators read the audit log of the story', async () => {
		await curator.goto(`/audit?accession=${accession}`);
		const log = (await curator.getByTestId('audit-log').textContent()) ?? '';
		expect(log).toContain(`approved potential ${accession} v1`);
		await curator.goto(`/audit?submission=${submissionUrl.split('/').pop()}`);
		const actions = await curator
			.locator('[data-testid=audit-log] tbody tr')
			.evaluateAll((trs) => trs.map((t) => t.getAttribute('data-action') ?? ''));
		expect(actions.filter((a) => /^(submission|review)\./.test(a))).toEqual([
			'review.approve',
			'submission.resubmit',
			'submission.edit',
			'review.return',
			'submission.submit',
			'submission.create'
		]);
		await curator.screenshot({ path: 'test-results/curation-audit.png', fullPage: true });
	});

	it('fills a source from its DOI, and says why when it cannot', async () => {
		await contributor.goto('/submissions/new/source');
		await contributor.locator('[name=doi]').fill('10.5555/not.registered');
		await contributor.getByRole('button', { name: 'Fill from DOI' }).click();
		await contributor.locator('[data-field-error=doi]').waitFor();
		expect(await contributor.locator('[data-field-error=doi]').textContent()).toContain(
			'no record for DOI 10.5555/not.registered'
		);
		await contributor.locator('[name=doi]').fill('https://doi.org/10.5555/hopline.demo.2026.031');
		await contributor.getByRole('button', { name: 'Fill from DOI' }).click();
		await contributor.getByTestId('doi-filled').waitFor();
		expect(await contributor.locator('[name=title]').inputValue()).toContain('Rieske-type cluster');
		expect(await contributor.locator('[name=authors]').inputValue()).toBe(
			'Moreau, Céline\nAchterberg, Jonas\nOkafor, Adaeze'
		);
		expect(await contributor.locator('[name=year]').inputValue()).toBe('2026');
		await contributor.getByRole('button', { name: 'Save draft' }).click();
		await contributor.getByTestId('notice').waitFor();
		expect(await contributor.getByTestId('version-table').textContent()).toContain(
			'10.5555/hopline.demo.2026.031'
		);
		await contributor.screenshot({
			path: 'test-results/curation-source-draft.png',
			fullPage: true
		});
	});
});
