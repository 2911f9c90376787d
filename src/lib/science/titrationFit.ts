import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { Matrix, inverse } from 'ml-matrix';
import { FARADAY_C_PER_MOL, GAS_J_PER_MOL_K, STANDARD_TEMPERATURE_K } from './constants';
import { requireFinite, requireInRange, requirePositive } from './guards';

/*
 * Least-squares fit of a redox titration (a spectroscopic signal against the ambient potential)
 * to one or two Nernstian components:
 *
 *   signal(E) = offset + Σ_c A_c / (1 + exp[n_c F (E − Em,c) / RT])
 *
 * A_c is the signal change on full reduction of component c (negative when the signal belongs to
 * the oxidised form). n is fixed when given (the usual choice: 1 for a one-electron centre) and
 * fitted otherwise. Levenberg–Marquardt minimisation (ml-levenberg-marquardt) with the analytic
 * Jacobian; standard errors from the covariance s²(JᵀJ)⁻¹ at the solution, s² = SSR/(N − p).
 * References: P. L. Dutton, Methods Enzymol. 54, 411 (1978) (Nernst fits of redox titrations);
 * W. H. Press et al., *Numerical Recipes* (3rd ed.), §15.5 (Levenberg–Marquardt, covariance).
 */

export interface TitrationPoint {
	/** Ambient potential, mV (vs SHE for normalised values). */
	potentialMv: number;
	signal: number;
}

export interface FitOptions {
	components: 1 | 2;
	/** Electrons per component; fitted when omitted. */
	n?: number;
	/** @default 298.15 */
	temperatureK?: number;
}

export interface FittedComponent {
	emMv: number;
	n: number;
	amplitude: number;
	emSeMv: number;
	/** Null when n was fixed. */
	nSe: number | null;
	amplitudeSe: number;
}

export interface NernstFit {
	components: FittedComponent[];
	offset: number;
	offsetSe: number;
	residuals: number[];
	rmsd: number;
	temperatureK: number;
	iterations: number;
}

interface Layout {
	components: number;
	fixedN: number | null;
	perComponent: number;
	count: number;
}

function layout(options: FitOptions): Layout {
	const fixedN = options.n ?? null;
	const perComponent = fixedN === null ? 3 : 2;
	return {
		components: options.components,
		fixedN,
		perComponent,
		count: 1 + perComponent * options.components
	};
}

/** Parameters: [offset, A1, Em1, (n1), A2, Em2, (n2)]. */
function unpack(p: readonly number[], l: Layout) {
	return Array.from({ length: l.components }, (_, c) => {
		const base = 1 + c * l.perComponent;
		return { amplitude: p[base]!, em: p[base + 1]!, n: l.fixedN ?? p[base + 2]! };
	});
}

function model(l: Layout, f: number) {
	return (p: number[]) => (e: number) => {
		let y = p[0]!;
		for (const c of unpack(p, l))
			y += c.amplitude / (1 + Math.exp(Math.min(700, c.n * f * (e - c.em))));
		return y;
	};
}

function jacobian(l: Layout, f: number) {
	return (p: number[]) => (e: number) => {
		const row = [1];
		for (const c of unpack(p, l)) {
			const u = c.n * f * (e - c.em);
			const red = 1 / (1 + Math.exp(Math.min(700, u)));
			const slope = red * (1 - red);
			row.push(red, c.amplitude * slope * c.n * f);
			if (l.fixedN === null) row.push(-c.amplitude * slope * f * (e - c.em));
		}
		return row;
	};
}

interface Minimum {
	parameters: number[];
	ssr: number;
	iterations: number;
}

/**
 * Levenberg–Marquardt in rounds of ten iterations, stopping when a round improves the sum of
 * squares by less than one part in 10⁸ (the package itself stops only on an absolute error).
 */
function minimise(
	data: { x: number[]; y: number[] },
	l: Layout,
	f: number,
	initialValues: number[],
	minValues: number[],
	maxValues: number[]
): Minimum {
	let parameters = initialValues;
	let ssr = Infinity;
	let iterations = 0;
	for (let round = 0; round < 40; round++) {
		const result = levenbergMarquardt(data, model(l, f), {
			initialValues: parameters,
			jacobianFunction: jacobian(l, f),
			minValues,
			maxValues,
			damping: 1e-2,
			maxIterations: 10,
			errorTolerance: 1e-14
		});
		iterations += result.iterations;
		const improved = ssr - result.parameterError;
		parameters = result.parameterValues;
		const previous = ssr;
		ssr = Math.min(ssr, result.parameterError);
		if (Number.isFinite(previous) && improved <= 1e-8 * previous) break;
	}
	return { parameters, ssr, iterations };
}

/** Potential where the (sorted) signal first crosses `level`, by linear interpolation. */
function crossing(points: TitrationPoint[], level: number): number {
	for (let i = 1; i < points.length; i++) {
		const a = points[i - 1]!;
		const b = points[i]!;
		if ((a.signal - level) * (b.signal - level) <= 0 && a.signal !== b.signal) {
			return (
				a.potentialMv +
				((level - a.signal) * (b.potentialMv - a.potentialMv)) / (b.signal - a.signal)
			);
		}
	}
	return (points[0]!.potentialMv + points.at(-1)!.potentialMv) / 2;
}

function startingPoints(points: TitrationPoint[], l: Layout): number[][] {
	const k = Math.max(1, Math.floor(points.length / 10));
	const mean = (xs: TitrationPoint[]) => xs.reduce((s, p) => s + p.signal, 0) / xs.length;
	const reducedEnd = mean(points.slice(0, k));
	const oxidisedEnd = mean(points.slice(-k));
	const total = reducedEnd - oxidisedEnd;
	const n0 = l.fixedN ?? 1;
	const guesses: number[][] = [];
	const shifts = [0, -40, 40];
	for (const shift of shifts) {
		const p = [oxidisedEnd];
		if (l.components === 1) {
			p.push(total, crossing(points, oxidisedEnd + total / 2) + shift);
			if (l.fixedN === null) p.push(n0);
		} else {
			for (const fraction of [0.75, 0.25]) {
				p.push(total / 2, crossing(points, oxidisedEnd + total * fraction) + shift);
				if (l.fixedN === null) p.push(n0);
			}
		}
		guesses.push(p);
	}
	return guesses;
}

/**
 * Fits the titration.
 * @throws {TypeError} for non-finite values.
 * @throws {RangeError} when there are too few points or distinct potentials for the parameters,
 * when no transition lies inside the measured range, or when the data cannot determine the
 * parameters (singular normal matrix).
 */
export function fitNernst(points: TitrationPoint[], options: FitOptions): NernstFit {
	const l = layout(options);
	const t = options.temperatureK ?? STANDARD_TEMPERATURE_K;
	requirePositive(t, 'temperatureK');
	if (options.components !== 1 && options.components !== 2) {
		throw new RangeError(`components must be 1 or 2, got ${String(options.components)}`);
	}
	if (l.fixedN !== null) requireInRange(l.fixedN, 'n', 0.1, 4);
	points.forEach((p, i) => {
		requireFinite(p.potentialMv, `points[${i}].potentialMv`);
		requireFinite(p.signal, `points[${i}].signal`);
	});
	const minimum = l.count + 2;
	if (points.length < minimum) {
		throw new RangeError(
			`${points.length} points cannot determine ${l.count} parameters; at least ${minimum} are needed`
		);
	}
	const sorted = [...points].sort((a, b) => a.potentialMv - b.potentialMv);
	const distinct = new Set(sorted.map((p) => p.potentialMv)).size;
	if (distinct < l.count + 1) {
		throw new RangeError(
			`only ${distinct} distinct potentials: at least ${l.count + 1} are needed`
		);
	}
	const low = sorted[0]!.potentialMv;
	const high = sorted.at(-1)!.potentialMv;
	const span = Math.max(...sorted.map((p) => p.signal)) - Math.min(...sorted.map((p) => p.signal));
	if (span === 0) throw new RangeError('the signal does not change: there is no transition to fit');

	const f = FARADAY_C_PER_MOL / (GAS_J_PER_MOL_K * t) / 1000; // per mV
	const data = { x: sorted.map((p) => p.potentialMv), y: sorted.map((p) => p.signal) };
	const minValues = [-Infinity];
	const maxValues = [Infinity];
	for (let c = 0; c < l.components; c++) {
		minValues.push(-Infinity, low - 0.5 * (high - low));
		maxValues.push(Infinity, high + 0.5 * (high - low));
		if (l.fixedN === null) {
			minValues.push(0.2);
			maxValues.push(4);
		}
	}
	// The first starting point usually succeeds; the shifted ones are tried when its minimum puts a
	// transition outside the measured range (a sign of a local minimum), and the best is kept.
	let best: Minimum | null = null;
	for (const initialValues of startingPoints(sorted, l)) {
		const result = minimise(data, l, f, initialValues, minValues, maxValues);
		if (!best || result.ssr < best.ssr) best = result;
		const inside = unpack(best.parameters, l).every((c) => c.em >= low && c.em <= high);
		if (inside) break;
	}
	const p = best!.parameters;
	const fitted = model(l, f)(p);
	const residuals = sorted.map((pt) => pt.signal - fitted(pt.potentialMv));
	const ssr = residuals.reduce((s, r) => s + r * r, 0);
	const dof = sorted.length - l.count;
	const variance = ssr / dof;

	const jac = jacobian(l, f)(p);
	const j = new Matrix(sorted.map((pt) => jac(pt.potentialMv)));
	let covariance: Matrix;
	try {
		covariance = inverse(j.transpose().mmul(j)).mul(variance);
	} catch {
		throw new RangeError('the data cannot determine the parameters (the fit is degenerate)');
	}
	const se = (i: number) => Math.sqrt(Math.max(0, covariance.get(i, i)));
	if (Array.from({ length: l.count }, (_, i) => se(i)).some((v) => !Number.isFinite(v))) {
		throw new RangeError('the data cannot determine the parameters (the fit is degenerate)');
	}
	const components = unpack(p, l)
		.map((c, index): FittedComponent => {
			const base = 1 + index * l.perComponent;
			return {
				emMv: c.em,
				n: c.n,
				amplitude: c.amplitude,
				amplitudeSe: se(base),
				emSeMv: se(base + 1),
				nSe: l.fixedN === null ? se(base + 2) : null
			};
		})
		.sort((a, b) => a.emMv - b.emMv);
	for (const c of components) {
		if (c.emMv < low || c.emMv > high) {
			throw new RangeError(
				`no transition inside the measured range ${low}–${high} mV: the fitted Em (${c.emMv.toFixed(0)} mV) lies outside it; extend the titration`
			);
		}
	}
	return {
		components,
		offset: p[0]!,
		offsetSe: se(0),
		residuals: points.map((pt) => pt.signal - fitted(pt.potentialMv)),
		rmsd: Math.sqrt(ssr / sorted.length),
		temperatureK: t,
		iterations: best!.iterations
	};
}

/** The fitted model's signal at a potential (mV): offset + Σ A / (1 + exp[nF(E − Em)/RT]). */
export function titrationSignal(
	fit: Pick<NernstFit, 'components' | 'offset' | 'temperatureK'>,
	potentialMv: number
): number {
	const f = FARADAY_C_PER_MOL / (GAS_J_PER_MOL_K * fit.temperatureK) / 1000;
	return fit.components.reduce(
		(y, c) => y + c.amplitude / (1 + Math.exp(Math.min(700, c.n * f * (potentialMv - c.emMv)))),
		fit.offset
	);
}
