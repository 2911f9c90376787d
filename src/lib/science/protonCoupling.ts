import { STANDARD_TEMPERATURE_K } from './constants';
import { requireElectronCount, requireFinite, requireInRange, requirePositive } from './guards';
import { nernstSlopeMvPerDecade } from './nernst';

/*
 * pH dependence of a midpoint potential when one proton binds on reduction (Nernst–Clark):
 *
 *   Em(pH) = Em,alk + (2.303RT/nF) · log10[(1 + [H⁺]/Ka,red) / (1 + [H⁺]/Ka,ox)]
 *
 * Em,alk is the potential above both pKa values (both forms deprotonated). With pKa,red above
 * pKa,ox the potential rises by 2.303RT/nF per pH unit below pKa,red down to pKa,ox and is flat
 * outside that window. A missing pKa means that form does not bind the proton in range.
 * References: W. M. Clark, *Oxidation–Reduction Potentials of Organic Systems* (1960);
 * P. L. Dutton, Methods Enzymol. 54, 411 (1978), eq. 5.
 */
export interface ProtonCoupling {
	emAlkalineMv: number;
	pKaOx?: number;
	pKaRed?: number;
	/** @default 1 */
	n?: number;
	/** @default 298.15 */
	temperatureK?: number;
}

function check(c: ProtonCoupling, pH: number): { n: number; t: number } {
	requireFinite(c.emAlkalineMv, 'emAlkalineMv');
	requireInRange(pH, 'pH', -2, 16);
	if (c.pKaOx !== undefined) requireInRange(c.pKaOx, 'pKaOx', -2, 20);
	if (c.pKaRed !== undefined) requireInRange(c.pKaRed, 'pKaRed', -2, 20);
	const n = c.n ?? 1;
	const t = c.temperatureK ?? STANDARD_TEMPERATURE_K;
	requireElectronCount(n);
	requirePositive(t, 'temperatureK');
	return { n, t };
}

/** log10(1 + 10^(pKa − pH)), computed without overflow. */
function log10OnePlusPower(x: number): number {
	return x > 15 ? x : Math.log10(1 + 10 ** x);
}

/**
 * Em at a given pH, mV. @throws {RangeError} for pH or pKa out of range, n outside 1–4.
 * @example emAtPH({ emAlkalineMv: -100, pKaRed: 8 }, 6) // ≈ +18.6 (two units below pKa,red)
 */
export function emAtPH(coupling: ProtonCoupling, pH: number): number {
	const { n, t } = check(coupling, pH);
	const red = coupling.pKaRed === undefined ? 0 : log10OnePlusPower(coupling.pKaRed - pH);
	const ox = coupling.pKaOx === undefined ? 0 : log10OnePlusPower(coupling.pKaOx - pH);
	return coupling.emAlkalineMv + nernstSlopeMvPerDecade(n, t) * (red - ox);
}

/**
 * dEm/dpH at a given pH, mV per pH unit: −(2.303RT/nF)·(θred − θox), θ the protonated fraction.
 * @example emSlopeMvPerPH({ emAlkalineMv: 0, pKaRed: 9 }, 5) // ≈ −59.16
 */
export function emSlopeMvPerPH(coupling: ProtonCoupling, pH: number): number {
	const { n, t } = check(coupling, pH);
	const protonated = (pKa: number | undefined) =>
		pKa === undefined ? 0 : 1 / (1 + 10 ** (pH - pKa));
	return -nernstSlopeMvPerDecade(n, t) * (protonated(coupling.pKaRed) - protonated(coupling.pKaOx));
}
