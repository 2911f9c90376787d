import { fail } from '@sveltejs/kit';
import {
	BARRIER_KJMOL_BOUNDS,
	DOUBLE_WELL_BOUNDS,
	SAMPLED_ENERGY_KCALMOL_BOUNDS,
	tunnellingRequestSchema
} from '$lib/schemas/calc';
import { listRowProblems, type RowProblem } from '$lib/schemas/twoColumnText';
import { formatSignificant, typesetNumbersIn } from '$lib/format';
import { fieldErrors } from '$lib/schemas/fieldErrors';
import type { FieldErrors } from '$lib/schemas/searchParams';
import { convertEnergy, type EnergyUnit } from '$lib/science/units';
import { calculate, callerOf, checkCaller } from '$lib/server/calc/compute';
import { tunnellingPlot } from '$lib/server/calc/tunnelling';
import { TUNNELLING_CAUTION } from '$lib/server/calc/answers';
import { toFormFailure } from '$lib/server/http/failures';
import type { Actions, PageServerLoad } from './$types';
import {
	DEFAULTS,
	FIELD_NAMES,
	isPageEnergyUnit,
	unitLabel,
	tunnellingRequestOf,
	type FormValues,
	type PageEnergyUnit
} from './fields';

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
	const [min, max] = bounds.map((b) => formatSignificant(convertEnergy(b, from, unit)));
	return `expected a number from ${min} to ${max} ${unitLabel(unit)}`;
}

/**
 * The request's field errors under the form's field names, energies in the page's unit; those of
 * single pasted points as row problems, by the line number of the point (`lines`).
 */
function formErrors(
	errors: FieldErrors,
	unit: PageEnergyUnit,
	lines: readonly number[],
	rows: RowProblem[]
): FieldErrors {
	const out: FieldErrors = {};
	for (const [key, messages] of Object.entries(errors)) {
		const point = /^potential\.points\.(\d+)\.(xA|energyKcalMol)$/.exec(key);
		if (point) {
			const index = Number(point[1]);
			const message =
				point[2] === 'xA'
					? messages.join('; ')
					: rangeIn(SAMPLED_ENERGY_KCALMOL_BOUNDS, 'kcal/mol', unit);
			rows.push({
				row: lines[index] ?? index + 1,
				message: typesetNumbersIn(`${point[2] === 'xA' ? 'x' : 'V'}: ${message}`)
			});
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
		const unit = isPageEnergyUnit(values.energyUnit) ? values.energyUnit : 'kcal/mol';
		const { body, lines, problems, errors } = tunnellingRequestOf(values);
		const rows: RowProblem[] = [...problems];
		const general = errors.pointsCount ?? [];
		delete errors.pointsCount;
		let request = null;
		if (!rows.length && !general.length && !Object.keys(errors).length) {
			const parsed = tunnellingRequestSchema.safeParse(body);
			if (parsed.success) request = parsed.data;
			else Object.assign(errors, formErrors(fieldErrors(parsed.error), unit, lines, rows));
		}
		if (rows.length || general.length)
			errors.pointsText = [...listRowProblems(rows), ...general, ...(errors.pointsText ?? [])];
		if (!request) return fail(400, { values, errors });
		try {
			const result = await calculate({ kind: 'tunnelling', request }, caller);
			const plot = result.levels ? tunnellingPlot(request, result.levels) : null;
			return { values, result, plot };
		} catch (e) {
			return toFormFailure(e, event, values);
		}
	}
};
