import { fail } from '@sveltejs/kit';
import {
	BARRIER_KJMOL_BOUNDS,
	DOUBLE_WELL_BOUNDS,
	MAX_POTENTIAL_SAMPLES,
	SAMPLED_ENERGY_KCALMOL_BOUNDS,
	tunnellingRequestSchema
} from '$lib/schemas/calc';
import { NOT_A_DECIMAL, readDecimal } from '$lib/schemas/decimal';
import { fieldErrors } from '$lib/schemas/fieldErrors';
import type { FieldErrors } from '$lib/schemas/searchParams';
import { convertEnergy, type EnergyUnit } from '$lib/science/units';
import { calculate, callerOf, checkCaller } from '$lib/server/calc/compute';
import { parseTwoColumnText } from '$lib/server/calc/twoColumnText';
import { tunnellingPlot } from '$lib/server/calc/tunnelling';
import { TUNNELLING_CAUTION } from '$lib/server/calc/answers';
import { toFormFailure } from '$lib/server/http/failures';
import type { Actions, PageServerLoad } from './$types';
import {
	DEFAULTS,
	FIELD_NAMES,
	PAGE_ENERGY_UNITS,
	formatNumber,
	isPageEnergyUnit,
	unitLabel,
	type FormValues,
	type PageEnergyUnit
} from './fields';

const NUMERIC = [
	'temperatureK',
	'imagFreqCm1',
	'barrier',
	'wellBarrier',
	'halfSeparationA',
	'asymmetry',
	'levels',
	'xMinA',
	'xMaxA',
	'points'
] as const;

/** Where the request's errors are shown on the form, and the bounds of those that are energies. */
const FORM_FIELD: Record<string, string> = {
	barrierKJmol: 'barrier',
	'potential.barrierKcalMol': 'wellBarrier',
	'potential.asymmetryKcalMol': 'asymmetry',
	'potential.halfSeparationA': 'halfSeparationA'
};
const ENERGY_BOUNDS: Record<string, { bounds: readonly [number, number]; unit: EnergyUnit }> = {
	barrier: { bounds: BARRIER_KJMOL_BOUNDS, unit: 'kJ/mol' },
	wellBarrier: { bounds: DOUBLE_WELL_BOUNDS.barrierKcalMol, unit: 'kcal/mol' },
	asymmetry: { bounds: DOUBLE_WELL_BOUNDS.asymmetryKcalMol, unit: 'kcal/mol' }
};

/** A range message in the page's unit (the request's bounds are in the API's units). */
function rangeIn(bounds: readonly [number, number], from: EnergyUnit, unit: PageEnergyUnit) {
	const [min, max] = bounds.map((b) => formatNumber(convertEnergy(b, from, unit)));
	return `expected a number from ${min} to ${max} ${unitLabel(unit)}`;
}

/** The request's field errors under the form's field names, energies in the page's unit. */
function formErrors(errors: FieldErrors, unit: PageEnergyUnit): FieldErrors {
	const out: FieldErrors = {};
	for (const [key, messages] of Object.entries(errors)) {
		const point = /^potential\.points\.(\d+)\.(xA|energyKcalMol)$/.exec(key);
		if (point) {
			const row = Number(point[1]) + 1;
			const message =
				point[2] === 'xA'
					? messages.join('; ')
					: rangeIn(SAMPLED_ENERGY_KCALMOL_BOUNDS, 'kcal/mol', unit);
			(out.pointsText ??= []).push(`point ${row}, ${point[2] === 'xA' ? 'x' : 'V'}: ${message}`);
			continue;
		}
		const field = key === 'potential.points' ? 'pointsText' : (FORM_FIELD[key] ?? key);
		const energy = ENERGY_BOUNDS[field];
		(out[field] ??= []).push(...(energy ? [rangeIn(energy.bounds, energy.unit, unit)] : messages));
	}
	return out;
}

export const load: PageServerLoad = () => ({ caution: TUNNELLING_CAUTION });

export const actions: Actions = {
	default: async (event) => {
		const caller = callerOf(event);
		const form = await event.request.formData();
		const values = Object.fromEntries(
			FIELD_NAMES.map((k) => [
				k,
				String(form.get(k) ?? (k === 'energyUnit' ? DEFAULTS.energyUnit : '')).trim()
			])
		) as FormValues;
		try {
			checkCaller(caller);
		} catch (e) {
			return toFormFailure(e, event, values);
		}
		if (!isPageEnergyUnit(values.energyUnit)) {
			return fail(400, {
				values,
				errors: { energyUnit: [`expected one of ${PAGE_ENERGY_UNITS.join(', ')}`] }
			});
		}
		const unit = values.energyUnit;
		const errors: FieldErrors = {};
		const numbers: Partial<Record<(typeof NUMERIC)[number], number>> = {};
		for (const name of NUMERIC) {
			if (values[name] === '') continue;
			const value = readDecimal(values[name]);
			if (value === null) errors[name] = [NOT_A_DECIMAL];
			else numbers[name] = value;
		}
		const kind = values.potentialKind;
		const sampled = parseTwoColumnText(values.pointsText, ['x', 'V'], MAX_POTENTIAL_SAMPLES);
		if (kind === 'points' && sampled.errors.length) errors.pointsText = sampled.errors;
		if (Object.keys(errors).length) return fail(400, { values, errors });

		const toKcal = (v: number | undefined) =>
			v === undefined ? undefined : convertEnergy(v, unit, 'kcal/mol');
		const potential =
			kind === 'double-well'
				? {
						kind,
						barrierKcalMol: toKcal(numbers.wellBarrier),
						halfSeparationA: numbers.halfSeparationA,
						asymmetryKcalMol: toKcal(numbers.asymmetry) ?? 0
					}
				: kind === 'points'
					? {
							kind,
							points: sampled.rows.map(([xA, energy]) => ({ xA, energyKcalMol: toKcal(energy) }))
						}
					: undefined;
		const parsed = tunnellingRequestSchema.safeParse({
			temperatureK: numbers.temperatureK ?? 298.15,
			imagFreqCm1: numbers.imagFreqCm1,
			barrierKJmol:
				numbers.barrier === undefined ? undefined : convertEnergy(numbers.barrier, unit, 'kJ/mol'),
			potential,
			isotope: values.isotope || 'H',
			levels: numbers.levels ?? 6,
			xMinA: numbers.xMinA,
			xMaxA: numbers.xMaxA,
			points: numbers.points
		});
		if (!parsed.success) {
			return fail(400, { values, errors: formErrors(fieldErrors(parsed.error), unit) });
		}
		try {
			const result = await calculate({ kind: 'tunnelling', request: parsed.data }, caller);
			const plot = result.levels ? tunnellingPlot(parsed.data, result.levels) : null;
			return { values, result, plot };
		} catch (e) {
			return toFormFailure(e, event, values);
		}
	}
};
