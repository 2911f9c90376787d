import type { Selectable } from 'kysely';
import type { ListedPotential } from '$lib/catalogue/conflicts';
import type { Database } from '../db/schema';

/*
 * The columns of the potential read model that comparing values needs (conflict flags, the
 * ladder's representative value), and the one mapping of such a row to its comparable form.
 */
export const COMPARABLE_COLUMNS = [
	'p.accession',
	'p.centre_accession',
	'p.couple',
	'p.em_mv_she',
	'p.uncertainty_mv',
	'p.ph',
	'p.temperature_k'
] as const;

type ComparableRow = Pick<
	Selectable<Database['potential']>,
	| 'accession'
	| 'centre_accession'
	| 'couple'
	| 'em_mv_she'
	| 'uncertainty_mv'
	| 'ph'
	| 'temperature_k'
>;

export function toComparable(r: ComparableRow): ListedPotential {
	return {
		accession: r.accession,
		centre: { accession: r.centre_accession },
		couple: r.couple,
		emMvShe: r.em_mv_she,
		uncertaintyMv: r.uncertainty_mv,
		ph: r.ph,
		temperatureK: r.temperature_k
	};
}
