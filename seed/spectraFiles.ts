import { demoSpectra, spectrumCsv, type DemoSpectrum } from './spectra';
import { renderSpectrumPng } from './spectraPng';

/*
 * The demo spectra as files, ready for the seed to store as attachments of the demo entries:
 * the PNG image and the two-column data file of each, with the conditions an attachment
 * records. Nothing is written here; storing them is the attachment store's job.
 */

export interface DemoSpectrumFiles extends Omit<DemoSpectrum, 'spectrum'> {
	png: { fileName: string; bytes: Buffer };
	data: { fileName: string; text: string };
}

export async function demoSpectrumFiles(): Promise<DemoSpectrumFiles[]> {
	const out: DemoSpectrumFiles[] = [];
	for (const { spectrum, ...about } of demoSpectra()) {
		const bytes = await renderSpectrumPng(spectrum, {
			gAxisFrequencyGHz: about.frequencyGHz,
			title: 'demo data (synthetic)'
		});
		out.push({
			...about,
			png: { fileName: `${about.name}.png`, bytes },
			data: { fileName: `${about.name}.csv`, text: spectrumCsv(spectrum) }
		});
	}
	return out;
}
