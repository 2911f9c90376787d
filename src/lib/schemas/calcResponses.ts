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

/** What every titration answer (API and page) says about its model and standard errors. */
export const TITRATION_CAUTION =
	'Model: one or two independent Nernstian components on a constant offset, potentials at equilibrium. ' +
	'The standard errors are linearised estimates (from the covariance at the least-squares minimum): they assume independent noise of equal variance and a correct model, and leave out systematic errors — mediator equilibration, electrode calibration, slow redox equilibria, drift — which commonly amount to 5–10 mV between repeated titrations (from memory, no source). ' +
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

export const tunnellingResponseSchema = z.strictObject({
	kappa: z
		.strictObject({
			wigner: z.number(),
			bell: z.number().nullable(),
			bellTruncated: z
				.number()
				.nullable()
				.describe('Bell’s factor truncated at the barrier height; null without barrierKJmol.'),
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
			massAmu: z.number()
		})
		.nullable()
		.describe('Vibrational levels of the potential; null without one.'),
	doubleWell: z
		.strictObject({
			barrierKcalMol: z.number(),
			splittingCm1: z.number(),
			splittingKcalMol: z.number(),
			zeroPointKcalMol: z.number(),
			groundAboveBarrier: z.boolean(),
			assessment: z.string()
		})
		.nullable(),
	isotopeEffect: z
		.strictObject({ splittingHCm1: z.number(), splittingDCm1: z.number(), kie: z.number() })
		.nullable(),
	notes,
	units: z.record(z.string(), z.string()),
	caution
});
export type TunnellingResponse = z.infer<typeof tunnellingResponseSchema>;
