import { fail } from '@sveltejs/kit';
import { MAX_TITRATION_POINTS, titrationRequestSchema } from '$lib/schemas/calc';
import { NOT_A_DECIMAL, readDecimal } from '$lib/schemas/decimal';
import { fieldErrors } from '$lib/schemas/fieldErrors';
import { titrationAnswer } from '$lib/server/calc/answers';
import { calculate, callerOf, checkCaller } from '$lib/server/calc/compute';
import { parseTwoColumnText } from '$lib/server/calc/twoColumnText';
import { toFormFailure } from '$lib/server/http/failures';
import type { Actions } from './$types';

const MAX_UPLOAD_BYTES = 1_000_000;

/*
 * Every answer carries `values`, the fields exactly as entered (the points as typed, or the
 * uploaded file's text), so that the form shows them again after a run, with or without
 * JavaScript. Numbers are read with readDecimal, as in every other form.
 */
export const actions: Actions = {
	default: async (event) => {
		const caller = callerOf(event);
		const form = await event.request.formData();
		const file = form.get('file');
		const values = {
			points: String(form.get('points') ?? ''),
			components: String(form.get('components') ?? '1'),
			n: String(form.get('n') ?? ''),
			temperatureK: String(form.get('temperatureK') ?? '298.15')
		};
		try {
			checkCaller(caller);
		} catch (e) {
			return toFormFailure(e, event, values);
		}
		if (file instanceof File && file.size > 0) {
			if (file.size > MAX_UPLOAD_BYTES)
				return fail(413, { values, errors: { file: ['the file is larger than 1 MB'] } });
			values.points = await file.text();
		}
		const { rows, errors: rowErrors } = parseTwoColumnText(
			values.points,
			['potential', 'signal'],
			MAX_TITRATION_POINTS
		);
		const errors: Record<string, string[]> = {};
		if (rowErrors.length) errors.points = rowErrors;
		const n = values.n.trim() === '' ? undefined : readDecimal(values.n);
		const temperatureK = readDecimal(values.temperatureK);
		const components = readDecimal(values.components);
		if (n === null) errors.n = [NOT_A_DECIMAL];
		if (temperatureK === null) errors.temperatureK = [NOT_A_DECIMAL];
		if (components === null) errors.components = ['expected 1 or 2'];
		if (Object.keys(errors).length) return fail(400, { values, errors });
		const parsed = titrationRequestSchema.safeParse({
			points: rows.map(([potentialMv, signal]) => ({ potentialMv, signal })),
			components,
			n,
			temperatureK
		});
		if (!parsed.success) return fail(400, { values, errors: fieldErrors(parsed.error) });
		const { points, ...options } = parsed.data;
		try {
			const result = await calculate({ kind: 'titration', points, options }, caller);
			return { values, answer: titrationAnswer(result), points };
		} catch (e) {
			return toFormFailure(e, event, values);
		}
	}
};
