import { beforeAll, describe, expect, inject, it } from 'vitest';
import { signInCookie } from '../support/session';

// The submission API: the same schemas and rules as the forms, over JSON.
const base = inject('baseUrl');
let contributor = '';
let reader = '';

function post(cookie: string, body: unknown) {
	return fetch(`${base}/api/v1/submissions`, {
		method: 'POST',
		headers: { origin: base, cookie, 'content-type': 'application/json' },
		body: JSON.stringify(body)
	});
}

beforeAll(async () => {
	contributor = await signInCookie(base, 'contributor@demo.hopline.test', 'demo-contributor-pass');
	reader = await signInCookie(base, 'reader@demo.hopline.test', 'demo-reader-pass');
});

describe('POST /api/v1/submissions', () => {
	it('names every bad field, under data. and visibility.', async () => {
		const res = await post(contributor, {
			kind: 'potential',
			data: { reportedValue: 'minus ten', reportedUnit: 'mV' },
			visibility: { visibility: 'embargoed' }
		});
		expect(res.status).toBe(400);
		const { error } = (await res.json()) as { error: { fields: Record<string, string[]> } };
		expect(error.fields['data.centreAccession']).toEqual(['required']);
		expect(error.fields['data.reportedValue']?.[0]).toMatch(/expected number/);
		expect(error.fields['visibility.embargoUntil']).toEqual(['give the date it becomes public']);
	});
	it('deposits a potential straight into review, with its warnings', async () => {
		const list = (await (await fetch(`${base}/api/v1/potentials?kind=fe4s4&limit=1`)).json()) as {
			items: { centre: { accession: string } }[];
		};
		const centre = list.items[0]?.centre.accession;
		const res = await post(contributor, {
			kind: 'potential',
			data: {
				centreAccession: centre,
				couple: '[4Fe-4S]2+/1+',
				reportedValue: 0.1,
				reportedUnit: 'V',
				referenceElectrode: 'SHE',
				method: 'solution_voltammetry'
			},
			submit: true
		});
		expect(res.status).toBe(201);
		const body = (await res.json()) as {
			id: number;
			accession: string;
			status: string;
			warnings: { kind: string }[];
		};
		expect(body.status).toBe('submitted');
		expect(body.warnings.map((w) => w.kind)).toContain('range');
		expect(res.headers.get('location')).toBe(`/api/v1/submissions/${body.id}`);

		const view = await fetch(`${base}/api/v1/submissions/${body.id}`, {
			headers: { cookie: contributor }
		});
		expect(
			((await view.json()) as { versions: { data: { emMvShe: number } }[] }).versions[0]?.data
				.emMvShe
		).toBe(100);
		// Another reader of the API cannot see it, nor can anyone signed out.
		expect(
			(await fetch(`${base}/api/v1/submissions/${body.id}`, { headers: { cookie: reader } })).status
		).toBe(403);
		expect((await fetch(`${base}/api/v1/submissions/${body.id}`)).status).toBe(401);
	});
	it('refuses readers and signed-out callers', async () => {
		expect((await post(reader, { kind: 'protein', data: {} })).status).toBe(403);
		expect((await post('', { kind: 'protein', data: {} })).status).toBe(401);
	});
});
