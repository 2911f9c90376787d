import { fail } from '@sveltejs/kit';
import { MAX_POTENTIAL_SAMPLES, tunnellingRequestSchema } from '$lib/schemas/calc';
import { fieldErrors } from '$lib/schemas/fieldErrors';
import { calculate, callerOf, checkCaller } from '$lib/server/calc/compute';
import { toFormFailure } from '$lib/server/http/failures';
import { parseTwoColumnText } from '$lib/server/calc/twoColumnText';
import type { Actions } from './$types';

const text = (form: FormData, name: string, fallback = '') =>
	String(form.get(name) ?? fallback).trim();
const numberOrUndefined = (value: string) =>
	value === '' ? undefined : Number(value.replace('\u2212', '-'));

export const actions: Actions = {
	default: async (event) => {
		const caller = callerOf(event);
		const form = await event.request.formData();
		const values = Object.fromEntries(
			[
				'temperatureK',
				'imagFreqCm1',
				'barrierKJmol',
				'potentialKind',
				'barrierKcalMol',
				'halfSeparationA',
				'asymmetryKcalMol',
				'pointsText',
				'isotope',
				'levels'
			].map((k) => [k, text(form, k)])
		);
		try {
			checkCaller(caller);
		} catch (e) {
			return toFormFailure(e, event, values);
		}
		const kind = values.potentialKind;
		const sampled = parseTwoColumnText(values.pointsText ?? '', ['x', 'V'], MAX_POTENTIAL_SAMPLES);
		if (kind === 'points' && sampled.errors.length) {
			return fail(400, { values, errors: { 'potential.points': sampled.errors } });
		}
		const potential =
			kind === 'double-well'
				? {
						kind,
						barrierKcalMol: numberOrUndefined(values.barrierKcalMol ?? ''),
						halfSeparationA: numberOrUndefined(values.halfSeparationA ?? ''),
						asymmetryKcalMol: numberOrUndefined(values.asymmetryKcalMol ?? '') ?? 0
					}
				: kind === 'points'
					? { kind, points: sampled.rows.map(([xA, energyKcalMol]) => ({ xA, energyKcalMol })) }
					: undefined;
		const parsed = tunnellingRequestSchema.safeParse({
			temperatureK: numberOrUndefined(values.temperatureK ?? '') ?? 298.15,
			imagFreqCm1: numberOrUndefined(values.imagFreqCm1 ?? ''),
			barrierKJmol: numberOrUndefined(values.barrierKJmol ?? ''),
			potential,
			isotope: values.isotope || 'H',
			levels: numberOrUndefined(values.levels ?? '') ?? 6
		});
		if (!parsed.success) return fail(400, { values, errors: fieldErrors(parsed.error) });
		try {
			return {
				values,
				result: await calculate({ kind: 'tunnelling', request: parsed.data }, caller)
			};
		} catch (e) {
			return toFormFailure(e, event, values);
		}
	}
};
