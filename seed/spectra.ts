import {
	FARADAY_C_PER_MOL,
	GAS_J_PER_MOL_K,
	STANDARD_TEMPERATURE_K,
	fromSHE,
	resonanceFieldMt,
	toSHE,
	type ReferenceElectrode
} from '../src/lib/science';
import { DEMO_POTENTIALS, DEMO_SPIN_RECORDS } from './demo';

/*
 * Synthetic demo spectra, computed from the demo scenario's own numbers (its g-values and its
 * potentials), so that the pictures and data files attached to demo entries agree with the
 * values beside them. Pure and deterministic: no randomness, no I/O; the PNG rendering is in
 * spectraPng.ts. These are drawings of a model, labelled as such, never measurements.
 */

/** One synthetic spectrum: the points and how its two columns are headed in its data file. */
export interface SyntheticSpectrum {
	xHeader: string;
	yHeader: string;
	points: [number, number][];
}

export interface EprPowderOptions {
	/** Principal g-values; one value for an isotropic centre. */
	g: readonly number[];
	/** Microwave frequency, GHz. */
	frequencyGHz: number;
	/** Peak-to-peak width of one orientation's derivative line, mT. @default 1.5 */
	linewidthMt?: number;
	/** Number of field points. @default 1024 */
	points?: number;
	/** Orientation grid steps per angle (cos θ and φ over one octant). @default 90 */
	orientationSteps?: number;
}

/**
 * First-derivative continuous-wave EPR spectrum of an S = 1/2 centre with a rhombic g-tensor,
 * frozen solution (powder), field swept at a fixed microwave frequency.
 *
 * Model: the powder pattern, a sum over orientations of the field B₀ relative to the g-tensor
 * axes, each resonating at B = hν/(g_eff·μ_B) with
 * g_eff² = g₁² sin²θ cos²φ + g₂² sin²θ sin²φ + g₃² cos²θ, each drawn as a Gaussian line
 * (inhomogeneous broadening, the usual shape for iron–sulfur clusters at low temperature) of
 * peak-to-peak derivative width ΔB_pp = 2σ, weighted by 1/g_eff for a field-swept spectrum
 * (Aasa & Vänngård, J. Magn. Reson. 19, 308 (1975), from memory); the derivative of each
 * Gaussian is taken analytically. Orientations: a midpoint grid uniform in cos θ and φ over one
 * octant, which samples the sphere evenly and suffices by the tensor's symmetry. No hyperfine
 * structure, no g-strain, no transition-probability anisotropy beyond 1/g_eff.
 *
 * The derivative of such a powder pattern shows a positive peak at the lowest field (largest
 * g), crosses zero at the middle g (the absorption maximum) and has a negative peak at the
 * highest field (smallest g) — the shape that tests check.
 * References: J. A. Weil & J. R. Bolton, *Electron Paramagnetic Resonance*, 2nd ed. (Wiley
 * 2007), ch. 4 (powder spectra; from memory).
 * Output: field in mT, intensity scaled so that the largest |y| is 1 (arbitrary units).
 * @throws {RangeError} for anything but one or three positive g-values, or bad widths/counts.
 */
export function eprPowderDerivative(options: EprPowderOptions): [number, number][] {
	const { frequencyGHz } = options;
	const width = options.linewidthMt ?? 1.5;
	const n = options.points ?? 1024;
	const steps = options.orientationSteps ?? 90;
	if (!(options.g.length === 1 || options.g.length === 3) || options.g.some((g) => !(g > 0))) {
		throw new RangeError(`g must be one or three positive values, got [${options.g.join(', ')}]`);
	}
	if (!(width > 0) || !Number.isInteger(n) || n < 16 || !Number.isInteger(steps) || steps < 4) {
		throw new RangeError('linewidthMt must be > 0, points ≥ 16 and orientationSteps ≥ 4');
	}
	const [g1, g2, g3] = (options.g.length === 1 ? [0, 0, 0] : [0, 1, 2]).map((i) => options.g[i]!);
	const sigma = width / 2;
	const fields = [g1!, g2!, g3!].map((g) => resonanceFieldMt(g, frequencyGHz));
	const lo = Math.min(...fields) - 8 * width;
	const hi = Math.max(...fields) + 8 * width;
	const step = (hi - lo) / (n - 1);
	const y = new Float64Array(n);
	for (let i = 0; i < steps; i++) {
		const cosT = (i + 0.5) / steps;
		const sin2T = 1 - cosT * cosT;
		for (let j = 0; j < steps; j++) {
			const phi = ((j + 0.5) / steps) * (Math.PI / 2);
			const gEff = Math.sqrt(
				g1! ** 2 * sin2T * Math.cos(phi) ** 2 +
					g2! ** 2 * sin2T * Math.sin(phi) ** 2 +
					g3! ** 2 * cosT * cosT
			);
			const b0 = resonanceFieldMt(gEff, frequencyGHz);
			const weight = 1 / gEff;
			// Only within ±6σ: beyond, the Gaussian is below 1e-7 of its peak.
			const first = Math.max(0, Math.ceil((b0 - 6 * sigma - lo) / step));
			const last = Math.min(n - 1, Math.floor((b0 + 6 * sigma - lo) / step));
			for (let k = first; k <= last; k++) {
				const d = lo + k * step - b0;
				y[k]! += weight * (-d / (sigma * sigma)) * Math.exp((-d * d) / (2 * sigma * sigma));
			}
		}
	}
	const peak = Math.max(...Array.from(y, Math.abs)) || 1;
	return Array.from(y, (v, k) => [lo + k * step, v / peak] as [number, number]);
}

export interface ThinLayerOptions {
	/** Midpoint potential of the adsorbed couple, mV vs SHE. */
	emMvShe: number;
	/** Electrons transferred. @default 1 */
	n?: number;
	/** Scan rate, mV/s. @default 20 */
	scanRateMvPerS?: number;
	/** Electrode area, cm². @default 0.03 */
	areaCm2?: number;
	/** Surface coverage of electroactive protein, pmol/cm². @default 5 */
	coveragePmolPerCm2?: number;
	/** Double-layer capacitance, µF/cm² (a flat charging current on each sweep). @default 5 */
	capacitanceUfPerCm2?: number;
	/** Cell temperature, K. @default 298.15 */
	temperatureK?: number;
	/** Half-width of the sweep around Em, mV. @default 300 */
	halfRangeMv?: number;
	/** Points per sweep direction. @default 400 */
	pointsPerSweep?: number;
}

/**
 * Cyclic voltammogram of a protein film: an adsorbed one-electron couple in the reversible
 * (Nernstian) thin-layer limit, oxidative sweep then reductive sweep.
 *
 * Model (Laviron, J. Electroanal. Chem. 101, 19 (1979), reversible limit; from memory):
 * i = (n²F²νAΓ/RT) · e^ξ / (1 + e^ξ)², ξ = nF(E − Em)/RT, positive on the oxidative sweep and
 * negative on the reductive one, plus a constant charging current ±C·A·ν. Both peaks sit at Em
 * (no peak separation), with height n²F²νAΓ/(4RT) and full width at half height
 * 3.53·RT/(nF) (90.6/n mV at 25 °C).
 * Output: potential in mV vs SHE, current in nA; the sweep starts at the negative end.
 * @throws {RangeError} for non-positive rates, areas, coverages, temperatures or counts.
 */
export function thinLayerVoltammogram(options: ThinLayerOptions): [number, number][] {
	const n = options.n ?? 1;
	const nu = (options.scanRateMvPerS ?? 20) / 1000; // V/s
	const area = options.areaCm2 ?? 0.03;
	const gamma = (options.coveragePmolPerCm2 ?? 5) * 1e-12; // mol/cm²
	const cdl = (options.capacitanceUfPerCm2 ?? 5) * 1e-6; // F/cm²
	const t = options.temperatureK ?? STANDARD_TEMPERATURE_K;
	const half = options.halfRangeMv ?? 300;
	const count = options.pointsPerSweep ?? 400;
	for (const [name, v] of [
		['n', n],
		['scanRateMvPerS', nu],
		['areaCm2', area],
		['coveragePmolPerCm2', gamma],
		['temperatureK', t],
		['halfRangeMv', half]
	] as const) {
		if (!(Number.isFinite(v) && v > 0)) throw new RangeError(`${name} must be > 0, got ${v}`);
	}
	if (!Number.isInteger(count) || count < 16) throw new RangeError('pointsPerSweep must be ≥ 16');
	const f = (n * FARADAY_C_PER_MOL) / (GAS_J_PER_MOL_K * t); // 1/V
	const scale =
		((n * n * FARADAY_C_PER_MOL ** 2 * nu * area * gamma) / (GAS_J_PER_MOL_K * t)) * 1e9;
	const charging = cdl * area * nu * 1e9; // nA
	const faradaic = (eMv: number) => {
		const xi = f * ((eMv - options.emMvShe) / 1000);
		// e^ξ/(1+e^ξ)² written symmetrically so that it cannot overflow at either end.
		const e = Math.exp(-Math.abs(xi));
		return (scale * e) / (1 + e) ** 2;
	};
	const out: [number, number][] = [];
	for (let k = 0; k < count; k++) {
		const e = options.emMvShe - half + (2 * half * k) / (count - 1);
		out.push([e, faradaic(e) + charging]);
	}
	for (let k = 0; k < count; k++) {
		const e = options.emMvShe + half - (2 * half * k) / (count - 1);
		out.push([e, -faradaic(e) - charging]);
	}
	return out;
}

/** A demo spectrum: which demo record it belongs to, its conditions and its data. */
export interface DemoSpectrum {
	/** File name stem, e.g. "epr-rox-c1". */
	name: string;
	kind: 'epr' | 'voltammogram';
	/** The demo centre key (seed/demo.ts) whose record it illustrates. */
	centre: string;
	/**
	 * The seed's key of the entry it is attached to (seed/load.ts): the spin record
	 * (`spin.<index in DEMO_SPIN_RECORDS>`) or the potential (`p.…`) it was computed from.
	 */
	entry: string;
	caption: string;
	temperatureK: number;
	frequencyGHz?: number;
	scanRateMvPerS?: number;
	electrode?: ReferenceElectrode;
	spectrum: SyntheticSpectrum;
}

const DEMO_FREQUENCY_GHZ = 9.4;

function demoEpr(centre: string, level: string): DemoSpectrum {
	const index = DEMO_SPIN_RECORDS.findIndex((s) => s.centre === centre && s.level === level);
	const spin = DEMO_SPIN_RECORDS[index];
	if (!spin) throw new Error(`no demo spin record ${centre} ${level}`);
	return {
		name: `epr-${centre.replace(/\./g, '-')}`,
		kind: 'epr',
		centre,
		entry: `spin.${index}`,
		caption: `Synthetic X-band EPR spectrum (demo data, computed): ${level}, g = ${spin.g.join(', ')}`,
		temperatureK: spin.temperatureK,
		frequencyGHz: DEMO_FREQUENCY_GHZ,
		spectrum: {
			xHeader: 'Field (mT)',
			yHeader: 'dχ″/dB (a.u.)',
			points: eprPowderDerivative({ g: spin.g, frequencyGHz: DEMO_FREQUENCY_GHZ })
		}
	};
}

function demoVoltammogram(potentialKey: string): DemoSpectrum {
	const p = DEMO_POTENTIALS.find((d) => d.key === potentialKey);
	if (!p) throw new Error(`no demo potential ${potentialKey}`);
	const reportedMv = p.unit === 'V' ? p.value * 1000 : p.value;
	const scanRate = 20;
	const emShe = toSHE(reportedMv, p.electrode, p.temperatureK);
	const points = thinLayerVoltammogram({
		emMvShe: emShe,
		n: p.n ?? 1,
		scanRateMvPerS: scanRate,
		temperatureK: p.temperatureK
	});
	// The file is written against the electrode the demo paper reports, in V, as a potentiostat
	// would write it; the plot converts it back to SHE.
	return {
		name: `cv-${p.centre.replace(/\./g, '-')}`,
		kind: 'voltammogram',
		centre: p.centre,
		entry: potentialKey,
		caption: `Synthetic protein-film voltammogram (demo data, computed): ${p.couple}, ${scanRate} mV/s`,
		temperatureK: p.temperatureK,
		scanRateMvPerS: scanRate,
		electrode: p.electrode,
		spectrum: {
			xHeader: 'Potential (V)',
			yHeader: 'Current (nA)',
			points: points.map(([e, i]) => [fromSHE(e, p.electrode, p.temperatureK) / 1000, i])
		}
	};
}

/** The demo's spectra: two EPR spectra at the demo g-values and one protein-film voltammogram. */
export function demoSpectra(): DemoSpectrum[] {
	return [
		demoEpr('rox.c1', '[2Fe-2S]1+'),
		demoEpr('rox.c2', '[4Fe-4S]1+'),
		demoVoltammogram('p.tcd.h1.2')
	];
}

/** A spectrum's data file: a header row and comma-separated rows (read by spectrumData.ts). */
export function spectrumCsv(spectrum: SyntheticSpectrum): string {
	const rows = spectrum.points.map(([x, y]) => `${x.toPrecision(8)},${y.toPrecision(6)}`);
	return [`${spectrum.xHeader},${spectrum.yHeader}`, ...rows, ''].join('\n');
}
