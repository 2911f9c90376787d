import { MAX_TITRATION_POINTS } from '$lib/schemas/calc';
import { NOT_A_DECIMAL, readDecimal } from '$lib/schemas/decimal';
import type { FieldErrors } from '$lib/schemas/searchParams';
import { parseTwoColumnText, type RowProblem } from '$lib/schemas/twoColumnText';

/*
 * The titration form's fields as typed, and the API request they make: shared by the action
 * (which checks the request with the API's schema) and the page (whose "API:" line shows it as
 * the fields stand), so that both read the same numbers from the same text.
 */

export type TitrationValues = Record<'points' | 'components' | 'n' | 'temperatureK', string>;

export const TITRATION_DEFAULTS: TitrationValues = {
	points: '',
	components: '1',
	n: '1',
	temperatureK: '298.15'
};

export interface TitrationBody {
	points: { potentialMv: number; signal: number }[];
	components: number | null;
	n?: number | null;
	temperatureK: number | null;
}

/** The request the fields make, the line number of each point, and what could not be read. */
export function titrationRequestOf(values: TitrationValues): {
	body: TitrationBody;
	lines: number[];
	problems: RowProblem[];
	errors: FieldErrors;
} {
	const parsed = parseTwoColumnText(values.points, ['potential', 'signal'], MAX_TITRATION_POINTS);
	const errors: FieldErrors = {};
	if (parsed.tooMany) errors.pointsCount = [parsed.tooMany];
	const n = values.n.trim() === '' ? undefined : readDecimal(values.n);
	const temperatureK = readDecimal(values.temperatureK);
	const components = readDecimal(values.components);
	if (n === null) errors.n = [NOT_A_DECIMAL];
	if (temperatureK === null) errors.temperatureK = [NOT_A_DECIMAL];
	if (components === null) errors.components = ['expected 1 or 2'];
	return {
		body: {
			points: parsed.rows.map(([potentialMv, signal]) => ({ potentialMv, signal })),
			components,
			...(n === undefined ? {} : { n }),
			temperatureK
		},
		lines: parsed.lines,
		problems: parsed.problems,
		errors
	};
}
