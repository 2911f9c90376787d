import { describe, expect, it } from 'vitest';
import { readAttachmentForm } from '$lib/server/attachments/attachmentForm';
import {
	attachTooLargeMessage,
	attachRequestLimit,
	isAttachRequest
} from '$lib/server/requestLimits';

// The multipart fields of an attachment as the page and the API send them (attachmentForm.ts);
// the oracle is the field list written in that module's header and attachmentMetaSchema's rules.

const png = () => new File([new Uint8Array([0x89, 0x50, 0x4e, 0x47])], 'spectrum.png');
const limits = { maxBytes: 1024 * 1024 };

function form(fields: Record<string, string | File>): FormData {
	const f = new FormData();
	for (const [k, v] of Object.entries(fields)) f.set(k, v);
	return f;
}

describe('readAttachmentForm', () => {
	it('reads conditions from text: °C to K, decimal commas, empty fields as not sent', async () => {
		const r = await readAttachmentForm(
			form({
				kind: 'epr_spectrum',
				caption: '  X-band  ',
				temperature: '25 °C',
				microwaveFrequencyGHz: '9,40',
				microwavePowerMw: '',
				scanRateMvPerS: '',
				referenceElectrode: '',
				file: png(),
				numbers: new File([], '')
			}),
			limits
		);
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		// 25 °C = 298.15 K (the Celsius scale's definition).
		expect(r.input.meta.conditions).toMatchObject({
			temperatureK: 298.15,
			microwaveFrequencyGHz: 9.4,
			microwavePowerMw: null,
			scanRateMvPerS: null
		});
		expect(r.input.meta.caption).toBe('X-band');
		expect(r.input.numbers).toBeNull();
		expect(r.input.numbersOnly).toBe(false);
	});

	it('names each bad field, conditions of another kind included, before reading any file', async () => {
		const r = await readAttachmentForm(
			form({
				kind: 'voltammogram',
				caption: '',
				temperature: 'warm',
				microwaveFrequencyGHz: '9.4',
				scanRateMvPerS: '0x10',
				colour: 'red',
				file: png()
			}),
			limits
		);
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.status).toBe(400);
		expect(Object.keys(r.errors).sort()).toEqual(
			['caption', 'form', 'conditions', 'scanRateMvPerS', 'temperature'].sort()
		);
		// Unknown fields are named together under `form`, at most five, so a flood of them
		// cannot grow the answer.
		expect(r.errors.form?.[0]).toMatch(/^unknown field "colour"; the fields are entry, kind/);
		expect(r.errors.conditions).toEqual([
			'microwave frequency, power and modulation apply to EPR spectra only'
		]);
	});

	it('refuses structure files here, and a form with no file', async () => {
		const r = await readAttachmentForm(form({ kind: 'structure', caption: 'x' }), limits);
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.errors.kind?.[0]).toMatch(/structure upload/);
		expect(r.errors.file?.[0]).toMatch(/choose an image/);
	});

	it('takes numbers alone as a numbers-only attachment', async () => {
		const numbers = new File(['x,y\n1,2\n'], 'n.csv');
		const r = await readAttachmentForm(form({ kind: 'other', caption: 'n', numbers }), limits);
		expect(r.ok && r.input.numbersOnly && r.input.file.fileName).toBe('n.csv');
	});

	it('refuses a file over its limit with 413 beside its field, unread', async () => {
		const big = new File([new Uint8Array(limits.maxBytes + 1)], 'big.png');
		const r = await readAttachmentForm(form({ kind: 'other', caption: 'x', file: big }), limits);
		expect(r.ok ? 0 : r.status).toBe(413);
		expect(r.ok ? [] : r.errors.file).toEqual([
			'the image is 1\u202f048\u202f577 bytes; the limit is 1\u202f048\u202f576 bytes (1.0 MB)'
		]);
	});
});

describe('the request limit of attaching', () => {
	it('applies to the page action and the API path only', () => {
		expect(isAttachRequest(new URL('http://x/submissions/12?/attach'))).toBe(true);
		expect(isAttachRequest(new URL('http://x/api/v1/submissions/12/attachments'))).toBe(true);
		expect(isAttachRequest(new URL('http://x/submissions/12?/save'))).toBe(false);
		expect(isAttachRequest(new URL('http://x/api/v1/submissions/12/attachments/3'))).toBe(false);
		expect(isAttachRequest(new URL('http://x/submissions/upload?/attach'))).toBe(false);
	});

	it('names both limits when the declared length is over them', () => {
		expect(attachTooLargeMessage(attachRequestLimit())).toBeNull();
		expect(attachTooLargeMessage(attachRequestLimit() + 1)).toMatch(
			/the limit is 10\.0 MB for the image and 1\.0 MB for its numbers file/
		);
	});
});
