import { z } from 'zod';
import { RATE_MODELS, hopRateQuerySchema } from './calc';

/*
 * What the calculator endpoints answer. The routes build their bodies as these types, so the
 * compiler checks them against the science's result types, and the OpenAPI document describes
 * them with the same schemas.
 */

const caution = z
	.string()
	.describe('What the model leaves out: an estimate is never a measurement.');
const warnings = z.array(z.string()).describe('Where the inputs leave the model’s validity.');

export const hopRateResponseSchema = z.strictObject({
	model: z.enum(RATE_MODELS),
	rateForward: z.number().describe('Forward rate, s⁻¹ (0 below 10⁻³⁰⁰).'),
	rateBackward: z.number().describe('Backward rate by detailed balance at T, s⁻¹.'),
	log10RateForward: z.number(),
	log10RateBackward: z.number(),
	warnings,
	inputs: hopRateQuerySchema.describe('The inputs, with defaults filled in.'),
	units: z.record(z.string(), z.string()),
	caution
});
export type HopRateResponse = z.infer<typeof hopRateResponseSchema>;

/**
 * What every titration answer (API and page) says about its model and standard errors. The
 * 5–10 mV spread between repeated titrations is from memory, no source: said to readers as a
 * typical, approximate figure.
 */
export const TITRATION_CAUTION =
	'Model: one or two independent Nernstian components on a constant offset, potentials at equilibrium. ' +
	'The standard errors are linearised estimates (from the covariance at the least-squares minimum): they assume independent noise of equal variance and a correct model, and leave out systematic errors — mediator equilibration, electrode calibration, slow redox equilibria, drift — which commonly amount to 5–10 mV between repeated titrations (a typical spread in practice; approximate, not from a published survey). ' +
	'A fitted n is the apparent n, the slope of the transition, not a count of electrons.';

/** The units of a titration answer: the page states the same. */
export const TITRATION_UNITS = {
	emMv: 'mV vs SHE (the potentials are read as mV vs SHE; convert other electrodes first)',
	potentials: 'mV vs SHE',
	temperatureK: 'K',
	amplitude: 'the unit of the signal sent'
};

const potentialRange = z
	.strictObject({ lowMv: z.number(), highMv: z.number() })
	.describe('The lowest and highest potential sent, mV vs SHE.');

const titrationFitSchema = z
	.strictObject({
		outcome: z.literal('fitted'),
		components: z.array(
			z.strictObject({
				emMv: z
					.number()
					.describe('Midpoint potential, mV vs SHE (the potentials are read as mV vs SHE).'),
				n: z
					.number()
					.describe(
						'The n sent; when fitted, the apparent n — the slope of the transition, not a whole number of electrons.'
					),
				amplitude: z
					.number()
					.describe(
						'Signal change on full reduction (negative when the oxidised form carries the signal).'
					),
				emSeMv: z.number().describe('Linearised standard error of emMv, mV.'),
				nSe: z
					.number()
					.nullable()
					.describe('Linearised standard error of n; null when n was fixed.'),
				amplitudeSe: z.number().describe('Linearised standard error of the amplitude.')
			})
		),
		offset: z.number(),
		offsetSe: z.number(),
		residuals: z.array(z.number()).describe('Signal minus fit, in the order of the points.'),
		rmsd: z.number(),
		temperatureK: z.number(),
		iterations: z.number().int().describe('Levenberg–Marquardt iterations, all starts together.'),
		potentialRange,
		search: z
			.strictObject({ starts: z.number().int(), distinctMinima: z.number().int() })
			.describe(
				'Starting points tried (a grid of Em across the range, n in 0.5, 1, 2 when fitted) and the distinct minima they ended in.'
			),
		alternatives: z
			.array(
				z.strictObject({
					components: z.array(
						z.strictObject({ emMv: z.number(), n: z.number(), amplitude: z.number() })
					),
					ssrRatio: z.number().describe('Its sum of squares over the best fit’s.'),
					deltaSsrOverVariance: z
						.number()
						.describe('(SSR − SSR_best)/s²; under 3.84 the two cannot be told apart at about 95 %.')
				})
			)
			.describe(
				'Other minima, more than a standard error from the best fit, that fit about as well: when there are any, the data do not single out one solution.'
			),
		warnings: z
			.array(
				z.strictObject({
					code: z.enum(['several_minima', 'large_em_error', 'n_at_limit', 'near_range_end']),
					message: z.string()
				})
			)
			.describe('Where a fitted number needs care.'),
		units: z.record(z.string(), z.string()),
		caution
	})
	.describe('outcome "fitted": the components, with their linearised standard errors.');

const titrationNoTransitionSchema = z
	.strictObject({
		outcome: z.literal('no_transition'),
		message: z.string().describe('Why no Em is given, in a sentence for people.'),
		reasons: z.array(
			z.strictObject({
				code: z.enum([
					'amplitude_not_significant',
					'em_undetermined',
					'outside_range',
					'degenerate'
				]),
				component: z
					.number()
					.int()
					.nullable()
					.describe('1-based, in order of Em; null for the fit as a whole.'),
				message: z.string()
			})
		),
		potentialRange,
		temperatureK: z.number(),
		units: z.record(z.string(), z.string()),
		caution
	})
	.describe(
		'outcome "no_transition": the data show no transition the model can place (an amplitude within 3 standard errors of zero, a standard error of Em wider than the measured range, Em outside the range, or parameters the data cannot determine). No Em is given.'
	);

export const titrationResponseSchema = z.discriminatedUnion('outcome', [
	titrationFitSchema,
	titrationNoTransitionSchema
]);
export type TitrationResponse = z.infer<typeof titrationResponseSchema>;

const notes = z.array(z.string());

const gridConvergenceSchema = z
	.strictObject({
		xMinA: z.number(),
		xMaxA: z.number(),
		points: z.number().int(),
		spacingA: z.number(),
		range: z
			.enum(['automatic', 'given'])
			.describe('automatic: extended until the wavefunctions decay; given: xMinA/xMaxA as sent.'),
		resolution: z
			.enum(['automatic', 'given'])
			.describe('automatic: points refined until the levels converge; given: points as sent.'),
		edgeAmplitude: z
			.number()
			.describe('Largest |ψ| at the outermost grid points relative to its peak (wanted ≤ 1e-8).'),
		decayed: z.boolean(),
		levelChange: z
			.number()
			.describe(
				'Largest change of a level, relative to its height above the potential minimum, against comparedWithPoints points (wanted < 1e-6).'
			),
		comparedWithPoints: z.number().int(),
		converged: z.boolean(),
		solutions: z.number().int().describe('DVR solutions computed to choose the grid.'),
		message: z.string()
	})
	.describe('The grid used and the convergence it reached.');

export const tunnellingResponseSchema = z.strictObject({
	kappa: z
		.strictObject({
			u: z.number().describe('u = hν‡/k_BT.'),
			crossoverTemperatureK: z
				.number()
				.describe(
					'T_c = hν‡/(2πk_B), K: below it (u > 2π) tunnelling far below the top dominates.'
				),
			wigner: z.number().describe('Wigner: within 2 % of the parabolic-barrier factor for u ≤ 2.'),
			bell: z.number().nullable().describe('Bell, infinite parabola; null for u ≥ 2π (diverges).'),
			bellTruncated: z
				.number()
				.nullable()
				.describe(
					'Bell’s factor truncated at the barrier height; null without barrierKJmol, or when it exceeds double precision (see bellTruncatedLog10).'
				),
			bellTruncatedLog10: z
				.number()
				.nullable()
				.describe('log₁₀ of Bell’s truncated factor, always finite; null without barrierKJmol.'),
			notes
		})
		.nullable()
		.describe('Tunnelling factors; null without imagFreqCm1.'),
	levels: z
		.strictObject({
			gridA: z.array(z.number()),
			potentialKcalMol: z.array(z.number()),
			energiesKcalMol: z.array(z.number()),
			energiesCm1: z.array(z.number()),
			wavefunctions: z
				.array(z.array(z.number()))
				.describe('wavefunctions[i][j] at gridA[j], normalised so that Σ ψ² Δx = 1 (Å⁻¹ᐟ²).'),
			massAmu: z.number(),
			grid: gridConvergenceSchema
		})
		.nullable()
		.describe('Vibrational levels of the potential; null without one.'),
	doubleWell: z
		.strictObject({
			minimaA: z.tuple([z.number(), z.number()]),
			topA: z.number(),
			barrierKcalMol: z.number().describe('Barrier top above the lower minimum.'),
			barrierNote: z
				.string()
				.nullable()
				.describe('Why the barrier differs from the one entered (a tilt); null when it does not.'),
			asymmetryKcalMol: z.number().describe('Right minimum minus left minimum.'),
			levelGapKcalMol: z
				.number()
				.describe('E₁ − E₀: the tunnelling splitting only in a symmetric well.'),
			splittingKcalMol: z
				.number()
				.describe(
					'Tunnelling splitting Δ = √((E₁ − E₀)² − ε²): the symmetric part, from a two-state model.'
				),
			splittingCm1: z.number(),
			localisedDifferenceKcalMol: z
				.number()
				.describe('ε: localised right level minus localised left level.'),
			splittingResolved: z
				.boolean()
				.describe('False when Δ is below the calculation’s noise or unstable on the grid.'),
			splittingChange: z
				.number()
				.nullable()
				.describe('Relative change of Δ against the coarser grid.'),
			zeroPointKcalMol: z.number(),
			groundAboveBarrier: z.boolean(),
			regime: z.enum(['adiabatic', 'intermediate', 'nonadiabatic']),
			assessment: z.string()
		})
		.nullable(),
	isotopeEffect: z
		.strictObject({
			splittingHCm1: z.number(),
			splittingDCm1: z.number(),
			kie: z
				.number()
				.describe('(Δ_H/Δ_D)², rounded to one significant figure: an order of magnitude.'),
			grids: z.strictObject({ H: gridConvergenceSchema, D: gridConvergenceSchema })
		})
		.nullable()
		.describe(
			'Shown only for vibrationally nonadiabatic transfer (H ground level below the barrier, splitting under a tenth of it) with both splittings resolved; otherwise null and `notes` says why.'
		),
	notes,
	units: z.record(z.string(), z.string()),
	caution
});
export type TunnellingResponse = z.infer<typeof tunnellingResponseSchema>;
