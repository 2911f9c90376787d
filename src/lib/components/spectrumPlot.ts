import { scaleLinear } from 'd3-scale';
import {
	REFERENCE_ELECTRODE_LABELS,
	electrodeOffsetMv,
	fieldToMt,
	gAtField,
	potentialAxisToSheMv,
	resonanceFieldMt,
	type ReferenceElectrode
} from '$lib/science';
import { fieldUnitOf, potentialUnitOf, type SpectrumData } from '$lib/schemas/spectrumData';

/*
 * What SpectrumPlot.svelte draws, worked out apart from the markup so it can be tested: the x
 * values on the axis the reader needs (mT for EPR, mV vs SHE for a voltammogram, through the
 * science module's one conversion each), the g ticks of the top axis, a thinned path for long
 * sweeps, and the CSV offered for download.
 */

export type SpectrumKind = 'epr' | 'voltammogram' | 'other';

export interface SpectrumConditions {
	kind: SpectrumKind;
	/** EPR microwave frequency, GHz: turns on the g axis. */
	frequencyGHz?: number | null;
	/** The electrode a voltammogram was recorded against: turns on the SHE axis. */
	electrode?: ReferenceElectrode | null;
	/** Cell temperature, K (the SCE offset follows it; Ag/AgCl holds within 15–35 °C). */
	temperatureK?: number | null;
}

export interface PreparedSpectrum {
	/** x on the plotted axis. */
	xs: number[];
	ys: number[];
	xLabel: string;
	yLabel: string;
	/** The microwave frequency when a g axis is drawn on top. */
	gAxisGHz: number | null;
	/** How the x axis was obtained from the file, or why it could not be converted. */
	note: string | null;
}

const labelOf = (name: string, unit: string | null) => (unit ? `${name} (${unit})` : name);

export function prepareSpectrum(
	data: SpectrumData,
	conditions: SpectrumConditions
): PreparedSpectrum {
	const xs = data.points.map((p) => p[0]);
	const ys = data.points.map((p) => p[1]);
	const plain: PreparedSpectrum = {
		xs,
		ys,
		xLabel: labelOf(data.x.name, data.x.unit),
		yLabel: labelOf(data.y.name, data.y.unit),
		gAxisGHz: null,
		note: null
	};
	if (conditions.kind === 'epr') {
		const unit = fieldUnitOf(data.x.unit);
		const nu = conditions.frequencyGHz ?? null;
		if (unit === null) return { ...plain, note: 'no g axis: the field column has no unit' };
		const mt = xs.map((x) => fieldToMt(x, unit));
		const fieldOk = mt.every((b) => b > 0);
		return {
			...plain,
			xs: mt,
			xLabel: `${data.x.name} (mT)`,
			gAxisGHz: nu !== null && nu > 0 && fieldOk ? nu : null,
			note:
				nu === null || !(nu > 0)
					? 'no g axis: the microwave frequency is not given'
					: fieldOk
						? `g = hν/(μ_B·B) at ${nu} GHz (CODATA 2018 constants)`
						: 'no g axis: the field does not stay above zero'
		};
	}
	if (conditions.kind === 'voltammogram') {
		const unit = potentialUnitOf(data.x.unit);
		const electrode = conditions.electrode ?? null;
		if (unit === null || electrode === null) {
			return {
				...plain,
				note: `potential as in the file: ${unit === null ? 'its unit is not V or mV' : 'the reference electrode is not given'}`
			};
		}
		const t = conditions.temperatureK ?? undefined;
		try {
			const she = potentialAxisToSheMv(xs, unit, electrode, t);
			const offset = electrodeOffsetMv(electrode, t);
			return {
				...plain,
				xs: she,
				xLabel: `${data.x.name} (mV vs SHE)`,
				note: `converted from ${unit} vs ${REFERENCE_ELECTRODE_LABELS[electrode]}: ${offset >= 0 ? '+' : '−'}${Math.abs(offset).toFixed(1)} mV`
			};
		} catch (e) {
			// A temperature outside the electrode's range: shown as recorded, and why.
			return {
				...plain,
				note: `potential as in the file (vs ${REFERENCE_ELECTRODE_LABELS[electrode]}): ${e instanceof Error ? e.message : 'no conversion'}`
			};
		}
	}
	return plain;
}

/**
 * Indices of the points to draw: all of them up to `budget`; beyond, the first and the lowest
 * and highest y of each run of consecutive points (in file order, so a cyclic sweep stays a
 * loop), which keeps every peak a reader could see at the plot's width.
 */
export function thinnedIndices(ys: readonly number[], budget = 2000): number[] {
	if (ys.length <= budget) return ys.map((_, i) => i);
	// Up to three points a run (first, lowest, highest): runs of 3·n/budget stay within it.
	const run = Math.ceil((ys.length * 3) / budget);
	const out: number[] = [];
	for (let start = 0; start < ys.length; start += run) {
		const end = Math.min(ys.length, start + run);
		let lo = start;
		let hi = start;
		for (let i = start; i < end; i++) {
			if ((ys[i] ?? 0) < (ys[lo] ?? 0)) lo = i;
			if ((ys[i] ?? 0) > (ys[hi] ?? 0)) hi = i;
		}
		out.push(...[...new Set([start, lo, hi])].sort((a, b) => a - b));
	}
	if (out.at(-1) !== ys.length - 1) out.push(ys.length - 1);
	return out;
}

/** Round g values inside the field range [loMt, hiMt], with the field where each sits. */
export function gTicks(
	loMt: number,
	hiMt: number,
	frequencyGHz: number,
	count = 6
): { g: number; fieldMt: number }[] {
	if (!(loMt > 0 && hiMt > loMt)) return [];
	const [gLow, gHigh] = [gAtField(hiMt, frequencyGHz), gAtField(loMt, frequencyGHz)];
	return scaleLinear()
		.domain([gLow, gHigh])
		.ticks(count)
		.filter((g) => g > 0)
		.map((g) => ({ g, fieldMt: resonanceFieldMt(g, frequencyGHz) }))
		.filter((t) => t.fieldMt >= loMt && t.fieldMt <= hiMt);
}

/** The plotted numbers as CSV: the file's columns, plus the converted axis when there is one. */
export function spectrumCsvText(data: SpectrumData, prepared: PreparedSpectrum): string {
	// A header from an uploaded file must not turn into a spreadsheet formula when opened.
	const quote = (s: string) => `"${(/^[=+\-@]/.test(s) ? `'${s}` : s).replace(/"/g, '""')}"`;
	const original = labelOf(data.x.name, data.x.unit);
	const converted = prepared.xLabel !== original;
	const header = [original, prepared.yLabel, ...(converted ? [prepared.xLabel] : [])]
		.map(quote)
		.join(',');
	const rows = data.points.map(([x, y], i) =>
		[x, y, ...(converted ? [prepared.xs[i]] : [])].map((v) => String(v)).join(',')
	);
	return [header, ...rows, ''].join('\n');
}
