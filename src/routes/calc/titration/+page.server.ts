import { fail } from '@sveltejs/kit';
import { MAX_TITRATION_POINTS, titrationRequestSchema } from '$lib/schemas/calc';
import { fieldErrors } from '$lib/schemas/fieldErrors';
import { calculate, callerOf, checkCaller } from '$lib/server/calc/compute';
import { toFormFailure } from '$lib/server/http/failures';
import { parseTwoColumnText } from '$lib/server/calc/twoColumnText';
import type { Actions } from './$types';

const MAX_UPLOAD_BYTES = 1_000_000;

export const actions: Actions = {
	default: async (event) => {
		const caller = callerOf(event);
		const form = await event.request.formData();
		const file = form.get('file');
		const pasted = String(form.get('points') ?? '');
		const values = {
			points: pasted,
			components: String(form.get('components') ?? '1'),
			n: String(form.get('n') ?? ''),
			temperatureK: String(form.get('temperatureK') ?? '298.15')
		};
		try {
			checkCaller(caller);
		} catch (e) {
			return toFormFailure(e, event, values);
		}
		let text = pasted;
		if (file instanceof File && file.size > 0) {
			if (file.size > MAX_UPLOAD_BYTES)
				return fail(413, { values, errors: { file: ['the file is larger than 1 MB'] } });
			text = await file.text();
			values.points = text;
		}
		const { rows, errors: rowErrors } = parseTwoColumnText(
			text,
			['potential', 'signal'],
			MAX_TITRATION_POINTS
		);
		const points = rows.map(([potentialMv, signal]) => ({ potentialMv, signal }));
		if (rowErrors.length) return fail(400, { values, errors: { points: rowErrors } });
		const parsed = titrationRequestSchema.safeParse({
			points,
			components: Number(values.components),
			n: values.n.trim() === '' ? undefined : Number(values.n),
			temperatureK: Number(values.temperatureK)
		});
		if (!parsed.success) return fail(400, { values, errors: fieldErrors(parsed.error) });
		const { points: valid, ...options } = parsed.data;
		try {
			const fit = await calculate({ kind: 'titration', points: valid, options }, caller);
			return { values, fit, points: valid };
		} catch (e) {
			return toFormFailure(e, event, values);
		}
	}
};
