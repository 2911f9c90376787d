import { Jimp } from 'jimp';
import { describe, expect, it } from 'vitest';
import {
	demoSpectra,
	eprPowderDerivative,
	spectrumCsv,
	thinLayerVoltammogram
} from '../../seed/spectra';
import { asciiLabel, niceTicks, renderSpectrumPng } from '../../seed/spectraPng';
import { readSpectrumData } from '$lib/schemas/spectrumData';
import {
	FARADAY_C_PER_MOL,
	GAS_J_PER_MOL_K,
	potentialAxisToSheMv,
	resonanceFieldMt,
	toSHE
} from '$lib/science';

/** Fields where y changes sign, by linear interpolation between neighbouring points. */
function zeroCrossings(points: [number, number][], from: '+' | '-' | 'any' = 'any'): number[] {
	const out: number[] = [];
	for (let k = 1; k < points.length; k++) {
		const [x0, y0] = points[k - 1]!;
		const [x1, y1] = points[k]!;
		const down = y0 > 0 && y1 <= 0;
		const up = y0 < 0 && y1 >= 0;
		if ((from === '+' && down) || (from === '-' && up) || (from === 'any' && (down || up)))
			out.push(x0 + ((x1 - x0) * y0) / (y0 - y1));
	}
	return out;
}
const nearest = (values: number[], target: number) =>
	values.reduce((a, b) => (Math.abs(b - target) < Math.abs(a - target) ? b : a), Infinity);
/** The x of the largest y within [lo, hi]. */
const argmaxIn = (points: [number, number][], lo: number, hi: number, sign = 1) =>
	points
		.filter(([x]) => x >= lo && x <= hi)
		.reduce((a, b) => (sign * b[1] > sign * a[1] ? b : a))[0];

describe('EPR powder derivative of a rhombic S = 1/2 centre', () => {
	// Rhombic g of the demo [4Fe-4S]1+ centre (demo numbers), 9.5 GHz, ΔB_pp 1.5 mT.
	const g = [2.05, 1.93, 1.89];
	const width = 1.5;
	const spectrum = eprPowderDerivative({ g, frequencyGHz: 9.5, linewidthMt: width });
	const [b1, b2, b3] = [2.05, 1.93, 1.89].map((v) => resonanceFieldMt(v, 9.5)) as [
		number,
		number,
		number
	];

	// Oracle: the shape of a rhombic powder derivative (Weil & Bolton 2007, ch. 4; from memory):
	// a positive peak at g₁ (lowest field), a zero crossing at g₂, a negative peak at g₃.
	it('has its low-field positive peak within the linewidth of g₁', () =>
		expect(Math.abs(argmaxIn(spectrum, b1 - 3 * width, b1 + 3 * width) - b1)).toBeLessThan(width));
	it('crosses zero (from + to −) within the linewidth of g₂', () =>
		expect(Math.abs(nearest(zeroCrossings(spectrum, '+'), b2) - b2)).toBeLessThan(width));
	it('has its high-field negative peak within the linewidth of g₃', () =>
		expect(Math.abs(argmaxIn(spectrum, b3 - 3 * width, b3 + 3 * width, -1) - b3)).toBeLessThan(
			width
		));
	it('stays positive between the g₁ and g₂ features (absorption rising)', () =>
		expect(spectrum.filter(([x]) => x > b1 + width && x < b2 - width).every(([, y]) => y > 0)).toBe(
			true
		));
	it('is scaled to a largest |y| of 1', () =>
		expect(Math.max(...spectrum.map(([, y]) => Math.abs(y)))).toBeCloseTo(1, 12));

	// Oracle: an isotropic line's derivative is odd about its centre, so it crosses zero exactly
	// at B(g); the grid of 1024 points and interpolation leave well under 0.05 mT.
	it('an isotropic centre crosses zero at its g', () => {
		const iso = eprPowderDerivative({ g: [2.004], frequencyGHz: 9.4 });
		const b = resonanceFieldMt(2.004, 9.4);
		expect(Math.abs(nearest(zeroCrossings(iso), b) - b)).toBeLessThan(0.05);
	});
	it('is deterministic', () =>
		expect(eprPowderDerivative({ g, frequencyGHz: 9.5, linewidthMt: width })).toEqual(spectrum));
	it('refuses two g-values', () =>
		expect(() => eprPowderDerivative({ g: [2, 1.9], frequencyGHz: 9.5 })).toThrow(RangeError));
	it('refuses a zero linewidth', () =>
		expect(() => eprPowderDerivative({ g, frequencyGHz: 9.5, linewidthMt: 0 })).toThrow(
			RangeError
		));
});

describe('protein-film voltammogram (reversible thin layer)', () => {
	const em = -125;
	const cv = thinLayerVoltammogram({ emMvShe: em });
	const oxidative = cv.slice(0, 400);
	const reductive = cv.slice(400);
	const step = 600 / 399;

	// Oracle: Laviron 1979, reversible limit — both peaks at Em, no separation.
	it('the oxidative peak sits at Em', () =>
		expect(Math.abs(argmaxIn(oxidative, -Infinity, Infinity) - em)).toBeLessThanOrEqual(step / 2));
	it('the reductive peak sits at Em', () =>
		expect(Math.abs(argmaxIn(reductive, -Infinity, Infinity, -1) - em)).toBeLessThanOrEqual(
			step / 2
		));
	// Oracle: Laviron 1979, peak height n²F²νAΓ/(4RT) above the charging current (ν 0.02 V/s,
	// A 0.03 cm², Γ 5 pmol/cm², 298.15 K; charging 5 µF/cm² · 0.03 cm² · 0.02 V/s = 3 nA).
	it('has the thin-layer peak height above its charging current', () => {
		const expected =
			((FARADAY_C_PER_MOL ** 2 * 0.02 * 0.03 * 5e-12) / (4 * GAS_J_PER_MOL_K * 298.15)) * 1e9;
		const top = Math.max(...oxidative.map(([, i]) => i));
		expect(top - 3).toBeCloseTo(expected, 2);
	});
	// Oracle: full width at half height 3.53·RT/F = 90.6 mV for n = 1 at 25 °C (Laviron 1979).
	it('has a full width at half height of 90.6 mV', () => {
		const half = (Math.max(...oxidative.map(([, i]) => i)) - 3) / 2 + 3;
		const above = oxidative.filter(([, i]) => i >= half).map(([e]) => e);
		expect(Math.max(...above) - Math.min(...above)).toBeGreaterThan(90.6 - 2 * step);
		expect(Math.max(...above) - Math.min(...above)).toBeLessThan(90.6 + 2 * step);
	});
	it('halves its width for n = 2', () => {
		const two = thinLayerVoltammogram({ emMvShe: 0, n: 2 }).slice(0, 400);
		const top = Math.max(...two.map(([, i]) => i));
		const above = two.filter(([, i]) => i >= (top - 3) / 2 + 3).map(([e]) => e);
		expect(Math.max(...above) - Math.min(...above)).toBeLessThan(45.3 + 2 * step);
	});
	it('refuses a zero scan rate', () =>
		expect(() => thinLayerVoltammogram({ emMvShe: 0, scanRateMvPerS: 0 })).toThrow(RangeError));
});

describe('the demo spectra', () => {
	const spectra = demoSpectra();
	it('are two EPR spectra and a voltammogram', () =>
		expect(spectra.map((s) => s.kind)).toEqual(['epr', 'epr', 'voltammogram']));

	it('write data files the spectrum reader reads back with convertible units', () => {
		for (const s of spectra) {
			const r = readSpectrumData(spectrumCsv(s.spectrum), {
				xAxis: s.kind === 'epr' ? 'field' : 'potential'
			});
			expect(r.ok, s.name).toBe(true);
			if (r.ok) expect(r.data.points).toHaveLength(s.spectrum.points.length);
		}
	});

	// The demo voltammogram is written against the electrode its demo potential was reported
	// against (−335 mV vs Ag/AgCl 3 M KCl): put back on the SHE scale through toSHE, its peaks
	// sit at that potential's SHE value.
	it('the voltammogram peaks at the demo potential on the SHE axis', () => {
		const cv = spectra[2]!;
		expect(cv.electrode).toBe('AgAgCl_3M');
		const she = potentialAxisToSheMv(
			cv.spectrum.points.map(([e]) => e),
			'V',
			cv.electrode!,
			cv.temperatureK
		);
		const oxidative = cv.spectrum.points.slice(0, 400).map(([, i], k) => [she[k], i]) as [
			number,
			number
		][];
		expect(
			Math.abs(argmaxIn(oxidative, -Infinity, Infinity) - toSHE(-335, 'AgAgCl_3M'))
		).toBeLessThan(1);
	});

	it('render to PNGs that decode with the expected size', async () => {
		for (const s of spectra) {
			const png = await renderSpectrumPng(s.spectrum, { gAxisFrequencyGHz: s.frequencyGHz });
			expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
			const image = await Jimp.read(png);
			expect([image.width, image.height]).toEqual([960, 600]);
			// The trace is drawn: some pixels carry the trace colour.
			const d = image.bitmap.data;
			let traced = 0;
			for (let i = 0; i < d.length; i += 4)
				if (d[i] === 0x1d && d[i + 1] === 0x4e && d[i + 2] === 0xd8) traced++;
			expect(traced).toBeGreaterThan(1000);
		}
	});
	it('render at a requested size', async () => {
		const png = await renderSpectrumPng(spectra[0]!.spectrum, { width: 400, height: 300 });
		const image = await Jimp.read(png);
		expect([image.width, image.height]).toEqual([400, 300]);
	});
});

describe('PNG helpers', () => {
	it('nice ticks step by 1, 2 or 5 × 10ᵏ', () =>
		expect(niceTicks(323.4, 361.9, 8)).toEqual([325, 330, 335, 340, 345, 350, 355, 360]));
	it('ASCII labels for the bitmap font', () =>
		expect(asciiLabel('dχ″/dB −1')).toBe("dchi''/dB -1"));
});

describe('the demo spectrum files', () => {
	it('pair each PNG with its data file and conditions', async () => {
		const { demoSpectrumFiles } = await import('../../seed/spectraFiles');
		const files = await demoSpectrumFiles();
		expect(files.map((f) => [f.png.fileName, f.data.fileName])).toEqual([
			['epr-rox-c1.png', 'epr-rox-c1.csv'],
			['epr-rox-c2.png', 'epr-rox-c2.csv'],
			['cv-tcd-h1.png', 'cv-tcd-h1.csv']
		]);
		expect(files[0]?.frequencyGHz).toBe(9.4);
		expect(files[2]?.electrode).toBe('AgAgCl_3M');
		expect(files.every((f) => f.caption.includes('demo data'))).toBe(true);
	});
});
