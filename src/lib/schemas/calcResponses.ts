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
