import { redirect } from '@sveltejs/kit';
import { HOP_PICK_PARAMS, hopPickSchema, hopRateQuerySchema } from '$lib/schemas/calc';
import { DEFAULT_CHAIN_CONDITIONS } from '$lib/schemas/chainConditions';
import { readDecimal } from '$lib/schemas/decimal';
import { parseSearchParams } from '$lib/schemas/searchParams';
import { HOP_DEFAULT_LAMBDA_EV, hopPair } from '$lib/server/calc/hopPair';
import { RATE_VALIDITY, runHopRate } from '$lib/server/calc/hopRate';
import { db } from '$lib/server/db';
import type { PageServerLoad } from './$types';

/*
 * A GET form: the inputs travel in the URL, so the values entered stay in the form after a run
 * (as typed: "−0,2" stays "−0,2"), with or without JavaScript, and a page can link to the
 * calculator filled in (`?donor=HL…&acceptor=HL…`).
 *
 * The query holds the API's parameters and the choice of two centres (HOP_PICK_PARAMS). With a
 * donor and an acceptor, ΔG° and the distance are filled in from the registry when both fields
 * are empty or when the "Fill" button asked (`fill`): the page answers with a redirect to the
 * same query with those values written in, so that the URL always says what was computed and
 * every field stays editable. A value typed over a filled one is kept; the page then shows what
 * the registry gives beside it.
 */
const PICK: ReadonlySet<string> = new Set(HOP_PICK_PARAMS);
const blank = (v: string | undefined) => v === undefined || v.trim() === '';

export const load: PageServerLoad = async ({ url, locals }) => {
	const values = Object.fromEntries(url.searchParams);
	const pickParams = new URLSearchParams();
	const calcParams = new URLSearchParams();
	for (const [k, v] of url.searchParams) (PICK.has(k) ? pickParams : calcParams).append(k, v);

	const picked = parseSearchParams(hopPickSchema, pickParams);
	const pick = picked.ok ? picked.data : {};
	const typedT = readDecimal(values.temperature ?? '');
	const conditions = {
		ph: pick.ph ?? DEFAULT_CHAIN_CONDITIONS.ph,
		temperatureK:
			typedT !== null && typedT >= 1 && typedT <= 1000
				? typedT
				: DEFAULT_CHAIN_CONDITIONS.temperatureK
	};
	const pair =
		pick.protein || pick.donor || pick.acceptor
			? await hopPair(db, pick, locals.viewer, conditions)
			: null;

	if (pair && (pick.fill !== undefined || (blank(values.dG) && blank(values.distance)))) {
		const next = new URLSearchParams(url.searchParams);
		next.delete('fill');
		if (pair.dG) next.set('dG', pair.dG.text);
		if (pair.distance) next.set('distance', pair.distance.text);
		if ((pair.dG || pair.distance) && blank(values.lambda))
			next.set('lambda', String(HOP_DEFAULT_LAMBDA_EV));
		if (next.toString() !== url.searchParams.toString()) redirect(303, `${url.pathname}?${next}`);
	}

	const shown = {
		values,
		validity: RATE_VALIDITY,
		pair,
		pickErrors: picked.ok ? {} : picked.fields,
		conditions,
		// Whether the value in the field is the one the registry gives (else it was typed over).
		fromRegistry: {
			dG: pair?.dG != null && readDecimal(values.dG ?? '') === readDecimal(pair.dG.text),
			distance:
				pair?.distance != null &&
				readDecimal(values.distance ?? '') === readDecimal(pair.distance.text)
		}
	};
	if ([...calcParams.values()].every((v) => v.trim() === ''))
		return { ...shown, errors: undefined, result: null };
	const query = parseSearchParams(hopRateQuerySchema, calcParams);
	if (!query.ok) return { ...shown, errors: query.fields, result: null };
	return { ...shown, errors: undefined, result: runHopRate(query.data), query: query.data };
};
