import type { ParamMatcher } from '@sveltejs/kit';
import { isAccession } from '$lib/schemas/accession';

export const match: ParamMatcher = (param) => isAccession(param);
