import { describe, expect, inject, it } from 'vitest';
import type { PotentialDto, Page } from '$lib/catalogue/dto';
import type { ApiErrorBody } from '$lib/schemas/apiError';

const base = inject('baseUrl');
const get = (path: string) => fetch(base + path);

describe('read API over HTTP (production build)', () => {
	it('lists potentials filtered by kind and Em range', async () => {
		const res = await get('/api/v1/potentials?kind=fe4s4&emMin=-350&emMax=-250&sort=em');
		expect(res.status).toBe(200);
		const body = (await res.json()) as Page<PotentialDto>;
		expect(body.total).toBeGreaterThan(0);
		for (const p of body.items) {
			expect(p.centre.cofactorKind).toBe('fe4s4');
			expect(p.emMvShe).toBeGreaterThanOrEqual(-350);
			expect(p.emMvShe).toBeLessThanOrEqual(-250);
		}
	});
	it('pages with limit and cursor until the end', async () => {
		const seen = new Set<string>();
		let url: string | null = `${base}/api/v1/potentials?limit=7`;
		let total = 0;
		while (url) {
			const body = (await (await fetch(url)).json()) as Page<PotentialDto> & {
				links: { next: string | null };
			};
			total = body.total;
			for (const p of body.items) seen.add(p.accession);
			// Absolute, so a client follows it as it is.
			if (body.links.next) expect(body.links.next.startsWith(`${base}/api/v1/`)).toBe(true);
			url = body.links.next;
		}
		expect(seen.size).toBe(total);
	});
	it('answers bad parameters with 400 naming each field', async () => {
		const res = await get(
			'/api/v1/potentials?emMin=low&phMax=15&kind=fe5s5&sort=colour&limit=9999'
		);
		expect(res.status).toBe(400);
		const body = (await res.json()) as ApiErrorBody;
		expect(body.error.code).toBe('bad_request');
		expect(Object.keys(body.error.fields ?? {}).sort()).toEqual([
			'emMin',
			'kind',
			'limit',
			'phMax',
			'sort'
		]);
	});
	it('answers an unknown accession or version with 404 in the same shape', async () => {
		const missing = await get('/api/v1/entries/HL999999');
		expect(missing.status).toBe(404);
		expect(((await missing.json()) as ApiErrorBody).error.code).toBe('not_found');
		const list = (await (await get('/api/v1/potentials?limit=1')).json()) as Page<PotentialDto>;
		const noVersion = await get(`/api/v1/entries/${list.items[0]?.accession}?version=40`);
		expect(noVersion.status).toBe(404);
		const badVersion = await get(`/api/v1/entries/${list.items[0]?.accession}?version=first`);
		expect(badVersion.status).toBe(400);
		const nowhere = await get('/api/v1/no-such-thing');
		expect(nowhere.status).toBe(404);
		expect(((await nowhere.json()) as ApiErrorBody).error.code).toBe('not_found');
	});
	it('serves CSV with the total and units in the header', async () => {
		const res = await get('/api/v1/potentials?format=csv&limit=5');
		expect(res.headers.get('content-type')).toMatch(/text\/csv/);
		expect(Number(res.headers.get('x-total-count'))).toBeGreaterThanOrEqual(40);
		const [header, ...rows] = (await res.text()).trim().split('\r\n');
		expect(header).toContain('em_mv_vs_she');
		expect(rows).toHaveLength(5);
	});
	it('serves other resources with their own filters', async () => {
		for (const path of [
			'/api/v1/proteins',
			'/api/v1/centres?kind=heme_c',
			'/api/v1/spin-records?spin=0.5',
			'/api/v1/distances?edgeMax=10'
		]) {
			const res = await get(path);
			expect(res.status, path).toBe(200);
			expect(((await res.json()) as Page<unknown>).total, path).toBeGreaterThan(0);
		}
	});
	it('never crashes a page on odd URLs', async () => {
		for (const path of [
			'/search?emMin=%00',
			'/search?page=-1',
			'/search?kind=' + 'x'.repeat(5000),
			'/e/HL000001/v0',
			'/e/%E0%A4%A',
			'/search?q=%5B%5D%28%29%2A'
		]) {
			const res = await get(path);
			expect(res.status, path).toBeLessThan(500);
		}
	});
});
