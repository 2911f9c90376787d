import type { ParamMatcher } from '@sveltejs/kit';
import { VERSION_SEGMENT_PATTERN } from '$lib/schemas/accession';

export const match: ParamMatcher = (param) => VERSION_SEGMENT_PATTERN.test(param);
