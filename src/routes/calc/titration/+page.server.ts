import { fail } from '@sveltejs/kit';
import { titrationRequestSchema } from '$lib/schemas/calc';
import { fieldErrors } from '$lib/schemas/fieldErrors';
import { listRowProblems, type RowProblem } from '$lib/schemas/twoColumnText';
import { typesetNumbersIn } from '$lib/format';
import { titrationAnswer } from '$lib/server/calc/answers';
import { calculate, callerOf, checkCaller } from '$lib/server/calc/compute';
import { toFormFailure } from '$lib/server/http/failures';
import type { Actions } from './$types';
import { TITRATION_DEFAULTS, titrationRequestOf, type TitrationValues } from './fields';

const MAX_UPLOAD_BYTES = 1_000_000;
const COLUMN = { potentialMv: 'potential', signal: 'signal' } as const;

/*
 * Every answer carries `values`, the fields exactly as entered (the points as typed, or the
 * uploaded file's text), so that the form shows them again after a run, with or without
 * JavaScript. Numbers are read with readDecimal, as in every other form. Every problem with the
 * points is listed under them by line number (what was wrong, what was expected), capped.
 */
export const actions: Actions = {
	default: async (event) => {
		const caller = callerOf(event);
		const form = await event.request.formData();
		const file = form.get('file');
		const text = (name: keyof TitrationValues) =>
			String(form.get(name) ?? TITRATION_DEFAULTS[name]);
		const values: TitrationValues = {
			points: text('points'),
			components: text('components'),
			n: String(form.get('n') ?? ''),
			temperatureK: text('temperatureK')
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
		const { body, lines, problems, errors } = titrationRequestOf(values);
		const rowProblems: RowProblem[] = [...problems];
		const general: string[] = errors.pointsCount ?? [];
		delete errors.pointsCount;
		let request = null;
		if (rowProblems.length === 0 && general.length === 0 && Object.keys(errors).length === 0) {
			const parsed = titrationRequestSchema.safeParse(body);
			if (parsed.success) request = parsed.data;
			else
				for (const [key, messages] of Object.entries(fieldErrors(parsed.error))) {
					const m = /^points\.(\d+)\.(potentialMv|signal)$/.exec(key);
					if (!m) (errors[key] ??= []).push(...messages);
					else {
						const field = m[2] as keyof typeof COLUMN;
						const value = body.points[Number(m[1])]?.[field];
						rowProblems.push({
							row: lines[Number(m[1])] ?? Number(m[1]) + 1,
							message: typesetNumbersIn(`${COLUMN[field]} ${value}: ${messages.join('; ')}`)
						});
					}
				}
		}
		if (rowProblems.length || general.length || errors.points)
			errors.points = [...listRowProblems(rowProblems), ...general, ...(errors.points ?? [])];
		if (!request) return fail(400, { values, errors });
		const { points, ...options } = request;
		try {
			const result = await calculate({ kind: 'titration', points, options }, caller);
			return { values, answer: titrationAnswer(result), points };
		} catch (e) {
			return toFormFailure(e, event, values);
		}
	}
};
