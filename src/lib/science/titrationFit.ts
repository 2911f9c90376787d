import { FARADAY_C_PER_MOL, GAS_J_PER_MOL_K, STANDARD_TEMPERATURE_K } from './constants';
import { requireFinite, requireInRange, requirePositive } from './guards';
import {
	invertPositiveDefinite,
	minimiseLeastSquares,
	normalEquations,
	solvePositiveDefinite,
	type LeastSquaresProblem
} from './leastSquares';

/*
 * Least-squares fit of a redox titration (a spectroscopic signal against the ambient potential)
 * to one or two Nernstian components:
 *
 *   signal(E) = offset + Σ_c A_c / (1 + exp[n_c F (E − Em,c) / RT])
 *
 * A_c is the signal change on full reduction of component c (negative when the signal belongs to
 * the oxidised form). n is fixed when given (the usual choice: 1 for a one-electron centre) and
 * fitted otherwise; a fitted n is the *apparent* n, the slope of the transition, which is not a
 * whole number of electrons (cooperativity, heterogeneity and slow equilibration all flatten or
 * steepen it).
 *
 * How, and why:
 * - The problem is scaled before it is minimised: the signal to the unit range
 *   (y − min)/(max − min), the potentials to x = (E − centre)/half-width of the measured range.
 *   The fit in these units is the same for data in any units and with any offset, so the answer
 *   is too; estimates and their covariance are mapped back (Em = centre + half-width·m, A = span·a,
 *   covariance D·C·D with D the diagonal of those factors). Unscaled, a signal of amplitude 1e-4
 *   stopped up to 2.8 standard errors from the least-squares minimum.
 * - Levenberg–Marquardt with Marquardt's diagonal scaling (leastSquares.ts), the analytic
 *   Jacobian, from several starts: a grid of Em (pairs) across the measured range, and n in
 *   {0.5, 1, 2} when n is fitted; for each start the offset and amplitudes are first solved by
 *   linear least squares. The lowest sum of squares wins. Two components or a free n have local
 *   minima (a bell-shaped semiquinone signal defeats a single start).
 * - Standard errors are the linearised (asymptotic) ones, from the covariance s²(JᵀJ)⁻¹ at the
 *   minimum with s² = SSR/(N − p). They assume independent noise of equal variance and a correct
 *   model, and are symmetric even where the true uncertainty is not.
 * - Several minima: another minimum more than one standard error away in some parameter whose sum
 *   of squares is within 3.84·s² of the best (the 95 % point of χ² with one degree of freedom: a
 *   likelihood-ratio comparison, Bates & Watts §6.1) is reported as an identifiability warning.
 * - No transition: when a component's amplitude is within 3 standard errors of zero, its Em's
 *   standard error exceeds the width of the measured range, its Em lies outside that range, or the
 *   parameters are not determined at all (JᵀJ singular), no Em is given: the answer says why.
 *   The thresholds are our choice (the issue's), no source.
 *
 * References: P. L. Dutton, Methods Enzymol. 54, 411 (1978) (Nernst fits of redox titrations);
 * D. M. Bates & D. G. Watts, *Nonlinear Regression Analysis and Its Applications* (Wiley 1988),
 * §2.3 (linearised standard errors), §6.1 (likelihood regions); W. H. Press et al., *Numerical
 * Recipes* (3rd ed.), §15.5 (Levenberg–Marquardt, covariance).
 */

export interface TitrationPoint {
	/** Ambient potential, mV (vs SHE for normalised values). */
	potentialMv: number;
	signal: number;
}

export interface FitOptions {
	components: 1 | 2;
	/** Electrons per component; fitted (as the apparent n) when omitted. */
	n?: number;
	/** @default 298.15 */
	temperatureK?: number;
}

export interface FittedComponent {
	emMv: number;
	/** The fixed n, or the apparent n when fitted (not a whole number of electrons). */
	n: number;
	amplitude: number;
	/** Linearised standard error of emMv. */
	emSeMv: number;
	/** Null when n was fixed. */
	nSe: number | null;
	amplitudeSe: number;
}

export type TitrationWarningCode =
	'several_minima' | 'large_em_error' | 'n_at_limit' | 'near_range_end';

export interface TitrationWarning {
	code: TitrationWarningCode;
	message: string;
}

/** Another local minimum of similar fit quality (see the file's comment). */
export interface AlternativeMinimum {
	components: { emMv: number; n: number; amplitude: number }[];
	/** Its sum of squares over the best one's. */
	ssrRatio: number;
	/** (SSR − SSR_best)/s²: under 3.84 the two cannot be told apart at about 95 %. */
	deltaSsrOverVariance: number;
}

export interface PotentialRange {
	lowMv: number;
	highMv: number;
}

export interface NernstFit {
	outcome: 'fitted';
	components: FittedComponent[];
	offset: number;
	offsetSe: number;
	/** Signal minus fit, in the order of the points given. */
	residuals: number[];
	rmsd: number;
	temperatureK: number;
	/** Levenberg–Marquardt iterations, all starts together. */
	iterations: number;
	potentialRange: PotentialRange;
	/** Starts tried and the distinct minima they ended in. */
	search: { starts: number; distinctMinima: number };
	alternatives: AlternativeMinimum[];
	warnings: TitrationWarning[];
}

export type NoTransitionReasonCode =
	'amplitude_not_significant' | 'em_undetermined' | 'outside_range' | 'degenerate';

export interface NoTransitionReason {
	code: NoTransitionReasonCode;
	/** 1-based, in order of the best fit's Em; null for the fit as a whole. */
	component: number | null;
	message: string;
}

/** The data show no transition the model can place: no Em is given, only why. */
export interface NoTransition {
	outcome: 'no_transition';
	message: string;
	reasons: NoTransitionReason[];
	potentialRange: PotentialRange;
	temperatureK: number;
}

export type TitrationResult = NernstFit | NoTransition;

/** Smallest |A|/SE(A) for a transition to count as distinguishable from noise. */
export const MIN_AMPLITUDE_SIGNIFICANCE = 3;
/** 95 % point of χ² with one degree of freedom. */
const CHI2_1_95 = 3.841;
const N_LIMITS = [0.2, 4] as const;
const N_STARTS = [0.5, 1, 2] as const;
/** Em starts, as fractions of the measured range (10 % … 90 %). */
const EM_STARTS = [0.1, 0.3, 0.5, 0.7, 0.9] as const;

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

/** Fraction reduced, 1/(1 + eᵘ), without overflow. */
function reduced(u: number): number {
	if (u > 0) {
		const e = Math.exp(-u);
		return e / (1 + e);
	}
	return 1 / (1 + Math.exp(u));
}

/** Parameters (scaled): [offset, a1, m1, (n1), a2, m2, (n2)]. */
function unpack(theta: readonly number[], l: Layout) {
	return Array.from({ length: l.components }, (_, c) => {
		const base = 1 + c * l.perComponent;
		return { a: theta[base]!, m: theta[base + 1]!, n: l.fixedN ?? theta[base + 2]! };
	});
}

/**
 * The scaled problem: x = (E − centre)/halfWidth, y = (signal − low)/span, k = F·halfWidth/RT
 * (per unit of x), model y = o + Σ a / (1 + exp[n k (x − m)]).
 */
function scaledProblem(
	x: Float64Array,
	y: Float64Array,
	k: number,
	l: Layout
): LeastSquaresProblem {
	const lower = [-Infinity];
	const upper = [Infinity];
	for (let c = 0; c < l.components; c++) {
		// Em may wander half a range beyond either end; one found there is reported as outside.
		lower.push(-Infinity, -2);
		upper.push(Infinity, 2);
		if (l.fixedN === null) {
			lower.push(N_LIMITS[0]);
			upper.push(N_LIMITS[1]);
		}
	}
	return {
		count: x.length,
		lower,
		upper,
		evaluate(theta, residuals, jacobian) {
			const p = l.count;
			const per = l.perComponent;
			const fixedN = l.fixedN;
			for (let i = 0; i < x.length; i++) {
				let model = theta[0]!;
				if (jacobian) jacobian[i * p] = 1;
				for (let c = 0; c < l.components; c++) {
					const base = 1 + c * per;
					const a = theta[base]!;
					const m = theta[base + 1]!;
					const n = fixedN ?? theta[base + 2]!;
					const dx = x[i]! - m;
					const s = reduced(n * k * dx);
					model += a * s;
					if (jacobian) {
						const at = i * p + base;
						const slope = s * (1 - s);
						jacobian[at] = s;
						jacobian[at + 1] = a * slope * n * k;
						if (fixedN === null) jacobian[at + 2] = -a * slope * k * dx;
					}
				}
				residuals[i] = y[i]! - model;
			}
		}
	};
}

/**
 * A start: Em (scaled) and n per component, with the offset and amplitudes that fit best for
 * them (linear least squares on the columns 1, s_1, s_2); null when those columns are dependent.
 */
function linearStart(
	x: Float64Array,
	y: Float64Array,
	k: number,
	l: Layout,
	ms: number[],
	ns: number[]
): number[] | null {
	const q = 1 + l.components;
	const columns = new Float64Array(x.length * q);
	for (let i = 0; i < x.length; i++) {
		columns[i * q] = 1;
		for (let c = 0; c < l.components; c++)
			columns[i * q + 1 + c] = reduced(ns[c]! * k * (x[i]! - ms[c]!));
	}
	const { jtj, jtr } = normalEquations(columns, y, q);
	const linear = solvePositiveDefinite(jtj, jtr, q);
	if (!linear) return null;
	const theta = [linear[0]!];
	for (let c = 0; c < l.components; c++) {
		theta.push(linear[1 + c]!, ms[c]!);
		if (l.fixedN === null) theta.push(ns[c]!);
	}
	return theta;
}

function starts(x: Float64Array, y: Float64Array, k: number, l: Layout): number[][] {
	const ems = EM_STARTS.map((f) => 2 * f - 1);
	const emSets: number[][] =
		l.components === 1
			? ems.map((m) => [m])
			: ems.flatMap((m1, i) => ems.slice(i + 1).map((m2) => [m1, m2]));
	const nSets: number[][] =
		l.fixedN !== null
			? [Array.from({ length: l.components }, () => l.fixedN!)]
			: l.components === 1
				? N_STARTS.map((n) => [n])
				: N_STARTS.flatMap((n1) => N_STARTS.map((n2) => [n1, n2]));
	const result: number[][] = [];
	for (const ms of emSets)
		for (const ns of nSets) {
			const theta = linearStart(x, y, k, l, ms, ns);
			if (theta) result.push(theta);
		}
	return result;
}

/** Components in order of Em, so that a minimum and its relabelling compare equal. */
function canonical(theta: readonly number[], l: Layout): number[] {
	const blocks = Array.from({ length: l.components }, (_, c) =>
		theta.slice(1 + c * l.perComponent, 1 + (c + 1) * l.perComponent)
	).sort((a, b) => a[1]! - b[1]!);
	return [theta[0]!, ...blocks.flat()];
}

interface Scale {
	centre: number;
	halfWidth: number;
	low: number;
	span: number;
}

/** Factor taking each scaled parameter to its physical one. */
function physicalFactors(l: Layout, s: Scale): number[] {
	const factors = [s.span];
	for (let c = 0; c < l.components; c++) {
		factors.push(s.span, s.halfWidth);
		if (l.fixedN === null) factors.push(1);
	}
	return factors;
}

function fmtMv(v: number): string {
	return `${v < 0 ? '−' : ''}${Math.abs(v).toFixed(0)} mV`;
}

/**
 * Fits the titration (see the file's comment for the model, the method and the rules).
 * @returns the fit, or — when the data show no transition the model can place — why not.
 * @throws {TypeError} for non-finite values.
 * @throws {RangeError} for too few points or distinct potentials for the parameters, a flat
 * signal, or options out of range.
 * @example fitNernst(points, { components: 1, n: 1 }) // { outcome: 'fitted', components: [{ emMv: −275.2, emSeMv: 1.3, … }], … }
 */
export function fitNernst(points: TitrationPoint[], options: FitOptions): TitrationResult {
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
	const distinct = new Set(points.map((p) => p.potentialMv)).size;
	if (distinct < l.count + 1) {
		throw new RangeError(
			`only ${distinct} distinct potentials: at least ${l.count + 1} are needed`
		);
	}
	const potentials = points.map((p) => p.potentialMv);
	const signals = points.map((p) => p.signal);
	const lowMv = Math.min(...potentials);
	const highMv = Math.max(...potentials);
	const low = Math.min(...signals);
	const span = Math.max(...signals) - low;
	if (!(span > 0))
		throw new RangeError('the signal does not change: there is no transition to fit');
	const scale: Scale = { centre: (lowMv + highMv) / 2, halfWidth: (highMv - lowMv) / 2, low, span };
	const potentialRange = { lowMv, highMv };

	const f = FARADAY_C_PER_MOL / (GAS_J_PER_MOL_K * t) / 1000; // per mV
	const k = f * scale.halfWidth;
	const x = Float64Array.from(potentials, (e) => (e - scale.centre) / scale.halfWidth);
	const y = Float64Array.from(signals, (v) => (v - low) / span);
	const problem = scaledProblem(x, y, k, l);

	const tried = starts(x, y, k, l);
	const minima = tried.map((start) => minimiseLeastSquares(problem, start));
	const iterations = minima.reduce((s, m) => s + m.iterations, 0);
	minima.sort((a, b) => a.ssr - b.ssr);
	const best = minima[0]!;
	const theta = canonical(best.parameters, l);

	const residualsScaled = new Float64Array(x.length);
	const jacobian = new Float64Array(x.length * l.count);
	problem.evaluate(theta, residualsScaled, jacobian);
	const ssr = residualsScaled.reduce((s, r) => s + r * r, 0);
	const dof = x.length - l.count;
	const variance = ssr / dof;
	const inverse = invertPositiveDefinite(
		normalEquations(jacobian, residualsScaled, l.count).jtj,
		l.count
	);
	const noTransition = (reasons: NoTransitionReason[]): NoTransition => ({
		outcome: 'no_transition',
		message: noTransitionMessage(reasons, l),
		reasons,
		potentialRange,
		temperatureK: t
	});
	if (!inverse) {
		return noTransition([
			{
				code: 'degenerate',
				component: null,
				message:
					'the data cannot determine the parameters of this model (the fit is degenerate: some parameter can change without changing the fit)'
			}
		]);
	}
	const factors = physicalFactors(l, scale);
	const physicalSe = (i: number) =>
		factors[i]! * Math.sqrt(Math.max(0, variance * inverse[i * l.count + i]!));
	const components = unpack(theta, l).map((c, index): FittedComponent => {
		const base = 1 + index * l.perComponent;
		return {
			emMv: scale.centre + scale.halfWidth * c.m,
			n: c.n,
			amplitude: span * c.a,
			emSeMv: physicalSe(base + 1),
			nSe: l.fixedN === null ? physicalSe(base + 2) : null,
			amplitudeSe: physicalSe(base)
		};
	});

	const reasons: NoTransitionReason[] = [];
	components.forEach((c, i) => {
		const component = i + 1;
		if (c.emMv < lowMv || c.emMv > highMv) {
			reasons.push({
				code: 'outside_range',
				component,
				message: `no transition inside the measured range ${fmtMv(lowMv)} to ${fmtMv(highMv)}: the best fit puts Em at ${fmtMv(c.emMv)}, outside it; extend the titration`
			});
			return;
		}
		const significance = Math.abs(c.amplitude) / c.amplitudeSe;
		if (!(significance >= MIN_AMPLITUDE_SIGNIFICANCE)) {
			reasons.push({
				code: 'amplitude_not_significant',
				component,
				message: `the amplitude is ${significance.toFixed(1)} standard errors from zero (${MIN_AMPLITUDE_SIGNIFICANCE} or more are needed to tell a transition from noise)`
			});
		}
		if (!(c.emSeMv <= highMv - lowMv)) {
			reasons.push({
				code: 'em_undetermined',
				component,
				message: `the standard error of Em (${c.emSeMv >= 1e5 ? 'above 100 000' : c.emSeMv.toFixed(0)} mV) exceeds the width of the measured range (${(highMv - lowMv).toFixed(0)} mV)`
			});
		}
	});
	if (reasons.length) return noTransition(reasons);

	const { distinctMinima, alternatives } = otherMinima(minima, theta, l, scale, variance, inverse);
	const residuals = Array.from(residualsScaled, (r) => span * r);
	return {
		outcome: 'fitted',
		components,
		offset: low + span * theta[0]!,
		offsetSe: physicalSe(0),
		residuals,
		rmsd: span * Math.sqrt(ssr / x.length),
		temperatureK: t,
		iterations,
		potentialRange,
		search: { starts: tried.length, distinctMinima },
		alternatives,
		warnings: fitWarnings(components, alternatives, l, potentialRange, f)
	};
}

/**
 * The distinct minima the starts ended in, and those of similar fit quality to the best: more
 * than one standard error away in some parameter, with (SSR − SSR_best)/s² under χ²₁(95 %).
 */
function otherMinima(
	minima: { parameters: number[]; ssr: number }[],
	best: number[],
	l: Layout,
	scale: Scale,
	variance: number,
	inverse: Float64Array
): { distinctMinima: number; alternatives: AlternativeMinimum[] } {
	const se = best.map((_, i) => Math.sqrt(Math.max(0, variance * inverse[i * l.count + i]!)));
	const found: { theta: number[]; ssr: number }[] = [{ theta: best, ssr: minima[0]!.ssr }];
	// What a minimum reports is its components' Em and n: two minima closer than a standard error
	// (or than 1e-6 of the scaled range, for near-exact data) in each are the same. Amplitudes are
	// left out: they differ only along a degenerate valley (two components merged into one, where
	// any split of the amplitude fits equally well), which is one answer, not many.
	const reported = (theta: number[]) =>
		theta.flatMap((_, i) => (i > 0 && (i - 1) % l.perComponent !== 0 ? [i] : []));
	for (const m of minima.slice(1)) {
		const theta = canonical(m.parameters, l);
		const same = found.some((f) =>
			reported(theta).every((i) => Math.abs(theta[i]! - f.theta[i]!) <= Math.max(se[i]!, 1e-6))
		);
		if (!same) found.push({ theta, ssr: m.ssr });
	}
	const bestSsr = minima[0]!.ssr;
	const alternatives = found
		.slice(1)
		.filter((m) => variance > 0 && (m.ssr - bestSsr) / variance < CHI2_1_95)
		.map((m): AlternativeMinimum => ({
			components: unpack(m.theta, l).map((c) => ({
				emMv: scale.centre + scale.halfWidth * c.m,
				n: c.n,
				amplitude: scale.span * c.a
			})),
			ssrRatio: m.ssr / bestSsr,
			deltaSsrOverVariance: (m.ssr - bestSsr) / variance
		}));
	return { distinctMinima: found.length, alternatives };
}

function fitWarnings(
	components: FittedComponent[],
	alternatives: AlternativeMinimum[],
	l: Layout,
	range: PotentialRange,
	f: number
): TitrationWarning[] {
	const warnings: TitrationWarning[] = [];
	if (alternatives.length) {
		const describe = (a: AlternativeMinimum) => {
			const [first, second] = a.components;
			// Two components on top of each other are one transition.
			if (
				first &&
				second &&
				Math.abs(first.emMv - second.emMv) < 2 &&
				Math.abs(first.n - second.n) < 0.02
			)
				return `a single transition, Em ${fmtMv(first.emMv)}, n ${first.n.toFixed(2)}`;
			return a.components.map((c) => `Em ${fmtMv(c.emMv)}, n ${c.n.toFixed(2)}`).join(' and ');
		};
		const list = alternatives.map(describe).join('; ');
		warnings.push({
			code: 'several_minima',
			message: `The data do not single out one solution: ${alternatives.length === 1 ? 'another fit' : `${alternatives.length} other fits`} (${list}) ${alternatives.length === 1 ? 'is' : 'are'} about as good (sum of squares within 3.84 s² of the best). Fix n, fit fewer components or measure more points.`
		});
	}
	// The Nernst slope ln10·RT/F: one decade of ox/red for n = 1 (59.2 mV at 298.15 K).
	const slopeMv = Math.LN10 / f;
	components.forEach((c, i) => {
		const say = (text: string) =>
			components.length > 1
				? `Component ${i + 1}: ${text}`
				: `${text.charAt(0).toUpperCase()}${text.slice(1)}`;
		if (c.emSeMv > slopeMv) {
			warnings.push({
				code: 'large_em_error',
				message: say(
					`the standard error of Em (${c.emSeMv.toFixed(0)} mV) is larger than the Nernst slope (${slopeMv.toFixed(0)} mV per decade of ox/red): Em is only roughly located.`
				)
			});
		}
		if (l.fixedN === null && (c.n <= N_LIMITS[0] * (1 + 1e-6) || c.n >= N_LIMITS[1] * (1 - 1e-6))) {
			warnings.push({
				code: 'n_at_limit',
				message: say(
					`the apparent n reached the limit of the fit (${N_LIMITS[0]} to ${N_LIMITS[1]}); it is not determined by the data — fix n.`
				)
			});
		}
		// Where ox/red = 10 (or 1/10): the titration should reach past it on both sides of Em.
		const decade = slopeMv / c.n;
		if (c.emMv - range.lowMv < decade || range.highMv - c.emMv < decade) {
			warnings.push({
				code: 'near_range_end',
				message: say(
					`Em lies within ${decade.toFixed(0)} mV (one decade of ox/red) of the end of the measured range: one plateau is not reached, so Em and the amplitude rest on extrapolation. Extend the titration.`
				)
			});
		}
	});
	return warnings;
}

function noTransitionMessage(reasons: NoTransitionReason[], l: Layout): string {
	const detail = reasons
		.map((r) =>
			r.component !== null && l.components > 1
				? `component ${r.component}: ${r.message}`
				: r.message
		)
		.join('; ');
	if (l.components === 2) {
		return `These data do not determine two transitions (${detail}). No Em is reported; fit one component${l.fixedN === null ? ', or fix n' : ''}.`;
	}
	if (reasons.every((r) => r.code === 'outside_range')) {
		return `${detail.charAt(0).toUpperCase()}${detail.slice(1)}. No Em is reported.`;
	}
	if (reasons.some((r) => r.code === 'amplitude_not_significant')) {
		return `No transition can be told apart from noise in these data (${detail}). No Em is reported.`;
	}
	return `These data do not determine Em (${detail}). No Em is reported.`;
}

/** The fitted model's signal at a potential (mV): offset + Σ A / (1 + exp[nF(E − Em)/RT]). */
export function titrationSignal(
	fit: Pick<NernstFit, 'components' | 'offset' | 'temperatureK'>,
	potentialMv: number
): number {
	const f = FARADAY_C_PER_MOL / (GAS_J_PER_MOL_K * fit.temperatureK) / 1000;
	return fit.components.reduce(
		(y, c) => y + c.amplitude * reduced(c.n * f * (potentialMv - c.emMv)),
		fit.offset
	);
}
