import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import {
	ATOMIC_MASS_KG,
	AVOGADRO_PER_MOL,
	HBAR_J_S,
	KCAL_PER_MOL_IN_CM1,
	SECOND_RADIATION_CM_K,
	TRANSFER_MASSES_AMU,
	assessDoubleWell,
	bellKappa,
	isotopeEffectFromSplittings,
	lowestEigenpairs,
	seededRandom,
	vibrationalLevels,
	wignerKappa
} from '$lib/science';

// ħω in kcal/mol for a force constant in kcal/(mol Å²) and a mass in u.
const hbarOmegaKcal = (forceKcalPerA2: number, massAmu: number) => {
	const k = (forceKcalPerA2 * 4184) / AVOGADRO_PER_MOL / 1e-20; // J/m²
	return (HBAR_J_S * Math.sqrt(k / (massAmu * ATOMIC_MASS_KG)) * AVOGADRO_PER_MOL) / 4184;
};

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
	it('a high barrier: small splitting, tunnelling between localised states', () => {
		const r = vibrationalLevels({
			potential: well(12),
			massAmu: TRANSFER_MASSES_AMU.H,
			xMinA: -1,
			xMaxA: 1,
			points: 300,
			levels: 2
		});
		const a = assessDoubleWell(r);
		expect(a.barrierKcalMol).toBeCloseTo(12, 2);
		expect(a.groundAboveBarrier).toBe(false);
		expect(a.splittingKcalMol / a.barrierKcalMol).toBeLessThan(0.1);
		expect(a.assessment).toMatch(/tunnels/);
	});
	it('a low barrier: the ground level lies above it', () => {
		const r = vibrationalLevels({
			potential: well(0.1),
			massAmu: TRANSFER_MASSES_AMU.H,
			xMinA: -1,
			xMaxA: 1,
			points: 300,
			levels: 2
		});
		expect(assessDoubleWell(r).groundAboveBarrier).toBe(true);
	});
	it('deuterium tunnels less: H/D isotope effect above 1', () => {
		const kie = isotopeEffectFromSplittings({
			potential: well(8),
			xMinA: -1,
			xMaxA: 1,
			points: 300
		});
		expect(kie.splittingHCm1).toBeGreaterThan(kie.splittingDCm1);
		expect(kie.kie).toBeGreaterThan(1);
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
