import { describe, expect, it } from 'vitest';
import {
	dragZoom,
	gTicks,
	plotKey,
	plotScene,
	pointReadout,
	prepareSpectrum,
	spectrumCsvText,
	thinnedIndices
} from '$lib/components/spectrumPlot';
import type { SpectrumData } from '$lib/schemas/spectrumData';
import { resonanceFieldMt } from '$lib/science';

const epr: SpectrumData = {
	x: { name: 'Field', unit: 'G' },
	y: { name: 'Signal', unit: 'a.u.' },
	points: [
		[3300, 0.1],
		[3390, 0],
		[3480, -0.1]
	]
};
const cv: SpectrumData = {
	x: { name: 'E', unit: 'V' },
	y: { name: 'i', unit: 'nA' },
	points: [
		[-0.6, 1],
		[-0.4, 2],
		[-0.6, -1]
	]
};

describe('preparing a spectrum for the plot', () => {
	it('an EPR field in gauss is plotted in mT with a g axis at the given frequency', () => {
		const p = prepareSpectrum(epr, { kind: 'epr', frequencyGHz: 9.5 });
		expect(p.xs).toEqual([330, 339, 348]);
		expect(p.xLabel).toBe('Field (mT)');
		expect(p.gAxisGHz).toBe(9.5);
		expect(p.note).toMatch(/CODATA 2018/);
	});
	it('no g axis without a frequency, and it says why', () => {
		const p = prepareSpectrum(epr, { kind: 'epr' });
		expect(p.gAxisGHz).toBeNull();
		expect(p.note).toBe('no g axis: the microwave frequency is not given');
	});
	it('no g axis when the field reaches zero', () =>
		expect(
			prepareSpectrum(
				{ ...epr, points: [[0, 1], ...epr.points] },
				{ kind: 'epr', frequencyGHz: 9.5 }
			).gAxisGHz
		).toBeNull());
	// Offsets: referenceElectrodes.ts (Ag/AgCl sat. KCl +197 mV; Bard & Faulkner Table C.2).
	it('a voltammogram in V vs Ag/AgCl is plotted in mV vs SHE', () => {
		const p = prepareSpectrum(cv, { kind: 'voltammogram', electrode: 'AgAgCl_sat' });
		expect(p.xs).toEqual([-403, -203, -403]);
		expect(p.xLabel).toBe('E (mV vs SHE)');
		expect(p.note).toBe('converted from V vs Ag/AgCl (saturated KCl): +197.0 mV');
	});
	it('a voltammogram outside its electrode’s temperature range stays as recorded, with the reason', () => {
		const p = prepareSpectrum(cv, {
			kind: 'voltammogram',
			electrode: 'AgAgCl_sat',
			temperatureK: 338.15
		});
		expect(p.xs).toEqual([-0.6, -0.4, -0.6]);
		expect(p.note).toMatch(/holds for 15–35 °C/);
	});
	it('a voltammogram without an electrode stays as recorded', () =>
		expect(prepareSpectrum(cv, { kind: 'voltammogram' }).note).toMatch(
			/reference electrode is not given/
		));
});

describe('g ticks', () => {
	it('sit at the resonance field of their g', () => {
		const ticks = gTicks(320, 360, 9.4);
		expect(ticks.length).toBeGreaterThan(2);
		for (const t of ticks) expect(t.fieldMt).toBeCloseTo(resonanceFieldMt(t.g, 9.4), 10);
		for (const t of ticks) expect(t.fieldMt >= 320 && t.fieldMt <= 360).toBe(true);
	});
	it('none for a range that is not above zero', () => expect(gTicks(0, 10, 9.4)).toEqual([]));
});

describe('thinning a long sweep', () => {
	it('keeps every point within the budget', () =>
		expect(thinnedIndices([1, 2, 3], 10)).toEqual([0, 1, 2]));
	it('keeps a narrow peak and the ends of a long sweep', () => {
		const ys = Array.from({ length: 20_000 }, (_, i) => (i === 12_345 ? 100 : i === 777 ? -50 : 0));
		const kept = thinnedIndices(ys, 2000);
		expect(kept.length).toBeLessThanOrEqual(2000 + 1);
		expect(kept).toContain(12_345);
		expect(kept).toContain(777);
		expect(kept[0]).toBe(0);
		expect(kept.at(-1)).toBe(19_999);
		expect([...kept].sort((a, b) => a - b)).toEqual(kept);
	});
});

describe('the CSV download', () => {
	it('has the file’s columns and the converted axis', () => {
		const p = prepareSpectrum(cv, { kind: 'voltammogram', electrode: 'AgAgCl_sat' });
		expect(spectrumCsvText(cv, p).split('\n').slice(0, 2)).toEqual([
			'"E (V)","i (nA)","E (mV vs SHE)"',
			'-0.6,1,-403'
		]);
	});
	it('keeps a header from becoming a spreadsheet formula', () => {
		const data: SpectrumData = { ...cv, x: { name: '=HYPERLINK("x")', unit: null } };
		expect(spectrumCsvText(data, prepareSpectrum(data, { kind: 'other' })).split('\n')[0]).toBe(
			'"\'=HYPERLINK(""x"")","i (nA)"'
		);
	});
});

describe('the plot’s geometry (plotScene), shared by the component and the pages’ script', () => {
	const many: SpectrumData = {
		x: { name: 'Field', unit: 'mT' },
		y: { name: 'Signal', unit: null },
		points: Array.from({ length: 101 }, (_, i) => [300 + i, Math.sin(i / 10)] as [number, number])
	};
	const prepared = prepareSpectrum(many, { kind: 'epr', frequencyGHz: 9.5 });
	const texts = (s: ReturnType<typeof plotScene>) =>
		s.marks.filter((m) => m.tag === 'text').map((m) => m.text);

	it('draws at 640 units until measured, smaller on a phone, with room for the g axis', () => {
		expect(plotScene(prepared, 0, null, String).frame).toMatchObject({ width: 640, height: 340 });
		const phone = plotScene(prepared, 350, null, String).frame;
		expect(phone).toMatchObject({ width: 350, height: 280 });
		expect(phone.margin.top).toBe(40);
	});

	it('labels the g axis from the stated frequency, and every tick lies inside the frame', () => {
		const scene = plotScene(prepared, 0, null, String);
		expect(texts(scene)).toContain('g');
		// 9.5 GHz, g = 2.1 resonates at 323.2 mT (resonanceFieldMt, the science module's one formula).
		expect(texts(scene)).toContain('2.1');
		for (const m of scene.marks.filter((m) => m.tag === 'line'))
			expect(Number(m.attrs.x1)).toBeGreaterThanOrEqual(scene.frame.margin.left - 0.001);
	});

	it('a zoom narrows the visible points and the x ticks', () => {
		const zoomed = plotScene(prepared, 0, [340, 350], String);
		expect(zoomed.visible).toHaveLength(11);
		expect(texts(zoomed)).toEqual(expect.arrayContaining(['340', '350']));
		expect(texts(zoomed)).not.toContain('310');
	});

	it('a drag of 8 px or less is a click, not a zoom; a longer one selects its x range', () => {
		const scene = plotScene(prepared, 0, null, String);
		expect(dragZoom(prepared, scene, 200, 207)).toBeNull();
		const range = dragZoom(prepared, scene, scene.px(320), scene.px(330));
		expect(range?.[0]).toBeCloseTo(320, 6);
		expect(range?.[1]).toBeCloseTo(330, 6);
	});

	it('keys: → picks the first point, + halves the range about it, − and 0 go back out', () => {
		const scene = plotScene(prepared, 0, null, String);
		expect(plotKey(prepared, scene, null, 'ArrowRight', false)).toEqual({ cursor: 0 });
		expect(plotKey(prepared, scene, 50, '+', false)).toEqual({ zoom: [325, 375] });
		expect(plotKey(prepared, plotScene(prepared, 0, [325, 375], String), 50, '-', false)).toEqual({
			zoom: null
		});
		expect(plotKey(prepared, scene, 50, '0', false)).toEqual({ zoom: null });
		expect(plotKey(prepared, scene, 50, 'a', false)).toEqual({ nothing: true });
	});

	it('reads a point with its g', () => {
		expect(pointReadout(prepared, 39, String)).toMatch(
			/^Field \(mT\): 339; Signal: .*g = 2\.002\d$/
		);
		expect(pointReadout(prepared, null, String)).toBe('');
	});
});
