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

export const titrationResponseSchema = z.strictObject({
	components: z.array(
		z.strictObject({
			emMv: z.number().describe('Midpoint potential, mV (same reference as the points).'),
			n: z.number().describe('Electrons, fitted or as fixed.'),
			amplitude: z.number(),
			emSeMv: z.number().describe('Standard error of emMv, mV.'),
			nSe: z.number().nullable().describe('Standard error of n; null when n was fixed.'),
			amplitudeSe: z.number()
		})
	),
	offset: z.number(),
	offsetSe: z.number(),
	residuals: z.array(z.number()).describe('Signal minus fit, in the order of the points.'),
	rmsd: z.number(),
	temperatureK: z.number(),
	iterations: z.number().int(),
	units: z.record(z.string(), z.string()),
	caution
});
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
