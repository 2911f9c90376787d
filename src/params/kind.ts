import type { ParamMatcher } from '@sveltejs/kit';
import { ENTRY_KINDS } from '$lib/kinds';

/** An entry kind identifier, as the API and the vocabulary spell it (e.g. spin_record). */
export const match = ((param): param is (typeof ENTRY_KINDS)[number] =>
	(ENTRY_KINDS as readonly string[]).includes(param)) satisfies ParamMatcher;
