import {
	ATOMIC_MASS_KG,
	AVOGADRO_PER_MOL,
	BOLTZMANN_J_PER_K,
	GAS_J_PER_MOL_K,
	HBAR_J_S,
	PLANCK_J_S,
	SPEED_OF_LIGHT_M_PER_S
} from './constants';
import { requireFinite, requireInRange, requirePositive } from './guards';
import { lowestEigenpairs } from './symmetricEigen';

/*
 * Quantum corrections for proton and hydride transfer: tunnelling factors for a parabolic
 * barrier, and vibrational levels of a one-dimensional potential by the Colbert–Miller discrete
 * variable representation. Frequencies in cm⁻¹, energies in kcal/mol or kJ/mol as named,
 * positions in Å, masses in atomic mass units. These are model estimates: a one-dimensional,
 * parabolic or fixed-potential picture of motion that is really many-dimensional.
 */

/** Second radiation constant c₂ = hc/k_B, cm·K (CODATA 2018: 1.438 776 877 cm K). */
export const SECOND_RADIATION_CM_K =
	(PLANCK_J_S * SPEED_OF_LIGHT_M_PER_S * 100) / BOLTZMANN_J_PER_K;
/** 1 kcal/mol in cm⁻¹ (thermochemical calorie, 4.184 J). */
export const KCAL_PER_MOL_IN_CM1 =
	4184 / AVOGADRO_PER_MOL / (PLANCK_J_S * SPEED_OF_LIGHT_M_PER_S * 100);

/** Atomic masses to enter for the transferring particle (u; AME2020 via CODATA). */
export const TRANSFER_MASSES_AMU = {
	/** ¹H atom; use for a proton or hydrogen atom moving with its electron density. */
	H: 1.00782503,
	/** ²H atom. */
	D: 2.01410178,
	/** ³H atom. */
	T: 3.01604928,
	/** Hydride: the H atom plus one electron (5.4858e-4 u); the difference is far below the model error. */
	hydride: 1.00837361
} as const;

function u(imagFreqCm1: number, temperatureK: number): number {
	requirePositive(imagFreqCm1, 'imagFreqCm1 (the magnitude of the imaginary frequency)');
	requirePositive(temperatureK, 'temperatureK');
	return (SECOND_RADIATION_CM_K * imagFreqCm1) / temperatureK;
}

/**
 * Wigner's tunnelling correction, the leading quantum term for a parabolic barrier top:
 * κ = 1 + (1/24)(hν‡/k_BT)². Reliable only while κ stays near 1 (u = hν‡/k_BT ≲ 2).
 * References: E. Wigner, Z. Phys. Chem. B 19, 203 (1932).
 * @param imagFreqCm1 magnitude of the imaginary frequency at the barrier top, cm⁻¹
 * @example wignerKappa(1000, 298.15) // ≈ 1.970
 */
export function wignerKappa(imagFreqCm1: number, temperatureK: number): number {
	const x = u(imagFreqCm1, temperatureK);
	return 1 + (x * x) / 24;
}

/**
 * Bell's tunnelling correction for a parabolic barrier, κ = ∫ P(E) e^{−(E−V)/k_BT} dE / k_BT with
 * P(E) = 1 / (1 + exp[2π(V − E)/hν‡]):
 * - without a barrier height, the infinite parabola: κ = (u/2)/sin(u/2), defined for u < 2π;
 * - with the barrier height V (kJ/mol), the parabola truncated at the reactant energy: the same
 *   integral from E = 0, computed numerically; equal to Bell's series
 *   (u/2)/sin(u/2) − Σₙ (−1)ⁿ⁺¹ exp[α(u − 2πn)/u] · u/(2πn − u), α = V/k_BT, where that converges,
 *   and finite for any u.
 * References: R. P. Bell, Trans. Faraday Soc. 55, 1 (1959); R. P. Bell, *The Tunnel Effect in
 * Chemistry* (Chapman & Hall, 1980), ch. 2.
 * @throws {RangeError} for the infinite parabola at u ≥ 2π (give the barrier height).
 * @example bellKappa(1000, 298.15) // ≈ 3.62
 */
export function bellKappa(
	imagFreqCm1: number,
	temperatureK: number,
	barrierKJmol?: number
): number {
	const x = u(imagFreqCm1, temperatureK);
	if (barrierKJmol === undefined) {
		if (x >= 2 * Math.PI) {
			throw new RangeError(
				`hν‡/k_BT = ${x.toFixed(2)} ≥ 2π: the infinite-parabola correction diverges; give the barrier height for the truncated form`
			);
		}
		return x / 2 / Math.sin(x / 2);
	}
	requirePositive(barrierKJmol, 'barrierKJmol');
	const alpha = (barrierKJmol * 1000) / (GAS_J_PER_MOL_K * temperatureK);
	const a = (2 * Math.PI) / x;
	// y = (E − V)/k_BT; κ = ∫_{−α}^{∞} e^{−y} / (1 + e^{−a y}) dy, integrand in a stable form.
	const integrand = (y: number) =>
		a * y >= 0
			? Math.exp(-y) / (1 + Math.exp(-a * y))
			: Math.exp((a - 1) * y) / (1 + Math.exp(a * y));
	return integrate(integrand, -alpha, 60);
}

/** Composite Gauss–Legendre quadrature (5 points per panel) over [a, b]. */
function integrate(f: (y: number) => number, a: number, b: number): number {
	const nodes = [0, -0.5384693101056831, 0.5384693101056831, -0.906179845938664, 0.906179845938664];
	const weights = [
		0.5688888888888889, 0.47862867049936647, 0.47862867049936647, 0.23692688505618908,
		0.23692688505618908
	];
	const panels = Math.max(400, Math.ceil((b - a) * 20));
	const h = (b - a) / panels;
	let sum = 0;
	for (let p = 0; p < panels; p++) {
		const mid = a + (p + 0.5) * h;
		for (let i = 0; i < 5; i++) sum += weights[i]! * f(mid + (nodes[i]! * h) / 2);
	}
	return (sum * h) / 2;
}

export type PotentialKcalMol = ((xA: number) => number) | { xA: number; energyKcalMol: number }[];

export interface VibrationalInput {
	/** V(x) in kcal/mol, as a function of x in Å or as sampled points (interpolated by a natural cubic spline). */
	potential: PotentialKcalMol;
	/** Mass of the moving particle, u; see TRANSFER_MASSES_AMU. */
	massAmu: number;
	xMinA: number;
	xMaxA: number;
	/** Grid points (the ends are excluded, where the wavefunction vanishes). @default 400 */
	points?: number;
	/** How many of the lowest levels to return. @default 6 */
	levels?: number;
}

export interface VibrationalLevels {
	gridA: number[];
	potentialKcalMol: number[];
	energiesKcalMol: number[];
	energiesCm1: number[];
	/** wavefunctions[i][j] at gridA[j], normalised so that Σ ψ² Δx = 1 (Å⁻¹ᐟ²). */
	wavefunctions: number[][];
}

/** Natural cubic spline through sampled points (Burden & Faires, Numerical Analysis, Alg. 3.4). */
function spline(samples: { xA: number; energyKcalMol: number }[]): (x: number) => number {
	const pts = [...samples].sort((p, q) => p.xA - q.xA);
	const n = pts.length;
	if (n < 4) throw new RangeError('a sampled potential needs at least 4 points');
	for (let i = 1; i < n; i++) {
		if (pts[i]!.xA === pts[i - 1]!.xA)
			throw new RangeError(`the potential is sampled twice at x = ${pts[i]!.xA} Å`);
	}
	pts.forEach((p, i) => {
		requireFinite(p.xA, `potential[${i}].xA`);
		requireFinite(p.energyKcalMol, `potential[${i}].energyKcalMol`);
	});
	const x = pts.map((p) => p.xA);
	const y = pts.map((p) => p.energyKcalMol);
	const h = x.slice(1).map((xi, i) => xi - x[i]!);
	const alpha = [
		0,
		...h
			.slice(1)
			.map((_, i) => (3 / h[i + 1]!) * (y[i + 2]! - y[i + 1]!) - (3 / h[i]!) * (y[i + 1]! - y[i]!))
	];
	const l = [1];
	const mu = [0];
	const z = [0];
	for (let i = 1; i < n - 1; i++) {
		l[i] = 2 * (x[i + 1]! - x[i - 1]!) - h[i - 1]! * mu[i - 1]!;
		mu[i] = h[i]! / l[i]!;
		z[i] = (alpha[i]! - h[i - 1]! * z[i - 1]!) / l[i]!;
	}
	const c = new Array<number>(n).fill(0);
	const b = new Array<number>(n - 1).fill(0);
	const d = new Array<number>(n - 1).fill(0);
	for (let j = n - 2; j >= 0; j--) {
		c[j] = z[j]! - mu[j]! * c[j + 1]!;
		b[j] = (y[j + 1]! - y[j]!) / h[j]! - (h[j]! * (c[j + 1]! + 2 * c[j]!)) / 3;
		d[j] = (c[j + 1]! - c[j]!) / (3 * h[j]!);
	}
	return (xq: number) => {
		if (xq < x[0]! || xq > x[n - 1]!) {
			throw new RangeError(
				`the grid reaches x = ${xq} Å, outside the sampled potential (${x[0]}–${x[n - 1]} Å)`
			);
		}
		let j = 0;
		while (j < n - 2 && xq > x[j + 1]!) j++;
		const t = xq - x[j]!;
		return y[j]! + b[j]! * t + c[j]! * t * t + d[j]! * t * t * t;
	};
}

/**
 * Vibrational levels and wavefunctions of a particle in a one-dimensional potential, by the
 * Colbert–Miller DVR on a uniform grid:
 *
 *   T_ij = ħ²/(2mΔx²) · (−1)^{i−j} · { π²/3 if i = j;  2/(i − j)² otherwise },   H = T + diag V(x_i)
 *
 * References: D. T. Colbert & W. H. Miller, J. Chem. Phys. 96, 1982 (1992), eq. A7.
 * @throws {RangeError} for a mass ≤ 0, an empty interval, fewer than 10 or more than 2000 points,
 * more levels than points, or a sampled potential that does not cover the grid.
 */
export function vibrationalLevels(input: VibrationalInput): VibrationalLevels {
	const points = input.points ?? 400;
	const levels = input.levels ?? 6;
	requirePositive(input.massAmu, 'massAmu');
	requireFinite(input.xMinA, 'xMinA');
	requireFinite(input.xMaxA, 'xMaxA');
	if (!(input.xMaxA > input.xMinA)) throw new RangeError('xMaxA must be greater than xMinA');
	if (!Number.isInteger(points) || points < 10 || points > 2000) {
		throw new RangeError(`points must be a whole number from 10 to 2000, got ${points}`);
	}
	if (!Number.isInteger(levels) || levels < 1 || levels > Math.min(50, points)) {
		throw new RangeError(
			`levels must be a whole number from 1 to ${Math.min(50, points)}, got ${levels}`
		);
	}
	const v = typeof input.potential === 'function' ? input.potential : spline(input.potential);
	const dx = (input.xMaxA - input.xMinA) / (points + 1);
	const grid = Array.from({ length: points }, (_, i) => input.xMinA + (i + 1) * dx);
	const potential = grid.map((x, i) => {
		const value = v(x);
		requireFinite(value, `potential at x = ${x.toFixed(4)} Å (point ${i})`);
		return value;
	});
	// ħ²/(2 m Δx²) in kcal/mol, with m in u and Δx in Å.
	const kinetic =
		((HBAR_J_S ** 2 / (2 * input.massAmu * ATOMIC_MASS_KG * (dx * 1e-10) ** 2)) *
			AVOGADRO_PER_MOL) /
		4184;
	const h = grid.map((_, i) => {
		const row = new Float64Array(points);
		for (let j = 0; j < points; j++) {
			const k = i - j;
			row[j] =
				k === 0
					? kinetic * (Math.PI ** 2 / 3) + potential[i]!
					: (kinetic * 2 * (k % 2 === 0 ? 1 : -1)) / (k * k);
		}
		return row;
	});
	const { values, vectors } = lowestEigenpairs(h, levels);
	const wavefunctions = vectors.map((vec) => {
		// Fix the arbitrary sign (largest lobe positive) and normalise on the grid.
		let peak = 0;
		for (const value of vec) if (Math.abs(value) > Math.abs(peak)) peak = value;
		const sign = peak < 0 ? -1 : 1;
		return Array.from(vec, (value) => (sign * value) / Math.sqrt(dx));
	});
	return {
		gridA: grid,
		potentialKcalMol: potential,
		energiesKcalMol: values,
		energiesCm1: values.map((e) => e * KCAL_PER_MOL_IN_CM1),
		wavefunctions
	};
}

export interface DoubleWellAssessment {
	barrierKcalMol: number;
	/** E₁ − E₀, cm⁻¹ and kcal/mol. */
	splittingCm1: number;
	splittingKcalMol: number;
	/** Ground level above the lower minimum, kcal/mol. */
	zeroPointKcalMol: number;
	/** True when the ground level lies at or above the barrier top. */
	groundAboveBarrier: boolean;
	assessment: string;
}

/**
 * Compares the lowest levels of a double well with its barrier — the usual test of whether a
 * proton transfer is vibrationally adiabatic (the ground level above, or comparable with, the
 * barrier: the proton is delocalised and follows the other coordinates) or proceeds by
 * tunnelling between localised states (splitting ≪ barrier: vibrationally nonadiabatic, rate
 * governed by the vibronic coupling, about half the splitting).
 * References: S. Hammes-Schiffer & A. A. Stuchebrukhov, Chem. Rev. 110, 6939 (2010), §2.
 * @throws {RangeError} when the potential has no barrier between two minima inside the grid.
 */
export function assessDoubleWell(levels: VibrationalLevels): DoubleWellAssessment {
	const v = levels.potentialKcalMol;
	const minima: number[] = [];
	for (let i = 1; i < v.length - 1; i++)
		if (v[i]! <= v[i - 1]! && v[i]! < v[i + 1]!) minima.push(i);
	if (minima.length < 2 || levels.energiesKcalMol.length < 2) {
		throw new RangeError(
			'not a double well: the potential needs two minima on the grid, and two levels are needed'
		);
	}
	const [left, right] = [...minima]
		.sort((a, b) => v[a]! - v[b]!)
		.slice(0, 2)
		.sort((a, b) => a - b) as [number, number];
	let top = left;
	for (let i = left; i <= right; i++) if (v[i]! > v[top]!) top = i;
	const bottom = Math.min(v[left]!, v[right]!);
	const barrier = v[top]! - bottom;
	const [e0, e1] = levels.energiesKcalMol as [number, number];
	const splitting = e1 - e0;
	const zeroPoint = e0 - bottom;
	const above = e0 >= v[top]!;
	const ratio = splitting / barrier;
	const assessment = above
		? 'The ground level lies above the barrier: the proton is delocalised over both wells; treat the transfer as vibrationally adiabatic.'
		: ratio > 0.1
			? 'The splitting is a sizeable fraction of the barrier: intermediate regime; neither limit is safe.'
			: 'The splitting is small against the barrier: the proton tunnels between localised states (vibrationally nonadiabatic transfer).';
	return {
		barrierKcalMol: barrier,
		splittingKcalMol: splitting,
		splittingCm1: splitting * KCAL_PER_MOL_IN_CM1,
		zeroPointKcalMol: zeroPoint,
		groundAboveBarrier: above,
		assessment
	};
}

/**
 * An H/D kinetic isotope effect estimate for transfer through a double well: the ratio of the
 * squared tunnelling splittings, (Δ_H/Δ_D)², as for a nonadiabatic rate proportional to the
 * squared vibronic coupling (about Δ/2) with similar Franck–Condon terms. Indicative only.
 * References: Hammes-Schiffer & Stuchebrukhov (2010), eq. 2.7 and §5.
 */
export function isotopeEffectFromSplittings(input: Omit<VibrationalInput, 'massAmu' | 'levels'>): {
	splittingHCm1: number;
	splittingDCm1: number;
	kie: number;
} {
	const h = assessDoubleWell(
		vibrationalLevels({ ...input, massAmu: TRANSFER_MASSES_AMU.H, levels: 2 })
	);
	const d = assessDoubleWell(
		vibrationalLevels({ ...input, massAmu: TRANSFER_MASSES_AMU.D, levels: 2 })
	);
	requireInRange(d.splittingCm1, 'the deuterium splitting', Number.MIN_VALUE, Infinity);
	return {
		splittingHCm1: h.splittingCm1,
		splittingDCm1: d.splittingCm1,
		kie: (h.splittingCm1 / d.splittingCm1) ** 2
	};
}
