import { z } from 'zod';
import { MOSER_DUTTON_CONTACT_A } from '$lib/science/electronTransfer';
import { ACCESSION_HINT, ACCESSION_PATTERN } from './accession';
import { queryNumber } from './searchParams';

/*
 * Inputs of the calculators, shared by their pages and the API. Bounds are those within which
 * the science functions are meaningful; everything outside is a 400 naming the field.
 */

export const RATE_MODELS = ['moser-dutton', 'marcus'] as const;

/*
 * The shortest edge-to-edge distance the hop rate accepts: 3.6 Å, van der Waals contact of the
 * edge atoms, where the Moser–Dutton ruler is anchored (its 10¹³ s⁻¹ at contact; Moser et al.,
 * Nature 355, 796 (1992)) and where the default Marcus coupling is calibrated to it. Neither
 * model says anything closer: the ruler was held at its contact value below it, and the Marcus
 * coupling H₀·exp(−β(R − 3.6)/2) grew past its contact value (distance 0 gave log k = 15.1).
 * Centres found closer in a structure are in contact: enter 3.6.
 */
export const MIN_HOP_DISTANCE_A = MOSER_DUTTON_CONTACT_A;
export const MAX_HOP_DISTANCE_A = 100;

export const hopRateQuerySchema = z.object({
	distance: queryNumber(
		MIN_HOP_DISTANCE_A,
		MAX_HOP_DISTANCE_A,
		' Å',
		`${MIN_HOP_DISTANCE_A} Å is van der Waals contact of the edge atoms, where both models reach their contact rate, Moser et al. 1992; enter centres in contact as ${MIN_HOP_DISTANCE_A}`
	),
	dG: queryNumber(-5, 5, ' eV'),
	lambda: queryNumber(0.01, 5, ' eV'),
	model: z
		.enum(RATE_MODELS, { error: `expected ${RATE_MODELS.join(' or ')}` })
		.default('moser-dutton'),
	temperature: queryNumber(1, 1000, ' K').default(298.15),
	packing: queryNumber(0, 1).default(0.76),
	/** Marcus coupling at contact, eV; defaults to the Moser–Dutton calibration. */
	h0: queryNumber(1e-9, 1, ' eV').optional(),
	/** Marcus distance decay, Å⁻¹; defaults to ln10·(1.2 − 0.8ρ). */
	beta: queryNumber(0, 5, ' Å⁻¹').optional()
});
export type HopRateQuery = z.infer<typeof hopRateQuerySchema>;

/*
 * The hop-rate page's choice of two centres from the registry, carried in the page's query string
 * beside the API's parameters (which are passed on as they are): a protein (an accession or words
 * from its name), the donor and acceptor centres (accessions: `?donor=HL000008&acceptor=HL000010`
 * is the link a distance row on a protein page makes), the pH the potentials are chosen nearest
 * to, and `fill`, sent by the button that asks for ΔG° and the distance to be filled in again.
 */
export const HOP_PICK_PARAMS = ['protein', 'donor', 'acceptor', 'ph', 'fill'] as const;
export const MAX_PROTEIN_QUERY_LENGTH = 200;
const centreAccession = z.string().regex(ACCESSION_PATTERN, `expected ${ACCESSION_HINT}`);
export const hopPickSchema = z.object({
	protein: z
		.string()
		.max(
			MAX_PROTEIN_QUERY_LENGTH,
			`at most ${MAX_PROTEIN_QUERY_LENGTH} characters: a protein's name, or its accession`
		)
		.optional(),
	donor: centreAccession.optional(),
	acceptor: centreAccession.optional(),
	ph: queryNumber(0, 14).optional(),
	fill: z.string().optional()
});
export type HopPick = z.infer<typeof hopPickSchema>;

const finite = (min: number, max: number, unit = '') =>
	z
		.number({ error: `expected a number from ${min} to ${max}${unit}` })
		.refine(
			(v) => Number.isFinite(v) && v >= min && v <= max,
			`expected a number from ${min} to ${max}${unit}`
		);

/*
 * Input sizes are bounded by what each method needs, so that no single request can hold a
 * calculation worker for long (the workers also have a time limit: CALC_TIME_LIMIT_MS).
 * - Titration points: a redox titration has tens of points and a continuously logged one a few
 *   hundred; 1 000 covers both (a two-component fit of 1 000 noisy points takes about 0.5 s).
 * - DVR grid points: the grid is chosen from the potential (interval extended until every
 *   returned level has decayed to 1e-8 of its peak at both ends, points refined until the levels
 *   change by less than 1e-6 relative; science/tunnelling.ts, adaptiveVibrationalLevels). The
 *   wells these inputs allow converge with 40–250 points; 600 is the bound for wide, heavy or
 *   given grids, and a choice that cannot converge within it says so. The cost grows with the
 *   cube (600 points: about 0.4 s a solution on a 2-core machine; 800 took 2.6 s for three).
 * - Sampled potential rows: a scan along a proton coordinate has tens of points; 500 is ample.
 */
export const MAX_TITRATION_POINTS = 1000;
export const MIN_GRID_POINTS = 50;
export const MAX_GRID_POINTS = 600;
export const MAX_POTENTIAL_SAMPLES = 500;

export const titrationRequestSchema = z.strictObject({
	points: z
		.array(
			z.strictObject({
				potentialMv: finite(-3000, 3000, ' mV').describe(
					'Ambient potential, mV vs SHE (convert values measured against another electrode first).'
				),
				signal: finite(-1e12, 1e12).describe(
					'The signal, in any unit; the fit does not depend on it.'
				)
			})
		)
		.min(4, 'at least 4 points are needed')
		.max(
			MAX_TITRATION_POINTS,
			`at most ${MAX_TITRATION_POINTS} points (a titration needs tens to a few hundred)`
		),
	components: z.union([z.literal(1), z.literal(2)], { error: 'expected 1 or 2' }).default(1),
	n: finite(0.1, 4)
		.optional()
		.describe('Electrons per component; leave out to fit the apparent n.'),
	temperatureK: finite(1, 1000, ' K').default(298.15)
});
export type TitrationRequest = z.infer<typeof titrationRequestSchema>;

/**
 * Bounds of the tunnelling calculator's energies, in the units of the API's fields (the page
 * converts them into the unit it shows).
 */
export const DOUBLE_WELL_BOUNDS = {
	barrierKcalMol: [0.001, 100],
	asymmetryKcalMol: [-50, 50]
} as const;
export const BARRIER_KJMOL_BOUNDS = [0.01, 500] as const;
export const SAMPLED_ENERGY_KCALMOL_BOUNDS = [-1000, 1000] as const;

export const doubleWellSchema = z.strictObject({
	kind: z.literal('double-well'),
	/**
	 * Barrier height of the untilted well above its minima, kcal/mol. Not 0: without a barrier
	 * the quartic is flat and confines nothing.
	 */
	barrierKcalMol: finite(
		DOUBLE_WELL_BOUNDS.barrierKcalMol[0],
		DOUBLE_WELL_BOUNDS.barrierKcalMol[1],
		' kcal/mol'
	),
	/** Distance from the barrier top to each minimum, Å. */
	halfSeparationA: finite(0.05, 2, ' Å'),
	/** Energy of the right minimum above the left, kcal/mol (a linear tilt). */
	asymmetryKcalMol: finite(
		DOUBLE_WELL_BOUNDS.asymmetryKcalMol[0],
		DOUBLE_WELL_BOUNDS.asymmetryKcalMol[1],
		' kcal/mol'
	).default(0)
});

export const sampledPotentialSchema = z.strictObject({
	kind: z.literal('points'),
	points: z
		.array(
			z.strictObject({
				xA: finite(-20, 20, ' Å'),
				energyKcalMol: finite(...SAMPLED_ENERGY_KCALMOL_BOUNDS, ' kcal/mol')
			})
		)
		.min(4, 'at least 4 points are needed')
		.max(
			MAX_POTENTIAL_SAMPLES,
			`at most ${MAX_POTENTIAL_SAMPLES} points (a scan needs tens; the levels come from the grid)`
		)
});

export const ISOTOPES = ['H', 'D', 'T', 'hydride'] as const;

const gridMessage = `expected a whole number of grid points from ${MIN_GRID_POINTS} to ${MAX_GRID_POINTS}`;
const levelsMessage = 'expected a whole number of levels from 2 to 20';

export const tunnellingRequestSchema = z
	.strictObject({
		temperatureK: finite(1, 2000, ' K').default(298.15),
		imagFreqCm1: finite(1, 5000, ' cm⁻¹').optional(),
		barrierKJmol: finite(...BARRIER_KJMOL_BOUNDS, ' kJ/mol').optional(),
		potential: z.discriminatedUnion('kind', [doubleWellSchema, sampledPotentialSchema]).optional(),
		isotope: z.enum(ISOTOPES).default('H'),
		massAmu: finite(0.5, 300, ' u').optional(),
		xMinA: finite(-20, 20, ' Å').optional(),
		xMaxA: finite(-20, 20, ' Å').optional(),
		/** Grid points; without them, refined until the levels converge. */
		points: z
			.number({ error: gridMessage })
			.int(gridMessage)
			.min(MIN_GRID_POINTS, gridMessage)
			.max(MAX_GRID_POINTS, gridMessage)
			.optional(),
		levels: z
			.number({ error: levelsMessage })
			.int(levelsMessage)
			.min(2, levelsMessage)
			.max(20, levelsMessage)
			.default(6)
	})
	.refine((r) => r.imagFreqCm1 !== undefined || r.potential !== undefined, {
		path: ['imagFreqCm1'],
		message: 'give an imaginary frequency, a potential, or both'
	})
	.refine((r) => (r.xMinA === undefined) === (r.xMaxA === undefined), {
		path: ['xMaxA'],
		message:
			'give both ends of the grid (xMinA and xMaxA), or neither for a grid chosen from the potential'
	})
	.refine((r) => r.xMinA === undefined || r.xMaxA === undefined || r.xMaxA > r.xMinA, {
		path: ['xMaxA'],
		message: 'xMaxA must be greater than xMinA'
	});
export type TunnellingRequest = z.infer<typeof tunnellingRequestSchema>;
