import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import {
	ATOMIC_MASS_KG,
	AVOGADRO_PER_MOL,
	HBAR_J_S,
	KCAL_PER_MOL_IN_CM1,
	SECOND_RADIATION_CM_K,
	TRANSFER_MASSES_AMU,
	WIGNER_VALID_U,
	adaptiveVibrationalLevels,
	assessDoubleWell,
	bellKappa,
	bellKappaLog10,
	crossoverTemperatureK,
	interpolateWavefunction,
	isotopeEffectFromSplittings,
	lowestEigenpairs,
	seededRandom,
	vibrationalLevels,
	wignerKappa,
	type AdaptiveLevels
} from '$lib/science';

// ħω in kcal/mol for a force constant in kcal/(mol Å²) and a mass in u.
const hbarOmegaKcal = (forceKcalPerA2: number, massAmu: number) => {
	const k = (forceKcalPerA2 * 4184) / AVOGADRO_PER_MOL / 1e-20; // J/m²
	return (HBAR_J_S * Math.sqrt(k / (massAmu * ATOMIC_MASS_KG)) * AVOGADRO_PER_MOL) / 4184;
};
// ħ²/(2m) in kcal/mol·Å², written out here from the CODATA constants (not the module's helper).
const kineticKcalA2 = (massAmu: number) =>
	((HBAR_J_S ** 2 / (2 * massAmu * ATOMIC_MASS_KG)) * 1e20 * AVOGADRO_PER_MOL) / 4184;
// The quartic double well of the calculator: minima at ±a, barrier B, a linear tilt ε.
const quartic =
	(barrier: number, a: number, tilt = 0) =>
	(x: number) =>
		barrier * ((x / a) ** 2 - 1) ** 2 + (tilt * (x + a)) / (2 * a);
const MAX_POINTS = 600; // the calculator's bound (schemas/calc.ts, MAX_GRID_POINTS)

describe('tunnelling factors', () => {
	// CODATA 2018: c₂ = hc/k = 1.438 776 877 × 10⁻² m K.
	it('uses c₂ = 1.438776877 cm K and 1 kcal/mol = 349.755 cm⁻¹', () => {
		expect(SECOND_RADIATION_CM_K).toBeCloseTo(1.438776877, 8);
		expect(KCAL_PER_MOL_IN_CM1).toBeCloseTo(349.755, 3);
	});
	// Wigner, Z. Phys. Chem. B 19, 203 (1932): κ = 1 + u²/24.
	it('Wigner: 1000i cm⁻¹ at 298.15 K gives κ = 1.970', () => {
		const x = (1.438776877 * 1000) / 298.15;
		expect(wignerKappa(1000, 298.15)).toBeCloseTo(1 + (x * x) / 24, 7);
		expect(wignerKappa(1000, 298.15)).toBeCloseTo(1.97, 3);
	});
	// Bell, The Tunnel Effect in Chemistry (1980), ch. 2: infinite parabola κ = (u/2)/sin(u/2).
	it('Bell (infinite parabola): 1000i cm⁻¹ at 298.15 K gives κ = 3.623', () => {
		const x = (1.438776877 * 1000) / 298.15;
		expect(bellKappa(1000, 298.15)).toBeCloseTo(x / 2 / Math.sin(x / 2), 7);
		expect(bellKappa(1000, 298.15)).toBeCloseTo(3.623, 3);
	});
	it('both tend to 1 at high temperature, and Bell ≥ Wigner', () => {
		expect(wignerKappa(100, 5000)).toBeCloseTo(1, 4);
		expect(bellKappa(100, 5000)).toBeCloseTo(1, 4);
		for (const t of [200, 300, 500])
			expect(bellKappa(800, t)).toBeGreaterThanOrEqual(wignerKappa(800, t));
	});
	it('the infinite parabola refuses u ≥ 2π', () =>
		expect(() => bellKappa(2000, 200)).toThrow(/2π/));
	it('the truncated parabola approaches the infinite one for a high barrier', () =>
		expect(bellKappa(1000, 298.15, 200) / bellKappa(1000, 298.15)).toBeCloseTo(1, 9));
	// Bell (1980) series for the truncated parabola: (u/2)/sin(u/2) − Σ (−1)ⁿ⁺¹ e^{α(u−2πn)/u} u/(2πn − u).
	it('the truncated parabola matches Bell’s series', () => {
		const x = (1.438776877 * 1200) / 298.15;
		const alpha = (40 * 1000) / (8.314462618 * 298.15);
		let series = x / 2 / Math.sin(x / 2);
		for (let n = 1; n < 50; n++)
			series -=
				((-1) ** (n + 1) * Math.exp((alpha * (x - 2 * Math.PI * n)) / x) * x) /
				(2 * Math.PI * n - x);
		expect(bellKappa(1200, 298.15, 40) / series).toBeCloseTo(1, 7);
	});
	it('the truncated parabola stays finite beyond u = 2π and grows as the temperature falls', () => {
		const cold = bellKappa(2000, 150, 50);
		expect(Number.isFinite(cold)).toBe(true);
		expect(cold).toBeGreaterThan(bellKappa(2000, 250, 50));
	});
	// Wigner's κ = 1 + u²/24 is the first term of Bell's (u/2)/sin(u/2) (Bell 1980, ch. 2): the
	// validity bound said in the doc comment and the page, checked against the full factor.
	it('Wigner is within 2 % of the infinite parabola up to u = 2, and reaches 1.5 only at u = √12', () => {
		const atU = (x: number) => (SECOND_RADIATION_CM_K * 1000) / x; // the temperature giving u = x at 1000 cm⁻¹
		const wAt2 = wignerKappa(1000, atU(WIGNER_VALID_U));
		const bAt2 = bellKappa(1000, atU(WIGNER_VALID_U));
		expect(wAt2).toBeCloseTo(1 + 4 / 24, 12);
		expect(1 - wAt2 / bAt2).toBeGreaterThan(0.017); // 1.1667 against 1.1884
		expect(1 - wAt2 / bAt2).toBeLessThan(0.02);
		expect(wignerKappa(1000, atU(Math.sqrt(12)))).toBeCloseTo(1.5, 12);
		expect(bellKappa(1000, atU(Math.sqrt(12)))).toBeCloseTo(
			Math.sqrt(3) / Math.sin(Math.sqrt(3)),
			9
		); // 1.7548
	});
	// T_c = hν‡/(2πk_B) (Bell 1980, §2.3): 1000 cm⁻¹ → 1.438776877 × 1000 / 2π = 228.99 K.
	it('the crossover temperature is where u = 2π', () => {
		expect(crossoverTemperatureK(1000)).toBeCloseTo((1.438776877 * 1000) / (2 * Math.PI), 6);
		expect(() => bellKappa(1000, crossoverTemperatureK(1000) * 0.999)).toThrow(/2π/);
	});
});

/*
 * Bell's truncated parabola, κ = ∫_{−α}^{∞} e^{−y}/(1 + e^{−a y}) dy with a = 2π/u, α = V/RT
 * (Bell, The Tunnel Effect in Chemistry, 1980, ch. 2), checked two independent ways:
 * 1. the same integral evaluated with mpmath 1.3.0 (Python) at 50 significant digits, by its
 *    tanh-sinh quadrature split at −α + 2^k, ±1/a and 0 — values recorded below; the script
 *    also evaluated Bell's series and agreed to all 17 digits printed;
 * 2. Bell's series, κ = (u/2)/sin(u/2) − Σₙ (−1)ⁿ⁺¹ e^{α(u − 2πn)/u} · u/(2πn − u), evaluated here
 *    in log space (log-sum-exp over signed terms), which holds away from the poles u = 2πn.
 */
describe('Bell’s truncated parabola in log space', () => {
	// [ν‡ (cm⁻¹), T (K), V (kJ/mol), log₁₀ κ by mpmath]
	const MPMATH: [number, number, number, number][] = [
		[1000, 298.15, 40, 0.5560488602272919],
		[1200, 298.15, 40, 0.9492953642523748],
		[1000, 50, 500, 408.3902328452719],
		[2000, 150, 50, 11.880882609350484],
		[1500, 200, 30, 3.651386713082964],
		[300, 1000, 0.5, -0.008622298492482828],
		[5000, 1, 500, 26093.999848377789],
		[1, 2000, 0.01, -2.504628880299601e-7]
	];
	it.each(MPMATH)('ν‡ %d cm⁻¹, %d K, %d kJ/mol: log₁₀ κ as mpmath gives', (nu, t, v, reference) => {
		// κ to 1e-12 relative; the logarithm to 1e-15 of its size.
		expect(Math.abs(bellKappaLog10(nu, t, v) - reference)).toBeLessThan(
			Math.max(5e-13, 1e-15 * Math.abs(reference))
		);
	});

	/** log₁₀ of Bell's series, summed in log space: the independent second route. */
	function seriesLog10(nu: number, t: number, barrierKJmol: number): number {
		// c₂ = hc/k and R = k·N_A from the exact SI values of h, c, k and N_A.
		const c2 = (6.62607015e-34 * 299792458 * 100) / 1.380649e-23;
		const u = (c2 * nu) / t;
		const alpha = (barrierKJmol * 1000) / (1.380649e-23 * 6.02214076e23 * t);
		const terms: { log: number; sign: number }[] = [
			{ log: Math.log(Math.abs(u / 2 / Math.sin(u / 2))), sign: Math.sign(Math.sin(u / 2)) }
		];
		for (let n = 1; n < 400; n++) {
			const d = 2 * Math.PI * n - u; // −(−1)ⁿ⁺¹ e^{α(u−2πn)/u} u/d
			terms.push({
				log: (alpha * (u - 2 * Math.PI * n)) / u + Math.log(u / Math.abs(d)),
				sign: -((-1) ** (n + 1)) * Math.sign(d)
			});
		}
		const max = Math.max(...terms.map((term) => term.log));
		const sum = terms.reduce((s, term) => s + term.sign * Math.exp(term.log - max), 0);
		return (max + Math.log(sum)) / Math.LN10;
	}
	it.each([
		[1000, 50, 500],
		[2000, 150, 50],
		[1500, 120, 80],
		[800, 298.15, 20],
		[3000, 100, 200]
	])('ν‡ %d cm⁻¹, %d K, %d kJ/mol: equals Bell’s series summed in log space', (nu, t, v) => {
		expect(bellKappaLog10(nu, t, v) - seriesLog10(nu, t, v)).toBeCloseTo(0, 10);
	});

	// The issue's case: κ ≈ 10^408 overflowed to Infinity and the API answered 500.
	it('50 K, 500 kJ/mol, 1000 cm⁻¹: a finite logarithm, and bellKappa refuses to overflow', () => {
		expect(bellKappaLog10(1000, 50, 500)).toBeCloseTo(408.3902328, 6);
		expect(() => bellKappa(1000, 50, 500)).toThrow(/beyond double precision.*bellKappaLog10/);
		expect(bellKappa(2000, 150, 50)).toBeCloseTo(10 ** 11.880882609350484, -2);
	});
	it('refuses a barrier of 0 and non-positive frequencies with the argument named', () => {
		expect(() => bellKappaLog10(1000, 300, 0)).toThrow(/barrierKJmol/);
		expect(() => bellKappaLog10(-1, 300, 10)).toThrow(/imagFreqCm1/);
	});
});

describe('Colbert–Miller DVR', () => {
	it('reproduces the harmonic oscillator, E_v = (v + ½)ħω', () => {
		const k = 400; // kcal/(mol Å²)
		const r = vibrationalLevels({
			potential: (x) => 0.5 * k * x * x,
			massAmu: 1,
			xMinA: -1,
			xMaxA: 1,
			points: 300,
			levels: 5
		});
		const w = hbarOmegaKcal(k, 1);
		r.energiesKcalMol.forEach((e, v) => expect(e / ((v + 0.5) * w)).toBeCloseTo(1, 8));
	});
	// Morse levels: E_v = ħω(v+½) − (ħω)²(v+½)²/(4D), ω = a√(2D/m) (P. M. Morse, Phys. Rev. 34, 57 (1929)).
	it('reproduces the Morse oscillator', () => {
		const D = 100;
		const a = 2;
		const m = TRANSFER_MASSES_AMU.H;
		const r = vibrationalLevels({
			potential: (x) => D * (1 - Math.exp(-a * x)) ** 2,
			massAmu: m,
			xMinA: -0.8,
			xMaxA: 4,
			points: 400,
			levels: 6
		});
		const w = hbarOmegaKcal(2 * D * a * a, m);
		r.energiesKcalMol.forEach((e, v) =>
			expect(e).toBeCloseTo(w * (v + 0.5) - (w * w * (v + 0.5) ** 2) / (4 * D), 5)
		);
	});
	it('wavefunctions are normalised on the grid', () => {
		const r = vibrationalLevels({
			potential: (x) => 100 * x * x,
			massAmu: 1,
			xMinA: -1,
			xMaxA: 1,
			points: 200,
			levels: 3
		});
		const dx = r.gridA[1]! - r.gridA[0]!;
		for (const psi of r.wavefunctions)
			expect(psi.reduce((s, p) => s + p * p * dx, 0)).toBeCloseTo(1, 10);
	});
	it('a sampled potential gives the levels of the function it samples', () => {
		const f = (x: number) => 150 * x * x;
		const samples = Array.from({ length: 81 }, (_, i) => ({
			xA: -1.2 + (2.4 * i) / 80,
			energyKcalMol: f(-1.2 + (2.4 * i) / 80)
		}));
		const a = vibrationalLevels({
			potential: f,
			massAmu: 1,
			xMinA: -1,
			xMaxA: 1,
			points: 150,
			levels: 3
		});
		const b = vibrationalLevels({
			potential: samples,
			massAmu: 1,
			xMinA: -1,
			xMaxA: 1,
			points: 150,
			levels: 3
		});
		b.energiesKcalMol.forEach((e, i) => expect(e).toBeCloseTo(a.energiesKcalMol[i]!, 3));
	});
	// ψ₀(x) = (mω/πħ)^{1/4} exp(−mωx²/2ħ) (any quantum mechanics text, e.g. Griffiths eq. 2.59):
	// the DVR's sinc interpolation gives it between the grid points too.
	it('interpolates a wavefunction between grid points in the DVR’s sinc basis', () => {
		const k = 400;
		const r = vibrationalLevels({
			potential: (x) => 0.5 * k * x * x,
			massAmu: 1,
			xMinA: -0.8,
			xMaxA: 0.8,
			points: 80,
			levels: 1
		});
		const psi = r.wavefunctions[0]!;
		expect(interpolateWavefunction(r.gridA, psi, r.gridA[17]!)).toBeCloseTo(psi[17]!, 12);
		const w = hbarOmegaKcal(k, 1);
		const l2 = (2 * kineticKcalA2(1)) / w; // ħ/mω, Å²
		const exact = (x: number) => (Math.PI * l2) ** -0.25 * Math.exp(-(x * x) / (2 * l2));
		for (const x of [-0.213, -0.05, 0.0071, 0.1234])
			expect(interpolateWavefunction(r.gridA, psi, x)).toBeCloseTo(exact(x), 6);
	});
	it('refuses a grid outside the sampled potential', () =>
		expect(() =>
			vibrationalLevels({
				potential: [0, 1, 2, 3].map((x) => ({ xA: x, energyKcalMol: x })),
				massAmu: 1,
				xMinA: -1,
				xMaxA: 2
			})
		).toThrow(/outside the sampled potential/));
});

describe('lowest eigenpairs', () => {
	// Cross-check with a general-purpose library: ml-matrix's symmetric eigen-decomposition.
	it('agree with ml-matrix on a random symmetric matrix', () => {
		const r = seededRandom(11);
		const n = 80;
		const m = Array.from({ length: n }, () => new Float64Array(n));
		for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) m[i]![j] = m[j]![i] = r.normal();
		const mine = lowestEigenpairs(m, 6);
		const reference = new EigenvalueDecomposition(new Matrix(m.map((row) => Array.from(row))), {
			assumeSymmetric: true
		});
		mine.values.forEach((v, i) => expect(v).toBeCloseTo(reference.realEigenvalues[i]!, 10));
		for (const [j, x] of mine.vectors.entries()) {
			for (let i = 0; i < n; i++) {
				let s = 0;
				for (let t = 0; t < n; t++) s += m[i]![t]! * x[t]!;
				expect(s).toBeCloseTo(mine.values[j]! * x[i]!, 9);
			}
		}
	});
});

describe('double wells', () => {
	const well = (height: number) => (x: number) => height * ((x / 0.4) ** 2 - 1) ** 2;
	const levelsOf = (height: number, massAmu: number = TRANSFER_MASSES_AMU.H) =>
		adaptiveVibrationalLevels({
			potential: well(height),
			massAmu,
			levels: 2,
			xMinA: -0.8,
			xMaxA: 0.8,
			maxPoints: MAX_POINTS
		});
	const assess = (l: AdaptiveLevels, f?: (x: number) => number) =>
		assessDoubleWell(l, { potential: f, comparison: l.comparison });
	it('a high barrier: small splitting, tunnelling between localised states', () => {
		const a = assess(levelsOf(12), well(12));
		// The barrier of V = B((x/a)² − 1)² is B, found on the potential itself.
		expect(a.barrierKcalMol).toBeCloseTo(12, 10);
		expect(a.minimaA[0]).toBeCloseTo(-0.4, 8);
		expect(a.topA).toBeCloseTo(0, 8);
		expect(a.groundAboveBarrier).toBe(false);
		expect(a.regime).toBe('nonadiabatic');
		expect(a.splittingKcalMol / a.barrierKcalMol).toBeLessThan(0.1);
		expect(a.assessment).toMatch(/tunnels/);
	});
	it('a symmetric well: the splitting is E₁ − E₀ and the localised levels are equal', () => {
		const l = levelsOf(8);
		const a = assess(l, well(8));
		expect(a.splittingKcalMol / a.levelGapKcalMol).toBeCloseTo(1, 9);
		expect(Math.abs(a.localisedDifferenceKcalMol)).toBeLessThan(1e-6 * a.levelGapKcalMol);
		expect(a.splittingResolved).toBe(true);
	});
	it('a low barrier: the ground level lies above it (vibrationally adiabatic)', () => {
		const a = assess(levelsOf(0.1), well(0.1));
		expect(a.groundAboveBarrier).toBe(true);
		expect(a.regime).toBe('adiabatic');
	});
	it('deuterium tunnels less: H/D isotope effect above 1', () => {
		const kie = isotopeEffectFromSplittings(
			assess(levelsOf(8), well(8)),
			assess(levelsOf(8, TRANSFER_MASSES_AMU.D), well(8))
		);
		expect(kie.splittingHCm1).toBeGreaterThan(kie.splittingDCm1);
		expect(kie.kie).toBeGreaterThan(1);
	});
	// Hammes-Schiffer & Stuchebrukhov (2010): the squared-splitting ratio is a rate ratio only for
	// nonadiabatic transfer; the app calls E₀ ≥ V_top vibrationally adiabatic.
	it('no isotope effect where the transfer is vibrationally adiabatic', () => {
		expect(() =>
			isotopeEffectFromSplittings(
				assess(levelsOf(0.1), well(0.1)),
				assess(levelsOf(0.1, TRANSFER_MASSES_AMU.D), well(0.1))
			)
		).toThrow(/vibrationally adiabatic/);
	});
	it('no isotope effect from a splitting below what the calculation resolves', () => {
		// A deuteron under a 100 kcal/mol barrier between wells 4 Å apart: Δ is far below the
		// eigenvectors' precision, and it changes from grid to grid.
		const f = quartic(100, 2);
		const grid = { potential: f, levels: 2, xMinA: -4, xMaxA: 4, maxPoints: MAX_POINTS };
		const h = adaptiveVibrationalLevels({ ...grid, massAmu: TRANSFER_MASSES_AMU.H });
		const d = adaptiveVibrationalLevels({ ...grid, massAmu: TRANSFER_MASSES_AMU.D });
		expect(assess(d, f).splittingResolved).toBe(false);
		expect(() => isotopeEffectFromSplittings(assess(h, f), assess(d, f))).toThrow(/resolves/);
	});
	it('refuses a single well', () => {
		const r = vibrationalLevels({
			potential: (x) => 50 * x * x,
			massAmu: 1,
			xMinA: -1,
			xMaxA: 1,
			points: 100,
			levels: 2
		});
		expect(() => assessDoubleWell(r)).toThrow(/not a double well/);
	});
});

/*
 * Tilted wells. The case of the issue: B = 12 kcal/mol, a = 0.5 Å. Untilted, (Δ_H/Δ_D)² = 8 228
 * (independent check: the levels in a harmonic-oscillator basis, a Galerkin method, numpy 2.4.6
 * eigh, N = 500 kept 350: E₁ − E₀ = 1.269755261e-3 kcal/mol for H and 1.3997876e-5 for D, ratio²
 * 8 228.4). With a tilt of 0.2 kcal/mol the old code took E₁ − E₀ (mostly the tilt) for the
 * splitting and gave 0.965. In the two-state model (Hammes-Schiffer & Stuchebrukhov 2010, §2)
 * the coupling of the localised states hardly depends on a tilt small against the barrier, so the
 * isotope effect must stay near 8 000.
 */
describe('tilted wells: the splitting is the symmetric part', () => {
	const assessTilt = (tilt: number, massAmu: number) => {
		const f = quartic(12, 0.5, tilt);
		const l = adaptiveVibrationalLevels({
			potential: f,
			massAmu,
			levels: 2,
			xMinA: -1,
			xMaxA: 1,
			maxPoints: MAX_POINTS
		});
		return assessDoubleWell(l, { potential: f, comparison: l.comparison });
	};
	const kieAt = (tilt: number) =>
		isotopeEffectFromSplittings(
			assessTilt(tilt, TRANSFER_MASSES_AMU.H),
			assessTilt(tilt, TRANSFER_MASSES_AMU.D)
		).kie;
	it('untilted: 8 228 as the oscillator-basis reference gives', () => {
		expect(kieAt(0) / 8228.4).toBeCloseTo(1, 3);
	});
	it('a 0.2 kcal/mol tilt: the isotope effect stays within 1 % of the untilted one (was 0.965)', () => {
		expect(kieAt(0.2) / kieAt(0)).toBeCloseTo(1, 2);
	});
	it('Δ² + ε² = (E₁ − E₀)², with ε near the tilt and E₁ − E₀ mostly the tilt', () => {
		const a = assessTilt(0.2, TRANSFER_MASSES_AMU.H);
		expect(
			Math.hypot(a.splittingKcalMol, a.localisedDifferenceKcalMol) / a.levelGapKcalMol
		).toBeCloseTo(1, 12);
		expect(a.splittingKcalMol / a.levelGapKcalMol).toBeLessThan(0.01);
		expect(a.localisedDifferenceKcalMol).toBeGreaterThan(0.15); // right well higher
		expect(a.localisedDifferenceKcalMol).toBeLessThan(0.2);
		expect(a.splittingResolved).toBe(true);
	});
	it('the tilt moves the minima: the barrier from the lower one exceeds the untilted barrier', () => {
		const a = assessTilt(0.2, TRANSFER_MASSES_AMU.H);
		// V(−a) = 0 and V(a) = ε for this form; the true minima are near, and a little lower.
		expect(a.asymmetryKcalMol).toBeCloseTo(0.2, 3);
		expect(a.barrierKcalMol).toBeGreaterThan(12);
		expect(a.barrierKcalMol).toBeCloseTo(12.1, 2);
	});
});

/*
 * The grid chosen from the potential. Before: a fixed ±2.5a with 400 points, so for a = 0.05 Å
 * and B = 0.01 kcal/mol the box was ±0.125 Å and E₀ came out 7.571 kcal/mol, against 1.5527.
 */
describe('the grid is chosen from the potential', () => {
	const H = TRANSFER_MASSES_AMU.H;
	// Reference: the same well in a harmonic-oscillator basis (numpy 2.4.6 eigh; N = 500 kept
	// 350, and N = 700 kept 500 agree to 1e-11): a different method from the grid.
	it('a small, shallow well (0.05 Å, 0.01 kcal/mol): E₀ = 1.5527 kcal/mol, not 7.57', () => {
		const r = adaptiveVibrationalLevels({
			potential: quartic(0.01, 0.05),
			massAmu: H,
			levels: 4,
			xMinA: -0.1,
			xMaxA: 0.1,
			maxPoints: MAX_POINTS
		});
		const reference = [1.552730547292, 5.639145060165, 11.188388735585, 17.565963819634];
		r.energiesKcalMol.forEach((e, i) => expect(e / reference[i]! - 1).toBeCloseTo(0, 9));
		expect(r.grid).toMatchObject({ decayed: true, converged: true, range: 'automatic' });
		expect(r.grid.edgeAmplitude).toBeLessThanOrEqual(1e-8);
		expect(r.grid.levelChange).toBeLessThan(1e-6);
		expect(r.grid.xMaxA - r.grid.xMinA).toBeGreaterThan(1); // far beyond the old ±0.125 Å
		expect(r.grid.message).toMatch(/decayed to .* of its peak at both ends/);
	});
	// The tiny-barrier limit: V = c·x⁴, E_n = (ħ²/2m)^{2/3} c^{1/3} e_n with e_n = 1.0603620905,
	// 3.7996730298, 7.4556979380, 11.6447455114 for −d²/dx² + x⁴ (F. T. Hioe & E. W. Montroll,
	// J. Math. Phys. 16, 1945 (1975); values from memory, confirmed with an independent 1 200-point
	// sinc-DVR in numpy/LAPACK to 1e-11).
	it('the pure quartic oscillator (the zero-barrier limit of the double well)', () => {
		const c = 1600;
		const r = adaptiveVibrationalLevels({
			potential: (x) => c * x ** 4,
			massAmu: H,
			levels: 4,
			xMinA: -0.05,
			xMaxA: 0.05,
			maxPoints: MAX_POINTS
		});
		const scale = kineticKcalA2(H) ** (2 / 3) * c ** (1 / 3);
		[1.0603620905, 3.7996730298, 7.455697938, 11.6447455114].forEach((e, i) =>
			expect(r.energiesKcalMol[i]! / (scale * e) - 1).toBeCloseTo(0, 9)
		);
		expect(r.grid.converged).toBe(true);
	});
	// The deep-well limit: near each minimum V = ½kδ² + αδ³ + βδ⁴ with k = 8B/a², α = 4B/a³,
	// β = B/a⁴; second-order perturbation theory (L. D. Landau & E. M. Lifshitz, Quantum Mechanics,
	// 3rd ed., §38, problem 3): E_n = ħω(n + ½) − (15/4)(α²/ħω)(ħ/mω)³(n² + n + 11/30)
	// + (3/2)β(ħ/mω)²(n² + n + ½). The doublets (n, n) are degenerate to far below this accuracy;
	// the terms left out are of relative order (ħω/B)².
	it('a deep well gives the harmonic levels with their anharmonic correction', () => {
		const [B, a] = [100, 2];
		const r = adaptiveVibrationalLevels({
			potential: quartic(B, a),
			massAmu: H,
			levels: 6,
			xMinA: -4,
			xMaxA: 4,
			maxPoints: MAX_POINTS
		});
		const w = hbarOmegaKcal((8 * B) / a ** 2, H);
		const l2 = (2 * kineticKcalA2(H)) / w; // ħ/mω, Å²
		const [alpha, beta] = [(4 * B) / a ** 3, B / a ** 4];
		r.energiesKcalMol.forEach((e, i) => {
			const n = Math.floor(i / 2);
			const perturbed =
				w * (n + 0.5) -
				(15 / 4) * (alpha ** 2 / w) * l2 ** 3 * (n * n + n + 11 / 30) +
				1.5 * beta * l2 ** 2 * (n * n + n + 0.5);
			// The omitted orders scale as (ħω/B)²·ħω·(n + ½)³; a tenth of that is the bound, still
			// far tighter than the anharmonic correction the check is about.
			const bound = 0.1 * (w / B) ** 2 * w * (n + 0.5) ** 3;
			expect(Math.abs(e - perturbed)).toBeLessThan(bound);
			// …and the harmonic term alone is outside that bound: the test sees the correction.
			expect(Math.abs(e - w * (n + 0.5))).toBeGreaterThan(bound);
		});
		expect(r.grid.converged).toBe(true);
	});
	// A flat sampled potential is a particle in a box: E_n = n²π²ħ²/(2mL²) (D. J. Griffiths,
	// Introduction to Quantum Mechanics, eq. 2.30). Its wavefunctions never decay before the
	// walls, and the grid cannot grow beyond the samples: the answer must say so.
	it('a flat sampled potential: the box levels, and a report that the wavefunctions reach the walls', () => {
		const L = 2;
		const flat = Array.from({ length: 21 }, (_, i) => ({ xA: (L * i) / 20, energyKcalMol: 0 }));
		const r = adaptiveVibrationalLevels({
			potential: flat,
			massAmu: 1,
			levels: 3,
			maxPoints: MAX_POINTS
		});
		r.energiesKcalMol.forEach((e, i) =>
			expect(e / (((i + 1) * Math.PI) ** 2 * kineticKcalA2(1)) / L ** -2 - 1).toBeLessThan(1e-3)
		);
		expect(r.grid).toMatchObject({ xMinA: 0, xMaxA: L, decayed: false, converged: false });
		expect(r.grid.message).toMatch(/sampled potential ends there/);
	});
	it('a given interval is kept and only checked', () => {
		const r = adaptiveVibrationalLevels({
			potential: quartic(0.01, 0.05),
			massAmu: H,
			levels: 2,
			xMinA: -0.125,
			xMaxA: 0.125,
			fixedRange: true,
			points: 400,
			maxPoints: MAX_POINTS
		});
		expect(r.grid).toMatchObject({ range: 'given', resolution: 'given', points: 400 });
		expect(r.grid.xMinA).toBe(-0.125);
		expect(r.energiesKcalMol[0]).toBeCloseTo(7.5708, 3); // the old answer, now with its warning
		expect(r.grid.converged).toBe(false);
		expect(r.grid.message).toMatch(/feel the grid's wall there; widen the interval/);
	});
	it('stays within the cost bound and says so when the potential does not confine the levels', () => {
		const r = adaptiveVibrationalLevels({
			potential: () => 0,
			massAmu: H,
			levels: 2,
			xMinA: -0.1,
			xMaxA: 0.1,
			maxPoints: 200
		});
		expect(r.grid.converged).toBe(false);
		expect(r.grid.points).toBeLessThanOrEqual(200);
		expect(r.grid.message).toMatch(/does not confine|cost bound/);
	});
	it('stops at the work budget and says so', () => {
		const flat = Array.from({ length: 21 }, (_, i) => ({ xA: (2 * i) / 20, energyKcalMol: 0 }));
		const r = adaptiveVibrationalLevels({
			potential: flat,
			massAmu: 1,
			levels: 3,
			maxPoints: MAX_POINTS,
			workBudget: 0.5
		});
		expect(r.grid.points).toBeLessThan(MAX_POINTS);
		expect(r.grid.message).toMatch(
			/stopped at the cost bound \(0\.5 solutions' worth on 600 points\)/
		);
	});
	it('refuses a function without a start interval, and one end without the other', () => {
		expect(() => adaptiveVibrationalLevels({ potential: quartic(1, 0.3), massAmu: H })).toThrow(
			/interval to start from/
		);
		expect(() =>
			adaptiveVibrationalLevels({ potential: quartic(1, 0.3), massAmu: H, xMinA: -1 })
		).toThrow(/both ends/);
	});
});
