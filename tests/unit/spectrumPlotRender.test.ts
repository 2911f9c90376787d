import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import SpectrumPlot from '$lib/components/SpectrumPlot.svelte';
import { readSpectrumData } from '$lib/schemas/spectrumData';
import { demoSpectra, spectrumCsv } from '../../seed/spectra';

/* The plot as the server sends it: readable without JavaScript, buttons only once hydrated. */

function html(index: number): string {
	const s = demoSpectra()[index]!;
	const r = readSpectrumData(spectrumCsv(s.spectrum), {
		xAxis: s.kind === 'epr' ? 'field' : 'potential'
	});
	if (!r.ok) throw new Error(r.problems.join('; '));
	return render(SpectrumPlot, {
		props: {
			data: r.data,
			conditions: {
				kind: s.kind,
				frequencyGHz: s.frequencyGHz ?? null,
				electrode: s.electrode ?? null,
				temperatureK: s.temperatureK
			},
			title: s.caption
		}
	}).body;
}

describe('SpectrumPlot on the server', () => {
	it('draws an EPR spectrum with its trace and a g axis', () => {
		const body = html(0);
		expect(body).toMatch(/<path[^>]* d="M[\d.]+,[\d.]+L/);
		expect(body).toContain('>g</text>');
		expect(body).toContain('>Field (mT)</text>');
		expect(body).toContain('at 9.4 GHz (CODATA 2018 constants)');
	});
	it('draws a voltammogram on the SHE axis, saying how it was converted', () => {
		const body = html(2);
		expect(body).toContain('>Potential (mV vs SHE)</text>');
		expect(body).toContain('converted from V vs Ag/AgCl (3 M KCl): +210.0 mV');
		expect(body).not.toContain('>g</text>');
	});
	it('offers the JavaScript-only buttons only after hydration', () =>
		expect(html(0)).not.toContain('Download SVG'));
});
