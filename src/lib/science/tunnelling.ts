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
import { convertEnergy } from './units';

/*
 * Quantum corrections for proton and hydride transfer: tunnelling factors for a parabolic
 * barrier, and vibrational levels of a one-dimensional potential by the Colbert–Miller discrete
 * variable representation on a grid chosen from the potential. Frequencies in cm⁻¹, energies in
 * kcal/mol or kJ/mol as named (conversions: units.ts), positions in Å, masses in atomic mass
 * units. These are model estimates: a one-dimensional, parabolic or fixed-potential picture of
 * motion that is really many-dimensional.
 */

/** Second radiation constant c₂ = hc/k_B, cm·K (CODATA 2018: 1.438 776 877 cm K). */
export const SECOND_RADIATION_CM_K =
	(PLANCK_J_S * SPEED_OF_LIGHT_M_PER_S * 100) / BOLTZMANN_J_PER_K;
/** 1 kcal/mol in cm⁻¹ (thermochemical calorie, 4.184 J), from units.ts. */
export const KCAL_PER_MOL_IN_CM1 = convertEnergy(1, 'kcal/mol', 'cm-1');

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

/**
 * u = hν‡/k_BT, the barrier-top frequency in units of the thermal energy.
 * @param imagFreqCm1 magnitude of the imaginary frequency at the barrier top, cm⁻¹
 */
export function barrierFrequencyRatio(imagFreqCm1: number, temperatureK: number): number {
	requirePositive(imagFreqCm1, 'imagFreqCm1 (the magnitude of the imaginary frequency)');
	requirePositive(temperatureK, 'temperatureK');
	return (SECOND_RADIATION_CM_K * imagFreqCm1) / temperatureK;
}

/**
 * The crossover temperature T_c = hν‡/(2πk_B), below which (u > 2π) tunnelling well below the
 * barrier top dominates and the infinite parabola diverges.
 * References: R. P. Bell, *The Tunnel Effect in Chemistry* (Chapman & Hall, 1980), §2.3.
 * @example crossoverTemperatureK(1000) // ≈ 229.0 K
 */
export function crossoverTemperatureK(imagFreqCm1: number): number {
	requirePositive(imagFreqCm1, 'imagFreqCm1 (the magnitude of the imaginary frequency)');
	return (SECOND_RADIATION_CM_K * imagFreqCm1) / (2 * Math.PI);
}

/**
 * Above this u = hν‡/k_BT Wigner's factor falls more than 2 % below the full parabolic-barrier
 * factor (Bell's infinite parabola): at u = 2, 1 + u²/24 = 1.167 against (u/2)/sin(u/2) = 1.188.
 * Wigner's κ reaches 1.5 only at u = √12 ≈ 3.46, where it is already 15 % low (1.50 against 1.75).
 */
export const WIGNER_VALID_U = 2;

/**
 * Wigner's tunnelling correction, the leading quantum term for a parabolic barrier top:
 * κ = 1 + (1/24)(hν‡/k_BT)², i.e. the first term of the expansion of Bell's infinite-parabola
 * factor (u/2)/sin(u/2) = 1 + u²/24 + 7u⁴/5760 + … . Within 2 % of that factor while
 * u = hν‡/k_BT ≤ 2 (WIGNER_VALID_U); 15 % low at u ≈ 3.46, where κ_W = 1.5.
 * References: E. Wigner, Z. Phys. Chem. B 19, 203 (1932); the series: Bell (1980), ch. 2.
 * @param imagFreqCm1 magnitude of the imaginary frequency at the barrier top, cm⁻¹
 * @throws {RangeError} for a frequency or temperature ≤ 0.
 * @example wignerKappa(1000, 298.15) // ≈ 1.970
 */
export function wignerKappa(imagFreqCm1: number, temperatureK: number): number {
	const x = barrierFrequencyRatio(imagFreqCm1, temperatureK);
	return 1 + (x * x) / 24;
}

/**
 * log₁₀ of Bell's tunnelling correction for a parabolic barrier,
 * κ = ∫ P(E) e^{−(E−V)/k_BT} dE / k_BT with P(E) = 1 / (1 + exp[2π(V − E)/hν‡]):
 * - without a barrier height, the infinite parabola: κ = (u/2)/sin(u/2), defined for u < 2π;
 * - with the barrier height V (kJ/mol), the parabola truncated at the reactant energy (the
 *   integral from E = 0). With y = (E − V)/k_BT, α = V/k_BT and a = 2π/u:
 *   κ = ∫_{−α}^{∞} e^{−y} / (1 + e^{−a·y}) dy. The logarithm of the integrand is concave, so the
 *   integral is taken in log space: the largest value of the integrand (at y = ln(a − 1)/a for
 *   a > 1, else at y = −α) is factored out, and the rest is integrated by adaptive
 *   Gauss–Kronrod (7–15) quadrature to 1e-12 relative. Finite for every u and V: below the
 *   crossover temperature (u > 2π) κ grows as e^{(1−a)α} and can exceed double precision
 *   (≈ 10^408 at 50 K, 500 kJ/mol, 1000 cm⁻¹); its logarithm cannot.
 *   It equals Bell's series (u/2)/sin(u/2) − Σₙ (−1)ⁿ⁺¹ exp[α(u − 2πn)/u] · u/(2πn − u).
 * References: R. P. Bell, Trans. Faraday Soc. 55, 1 (1959); R. P. Bell, *The Tunnel Effect in
 * Chemistry* (Chapman & Hall, 1980), ch. 2 (the truncated parabola and its series).
 * @throws {RangeError} for the infinite parabola at u ≥ 2π (give the barrier height), or for a
 * frequency, temperature or barrier ≤ 0.
 * @example bellKappaLog10(1000, 50, 500) // ≈ 408.4
 */
export function bellKappaLog10(
	imagFreqCm1: number,
	temperatureK: number,
	barrierKJmol?: number
): number {
	const x = barrierFrequencyRatio(imagFreqCm1, temperatureK);
	if (barrierKJmol === undefined) {
		if (x >= 2 * Math.PI) {
			throw new RangeError(
				`hν‡/k_BT = ${x.toFixed(2)} ≥ 2π: the infinite-parabola correction diverges; give the barrier height for the truncated form`
			);
		}
		return Math.log10(x / 2 / Math.sin(x / 2));
	}
	requirePositive(barrierKJmol, 'barrierKJmol');
	const alpha = (barrierKJmol * 1000) / (GAS_J_PER_MOL_K * temperatureK);
	return truncatedParabolaLogKappa(alpha, (2 * Math.PI) / x) / Math.LN10;
}

/**
 * Bell's tunnelling correction for a parabolic barrier, κ = 10^bellKappaLog10(…) (see there for
 * the definition): the infinite parabola without a barrier height, the parabola truncated at the
 * reactant energy with it.
 * References: as bellKappaLog10.
 * @throws {RangeError} for the infinite parabola at u ≥ 2π, and when κ exceeds the largest
 * double (≈ 1.8e308), which the truncated form does far below the crossover temperature — use
 * bellKappaLog10 there.
 * @example bellKappa(1000, 298.15) // ≈ 3.62
 */
export function bellKappa(
	imagFreqCm1: number,
	temperatureK: number,
	barrierKJmol?: number
): number {
	const log10Kappa = bellKappaLog10(imagFreqCm1, temperatureK, barrierKJmol);
	const kappa = 10 ** log10Kappa;
	if (!Number.isFinite(kappa)) {
		throw new RangeError(
			`κ = 10^${log10Kappa.toFixed(1)} is beyond double precision; use its logarithm (bellKappaLog10)`
		);
	}
	return kappa;
}

/** ln ∫_{−α}^{∞} e^{−y}/(1 + e^{−a y}) dy, by factoring out the integrand's maximum. */
function truncatedParabolaLogKappa(alpha: number, a: number): number {
	// ln of the integrand is f(y) = (a − 1)·y − softplus(a·y), softplus(z) = ln(1 + e^z), written
	// so that it neither overflows nor loses digits; rel(y) = f(y) − f(peak) without subtracting
	// two large numbers (far below T_c, f(peak) reaches 6e4).
	const softplus = (z: number) => (z > 0 ? z + Math.log1p(Math.exp(-z)) : Math.log1p(Math.exp(z)));
	const stationary = a > 1 ? Math.log(a - 1) / a : -Infinity;
	const peak = Math.max(stationary, -alpha);
	const top = (a - 1) * peak - softplus(a * peak);
	const rel = (y: number) => (a - 1) * (y - peak) - (softplus(a * y) - softplus(a * peak));
	// The integrand is below e^{-50} of its peak beyond [lo, hi] (f is concave).
	const depth = 50;
	let lo = -alpha;
	if (rel(lo) < -depth) lo = bisect((y) => rel(y) + depth, lo, peak);
	let step = Math.max(1, 1 / a);
	while (rel(peak + step) > -depth) step *= 2;
	const hi = bisect((y) => rel(y) + depth, peak + step, peak);
	// Panels at the integrand's scales, so that no feature falls between the quadrature's nodes:
	// the logistic step (width 1/a) around 0, the exponentials e^{−y} (y > 0) and e^{(a−1)y}
	// (y < 0) and the peak.
	const scales = [1, 3, 10, 30];
	const breaks = [
		lo,
		hi,
		peak,
		0,
		...scales.flatMap((k) => [
			k / a,
			-k / a,
			k,
			peak + k / Math.abs(a - 1),
			peak - k / Math.abs(a - 1)
		])
	].filter((b) => Number.isFinite(b) && b >= lo && b <= hi);
	const integral = adaptiveGaussKronrod((y) => Math.exp(rel(y)), breaks, 1e-13);
	return top + Math.log(integral);
}

/** A root of g between two points where g changes sign (g(up) > 0 ≥ g(down) or the reverse). */
function bisect(g: (y: number) => number, down: number, up: number): number {
	let [a, b] = [down, up];
	for (let i = 0; i < 200 && Math.abs(b - a) > 1e-12 * Math.max(1, Math.abs(a)); i++) {
		const mid = (a + b) / 2;
		if (g(mid) > 0) b = mid;
		else a = mid;
	}
	return (a + b) / 2;
}

// Gauss–Kronrod 7–15 nodes and weights (R. Piessens et al., QUADPACK, Springer 1983, routine QK15).
const GK_NODES = [
	0.9914553711208126, 0.9491079123427585, 0.8648644233597691, 0.7415311855993945,
	0.5860872354676911, 0.4058451513773972, 0.20778495500789848, 0
];
const GK_WEIGHTS = [
	0.022935322010529224, 0.06309209262997856, 0.10479001032225019, 0.14065325971552592,
	0.1690047266392679, 0.19035057806478542, 0.20443294007529889, 0.20948214108472782
];
const GAUSS_WEIGHTS = [
	0.1294849661688697, 0.27970539148927664, 0.3818300505051189, 0.4179591836734694
];

function gaussKronrod(f: (y: number) => number, a: number, b: number) {
	const mid = (a + b) / 2;
	const half = (b - a) / 2;
	let kronrod = GK_WEIGHTS[7]! * f(mid);
	let gauss = GAUSS_WEIGHTS[3]! * f(mid);
	for (let i = 0; i < 7; i++) {
		const pair = f(mid - half * GK_NODES[i]!) + f(mid + half * GK_NODES[i]!);
		kronrod += GK_WEIGHTS[i]! * pair;
		if (i % 2 === 1) gauss += GAUSS_WEIGHTS[(i - 1) / 2]! * pair;
	}
	return { value: kronrod * half, error: Math.abs((kronrod - gauss) * half) };
}

/** ∫ f over [min(breaks), max(breaks)], splitting the worst panel until the error is below tol·|∫|. */
function adaptiveGaussKronrod(f: (y: number) => number, breaks: number[], tol: number): number {
	const points = [...new Set(breaks)].sort((p, q) => p - q);
	const panels = points
		.slice(1)
		.map((b, i) => ({ a: points[i]!, b, ...gaussKronrod(f, points[i]!, b) }));
	for (let i = 0; i < 4000; i++) {
		const total = panels.reduce((s, p) => s + p.value, 0);
		const error = panels.reduce((s, p) => s + p.error, 0);
		if (error <= tol * Math.abs(total)) break;
		let worst = 0;
		for (let j = 1; j < panels.length; j++) if (panels[j]!.error > panels[worst]!.error) worst = j;
		const { a, b } = panels[worst]!;
		const mid = (a + b) / 2;
		panels.splice(
			worst,
			1,
			{ a, b: mid, ...gaussKronrod(f, a, mid) },
			{ a: mid, b, ...gaussKronrod(f, mid, b) }
		);
	}
	return panels.reduce((s, p) => s + p.value, 0);
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
	massAmu: number;
}

/** ħ²/(2m) in kcal/mol·Å² for a mass in u. */
function kineticScale(massAmu: number): number {
	const joulesSquareMetres = HBAR_J_S ** 2 / (2 * massAmu * ATOMIC_MASS_KG);
	return convertEnergy((joulesSquareMetres * 1e20 * AVOGADRO_PER_MOL) / 1000, 'kJ/mol', 'kcal/mol');
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
 * A potential as a function of x (Å), and the interval where it is defined: everywhere for a
 * function, the sampled span for points (a natural cubic spline through them).
 * @throws {RangeError} for fewer than 4 samples or a position sampled twice.
 */
export function potentialFunction(potential: PotentialKcalMol): {
	v: (xA: number) => number;
	domainA: [number, number] | null;
} {
	if (typeof potential === 'function') return { v: potential, domainA: null };
	const v = spline(potential);
	const xs = potential.map((p) => p.xA);
	return { v, domainA: [Math.min(...xs), Math.max(...xs)] };
}

/**
 * Vibrational levels and wavefunctions of a particle in a one-dimensional potential, by the
 * Colbert–Miller DVR on a given uniform grid (walls at xMinA and xMaxA, where ψ = 0):
 *
 *   T_ij = ħ²/(2mΔx²) · (−1)^{i−j} · { π²/3 if i = j;  2/(i − j)² otherwise },   H = T + diag V(x_i)
 *
 * The grid is taken as given; adaptiveVibrationalLevels chooses one from the potential.
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
	const kinetic = kineticScale(input.massAmu) / dx ** 2;
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
		wavefunctions,
		massAmu: input.massAmu
	};
}

/**
 * A DVR wavefunction between its grid points, in the DVR's own basis: the Colbert–Miller grid
 * functions are sinc functions, so ψ(x) = Σᵢ ψ(xᵢ) · sinc(π(x − xᵢ)/Δx), which equals ψ(xᵢ) at
 * every grid point (sinc z = sin z / z).
 * References: Colbert & Miller (1992), §II.
 * @param gridA the uniform grid, Å; psi the wavefunction at its points.
 */
export function interpolateWavefunction(gridA: number[], psi: number[], xA: number): number {
	const dx = gridA[1]! - gridA[0]!;
	let sum = 0;
	for (let i = 0; i < gridA.length; i++) {
		const z = (Math.PI * (xA - gridA[i]!)) / dx;
		sum += psi[i]! * (Math.abs(z) < 1e-12 ? 1 : Math.sin(z) / z);
	}
	return sum;
}

export interface AdaptiveGridInput {
	/** V(x) in kcal/mol: a function of x in Å, or sampled points. */
	potential: PotentialKcalMol;
	massAmu: number;
	/** How many of the lowest levels to return. @default 6 */
	levels?: number;
	/**
	 * The interval to start from, Å (both or neither). Without them: the sampled span for
	 * points; a function needs them.
	 */
	xMinA?: number;
	xMaxA?: number;
	/** Keep the interval as given instead of extending it until the wavefunctions decay. @default false */
	fixedRange?: boolean;
	/** A fixed number of grid points instead of refining until the levels converge. */
	points?: number;
	/** The most grid points any solution may use (the cost grows as the cube). @default 2000 */
	maxPoints?: number;
	/** |ψ| at the outermost grid points, relative to its peak, that counts as decayed. @default 1e-8 */
	edgeTolerance?: number;
	/** Relative change of the levels between successive grids that counts as converged. @default 1e-6 */
	levelTolerance?: number;
	/**
	 * What choosing the grid may cost, in solutions on maxPoints points (600 points: ≈ 0.4 s
	 * each on a 2-core machine), comparisons included; past it the choice stops and says so.
	 * @default 4
	 */
	workBudget?: number;
}

export interface GridConvergence {
	xMinA: number;
	xMaxA: number;
	points: number;
	spacingA: number;
	/** Whether the interval was chosen from the potential or given (kept as given). */
	range: 'automatic' | 'given';
	/** Whether the number of points was refined until convergence or given. */
	resolution: 'automatic' | 'given';
	/** The largest |ψ| at the outermost grid points, relative to its peak, over the levels returned. */
	edgeAmplitude: number;
	/** True when edgeAmplitude ≤ edgeTolerance (1e-8 by default). */
	decayed: boolean;
	/**
	 * The largest change of a level against the solution on `comparedWithPoints` points over the
	 * same interval, relative to the level's height above the potential's minimum on the grid.
	 */
	levelChange: number;
	comparedWithPoints: number;
	/** True when the wavefunctions decayed and the levels changed by less than levelTolerance. */
	converged: boolean;
	/** DVR solutions computed to choose the grid. */
	solutions: number;
	/** What was reached, in words (and what stopped it, when it is not converged). */
	message: string;
}

export interface AdaptiveLevels extends VibrationalLevels {
	grid: GridConvergence;
	/** The solution the final one was compared with (same interval, fewer points). */
	comparison: VibrationalLevels;
}

/** |ψ| at each end of the grid relative to its peak, the largest over the levels. */
function edgeRatios(levels: VibrationalLevels): { left: number; right: number } {
	let left = 0;
	let right = 0;
	for (const psi of levels.wavefunctions) {
		let peak = 0;
		for (const p of psi) peak = Math.max(peak, Math.abs(p));
		left = Math.max(left, Math.abs(psi[0]!) / peak);
		right = Math.max(right, Math.abs(psi.at(-1)!) / peak);
	}
	return { left, right };
}

/** max |E − E'| / (E − V_min) over the levels of two solutions. */
function levelChange(finer: VibrationalLevels, coarser: VibrationalLevels): number {
	const vMin = Math.min(...finer.potentialKcalMol);
	let change = 0;
	finer.energiesKcalMol.forEach((e, i) => {
		change = Math.max(
			change,
			Math.abs(e - coarser.energiesKcalMol[i]!) / Math.max(e - vMin, 1e-300)
		);
	});
	return change;
}

const sci = (v: number) => v.toExponential(1);

/** The most points used while looking for the interval (about 40 ms a solution). */
const COARSE_POINTS = 300;

/**
 * Vibrational levels (as vibrationalLevels) on a grid chosen from the potential:
 * 1. the interval is extended at each end where a returned level's wavefunction has not decayed
 *    to edgeTolerance (1e-8) of its peak — measured on the grid, and by its WKB estimate
 *    exp(−∫√(2m(V − E))/ħ dx) from the outermost turning point, since on a coarse grid the far
 *    tail is the representation's noise — by the distance that WKB decay needs, on a grid whose
 *    spacing π/k_cut resolves momenta up to the top level's classical ħk = √(2m(E − V_min))
 *    plus three widths of the ground level's; an end that stays classically allowed three times
 *    running is not extended further (the potential does not confine the levels);
 * 2. the points are then multiplied by 1.25 until no level (measured from the potential's
 *    minimum) changes by more than levelTolerance (1e-6) relative, and any tail above the
 *    tolerance that WKB says has decayed (noise) is gone, within maxPoints and workBudget;
 * 3. the ends are checked again on the final grid (and extended, with step 2 repeated, if needed).
 * A given interval (fixedRange) or number of points is kept, and then only checked: the result
 * always says what was reached (`grid`), compared with a solution on 1/1.25 of the points.
 * A sampled potential cannot be extended beyond its samples.
 * The sinc (Colbert–Miller) DVR converges exponentially with the grid density once the grid
 * resolves the highest momenta, so the comparison overstates the final solution's error; where
 * a wavefunction meets a wall (a sampled potential's end) it converges only algebraically.
 * References: Colbert & Miller (1992) for the DVR; the WKB decay: L. D. Landau & E. M. Lifshitz,
 * *Quantum Mechanics* (3rd ed., 1977), §46.
 * @throws {RangeError} as vibrationalLevels, for a function potential without a start interval,
 * or for one end of the interval without the other.
 */
export function adaptiveVibrationalLevels(input: AdaptiveGridInput): AdaptiveLevels {
	const levels = input.levels ?? 6;
	const maxPoints = input.maxPoints ?? 2000;
	const edgeTolerance = input.edgeTolerance ?? 1e-8;
	const levelTolerance = input.levelTolerance ?? 1e-6;
	requirePositive(input.massAmu, 'massAmu');
	if (!Number.isInteger(maxPoints) || maxPoints < 10 || maxPoints > 2000) {
		throw new RangeError(`maxPoints must be a whole number from 10 to 2000, got ${maxPoints}`);
	}
	const { v, domainA } = potentialFunction(input.potential);
	if ((input.xMinA === undefined) !== (input.xMaxA === undefined)) {
		throw new RangeError('give both ends of the grid (xMinA and xMaxA), or neither');
	}
	let lo = input.xMinA ?? domainA?.[0];
	let hi = input.xMaxA ?? domainA?.[1];
	if (lo === undefined || hi === undefined) {
		throw new RangeError('a potential given as a function needs an interval to start from');
	}
	requireFinite(lo, 'xMinA');
	requireFinite(hi, 'xMaxA');
	if (!(hi > lo)) throw new RangeError('xMaxA must be greater than xMinA');
	const [floor, ceiling] = domainA ?? [-Infinity, Infinity];
	const extendable = !input.fixedRange;
	const kinetic = kineticScale(input.massAmu);
	const minPoints = Math.max(10, levels + 2);
	if (input.points !== undefined && input.points < minPoints) {
		throw new RangeError(`points must be at least ${minPoints} for ${levels} levels`);
	}
	let solutions = 0;
	// The cost of a solution grows as n³: the whole choice may cost what workBudget solutions on
	// maxPoints points cost, then it stops and says so. A step is taken only when the comparison
	// that may follow it (1/1.25 of its points) fits too.
	const workBudget = input.workBudget ?? 4;
	const budget = workBudget * maxPoints ** 3;
	let spent = 0;
	let outOfBudget = false;
	const affordable = (n: number) => {
		if (spent + n ** 3 + (n / 1.25) ** 3 <= budget) return true;
		outOfBudget = true;
		return false;
	};
	const solve = (n: number) => {
		solutions++;
		spent += n ** 3;
		return vibrationalLevels({
			potential: v,
			massAmu: input.massAmu,
			xMinA: lo!,
			xMaxA: hi!,
			points: n,
			levels
		});
	};
	/** V within a sampled potential's span (rounding must not step outside it). */
	const inside = (x: number) => v(Math.min(ceiling, Math.max(floor, x)));
	const pointsAt = (dx: number) =>
		Math.min(maxPoints, Math.max(minPoints, Math.round((hi! - lo!) / dx) - 1));
	/**
	 * How far to move an end so that a wavefunction at `ratio` of its peak there decays to the
	 * tolerance: WKB, ∫ √((V − E)/(ħ²/2m)) dx = 1.2·ln(ratio/tolerance) beyond the end; at most
	 * the interval's width, and within a sampled potential's span.
	 */
	const extension = (x: number, direction: 1 | -1, ratio: number, top: number) => {
		const width = hi! - lo!;
		const room = direction < 0 ? x - floor : ceiling - x;
		const reach = Math.min(width, room);
		const target = 1.2 * Math.log(ratio / edgeTolerance);
		const step = width / 400;
		let integral = 0;
		let d = 0;
		while (d < reach && integral < target) {
			d = Math.min(reach, d + step);
			integral += step * Math.sqrt(Math.max(inside(x + direction * d) - top, 0) / kinetic);
		}
		return Math.min(reach, Math.max(d, 0.02 * width));
	};
	/**
	 * The WKB estimate of |ψ| at an end relative to its turning point, exp(−∫ √((V − E)/(ħ²/2m)) dx)
	 * from the outermost classical turning point of energy E to the end. On a coarse grid the
	 * computed tail far out is the representation's noise (about 1e-8), not the wavefunction, so
	 * an end is extended only where this estimate, too, has not decayed.
	 */
	const wkbRatio = (x: number, inward: 1 | -1, top: number) => {
		const step = (hi! - lo!) / 1000;
		let exponent = 0;
		for (let d = 0; d < hi! - lo!; d += step) {
			const excess = inside(x + inward * d) - top;
			if (excess <= 0) break;
			exponent += step * Math.sqrt(excess / kinetic);
		}
		return Math.exp(-exponent);
	};
	/** A tail above the tolerance at an end where the WKB estimate has decayed: representation noise. */
	const ringing = (result: VibrationalLevels) => {
		const edges = edgeRatios(result);
		const top = Math.max(...result.energiesKcalMol);
		return (
			(edges.left > edgeTolerance && wkbRatio(lo!, 1, top) <= edgeTolerance) ||
			(edges.right > edgeTolerance && wkbRatio(hi!, -1, top) <= edgeTolerance)
		);
	};
	/** Ends moved while still classically allowed for the top level: three times means unconfined. */
	const open = { left: 0, right: 0 };
	let unconfined = false;
	/** Moves the ends whose wavefunctions have not decayed; false when none could move. */
	const extend = (result: VibrationalLevels) => {
		if (!extendable) return false;
		const edges = edgeRatios(result);
		const top = Math.max(...result.energiesKcalMol);
		const left = Math.min(edges.left, wkbRatio(lo!, 1, top));
		const right = Math.min(edges.right, wkbRatio(hi!, -1, top));
		let moved = false;
		if (left > edgeTolerance && lo! > floor && open.left < 3) {
			lo = Math.max(floor, lo! - extension(lo!, -1, left, top));
			open.left = v(lo) <= top ? open.left + 1 : 0;
			moved = true;
		}
		if (right > edgeTolerance && hi! < ceiling && open.right < 3) {
			hi = Math.min(ceiling, hi! + extension(hi!, 1, right, top));
			open.right = v(hi) <= top ? open.right + 1 : 0;
			moved = true;
		}
		if (open.left >= 3 || open.right >= 3) unconfined = true;
		return moved;
	};

	// 1. The interval, on a grid that resolves the highest level's momenta (at most
	// COARSE_POINTS: this step only finds where the wavefunctions have decayed).
	const coarseCap = Math.min(input.points ?? maxPoints, maxPoints, COARSE_POINTS);
	let n = Math.min(coarseCap, Math.max(64, 4 * levels));
	let dx = (hi - lo) / (n + 1);
	let result = solve(n);
	for (let round = 0; round < 12; round++) {
		const vMin = Math.min(...result.potentialKcalMol);
		const top = Math.max(...result.energiesKcalMol);
		// Momenta up to the top level's classical one plus three ground-state widths (the
		// harmonic oscillator's ψ(p) is down to ~1e-3 there): Δx = π/k_cut.
		const k = (e: number) => Math.sqrt(Math.max(e - vMin, 1e-12) / kinetic);
		const wanted = Math.PI / (k(top) + 3 * k(result.energiesKcalMol[0]!));
		const [before, beforeLo, beforeHi] = [dx, lo, hi];
		const moved = extend(result);
		const resolved = dx <= 1.05 * wanted && (dx >= 0.6 * wanted || n <= minPoints);
		if (!moved && (resolved || n >= coarseCap)) break;
		dx = wanted;
		const next = Math.min(Math.max(pointsAt(dx), 32), coarseCap);
		if (!affordable(next)) {
			[dx, lo, hi] = [before, beforeLo, beforeHi];
			break;
		}
		n = next;
		dx = (hi - lo) / (n + 1);
		result = solve(n);
	}

	// 2. The points (or the given number) on that interval; 3. the ends again on the final grid.
	let comparison = result;
	let change = Infinity;
	for (let pass = 0; ; pass++) {
		if (input.points !== undefined) {
			if (n !== input.points) {
				n = input.points;
				result = solve(n);
			}
			comparison = solve(Math.max(minPoints, Math.round(n / 1.25)));
			change = levelChange(result, comparison);
		} else {
			let refined = false;
			for (let step = 0; step < 30; step++) {
				const next = Math.min(maxPoints, Math.ceil(n * 1.25));
				if (next <= n || !affordable(next)) break;
				comparison = result;
				n = next;
				result = solve(n);
				change = levelChange(result, comparison);
				refined = true;
				// A tail above the tolerance where the WKB estimate has decayed is the grid's
				// representation error, which more points reduce: refine on.
				if (change < levelTolerance && !ringing(result)) break;
			}
			if (!refined || comparison.gridA.length > Math.round(n / 1.2)) {
				// At maxPoints (or the cost bound) before a full step of 1.25: compare with a grid
				// a full step coarser, or slowly converging levels would look converged.
				comparison = solve(Math.max(minPoints, Math.round(n / 1.25)));
				change = levelChange(result, comparison);
			}
		}
		dx = (hi - lo) / (n + 1);
		if (pass === 2 || outOfBudget) break;
		const [beforeLo, beforeHi] = [lo, hi];
		if (!extend(result)) break;
		const next = input.points ?? pointsAt(dx);
		if (!affordable(next)) {
			[lo, hi] = [beforeLo, beforeHi];
			break;
		}
		n = next;
		result = solve(n);
	}

	const edges = edgeRatios(result);
	const edgeAmplitude = Math.max(edges.left, edges.right);
	const decayed = edgeAmplitude <= edgeTolerance;
	const converged = decayed && change < levelTolerance;
	const spacingA = (hi - lo) / (n + 1);
	const where = `${lo.toFixed(3)} to ${hi.toFixed(3)} Å, ${n} points (spacing ${spacingA.toPrecision(3)} Å)`;
	const reasons: string[] = [];
	if (!decayed) {
		const end = edges.left >= edges.right ? 'left' : 'right';
		const top = Math.max(...result.energiesKcalMol);
		const wkb = end === 'left' ? wkbRatio(lo, 1, top) : wkbRatio(hi, -1, top);
		reasons.push(
			`a wavefunction is still ${sci(edgeAmplitude)} of its peak at the ${end} end (wanted ≤ ${sci(edgeTolerance)})` +
				(wkb <= edgeTolerance
					? `, where its WKB estimate is ${sci(wkb)}: that tail is the grid's representation error` +
						(input.points !== undefined ? '; use more points' : '')
					: ": the levels feel the grid's wall there") +
				(wkb <= edgeTolerance
					? ''
					: domainA && (lo <= floor || hi >= ceiling)
						? '; the sampled potential ends there — sample a wider range'
						: !extendable
							? '; widen the interval'
							: unconfined
								? '; the potential does not confine the levels (the ends stay classically allowed as the interval grows)'
								: outOfBudget
									? `; stopped at the cost bound (${workBudget} solutions' worth on ${maxPoints} points)`
									: `; the interval cannot grow further within ${maxPoints} points`)
		);
	}
	if (!(change < levelTolerance)) {
		reasons.push(
			`the levels still change by ${sci(change)} relative against ${comparison.gridA.length} points (wanted < ${sci(levelTolerance)})` +
				(input.points !== undefined
					? '; use more points'
					: outOfBudget
						? `; stopped at the cost bound (${workBudget} solutions' worth on ${maxPoints} points)`
						: `; ${maxPoints} points is the most allowed`)
		);
	}
	const message = converged
		? `Grid ${where}: every level's wavefunction has decayed to ${sci(edgeAmplitude)} of its peak at both ends, and the levels change by ${sci(change)} relative against ${comparison.gridA.length} points.`
		: `Grid ${where}, not converged: ${reasons.join('; ')}.`;
	return {
		...result,
		grid: {
			xMinA: lo,
			xMaxA: hi,
			points: n,
			spacingA,
			range: extendable ? 'automatic' : 'given',
			resolution: input.points === undefined ? 'automatic' : 'given',
			edgeAmplitude,
			decayed,
			levelChange: change,
			comparedWithPoints: comparison.gridA.length,
			converged,
			solutions,
			message
		},
		comparison
	};
}

export type DoubleWellRegime = 'adiabatic' | 'intermediate' | 'nonadiabatic';

export interface DoubleWellAssessment {
	/** Positions of the two minima and the barrier top between them, Å. */
	minimaA: [number, number];
	topA: number;
	/** Barrier top above the lower minimum, kcal/mol. */
	barrierKcalMol: number;
	/** Right minimum minus left minimum, kcal/mol (0 for a symmetric well). */
	asymmetryKcalMol: number;
	/** E₁ − E₀, kcal/mol: the tunnelling splitting only in a symmetric well. */
	levelGapKcalMol: number;
	/**
	 * The tunnelling splitting Δ (twice the coupling of the localised states), kcal/mol and cm⁻¹:
	 * the symmetric part of E₁ − E₀ once the localised levels' difference ε is taken out,
	 * Δ = √((E₁ − E₀)² − ε²).
	 */
	splittingKcalMol: number;
	splittingCm1: number;
	/** ε: the localised right level minus the localised left level, kcal/mol. */
	localisedDifferenceKcalMol: number;
	/** True when Δ is above the calculation's noise and (given a comparison) stable to 1e-3. */
	splittingResolved: boolean;
	/** Relative change of Δ against the comparison solution; null without one. */
	splittingChange: number | null;
	/** Ground level above the lower minimum, kcal/mol. */
	zeroPointKcalMol: number;
	/** True when the ground level lies at or above the barrier top. */
	groundAboveBarrier: boolean;
	regime: DoubleWellRegime;
	assessment: string;
}

/** Samples of a potential given as a function, to find its minima and barrier top. */
const EXTREMA_SAMPLES = 4001;

/** The position where f is smallest on [a, b] (golden-section search; f unimodal there). */
function goldenMinimum(f: (x: number) => number, a: number, b: number): number {
	const r = (Math.sqrt(5) - 1) / 2;
	let [lo, hi] = [a, b];
	let c = hi - r * (hi - lo);
	let d = lo + r * (hi - lo);
	let fc = f(c);
	let fd = f(d);
	for (let i = 0; i < 100 && hi - lo > 1e-12 * Math.max(1, Math.abs(lo)); i++) {
		if (fc < fd) {
			hi = d;
			d = c;
			fd = fc;
			c = hi - r * (hi - lo);
			fc = f(c);
		} else {
			lo = c;
			c = d;
			fc = fd;
			d = lo + r * (hi - lo);
			fd = f(d);
		}
	}
	return (lo + hi) / 2;
}

/** The two-state splitting Δ and localised difference ε from the two lowest levels. */
function twoStateSplitting(levels: VibrationalLevels) {
	const x = levels.gridA;
	const dx = x[1]! - x[0]!;
	const [p0, p1] = levels.wavefunctions as [number[], number[]];
	let x00 = 0;
	let x11 = 0;
	let x01 = 0;
	for (let i = 0; i < x.length; i++) {
		x00 += x[i]! * p0[i]! * p0[i]! * dx;
		x11 += x[i]! * p1[i]! * p1[i]! * dx;
		x01 += x[i]! * p0[i]! * p1[i]! * dx;
	}
	const gap = levels.energiesKcalMol[1]! - levels.energiesKcalMol[0]!;
	const norm = Math.hypot(x11 - x00, 2 * x01);
	return norm === 0
		? { splitting: gap, epsilon: 0 }
		: { splitting: (gap * 2 * Math.abs(x01)) / norm, epsilon: (gap * (x11 - x00)) / norm };
}

/**
 * Compares the lowest levels of a double well with its barrier — the usual test of whether a
 * proton transfer is vibrationally adiabatic (the ground level above, or comparable with, the
 * barrier: the proton is delocalised and follows the other coordinates) or proceeds by
 * tunnelling between localised states (splitting ≪ barrier: vibrationally nonadiabatic, rate
 * governed by the vibronic coupling, about half the splitting).
 *
 * The minima and the top are found on the grid or, given the potential as a function, on 4 001
 * samples of the grid's interval, and then refined on it (golden-section search), so that the
 * barrier is the potential's own.
 *
 * In a tilted well E₁ − E₀ is mostly the tilt. The splitting is therefore the symmetric part, from
 * a two-state model: the localised states are the combinations of the two lowest levels that
 * diagonalise the position x (the generalised Mulliken–Hush construction, with the proton's
 * position in place of the dipole), ε is their energy difference and Δ = 2|H_LR|:
 *   Δ = (E₁ − E₀)·2|x₀₁| / √((x₁₁ − x₀₀)² + 4x₀₁²),   ε = (E₁ − E₀)(x₁₁ − x₀₀) / √(…),
 * so that Δ² + ε² = (E₁ − E₀)². In a symmetric well x₀₀ = x₁₁ and Δ = E₁ − E₀. Δ counts as
 * resolved when it exceeds 1e-10 of the Hamiltonian's norm (eigenvectors are accurate to about
 * 1e-13 of it over the gap) and, given the solution on a coarser grid, changes by less than 1e-3.
 * References: S. Hammes-Schiffer & A. A. Stuchebrukhov, Chem. Rev. 110, 6939 (2010), §2;
 * R. J. Cave & M. D. Newton, Chem. Phys. Lett. 249, 15 (1996) (generalised Mulliken–Hush).
 * @throws {RangeError} when the potential has no barrier between two minima inside the grid.
 */
export function assessDoubleWell(
	levels: VibrationalLevels,
	options: { potential?: (xA: number) => number; comparison?: VibrationalLevels } = {}
): DoubleWellAssessment {
	const f = options.potential;
	const grid = levels.gridA;
	// Where to look for the extrema: given the potential as a function, a fine sampling of the
	// grid's interval (the DVR grid can be coarser than a narrow double well); else the grid.
	const x = f
		? Array.from(
				{ length: EXTREMA_SAMPLES },
				(_, i) => grid[0]! + ((grid.at(-1)! - grid[0]!) * i) / (EXTREMA_SAMPLES - 1)
			)
		: grid;
	const v = f ? x.map(f) : levels.potentialKcalMol;
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
	const refine = (i: number, sign: 1 | -1) =>
		f ? goldenMinimum((y) => sign * f(y), x[i - 1]!, x[i + 1]!) : x[i]!;
	const xL = refine(left, 1);
	const xR = refine(right, 1);
	const xTop = refine(top, -1);
	const at = (xq: number, i: number) => (f ? f(xq) : v[i]!);
	const [vL, vR, vTop] = [at(xL, left), at(xR, right), at(xTop, top)];
	const bottom = Math.min(vL, vR);
	const barrier = vTop - bottom;
	const [e0, e1] = levels.energiesKcalMol as [number, number];
	const { splitting, epsilon } = twoStateSplitting(levels);
	const dx = grid[1]! - grid[0]!;
	const norm =
		(kineticScale(levels.massAmu) / dx ** 2) * Math.PI ** 2 +
		Math.max(...levels.potentialKcalMol.map(Math.abs));
	const splittingChange = options.comparison
		? Math.abs(twoStateSplitting(options.comparison).splitting - splitting) / splitting
		: null;
	const splittingResolved =
		splitting > 1e-10 * norm && (splittingChange === null || splittingChange < 1e-3);
	const above = e0 >= vTop;
	const regime: DoubleWellRegime = above
		? 'adiabatic'
		: splitting / barrier > 0.1
			? 'intermediate'
			: 'nonadiabatic';
	const assessment =
		regime === 'adiabatic'
			? 'The ground level lies above the barrier: the proton is delocalised over both wells; treat the transfer as vibrationally adiabatic.'
			: regime === 'intermediate'
				? 'The splitting is a sizeable fraction of the barrier: intermediate regime; neither limit is safe.'
				: 'The splitting is small against the barrier: the proton tunnels between localised states (vibrationally nonadiabatic transfer).';
	return {
		minimaA: [xL, xR],
		topA: xTop,
		barrierKcalMol: barrier,
		asymmetryKcalMol: vR - vL,
		levelGapKcalMol: e1 - e0,
		splittingKcalMol: splitting,
		splittingCm1: splitting * KCAL_PER_MOL_IN_CM1,
		localisedDifferenceKcalMol: epsilon,
		splittingResolved,
		splittingChange,
		zeroPointKcalMol: e0 - bottom,
		groundAboveBarrier: above,
		regime,
		assessment
	};
}

/**
 * Why the H transfer's regime allows no isotope effect from splittings, or null when it is
 * vibrationally nonadiabatic (see isotopeEffectFromSplittings).
 */
export function isotopeEffectRefusal(h: DoubleWellAssessment): string | null {
	return h.regime === 'nonadiabatic'
		? null
		: h.regime === 'adiabatic'
			? 'no isotope effect from splittings: the H ground level lies above the barrier (vibrationally adiabatic transfer), where the rate is not set by the splitting'
			: 'no isotope effect from splittings: the H splitting is over a tenth of the barrier (intermediate regime), where the rate is not proportional to its square';
}

/**
 * An H/D kinetic isotope effect estimate for transfer through a double well: the ratio of the
 * squared tunnelling splittings, (Δ_H/Δ_D)², as for a nonadiabatic rate proportional to the
 * squared vibronic coupling (about Δ/2) with similar Franck–Condon terms. Indicative only (an
 * order of magnitude), and only where that rate law holds.
 * References: Hammes-Schiffer & Stuchebrukhov (2010), eq. 2.7 and §5.
 * @throws {RangeError} when the H transfer is not vibrationally nonadiabatic (the ground level
 * above the barrier, or a splitting over a tenth of it), or a splitting is not resolved.
 */
export function isotopeEffectFromSplittings(
	h: DoubleWellAssessment,
	d: DoubleWellAssessment
): { splittingHCm1: number; splittingDCm1: number; kie: number } {
	const refusal = isotopeEffectRefusal(h);
	if (refusal) throw new RangeError(refusal);
	for (const [name, a] of [
		['H', h],
		['D', d]
	] as const) {
		if (!a.splittingResolved) {
			throw new RangeError(
				`no isotope effect from splittings: the ${name} tunnelling splitting is below what this calculation resolves beside the tilt and the grid error`
			);
		}
	}
	requireInRange(d.splittingCm1, 'the deuterium splitting', Number.MIN_VALUE, Infinity);
	return {
		splittingHCm1: h.splittingCm1,
		splittingDCm1: d.splittingCm1,
		kie: (h.splittingCm1 / d.splittingCm1) ** 2
	};
}
