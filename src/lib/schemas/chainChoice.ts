import { z } from 'zod';
import { ACCESSION_HINT, ACCESSION_PATTERN } from './accession';
import {
	CHAIN_PH_RANGE,
	CHAIN_TEMPERATURE_RANGE,
	DEFAULT_CHAIN_CONDITIONS,
	type ChainConditions
} from './chainConditions';
import { parseSearchParams, queryNumber, type FieldErrors } from './searchParams';

/*
 * The reader's choice for a protein page's chain estimate, carried in the page's query string
 * (`?entry=HL000101&exit=HL000109&ph=7&temperature=298.15`) so that it works without scripts, can
 * be linked to, and is kept by the read cache like any other page. Only these four parameters are
 * read; every value is checked, and any fault is a 400 naming the parameter. Whether the centres
 * named belong to the protein (and are visible to the reader) is checked against the protein's
 * centres by the chain planner (server/calc/chainEstimate.ts).
 */

export const CHAIN_CHOICE_PARAMS = ['entry', 'exit', 'ph', 'temperature'] as const;

export interface ChainChoice {
	/** Centre accessions; null: the default ends (chainEstimate.ts, defaultEnds). */
	entry: string | null;
	exit: string | null;
	conditions: ChainConditions;
	/** True when the query named any of the four parameters (the reader chose). */
	chosen: boolean;
}

const centreParam = z.string().regex(ACCESSION_PATTERN, `expected ${ACCESSION_HINT}`);

export const chainChoiceSchema = z
	.object({
		entry: centreParam.optional(),
		exit: centreParam.optional(),
		ph: queryNumber(CHAIN_PH_RANGE.min, CHAIN_PH_RANGE.max).optional(),
		temperature: queryNumber(
			CHAIN_TEMPERATURE_RANGE.min,
			CHAIN_TEMPERATURE_RANGE.max,
			' K'
		).optional()
	})
	.refine((c) => c.entry === undefined || c.entry !== c.exit, {
		message: 'entry and exit must be different centres',
		path: ['exit']
	});

/** The chain choice in a query string; the page's other parameters are left to it. */
export function parseChainChoice(
	params: URLSearchParams
): { ok: true; choice: ChainChoice } | { ok: false; fields: FieldErrors } {
	const own = new URLSearchParams();
	for (const key of CHAIN_CHOICE_PARAMS) for (const v of params.getAll(key)) own.append(key, v);
	const parsed = parseSearchParams(chainChoiceSchema, own);
	if (!parsed.ok) return parsed;
	const { entry, exit, ph, temperature } = parsed.data;
	return {
		ok: true,
		choice: {
			entry: entry ?? null,
			exit: exit ?? null,
			conditions: {
				ph: ph ?? DEFAULT_CHAIN_CONDITIONS.ph,
				temperatureK: temperature ?? DEFAULT_CHAIN_CONDITIONS.temperatureK
			},
			chosen: [entry, exit, ph, temperature].some((v) => v !== undefined)
		}
	};
}
